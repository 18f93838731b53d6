// Sending phone notifications with web-push to the local push service started here (HTTPS, port 0): a
// virtual device subscribes, sendPush delivers, and the payload is decrypted twice — by the service, and
// again here on our own from the raw body with http_ece (the reference implementation of RFC 8188) and the
// device's private key. The service's checks follow RFC 8030 (push protocol), RFC 8291 (message encryption)
// and RFC 8292 (VAPID); the bad-token cases are built here by hand with node:crypto.
//
// The worker trusts the service's self-signed certificate through NODE_EXTRA_CA_CERTS, which Node reads only
// at start-up; this test process is already running, so it passes an https.Agent with the certificate as `ca`.
import { createECDH, createPrivateKey, sign } from 'node:crypto';
import fs from 'node:fs';
import https from 'node:https';
import os from 'node:os';
import path from 'node:path';
import { decrypt } from 'http_ece';
import webpush from 'web-push';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startFakePush, type FakePush, type ReceivedPush } from '@/fakes/push/server';
import { checkGermination } from '@/lib/notify/messages';
import { PushSendError, sendPush, topicFor, vapidKeys, type VapidKeys } from '@/lib/notify/push';

let push: FakePush;
let agent: https.Agent;
let vapid: VapidKeys;
let workDir: string;

interface Subscription {
  id: string;
  label: string;
  endpoint: string;
  keys: { p256dh: string; auth: string };
}

beforeAll(async () => {
  workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'sowcast-push-test-'));
  push = await startFakePush({ port: 0, dir: path.join(workDir, 'fake-push') });
  agent = new https.Agent({ ca: fs.readFileSync(push.certPath) });
  vapid = vapidKeys({}, path.join(workDir, 'data'));
});

afterAll(async () => {
  agent?.destroy();
  await push?.close();
  fs.rmSync(workDir, { recursive: true, force: true });
});

beforeEach(async () => {
  await call('POST', '/_control/reset');
});

function call<T = any>(method: string, urlOrPath: string, body?: unknown, headers: Record<string, string | number> = {}) {
  const url = urlOrPath.startsWith('https://') ? urlOrPath : `${push.url}${urlOrPath}`;
  const payload = body === undefined ? undefined : Buffer.isBuffer(body) ? body : Buffer.from(JSON.stringify(body));
  return new Promise<{ status: number; headers: Record<string, unknown>; body: T }>((resolve, reject) => {
    const req = https.request(url, { method, agent, headers: { ...(payload ? { 'content-length': payload.length } : {}), ...headers } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        const text = Buffer.concat(chunks).toString('utf8');
        let parsed: unknown = text;
        try {
          parsed = JSON.parse(text);
        } catch {
          // an HTML page
        }
        resolve({ status: res.statusCode ?? 0, headers: res.headers, body: parsed as T });
      });
    });
    req.on('error', reject);
    req.end(payload);
  });
}

async function subscribe(label: string, extra: Record<string, unknown> = {}): Promise<Subscription> {
  const res = await call<Subscription>('POST', '/_control/subscriptions', { label, ...extra });
  expect(res.status).toBe(201);
  return res.body;
}

const target = (s: Subscription) => ({ endpoint: s.endpoint, p256dh: s.keys.p256dh, auth: s.keys.auth });
const received = async (query = '') => (await call<ReceivedPush[]>('GET', `/_control/messages${query}`)).body;

const germination = checkGermination({
  baseUrl: 'http://127.0.0.1:3999',
  plotId: 'plot-north-corner',
  plotName: 'North corner',
  propertyName: 'Hollow Oak Club',
  date: '2027-09-24',
  seededOn: '2027-09-13',
});

