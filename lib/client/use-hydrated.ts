'use client';

import { useSyncExternalStore } from 'react';

const subscribe = () => () => {};

/**
 * False in the server's HTML and during hydration, true once React runs in the browser. Forms keep their
 * submit buttons disabled until then, so a quick tap on a slow phone never sends the form natively (for
 * sign-in that would put the password in the address bar).
 */
export function useHydrated(): boolean {
  return useSyncExternalStore(subscribe, () => true, () => false);
}
