// A person's own settings: notification settings (GET/PUT /api/settings/notifications) and the devices that get
// phone notifications (GET /api/settings/push, POST/DELETE /api/settings/push-subscriptions), over real HTTP
// with real sessions. Who may call them is in the role matrix (access.test.ts).
import { createECDH, createPublicKey, randomBytes, randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { signedInUser, type Client, type TestUser } from '../support/http';

type Person = { user: TestUser; client: Client };
let alice: Person;
let bruno: Person;

const db = testDb();

beforeAll(async () => {
  [alice, bruno] = await Promise.all([signedInUser('settings-alice'), signedInUser('settings-bruno')]);
});

afterAll(async () => {
  await db.destroy();
});

const VALID = {
  emailEnabled: true,
  pushEnabled: false,
  reminderHour: 6,
  quietStartHour: 22,
  quietEndHour: 5,
  dueReminders: false,
  digest: true,
};

/**
 * A subscription as a browser's PushSubscription.toJSON() gives it (W3C Push API): an https endpoint and the
 * device's keys — p256dh an uncompressed P-256 point (65 octets, SEC 1), auth 16 random octets (RFC 8291 §3.2),
 * both base64url without padding (RFC 4648 §5). The key pair is made with node:crypto.
 */
function browserSubscription(host = 'push.example.test') {
  const ecdh = createECDH('prime256v1');
  ecdh.generateKeys();
  return {
    endpoint: `https://${host}/send/${randomUUID()}`,
    expirationTime: null,
    keys: { p256dh: ecdh.getPublicKey().toString('base64url'), auth: randomBytes(16).toString('base64url') },
  };
}

describe('notification settings', () => {
  it('start as the defaults: e-mail and phone on, 07:00, no quiet hours, due reminders on, no digest', async () => {
    const res = await bruno.client.get('/api/settings/notifications');
    expect(res.status, res.text).toBe(200);
    expect(res.body.settings).toEqual({
      emailEnabled: true,
      pushEnabled: true,
      reminderHour: 7,
      quietStartHour: null,
      quietEndHour: null,
      dueReminders: true,
      digest: false,
    });
  });

  it('round-trip: what is saved is what is read back, quiet hours across midnight included', async () => {
    const put = await alice.client.request('PUT', '/api/settings/notifications', { json: VALID });
    expect(put.status, put.text).toBe(200);
    expect(put.body.settings).toEqual(VALID);
    expect((await alice.client.get('/api/settings/notifications')).body.settings).toEqual(VALID);
    // Another person's settings are their own.
    expect((await bruno.client.get('/api/settings/notifications')).body.settings.reminderHour).toBe(7);

    const off = { ...VALID, quietStartHour: null, quietEndHour: null, reminderHour: 0 };
    expect((await alice.client.request('PUT', '/api/settings/notifications', { json: off })).status).toBe(200);
    expect((await alice.client.get('/api/settings/notifications')).body.settings).toEqual(off);
  });

  const BAD: { name: string; body: Record<string, unknown>; field: string; message: RegExp }[] = [
    { name: 'an hour past 23', body: { ...VALID, reminderHour: 24 }, field: 'reminderHour', message: /Reminder hour must be an hour from 0 to 23/ },
    { name: 'a negative hour', body: { ...VALID, quietStartHour: -1 }, field: 'quietStartHour', message: /Quiet hours start/ },
    { name: 'half an hour', body: { ...VALID, reminderHour: 6.5 }, field: 'reminderHour', message: /whole hour/ },
    { name: 'an hour as text', body: { ...VALID, reminderHour: '7' }, field: 'reminderHour', message: /Reminder hour/ },
    { name: 'a start without an end', body: { ...VALID, quietEndHour: null }, field: 'quietEndHour', message: /both the start and the end/ },
    { name: 'quiet hours that start and end together', body: { ...VALID, quietStartHour: 3, quietEndHour: 3 }, field: 'quietEndHour', message: /different hours/ },
    { name: 'a switch that is not on or off', body: { ...VALID, digest: 'yes' }, field: 'digest', message: /Morning digest must be on or off/ },
    { name: 'a missing switch', body: { ...VALID, emailEnabled: undefined }, field: 'emailEnabled', message: /E-mail must be on or off/ },
  ];

  for (const bad of BAD) {
    it(`refuses ${bad.name} with 400 naming ${bad.field}, and keeps what was saved`, async () => {
      const before = (await alice.client.get('/api/settings/notifications')).body.settings;
      const res = await alice.client.request('PUT', '/api/settings/notifications', { json: bad.body });
      expect(res.status, res.text).toBe(400);
      expect(res.body.fields[bad.field]).toMatch(bad.message);
      expect(res.body.error).toContain(`(${bad.field})`);
      expect((await alice.client.get('/api/settings/notifications')).body.settings).toEqual(before);
    });
  }

  it('refuses fields it does not know', async () => {
    const res = await alice.client.request('PUT', '/api/settings/notifications', { json: { ...VALID, userId: bruno.user.id } });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.fields)).toMatch(/userId/);
  });

  it('refuses a body that is not JSON (415: only application/json is read, RFC 9110 §15.5.16)', async () => {
    const res = await alice.client.request('PUT', '/api/settings/notifications', { raw: 'reminderHour=6', contentType: 'application/x-www-form-urlencoded' });
    expect(res.status).toBe(415);
    expect(res.body.error).toMatch(/JSON/);
  });
});

