// Sowcast's service worker: shows the phone notifications the worker sends through Web Push and opens the
// page a notification is about when it is tapped. Payload (JSON, built in lib/notify/messages.ts):
// { title, body, url, tag } — url is the step's (or plot's) page.
// It also keeps the My steps page readable offline: the page, its scripts and styles, and the last answer
// of GET /api/my-steps — network first, the kept copy only when the network fails. Nothing else of the API is
// kept, and the copy is dropped when someone signs out or in (it is one person's list).
/* eslint-env serviceworker */

const FALLBACK_URL = '/properties';

const FIELD_CACHE = 'sowcast-field-v1';
const FIELD_PAGE = '/my-steps';
const FIELD_DATA = '/api/my-steps';
/** Whose list the kept copy is (a synthetic entry in the cache). */
const FIELD_OWNER = '/__sowcast/field-owner';
/** Set on an answer served from the kept copy: when it was stored (ISO 8601). */
const STORED_AT_HEADER = 'x-sowcast-stored-at';

self.addEventListener('install', () => {
  // Take over at once so a fresh subscription, and the offline copy of My steps, are served by this version.
  self.skipWaiting();
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    (async () => {
      // Copies kept by an older version of this worker are of no use to this one.
      const names = await caches.keys();
      await Promise.all(names.filter((name) => name.startsWith('sowcast-field-') && name !== FIELD_CACHE).map((name) => caches.delete(name)));
      await self.clients.claim();
    })(),
  );
});

function clearFieldCache() {
  return caches.delete(FIELD_CACHE);
}

/** A copy of a response with the moment it was stored, so the page can say how old what it shows is. */
async function stamped(response) {
  const headers = new Headers(response.headers);
  headers.set(STORED_AT_HEADER, new Date().toISOString());
  return new Response(await response.blob(), { status: response.status, statusText: response.statusText, headers });
}

/** Only a plain 200 of this site is kept: never a redirect to sign-in, an error, or another origin's answer. */
const keepable = (response) => response && response.ok && response.status === 200 && response.type === 'basic' && !response.redirected;

async function networkFirst(request, key) {
  const cache = await caches.open(FIELD_CACHE);
  try {
    const response = await fetch(request);
    if (keepable(response)) await cache.put(key, await stamped(response.clone()));
    else if (response.status === 401 || response.redirected || response.type === 'opaqueredirect') await clearFieldCache();
    return response;
  } catch (error) {
    // Vary (RSC, Accept-Encoding…) differs between the request that stored a copy and this one; the key is the path.
    const kept = await cache.match(key, { ignoreVary: true, ignoreSearch: true });
    if (kept) return kept;
    throw error;
  }
}

/** Build files have content hashes in their names: a kept one never goes stale. */
async function staticAsset(event) {
  const cache = await caches.open(FIELD_CACHE);
  const kept = await cache.match(event.request, { ignoreVary: true });
  if (kept) return kept;
  const response = await fetch(event.request);
  if (keepable(response) && (await fromFieldPage(event))) await cache.put(event.request, response.clone());
  return response;
}

async function fromFieldPage(event) {
  const id = event.clientId || event.resultingClientId;
  const client = id ? await self.clients.get(id) : null;
  return !!client && new URL(client.url).pathname === FIELD_PAGE;
}

/**
 * Sent by the My steps page once it is shown online ({ type: 'field:keep', userId, assets }): stores the page,
 * its list and the build files it loaded (those fetched before this worker controlled the page never passed
 * through it). A list of another person first drops the old copy.
 */
async function keepFieldPage(data) {
  const owner = typeof data.userId === 'string' ? data.userId : '';
  if (!owner) return { ok: false };
  let cache = await caches.open(FIELD_CACHE);
  const known = await cache.match(FIELD_OWNER);
  if (known && (await known.text()) !== owner) {
    await clearFieldCache();
    cache = await caches.open(FIELD_CACHE);
  }
  await cache.put(FIELD_OWNER, new Response(owner));
  const assets = (Array.isArray(data.assets) ? data.assets : [])
    .map((raw) => {
      try {
        const url = new URL(raw, self.location.origin);
        return url.origin === self.location.origin && url.pathname.startsWith('/_next/static/') ? url.href : null;
      } catch {
        return null;
      }
    })
    .filter(Boolean);
  for (const path of [FIELD_PAGE, FIELD_DATA]) {
    const response = await fetch(path, { credentials: 'same-origin', cache: 'no-store' });
    if (!keepable(response)) {
      // Signed out meanwhile: nothing of the old list may stay.
      await clearFieldCache();
      return { ok: false };
    }
    await cache.put(path, await stamped(response));
  }
  for (const href of assets) {
    if (await cache.match(href)) continue;
    const response = await fetch(href).catch(() => null);
    if (keepable(response)) await cache.put(href, response);
  }
  // Build files of an older release that this page no longer loads.
  const wanted = new Set(assets);
  for (const request of await cache.keys()) {
    const url = new URL(request.url);
    if (url.pathname.startsWith('/_next/static/') && !wanted.has(url.href)) await cache.delete(request);
  }
  return { ok: true, storedAt: new Date().toISOString() };
}

self.addEventListener('message', (event) => {
  const data = event.data || {};
  const port = event.ports && event.ports[0];
  const reply = (answer) => port && port.postMessage(answer);
  if (data.type === 'field:keep') {
    event.waitUntil(keepFieldPage(data).then(reply, (error) => reply({ ok: false, error: String(error) })));
  } else if (data.type === 'field:clear') {
    event.waitUntil(clearFieldCache().then(() => reply({ ok: true })));
  }
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;
  // Signing out or in changes whose list this browser may show: drop the copy, and let the request go on as it would.
  if (url.pathname === '/api/auth/signout' || url.pathname.startsWith('/api/auth/callback/')) {
    event.waitUntil(clearFieldCache());
    return;
  }
  if (request.method !== 'GET') return;
  if (request.mode === 'navigate' && url.pathname === FIELD_PAGE) {
    event.respondWith(networkFirst(request, FIELD_PAGE));
    return;
  }
  if (url.pathname === FIELD_DATA && url.search === '' && request.mode !== 'navigate') {
    event.respondWith(networkFirst(request, FIELD_DATA));
    return;
  }
  if (url.pathname.startsWith('/_next/static/')) {
    event.respondWith(staticAsset(event));
  }
  // Everything else goes to the network untouched: no other page or API answer is ever kept.
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
