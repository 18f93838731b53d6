// Sends one phone notification through the Web Push protocol (RFC 8030) with web-push: the payload is
// encrypted for the device (RFC 8291, aes128gcm) and signed for the push service with VAPID (RFC 8292).
// The push service is whatever the browser subscribed to; locally that is the fake in fakes/push, whose
// self-signed certificate the worker trusts through NODE_EXTRA_CA_CERTS (set by the start and test scripts).
import { createHash, randomBytes } from 'node:crypto';
import fs from 'node:fs';
import type https from 'node:https';
import path from 'node:path';
import webpush from 'web-push';
import type { PushContent } from './messages';

export interface VapidKeys {
  publicKey: string; // base64url, uncompressed P-256 point — what the browser's PushManager.subscribe gets
  privateKey: string; // base64url
  subject: string; // mailto: or https: contact for the push service operator (RFC 8292 §2.1)
}

export interface PushTarget {
  endpoint: string;
  p256dh: string;
  auth: string;
}

export interface SendPushOptions {
  vapid?: VapidKeys;
  /** An HTTPS agent, e.g. one trusting a test's own CA; otherwise Node's default trust store. */
  agent?: https.Agent;
  ttlSeconds?: number;
  timeoutMs?: number;
}

/** The variables read; a plain record so tests can pass their own (Next types process.env more narrowly). */
export type Environment = Record<string, string | undefined>;

export const DEFAULT_VAPID_SUBJECT = 'mailto:reminders@sowcast.invalid';

// A reminder older than a day is stale news ("check germination today"): let the push service drop it.
const DEFAULT_TTL_SECONDS = 24 * 3600;

export function defaultDataDir(env: Environment = process.env): string {
  return path.resolve(/*turbopackIgnore: true*/ env.SOWCAST_DATA_DIR || '.data');
}

type KeyPair = Pick<VapidKeys, 'publicKey' | 'privateKey'>;
const cache = new Map<string, KeyPair>();

/**
 * The application server's VAPID key pair: from VAPID_PUBLIC_KEY / VAPID_PRIVATE_KEY / VAPID_SUBJECT, or else
 * generated once into `${dataDir}/vapid.json` and reused, so subscriptions made in browsers stay valid across
 * restarts (a browser subscription is bound to the public key it was made with).
 */
export function vapidKeys(env: Environment = process.env, dataDir: string = defaultDataDir(env)): VapidKeys {
  const subject = env.VAPID_SUBJECT || DEFAULT_VAPID_SUBJECT;
  if (env.VAPID_PUBLIC_KEY || env.VAPID_PRIVATE_KEY) {
    if (!env.VAPID_PUBLIC_KEY || !env.VAPID_PRIVATE_KEY) {
      throw new Error('Set both VAPID_PUBLIC_KEY and VAPID_PRIVATE_KEY, or neither (then Sowcast makes its own in .data/)');
    }
    return { publicKey: env.VAPID_PUBLIC_KEY, privateKey: env.VAPID_PRIVATE_KEY, subject };
  }
  const file = path.join(dataDir, 'vapid.json');
  const known = cache.get(file);
  if (known) return { ...known, subject };
  const keys = readVapidFile(file) ?? createVapidFile(file);
  cache.set(file, keys);
  return { ...keys, subject };
}

function readVapidFile(file: string): KeyPair | null {
  let text: string;
  try {
    text = fs.readFileSync(file, 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw err;
  }
  const parsed = JSON.parse(text) as Partial<KeyPair>;
  if (typeof parsed.publicKey !== 'string' || typeof parsed.privateKey !== 'string') {
    throw new Error(`${file} does not hold a VAPID key pair (publicKey, privateKey); remove it to make a new one`);
  }
  return { publicKey: parsed.publicKey, privateKey: parsed.privateKey };
}

// Web and worker processes may start together: write to a private temporary file and hard-link it into place,
// which fails if another process got there first — then everyone uses that one.
function createVapidFile(file: string): KeyPair {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const { publicKey, privateKey } = webpush.generateVAPIDKeys();
  const keys: KeyPair = { publicKey, privateKey };
  const tmp = `${file}.${process.pid}.${randomBytes(4).toString('hex')}`;
  fs.writeFileSync(tmp, `${JSON.stringify(keys, null, 2)}\n`, { mode: 0o600, flag: 'wx' });
  try {
    fs.linkSync(tmp, file);
    return keys;
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
    const winner = readVapidFile(file);
    if (!winner) throw err;
    return winner;
  } finally {
    fs.rmSync(tmp, { force: true });
  }
}

/**
 * RFC 8030 §5.4: a Topic is at most 32 characters of the base64url alphabet. A hash of the tag fits, keeps the
 * same tag on the same topic (a newer message replaces one still waiting), and shows the push service nothing.
 */
export function topicFor(tag: string): string {
  return createHash('sha256').update(tag, 'utf8').digest('base64url').slice(0, 32);
}

export class PushSendError extends Error {
  constructor(
    message: string,
    readonly statusCode: number | null,
    /** False when sending the same request again cannot help (bad request, refused VAPID, too large). */
    readonly retryable: boolean,
    options?: { cause?: unknown },
  ) {
    super(message, options);
    this.name = 'PushSendError';
  }
}

/**
 * Sends a notification. 'gone' means the push service no longer knows the subscription (404/410, RFC 8030
 * §7.3): the caller deletes it. Any other refusal or network failure throws a PushSendError.
 */
export async function sendPush(sub: PushTarget, payload: PushContent, opts: SendPushOptions = {}): Promise<'sent' | 'gone'> {
  const vapid = opts.vapid ?? vapidKeys();
  try {
    await webpush.sendNotification(
      { endpoint: sub.endpoint, keys: { p256dh: sub.p256dh, auth: sub.auth } },
      JSON.stringify(payload),
      {
        vapidDetails: vapid,
        TTL: opts.ttlSeconds ?? DEFAULT_TTL_SECONDS,
        urgency: 'normal',
        topic: topicFor(payload.tag),
        contentEncoding: 'aes128gcm',
        timeout: opts.timeoutMs ?? 15_000,
        ...(opts.agent ? { agent: opts.agent } : {}),
      },
    );
    return 'sent';
  } catch (err) {
    if (err instanceof webpush.WebPushError) {
      if (err.statusCode === 404 || err.statusCode === 410) return 'gone';
      const retryable = err.statusCode === 429 || err.statusCode >= 500;
      const detail = err.body ? `: ${String(err.body).slice(0, 200)}` : '';
      throw new PushSendError(`The push service answered ${err.statusCode}${detail}`, err.statusCode, retryable, { cause: err });
    }
    const message = err instanceof Error ? err.message : String(err);
    // Socket errors carry a code (ECONNREFUSED, ETIMEDOUT…); without one, web-push refused the input itself.
    const network = typeof (err as NodeJS.ErrnoException)?.code === 'string' || /timeout/i.test(message);
    throw new PushSendError(
      network ? `Could not reach the push service: ${message}` : `Could not build the push request: ${message}`,
      null,
      network,
      { cause: err },
    );
  }
}