/** A VAPID JWT signed here with node:crypto (RFC 7515 compact JWS, ES256 = r||s per RFC 7518 §3.4). */
function vapidToken(claims: Record<string, unknown>, keys: VapidKeys = vapid) {
  const pub = Buffer.from(keys.publicKey, 'base64url');
  const key = createPrivateKey({
    key: { kty: 'EC', crv: 'P-256', d: keys.privateKey, x: pub.subarray(1, 33).toString('base64url'), y: pub.subarray(33).toString('base64url') },
    format: 'jwk',
  });
  const head = Buffer.from(JSON.stringify({ typ: 'JWT', alg: 'ES256' })).toString('base64url');
  const body = Buffer.from(JSON.stringify(claims)).toString('base64url');
  const signature = sign('sha256', Buffer.from(`${head}.${body}`), { key, dsaEncoding: 'ieee-p1363' }).toString('base64url');
  return `vapid t=${head}.${body}.${signature}, k=${keys.publicKey}`;
}

/** A well-formed Web Push request for `sub` from web-push itself, with the Authorization replaced. */
function requestWith(sub: Subscription, authorization: string | null) {
  const details = webpush.generateRequestDetails(sub, JSON.stringify(germination.push), { vapidDetails: vapid, TTL: 60 });
  const headers: Record<string, string | number> = { ...details.headers };
  if (authorization === null) delete headers.Authorization;
  else headers.Authorization = authorization;
  return call('POST', sub.endpoint, details.body, headers);
}

describe('sendPush to the local push service', () => {
  it('delivers the germination check; the service decrypts it to exactly what was sent, with the plot link', async () => {
    const phone = await subscribe('ann-phone');
    await subscribe('bo-phone');
    expect(await sendPush(target(phone), germination.push, { agent, vapid })).toBe('sent');

    const messages = await received('?label=ann-phone');
    expect(messages).toHaveLength(1);
    const [m] = messages;
    expect(m.subscriptionId).toBe(phone.id);
    expect(m.payload).toEqual(germination.push);
    expect((m.payload as { url: string }).url).toBe('http://127.0.0.1:3999/plots/plot-north-corner/check');
    expect(m.ttl).toBe(24 * 3600);
    expect(m.urgency).toBe('normal');
    // RFC 8030 §5.4: at most 32 characters of the URL-safe base64 alphabet.
    expect(m.topic).toBe(topicFor(germination.push.tag));
    expect(m.topic).toMatch(/^[A-Za-z0-9_-]{1,32}$/);
    expect(m.vapid.audience).toBe(push.url);
    expect(m.vapid.subject).toBe('mailto:reminders@sowcast.invalid');
    expect(await received('?label=bo-phone')).toHaveLength(0);
  });

  it('sends a body that decrypts on its own with http_ece and the device key (RFC 8291 / RFC 8188)', async () => {
    const phone = await subscribe('ann-phone');
    await sendPush(target(phone), germination.push, { agent, vapid });
    const [m] = await received();
    const body = Buffer.from(m.rawBody, 'base64');

    // RFC 8188 §2.1 header: salt(16) | rs(4) | idlen(1) | keyid; RFC 8291 §4: keyid is the sender's
    // ephemeral P-256 public key, 65 octets uncompressed (0x04 …), and the message is a single record.
    expect(body.length).toBeGreaterThan(21 + 65 + 16);
    const rs = body.readUInt32BE(16);
    expect(body[20]).toBe(65);
    expect(body[21]).toBe(0x04);
    expect(body.length - 86).toBeLessThanOrEqual(rs);

    const keys = (await call<{ privateKey: string; p256dh: string; auth: string }>('GET', `/_control/subscriptions/${phone.id}/private-key`)).body;
    const device = createECDH('prime256v1');
    device.setPrivateKey(Buffer.from(keys.privateKey, 'base64url'));
    expect(device.getPublicKey().toString('base64url')).toBe(phone.keys.p256dh);
    const plain = decrypt(body, { version: 'aes128gcm', privateKey: device, authSecret: keys.auth });
    const payload = JSON.parse(plain.toString('utf8'));
    expect(payload).toEqual(germination.push);
    expect(payload.url).toBe('http://127.0.0.1:3999/plots/plot-north-corner/check');

    // The wrong device cannot read it.
    const other = createECDH('prime256v1');
    other.generateKeys();
    expect(() => decrypt(body, { version: 'aes128gcm', privateKey: other, authSecret: keys.auth })).toThrow();
  });

  it("returns 'gone' once the subscription is gone (410) or unknown (404), RFC 8030 §7.3", async () => {
    const phone = await subscribe('ann-phone');
    expect((await call('POST', `/_control/subscriptions/${phone.id}/gone`)).status).toBe(200);
    expect(await sendPush(target(phone), germination.push, { agent, vapid })).toBe('gone');
    const unknown = { ...target(phone), endpoint: `${push.url}/push/00000000-0000-0000-0000-000000000000` };
    expect(await sendPush(unknown, germination.push, { agent, vapid })).toBe('gone');
    expect(await received()).toHaveLength(0);
  });

  it('throws a non-retryable error when the service refuses the sender, and a retryable one when unreachable', async () => {
    const other = webpush.generateVAPIDKeys();
    // RFC 8292 §4.1: a subscription made with an application server key takes only that sender's messages.
    const restricted = await subscribe('kept-phone', { applicationServerKey: other.publicKey });
    const refused = await sendPush(target(restricted), germination.push, { agent, vapid }).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(PushSendError);
    expect((refused as PushSendError).statusCode).toBe(403);
    expect((refused as PushSendError).retryable).toBe(false);

    const closed = { ...target(restricted), endpoint: 'https://127.0.0.1:1/push/x' };
    const unreachable = await sendPush(closed, germination.push, { agent, vapid }).catch((e: unknown) => e);
    expect(unreachable).toBeInstanceOf(PushSendError);
    expect((unreachable as PushSendError).retryable).toBe(true);
  });
});

