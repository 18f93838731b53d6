// Step outcomes made on a phone without a connection wait here — in IndexedDB (idb-keyval), so a reload or a
// closed tab loses none — until they reach the server. Each has a client id; the server answers a repeat of
// the same outcome as done, so an answer lost on the way back costs a second send, never a second record.
import { createStore, del, get, set, values, type UseStore } from 'idb-keyval';
import type { StepKind } from '@/lib/schedule/types';
import type { StepOutcomeInput } from '@/lib/validations/step';

export interface QueuedOutcome {
  clientId: string;
  /** Whose outcome it is: only that person's session sends it. */
  userId: string;
  stepId: string;
  propertyId: string;
  kind: StepKind;
  title: string;
  plotName: string;
  body: StepOutcomeInput;
  queuedAt: string;
  attempts: number;
  /** waiting: sent at the next chance; refused: the server said no (the reason kept), the person decides. */
  state: 'waiting' | 'refused';
  lastError?: string;
  /** The server's per-field reasons for a refusal (field → message). */
  lastFields?: Record<string, string>;
  lastTriedAt?: string;
}

export interface SendResult {
  sent: QueuedOutcome[];
  refused: QueuedOutcome[];
  /** The connection (or the session) stopped the run; what is left waits for the next chance. */
  stopped: 'offline' | 'signed-out' | null;
}

let store: UseStore | null = null;
const outbox = () => (store ??= createStore('sowcast-outbox', 'outcomes'));

/** Another tab or this one changed the queue: listeners re-read it. */
export const OUTBOX_EVENT = 'sowcast:outbox';
function changed() {
  window.dispatchEvent(new Event(OUTBOX_EVENT));
  try {
    new BroadcastChannel('sowcast-outbox').postMessage('changed');
  } catch {
    // Older browsers have no BroadcastChannel; this tab still hears the event.
  }
}

/** RFC 9562 version 4 UUID; crypto.randomUUID exists only in secure contexts, getRandomValues everywhere. */
export function newClientId(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6] & 0x0f) | 0x40;
  b[8] = (b[8] & 0x3f) | 0x80;
  const hex = [...b].map((x) => x.toString(16).padStart(2, '0')).join('');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

export async function enqueueOutcome(entry: Omit<QueuedOutcome, 'attempts' | 'state' | 'queuedAt'> & { queuedAt?: string }): Promise<QueuedOutcome> {
  const queued: QueuedOutcome = { ...entry, queuedAt: entry.queuedAt ?? new Date().toISOString(), attempts: 0, state: 'waiting' };
  await set(queued.clientId, queued, outbox());
  changed();
  return queued;
}

export async function listOutcomes(userId: string): Promise<QueuedOutcome[]> {
  const all = (await values<QueuedOutcome>(outbox())).filter((e) => e.userId === userId);
  return all.sort((a, b) => a.queuedAt.localeCompare(b.queuedAt));
}

export async function discardOutcome(clientId: string): Promise<void> {
  await del(clientId, outbox());
  changed();
}

/** A refused outcome tried again (after the person fixed what the server objected to elsewhere). */
export async function retryOutcome(clientId: string): Promise<void> {
  const entry = await get<QueuedOutcome>(clientId, outbox());
  if (!entry) return;
  await set(clientId, { ...entry, state: 'waiting', lastError: undefined }, outbox());
  changed();
}

/** Answers that will change by asking again later (RFC 9110 §15: timeout, too many requests, server errors). */
const retryable = (status: number) => status === 0 || status === 408 || status === 429 || status >= 500;

async function post(entry: QueuedOutcome): Promise<{ status: number; payload: Record<string, unknown> | null }> {
  try {
    const response = await fetch(`/api/steps/${entry.stepId}/complete`, {
      method: 'POST',
      headers: { Accept: 'application/json', 'Content-Type': 'application/json' },
      body: JSON.stringify(entry.body),
      credentials: 'same-origin',
      cache: 'no-store',
    });
    return { status: response.status, payload: (await response.json().catch(() => null)) as Record<string, unknown> | null };
  } catch {
    return { status: 0, payload: null };
  }
}

let running: Promise<SendResult> | null = null;

/**
 * Sends this person's waiting outcomes, oldest first, one at a time. Tabs take turns (Web Locks where the
 * browser has them), so two tabs coming online together do not both send; a repeat would be harmless anyway.
 */
export function sendOutcomes(userId: string, only?: string): Promise<SendResult> {
  if (running) return running.then(() => sendOutcomes(userId, only));
  const run = async (): Promise<SendResult> => {
    const result: SendResult = { sent: [], refused: [], stopped: null };
    for (const entry of await listOutcomes(userId)) {
      if (entry.state !== 'waiting' || (only && entry.clientId !== only)) continue;
      const current = await get<QueuedOutcome>(entry.clientId, outbox());
      if (!current || current.state !== 'waiting') continue; // another tab sent it meanwhile
      const { status, payload } = await post(current);
      const tried = { ...current, attempts: current.attempts + 1, lastTriedAt: new Date().toISOString() };
      if (status >= 200 && status < 300) {
        await del(current.clientId, outbox());
        result.sent.push(tried);
        continue;
      }
      const message = typeof payload?.error === 'string' ? payload.error : `The server answered HTTP ${status}.`;
      if (status === 401) {
        await set(current.clientId, { ...tried, lastError: 'Your session has ended: sign in again to send it.' }, outbox());
        result.stopped = 'signed-out';
        break;
      }
      if (retryable(status)) {
        await set(current.clientId, { ...tried, lastError: status === 0 ? undefined : message }, outbox());
        if (status === 0) {
          result.stopped = 'offline';
          break;
        }
        continue;
      }
      const fields = payload?.fields && typeof payload.fields === 'object' ? (payload.fields as Record<string, string>) : undefined;
      const refused: QueuedOutcome = { ...tried, state: 'refused', lastError: message, lastFields: fields };
      await set(current.clientId, refused, outbox());
      result.refused.push(refused);
    }
    return result;
  };
  const locks = typeof navigator !== 'undefined' ? (navigator as Navigator & { locks?: LockManager }).locks : undefined;
  const started: Promise<SendResult> = (locks ? (locks.request('sowcast-outbox', () => run()) as unknown as Promise<SendResult>) : run()).finally(() => {
    running = null;
    changed();
  });
  running = started;
  return started;
}

export function onOutboxChange(listener: () => void): () => void {
  window.addEventListener(OUTBOX_EVENT, listener);
  let channel: BroadcastChannel | null = null;
  try {
    channel = new BroadcastChannel('sowcast-outbox');
    channel.onmessage = listener;
  } catch {
    channel = null;
  }
  return () => {
    window.removeEventListener(OUTBOX_EVENT, listener);
    channel?.close();
  };
}
