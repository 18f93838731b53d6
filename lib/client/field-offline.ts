// The browser's side of reading My steps offline: registers the service worker (public/sw.js, the one push
// notifications use) and asks it to keep this page, its list and its build files; forgets them on sign-out.

/** Must match FIELD_CACHE in public/sw.js. */
export const FIELD_CACHE = 'sowcast-field-v1';
/** Set by the service worker on an answer served from its kept copy (ISO 8601 of when it was stored). */
export const STORED_AT_HEADER = 'x-sowcast-stored-at';

export type OfflineReadiness =
  | { state: 'checking' }
  | { state: 'unsupported'; why: string }
  | { state: 'ready'; storedAt: string }
  | { state: 'failed'; why: string };

/** Same-origin build files this page has loaded: scripts, styles, fonts. */
function loadedAssets(): string[] {
  const urls = new Set<string>();
  const add = (raw: string | null | undefined) => {
    if (!raw) return;
    try {
      const url = new URL(raw, location.href);
      if (url.origin === location.origin && url.pathname.startsWith('/_next/static/')) urls.add(url.href);
    } catch {
      // not a URL
    }
  };
  for (const entry of performance.getEntriesByType('resource')) add(entry.name);
  document.querySelectorAll<HTMLScriptElement>('script[src]').forEach((s) => add(s.src));
  document.querySelectorAll<HTMLLinkElement>('link[href]').forEach((l) => {
    if (['stylesheet', 'preload', 'modulepreload'].includes(l.rel)) add(l.href);
  });
  return [...urls];
}

function ask<T>(worker: ServiceWorker, message: unknown, timeoutMs = 30_000): Promise<T> {
  return new Promise((resolve, reject) => {
    const channel = new MessageChannel();
    const timer = setTimeout(() => reject(new Error('the service worker did not answer')), timeoutMs);
    channel.port1.onmessage = (event) => {
      clearTimeout(timer);
      resolve(event.data as T);
    };
    worker.postMessage(message, [channel.port2]);
  });
}

export async function keepForOffline(userId: string): Promise<OfflineReadiness> {
  if (!window.isSecureContext || !('serviceWorker' in navigator)) {
    return { state: 'unsupported', why: 'This browser cannot keep the list for offline reading (it needs a secure https connection).' };
  }
  try {
    await navigator.serviceWorker.register('/sw.js');
    const registration = await navigator.serviceWorker.ready;
    const worker = registration.active;
    if (!worker) return { state: 'failed', why: 'The offline helper did not start.' };
    const answer = await ask<{ ok: boolean; storedAt?: string; error?: string }>(worker, { type: 'field:keep', userId, assets: loadedAssets() });
    return answer.ok && answer.storedAt ? { state: 'ready', storedAt: answer.storedAt } : { state: 'failed', why: answer.error ?? 'The list could not be kept.' };
  } catch (error) {
    return { state: 'failed', why: error instanceof Error ? error.message : String(error) };
  }
}

/** Drops the kept copy of one person's list (sign-out); the service worker does the same when it sees it. */
export async function forgetOfflineCopy(): Promise<void> {
  try {
    if ('caches' in window) await caches.delete(FIELD_CACHE);
  } catch {
    // No Cache API (or storage blocked): nothing was kept.
  }
}