describe('the local push service checks VAPID (RFC 8292)', () => {
  const nowS = () => Math.floor(Date.now() / 1000);
  const claims = () => ({ aud: push.url, exp: nowS() + 3600, sub: 'mailto:reminders@sowcast.invalid' });

  it('accepts a token built by hand that follows the RFC (so the checks below fail for their own reason)', async () => {
    const phone = await subscribe('ann-phone');
    const res = await requestWith(phone, vapidToken(claims()));
    expect(res.status).toBe(201);
    // RFC 8030 §5: 201 Created with the push message resource in Location.
    expect(String(res.headers.location)).toMatch(new RegExp(`^${push.url}/_control/messages/`));
    const [m] = await received();
    expect(m.payload).toEqual(germination.push);
  });

  it('answers 403 to a bad signature', async () => {
    const phone = await subscribe('ann-phone');
    const good = vapidToken(claims());
    const [, t, k] = /^vapid t=([^,]+), k=(.+)$/.exec(good)!;
    const [h, p, s] = t.split('.');
    const signature = Buffer.from(s, 'base64url');
    signature[10] ^= 0xff;
    const res = await requestWith(phone, `vapid t=${h}.${p}.${signature.toString('base64url')}, k=${k}`);
    expect(res.status).toBe(403);
    expect(res.body.error).toMatch(/signature/);
    expect(await received()).toHaveLength(0);
  });

  it('answers 403 when k is not the key that signed', async () => {
    const phone = await subscribe('ann-phone');
    const other = { ...webpush.generateVAPIDKeys(), subject: vapid.subject };
    const signedByOther = vapidToken(claims(), other);
    const res = await requestWith(phone, signedByOther.replace(/k=.+$/, `k=${vapid.publicKey}`));
    expect(res.status).toBe(403);
  });

  it('answers 403 to a wrong audience, an expired token, one more than 24 h ahead, and one without sub', async () => {
    const phone = await subscribe('ann-phone');
    const cases = [
      { ...claims(), aud: 'https://push.example.test' },
      { ...claims(), exp: nowS() - 10 },
      { ...claims(), exp: nowS() + 24 * 3600 + 120 },
      { aud: push.url, exp: nowS() + 3600 },
    ];
    for (const c of cases) {
      const res = await requestWith(phone, vapidToken(c));
      expect(res.status, JSON.stringify(c)).toBe(403);
    }
    expect(await received()).toHaveLength(0);
  });

  it('answers 401 with a vapid challenge when there is no authorization (RFC 8292 §4.2)', async () => {
    const phone = await subscribe('ann-phone');
    const res = await requestWith(phone, null);
    expect(res.status).toBe(401);
    expect(res.headers['www-authenticate']).toBe('vapid');
  });
});

