// Sowcast's service worker: shows the phone notifications the worker sends through Web Push and opens the
// page a notification is about when it is tapped. Payload (JSON, built in lib/notify/messages.ts):
// { title, body, url, tag } — url is the step's (or plot's) page.
/* eslint-env serviceworker */

const FALLBACK_URL = '/properties';

self.addEventListener('install', () => {
  // Nothing to cache yet: take over at once so a fresh subscription is served by this version.
  self.skipWaiting();
});

self.addEventListener('activate', (event) => {
  event.waitUntil(self.clients.claim());
});

function readPayload(event) {
  if (!event.data) return null;
  try {
    return event.data.json();
  } catch {
    // A payload that is not JSON is still shown, as its text.
    return { body: event.data.text() };
  }
}

/**
 * Only pages of this site are opened from a notification: the link's path is kept and put on this origin, so a
 * message built with another host name for the same site (a proxy, 127.0.0.1 vs localhost) still opens here.
 */
function sameOriginUrl(raw) {
  try {
    const url = new URL(typeof raw === 'string' && raw ? raw : FALLBACK_URL, self.location.origin);
    return new URL(url.pathname + url.search + url.hash, self.location.origin).href;
  } catch {
    return new URL(FALLBACK_URL, self.location.origin).href;
  }
}

self.addEventListener('push', (event) => {
  const payload = readPayload(event) ?? {};
  const title = typeof payload.title === 'string' && payload.title ? payload.title : 'Sowcast';
  const options = {
    body: typeof payload.body === 'string' ? payload.body : '',
    // The same tag replaces an older notification about the same thing instead of stacking another.
    tag: typeof payload.tag === 'string' && payload.tag ? payload.tag : undefined,
    renotify: typeof payload.tag === 'string' && payload.tag !== '',
    icon: '/favicon.ico',
    badge: '/favicon.ico',
    data: { url: sameOriginUrl(payload.url) },
  };
  // userVisibleOnly: every push must show a notification, so this runs even for an empty payload.
  event.waitUntil(self.registration.showNotification(title, options));
});

self.addEventListener('notificationclick', (event) => {
  event.notification.close();
  const target = (event.notification.data && event.notification.data.url) || sameOriginUrl(FALLBACK_URL);
  event.waitUntil(
    (async () => {
      const windows = await self.clients.matchAll({ type: 'window', includeUncontrolled: true });
      // A tab already on that page comes to the front; otherwise a Sowcast tab goes there; else a new one opens.
      const exact = windows.find((client) => client.url === target);
      if (exact) return exact.focus().catch(() => exact);
      const tab = windows.find((client) => new URL(client.url).origin === self.location.origin && 'navigate' in client);
      if (tab) {
        try {
          const navigated = await tab.navigate(target);
          if (navigated) return navigated.focus().catch(() => navigated);
        } catch {
          // navigate() refuses a tab this worker does not control; open a new one instead.
        }
      }
      return self.clients.openWindow(target);
    })(),
  );
});
