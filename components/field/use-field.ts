'use client';

import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState, useSyncExternalStore } from 'react';
import { ApiError } from '@/lib/client/api';
import { keepForOffline, STORED_AT_HEADER, type OfflineReadiness } from '@/lib/client/field-offline';
import { listOutcomes, onOutboxChange, sendOutcomes, type QueuedOutcome, type SendResult } from '@/lib/client/outbox';
import type { MyStep } from '@/lib/planning/my-steps';

export interface MyStepsAnswer {
  userId: string;
  generatedAt: string;
  steps: MyStep[];
  /** Set when the service worker answered from its kept copy (the network failed). */
  storedAt: string | null;
}

export const myStepsKey = ['my-steps'] as const;
const outboxKey = (userId: string) => ['outbox', userId] as const;

/** A waiting outcome is sent again this often while the page is open (common practice, no source). */
export const RETRY_MS = 20_000;

async function fetchMySteps(): Promise<MyStepsAnswer> {
  let response: Response;
  try {
    response = await fetch('/api/my-steps', { headers: { Accept: 'application/json' }, credentials: 'same-origin', cache: 'no-store' });
  } catch {
    throw new ApiError(0, 'Sowcast could not be reached, and this phone has no copy of your steps yet. Open this page once while online.');
  }
  const payload = (await response.json().catch(() => null)) as (Omit<MyStepsAnswer, 'storedAt'> & { error?: string }) | null;
  if (!response.ok || !payload) {
    throw new ApiError(response.status, payload?.error ?? (response.status === 401 ? 'Your session has ended. Sign in again.' : `Your steps could not be loaded (HTTP ${response.status}).`));
  }
  return { ...payload, storedAt: response.headers.get(STORED_AT_HEADER) };
}

export function useMySteps() {
  return useQuery({ queryKey: myStepsKey, queryFn: fetchMySteps, refetchOnWindowFocus: true });
}

const subscribeOnline = (callback: () => void) => {
  window.addEventListener('online', callback);
  window.addEventListener('offline', callback);
  return () => {
    window.removeEventListener('online', callback);
    window.removeEventListener('offline', callback);
  };
};

/** The browser's own idea of the connection (HTML navigator.onLine); a failed request is the real test. */
export function useOnline(): boolean {
  return useSyncExternalStore(subscribeOnline, () => navigator.onLine, () => true);
}

/**
 * This person's queued outcomes, and the sender: it runs on page load, when the browser comes back online
 * and on a timer while something waits. `onSent` hears every outcome that reached the server.
 */
export function useOutbox(userId: string, onSent: (sent: QueuedOutcome[]) => void) {
  const queryClient = useQueryClient();
  const query = useQuery({ queryKey: outboxKey(userId), queryFn: () => listOutcomes(userId), staleTime: Infinity, networkMode: 'always' });
  const [last, setLast] = useState<SendResult | null>(null);
  const sentRef = useRef(onSent);
  useEffect(() => {
    sentRef.current = onSent;
  }, [onSent]);

  const send = useCallback(
    async (only?: string) => {
      const result = await sendOutcomes(userId, only);
      setLast(result);
      if (result.sent.length) {
        sentRef.current(result.sent);
        await queryClient.invalidateQueries({ queryKey: myStepsKey });
      }
      await queryClient.invalidateQueries({ queryKey: outboxKey(userId) });
      return result;
    },
    [queryClient, userId],
  );

  useEffect(() => onOutboxChange(() => void queryClient.invalidateQueries({ queryKey: outboxKey(userId) })), [queryClient, userId]);

  useEffect(() => {
    void send();
    const online = () => void send();
    window.addEventListener('online', online);
    return () => window.removeEventListener('online', online);
  }, [send]);

  const waiting = (query.data ?? []).some((e) => e.state === 'waiting');
  useEffect(() => {
    if (!waiting) return;
    const timer = window.setInterval(() => void send(), RETRY_MS);
    return () => window.clearInterval(timer);
  }, [waiting, send]);

  return { entries: query.data ?? [], last, send };
}

/** Keeps this page for offline reading once it has been shown online (later lists pass through the worker). */
export function useOfflineCopy(userId: string, online: boolean) {
  const [readiness, setReadiness] = useState<OfflineReadiness>({ state: 'checking' });
  const done = useRef(false);
  useEffect(() => {
    if (!online || done.current) return;
    done.current = true;
    void keepForOffline(userId).then(setReadiness);
  }, [userId, online]);
  return readiness;
}