describe('the local push service follows RFC 8030', () => {
  it('refuses a request without TTL (§5.2) and a malformed Topic (§5.4)', async () => {
    const phone = await subscribe('ann-phone');
    const details = webpush.generateRequestDetails(phone, JSON.stringify(germination.push), { vapidDetails: vapid, TTL: 60 });
    const { TTL: _ttl, ...withoutTtl } = details.headers;
    expect((await call('POST', phone.endpoint, details.body, withoutTtl)).status).toBe(400);
    expect((await call('POST', phone.endpoint, details.body, { ...details.headers, Topic: 'has spaces and is far too long to be a topic' })).status).toBe(400);
    expect(await received()).toHaveLength(0);
  });

  it('refuses a body that is not aes128gcm for this device', async () => {
    const phone = await subscribe('ann-phone');
    const other = await subscribe('bo-phone');
    // Encrypted for bo-phone, posted to ann-phone's endpoint.
    const details = webpush.generateRequestDetails(other, JSON.stringify(germination.push), { vapidDetails: vapid, TTL: 60 });
    const res = await call('POST', phone.endpoint, details.body, details.headers);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/decrypt/);
  });

  it('refuses a body over 4096 octets with 413 (RFC 8291 §4 / RFC 8030 §7.2)', async () => {
    const phone = await subscribe('ann-phone');
    const big = { ...germination.push, body: 'x'.repeat(5000) };
    const result = await sendPush(target(phone), big, { agent, vapid }).catch((e: unknown) => e);
    expect(result).toBeInstanceOf(PushSendError);
    expect((result as PushSendError).statusCode).toBe(413);
  });

  it('lists received messages and devices on its page, escaped', async () => {
    const phone = await subscribe('<b>ann</b>');
    await sendPush(target(phone), germination.push, { agent, vapid });
    const page = await call<string>('GET', '/');
    expect(page.status).toBe(200);
    expect(page.body).toContain('Check germination on North corner today');
    expect(page.body).toContain('&lt;b&gt;ann&lt;/b&gt;');
    expect(page.body).not.toContain('<b>ann</b>');
    expect((await call('GET', '/health')).status).toBe(200);
  });
});

describe('vapidKeys', () => {
  it('generates a P-256 pair once into vapid.json (mode 600) and reuses it', () => {
    const dir = path.join(workDir, 'vapid-once');
    const first = vapidKeys({}, dir);
    const file = path.join(dir, 'vapid.json');
    expect(fs.statSync(file).mode & 0o777).toBe(0o600);
    expect(JSON.parse(fs.readFileSync(file, 'utf8'))).toEqual({ publicKey: first.publicKey, privateKey: first.privateKey });
    // RFC 8292 §3.2: the key is an uncompressed P-256 point, 65 octets.
    expect(Buffer.from(first.publicKey, 'base64url')).toHaveLength(65);
    expect(vapidKeys({}, dir)).toEqual(first);
  });

  it('takes the keys from the environment when given, and refuses half a pair', () => {
    const pair = webpush.generateVAPIDKeys();
    const env = { VAPID_PUBLIC_KEY: pair.publicKey, VAPID_PRIVATE_KEY: pair.privateKey, VAPID_SUBJECT: 'https://sowcast.example.test' };
    expect(vapidKeys(env, path.join(workDir, 'unused'))).toEqual({ ...pair, subject: 'https://sowcast.example.test' });
    expect(fs.existsSync(path.join(workDir, 'unused'))).toBe(false);
    expect(() => vapidKeys({ VAPID_PUBLIC_KEY: pair.publicKey }, workDir)).toThrow(/both/);
  });
});