describe('push devices', () => {
  it('gives the VAPID public key as an uncompressed P-256 point (RFC 8292 §3.2), which node:crypto accepts', async () => {
    const res = await alice.client.get('/api/settings/push');
    expect(res.status, res.text).toBe(200);
    const key = Buffer.from(res.body.publicKey, 'base64url');
    expect(key).toHaveLength(65);
    expect(key[0]).toBe(0x04); // SEC 1 §2.3.3: uncompressed form
    const jwk = { kty: 'EC', crv: 'P-256', x: key.subarray(1, 33).toString('base64url'), y: key.subarray(33).toString('base64url') };
    expect(() => createPublicKey({ key: jwk, format: 'jwk' })).not.toThrow();
    // The same key on every call: a browser subscription is bound to it.
    expect((await bruno.client.get('/api/settings/push')).body.publicKey).toBe(res.body.publicKey);
  });

  it('saves a browser subscription, lists it for its owner only, and removes it', async () => {
    const subscription = browserSubscription();
    const saved = await alice.client.post('/api/settings/push-subscriptions', { ...subscription, label: 'Firefox on Android' });
    expect(saved.status, saved.text).toBe(201);
    expect(saved.body.device).toMatchObject({ endpoint: subscription.endpoint, label: 'Firefox on Android' });

    const mine = (await alice.client.get('/api/settings/push')).body.devices as { endpoint: string; label: string; service: string; lastSentAt: string | null }[];
    expect(mine.find((d) => d.endpoint === subscription.endpoint)).toMatchObject({ label: 'Firefox on Android', service: 'push.example.test', lastSentAt: null });
    const theirs = (await bruno.client.get('/api/settings/push')).body.devices as { endpoint: string }[];
    expect(theirs.map((d) => d.endpoint)).not.toContain(subscription.endpoint);

    const removed = await alice.client.request('DELETE', '/api/settings/push-subscriptions', { json: { endpoint: subscription.endpoint } });
    expect(removed.status, removed.text).toBe(204);
    const after = (await alice.client.get('/api/settings/push')).body.devices as { endpoint: string }[];
    expect(after.map((d) => d.endpoint)).not.toContain(subscription.endpoint);
    // Removing again is the same answer: nothing to remove is not an error.
    expect((await alice.client.request('DELETE', '/api/settings/push-subscriptions', { json: { endpoint: subscription.endpoint } })).status).toBe(204);
  });

  it("another person's endpoint: the same 204 as any unknown endpoint, and their device stays", async () => {
    const subscription = browserSubscription();
    expect((await bruno.client.post('/api/settings/push-subscriptions', subscription)).status).toBe(201);
    const unknown = await alice.client.request('DELETE', '/api/settings/push-subscriptions', { json: { endpoint: browserSubscription().endpoint } });
    const foreign = await alice.client.request('DELETE', '/api/settings/push-subscriptions', { json: { endpoint: subscription.endpoint } });
    expect([foreign.status, foreign.text]).toEqual([unknown.status, unknown.text]);
    expect(foreign.status).toBe(204);
    const theirs = (await bruno.client.get('/api/settings/push')).body.devices as { endpoint: string }[];
    expect(theirs.map((d) => d.endpoint)).toContain(subscription.endpoint);
  });

  it("another person's existing endpoint is refused with 409 and stays theirs; the answer does not say whose", async () => {
    const subscription = browserSubscription();
    expect((await bruno.client.post('/api/settings/push-subscriptions', { ...subscription, label: 'Bruno phone' })).status).toBe(201);
    const taken = await alice.client.post('/api/settings/push-subscriptions', { ...subscription, keys: browserSubscription().keys, label: 'mine now' });
    expect(taken.status, taken.text).toBe(409);
    expect(taken.body.fields).toHaveProperty('endpoint');
    expect(taken.text).not.toContain(bruno.user.email);
    expect(taken.text).not.toContain(bruno.user.name);
    const row = await db.selectFrom('push_subscriptions').select(['user_id', 'label', 'p256dh']).where('endpoint', '=', subscription.endpoint).executeTakeFirstOrThrow();
    expect(row).toEqual({ user_id: bruno.user.id, label: 'Bruno phone', p256dh: subscription.keys.p256dh });
    // The owner subscribing again with the same endpoint still updates their own row.
    expect((await bruno.client.post('/api/settings/push-subscriptions', { ...subscription, label: 'Bruno phone, renamed' })).status).toBe(201);
    expect((await db.selectFrom('push_subscriptions').select('label').where('endpoint', '=', subscription.endpoint).executeTakeFirstOrThrow()).label).toBe('Bruno phone, renamed');
  });

  it('refuses endpoints on loopback, private, link-local, unique-local and CGNAT addresses (SSRF), and a name that does not resolve', async () => {
    // OWASP SSRF Prevention Cheat Sheet; ranges from IANA's special-purpose registries (RFC 6890, RFC 1918, RFC 3927, RFC 4193, RFC 6598).
    const fakePush = new URL(process.env.FAKE_PUSH_URL!);
    for (const host of [
      '127.0.0.1', `127.0.0.1:${Number(fakePush.port) + 1}`, 'localhost', '[::1]', '10.0.0.7', '172.16.0.1', '192.168.1.20',
      '169.254.169.254', '[fe80::1]', '[fd00::1]', '100.64.0.1', '0.0.0.0', '[::ffff:127.0.0.1]', 'push.nowhere.invalid',
    ]) {
      const body = browserSubscription(host);
      const res = await alice.client.post('/api/settings/push-subscriptions', body);
      expect(res.status, `${host}: ${res.text}`).toBe(400);
      expect(res.body.fields.endpoint, host).toMatch(/public push service|could not be found/);
      expect(await db.selectFrom('push_subscriptions').select('id').where('endpoint', '=', body.endpoint).executeTakeFirst()).toBeUndefined();
    }
  });

  it('takes a subscription exactly as a Web Push service issues it (the local RFC 8030 push service)', async () => {
    const pushUrl = process.env.FAKE_PUSH_URL;
    expect(pushUrl, 'the test run starts the fake push service and exports FAKE_PUSH_URL').toBeTruthy();
    const { publicKey } = (await alice.client.get('/api/settings/push')).body;
    const response = await fetch(`${pushUrl}/_control/subscriptions`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ label: `settings test ${randomUUID()}`, applicationServerKey: publicKey }),
    });
    expect(response.status).toBe(201);
    const issued = (await response.json()) as { endpoint: string; keys: { p256dh: string; auth: string } };
    const saved = await alice.client.post('/api/settings/push-subscriptions', issued);
    expect(saved.status, saved.text).toBe(201);
    const devices = (await alice.client.get('/api/settings/push')).body.devices as { endpoint: string; service: string }[];
    expect(devices.find((d) => d.endpoint === issued.endpoint)?.service).toBe(new URL(pushUrl!).host);
  });

  const BAD: { name: string; body: unknown; field: string }[] = [
    { name: 'a plain-http endpoint', body: { ...browserSubscription(), endpoint: 'http://push.example.test/x' }, field: 'endpoint' },
    { name: 'an endpoint that is not a URL', body: { ...browserSubscription(), endpoint: 'not a url' }, field: 'endpoint' },
    { name: 'a p256dh that is not a P-256 point', body: { ...browserSubscription(), keys: { p256dh: 'abc', auth: randomBytes(16).toString('base64url') } }, field: 'keys.p256dh' },
    { name: 'an auth secret with the wrong alphabet', body: { ...browserSubscription(), keys: { p256dh: browserSubscription().keys.p256dh, auth: '+/+/+/+/+/+/+/+/+/+/++' } }, field: 'keys.auth' },
    { name: 'no keys at all', body: { endpoint: browserSubscription().endpoint }, field: 'keys' },
    { name: 'a label longer than 120 characters', body: { ...browserSubscription(), label: 'x'.repeat(121) }, field: 'label' },
  ];
  for (const bad of BAD) {
    it(`refuses ${bad.name} with 400 naming ${bad.field}, storing nothing`, async () => {
      const before = (await alice.client.get('/api/settings/push')).body.devices;
      const res = await alice.client.post('/api/settings/push-subscriptions', bad.body);
      expect(res.status, res.text).toBe(400);
      expect(Object.keys(res.body.fields)).toContain(bad.field);
      expect((await alice.client.get('/api/settings/push')).body.devices).toEqual(before);
    });
  }

  it('a removal without an endpoint is 400 naming it', async () => {
    const res = await alice.client.request('DELETE', '/api/settings/push-subscriptions', { json: {} });
    expect(res.status).toBe(400);
    expect(res.body.fields.endpoint).toBeTruthy();
  });
});
