// The worker tells the right person at the right local hour: a spray marked done → 14 days on, exactly one
// e-mail and one push "kill wait over" at 07:00 America/Chicago, on the two daylight-saving change days of 2027;
// a germination check pushed to the phone with its click URL. Real PostgreSQL (a database of this file's own),
// real pg-boss, a real worker process, the local fakes over loopback.
// Outside references:
// - America/Chicago: CST = UTC−6, CDT = UTC−5; DST from the second Sunday of March to the first Sunday of
//   November (15 U.S.C. §260a): 14 March and 7 November 2027 (IANA time zone database).
// - The e-mail is parsed again here with mailparser (RFC 5322 / MIME, RFC 2045–2049).
// - The push body is decrypted here with http_ece, the reference implementation of RFC 8188 (aes128gcm), with
//   the device keys of RFC 8291 — independently of the fake push service's own decryption.
// - The worker runs with TZ=Pacific/Auckland, so nothing may depend on the server's own zone.
import { createECDH } from 'node:crypto';
import path from 'node:path';
import { decrypt } from 'http_ece';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FreshDatabase } from '../support/db';
import {
  ClockFile, makeClub, makePlanting, mark, reminderRunAt, startFakes, startWorker, useDatabase, waitFor, workerDatabase,
  type ClubPerson, type Fakes, type WorkerProcess,
} from '../support/worker';

const ZONE = 'America/Chicago';
const BASE = 'http://sowcast.test';
const KILL_WAIT_SUBJECT = 'The kill wait on Creekside strip is over — seed or till now';

let database: FreshDatabase;
let fakes: Fakes;
let clock: ClockFile;
let worker: WorkerProcess;
let club: Awaited<ReturnType<typeof makeClub>>;
let ada: ClubPerson;
let ben: ClubPerson;

const completeStep = async (o: { stepId: string; plantingId: string; status: 'done' | 'skipped'; date: string }) => {
  const { completeStep: complete } = await import('@/lib/planning/complete-step');
  return complete({ ...o, userId: ada.id, now: clock.get() });
};

const notificationsFor = async (stepId: string) => {
  const { getDb } = await import('@/db');
  return getDb().selectFrom('notifications').selectAll().where('step_id', '=', stepId).orderBy('channel').execute();
};

/** Lets the worker see the clock, run the reminders, and finish any sends those runs queued. */
async function settle(at: Date) {
  const from = mark(worker);
  await reminderRunAt(worker, at, 20_000, from);
  const second = mark(worker);
  await reminderRunAt(worker, at, 20_000, second);
  await new Promise((r) => setTimeout(r, 1500));
}

function fallForm(targetSeedDate: string, season: 'fall' | 'spring' = 'fall') {
  return {
    season,
    method: 'prepared-seedbed',
    blend: [{ speciesId: season === 'fall' ? 'cereal-rye' : 'white-clover', share: 1 }],
    targetSeedDate,
    herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
    sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
  };
}

beforeAll(async () => {
  database = await workerDatabase('worker_reminders');
  useDatabase(database.url);
  fakes = await startFakes();
  clock = new ClockFile(path.join(fakes.dir, 'clock'));
  clock.set('2027-02-28T16:00:00Z'); // 10:00 CST, Sunday 28 February
  club = await makeClub({
    fakes,
    tag: 'reminders',
    people: [
      { name: 'Ada Owner', role: 'owner', phone: true },
      { name: 'Ben Member', role: 'member', phone: true },
      { name: 'Cy Viewer', role: 'viewer', phone: true },
    ],
  });
  [ada, ben] = club.people;
});

afterAll(async () => {
  await worker?.stop();
  await fakes?.close();
  const { getDb } = await import('@/db');
  await getDb().destroy().catch(() => {});
  await database?.drop();
});

describe('kill wait over, at 07:00 in the property’s zone', () => {
  let killWaitId: string;

  it('spraying marked done on Sun 28 Feb puts the end of the kill wait on Sun 14 Mar', async () => {
    const p = await makePlanting({ plotId: club.plot.id, form: fallForm('2027-04-15', 'spring'), now: clock.get(), createdBy: ada.id });
    const spray = await p.step('spray');
    const result = await completeStep({ stepId: spray.id, plantingId: p.planting.id, status: 'done', date: '2027-02-28' });
    const killWait = result.steps.find((s) => s.kind === 'kill-wait')!;
    expect(killWait.date).toBe('2027-03-14'); // 14 days, the kill wait's default
    expect(result.steps.find((s) => s.kind === 'spray')).toMatchObject({ status: 'done', doneOn: '2027-02-28' });
    killWaitId = killWait.id;

    worker = await startWorker({ id: 'reminders-1', databaseUrl: database.url, clock, env: { ...fakes.env, TZ: 'Pacific/Auckland' } });
    await worker.waitForLog('the first forecast', (l) => l.msg === 'forecast stored' || l.msg.startsWith('forecast refresh failed'), 20_000);
  });

  it('the worker keeps its cron schedules in pg-boss: reminders every minute, forecasts every three hours', async () => {
    const { sql } = await import('kysely');
    const { getDb } = await import('@/db');
    const rows = await sql<{ name: string; cron: string }>`select name, cron from pgboss.schedule order by name`.execute(getDb());
    expect(rows.rows).toEqual([
      { name: 'forecast-refresh', cron: '0 */3 * * *' },
      { name: 'reminders-due', cron: '* * * * *' },
    ]);
  });

  it('at 06:59 CDT (11:59Z) on the change day, nothing is sent', async () => {
    const at = new Date('2027-03-14T11:59:00Z');
    clock.set(at);
    await settle(at);
    expect(await notificationsFor(killWaitId)).toEqual([]);
    expect((await fakes.inbox()).filter((m) => m.subject === KILL_WAIT_SUBJECT)).toEqual([]);
    expect((await fakes.pushes()).filter((p) => (p.payload as { tag?: string }).tag === `kill-wait:${killWaitId}`)).toEqual([]);
  });

  it('at 07:00 CDT (12:00Z) exactly one e-mail and one push reach the owner; the member and viewer get none', async () => {
    const at = new Date('2027-03-14T12:00:00Z');
    clock.set(at);
    const mail = await waitFor('the kill-wait e-mail', async () => (await fakes.inbox()).find((m) => m.subject === KILL_WAIT_SUBJECT));
    const push = await waitFor('the kill-wait push', async () =>
      (await fakes.pushes()).find((p) => (p.payload as { tag?: string }).tag === `kill-wait:${killWaitId}`),
    );
    await settle(at); // further runs must not send it again
    expect((await fakes.inbox()).filter((m) => m.subject === KILL_WAIT_SUBJECT)).toHaveLength(1);
    expect((await fakes.pushes()).filter((p) => (p.payload as { tag?: string }).tag === `kill-wait:${killWaitId}`)).toHaveLength(1);
    expect(mail.to).toEqual([ada.email]);
    expect(push.subscriptionId).toBe(ada.deviceId);

    const rows = await notificationsFor(killWaitId);
    expect(rows.map((r) => [r.channel, r.user_id, r.dedupe_key])).toEqual([
      ['email', ada.id, `${killWaitId}:kill-wait-over:${ada.id}:email:2027-03-14`],
      ['push', ada.id, `${killWaitId}:kill-wait-over:${ada.id}:push:2027-03-14`],
    ]);
    for (const r of rows) {
      expect(new Date(r.send_after).toISOString()).toBe('2027-03-14T12:00:00.000Z');
      expect(r.sent_at).not.toBeNull();
    }
    expect(ben.id).not.toBe(ada.id);
  });

  it('the e-mail is valid MIME with a plain-text and an HTML body, the step link and the settings link', async () => {
    const { messageIdFor } = await import('@/lib/notify/email');
    const mail = (await fakes.inbox()).find((m) => m.subject === KILL_WAIT_SUBJECT)!;
    const parsed = await simpleParser(await fakes.rawMail(mail.id));
    expect(parsed.subject).toBe(KILL_WAIT_SUBJECT);
    expect(parsed.messageId).toBe(messageIdFor(`${killWaitId}:kill-wait-over:${ada.id}:email:2027-03-14`));
    expect((parsed.to as { value: { address: string }[] }).value.map((v) => v.address)).toEqual([ada.email]);
    expect(parsed.text).toContain(`${BASE}/settings`);
    expect(parsed.text).toContain(`${BASE}/steps/${killWaitId}`);
    expect(parsed.text).toContain('Sun 14 Mar');
    expect(typeof parsed.html).toBe('string');
    expect(parsed.html as string).toContain(`href="${BASE}/settings"`);
    expect(parsed.html as string).toContain(`href="${BASE}/steps/${killWaitId}"`);
    expect(parsed.headers.get('content-type')).toMatchObject({ value: 'multipart/alternative' });
  });

  it('the push decrypts with http_ece (RFC 8188) to a payload that opens the step', async () => {
    const push = (await fakes.pushes()).find((p) => (p.payload as { tag?: string }).tag === `kill-wait:${killWaitId}`)!;
    const payload = await decryptPush(push.subscriptionId, push.rawBody);
    expect(payload).toEqual(push.payload);
    expect(payload).toMatchObject({ title: 'Kill wait over: Creekside strip', url: `${BASE}/steps/${killWaitId}` });
  });
});

describe('check germination, pushed to the phone', () => {
  it('arrives on its day at 07:00 local, decrypts with http_ece, and opens the plot', async () => {
    clock.set('2027-09-01T15:00:00Z');
    const { createPlot } = await import('@/lib/data/plots');
    const plot = await createPlot(club.property.id, { name: 'North corner', acres: 0.75, cover: 'grass-weeds', sun: 'full' } as never);
    const p = await makePlanting({ plotId: plot.id, form: fallForm('2027-09-01'), now: clock.get(), createdBy: ada.id });
    await completeStep({ stepId: (await p.step('spray')).id, plantingId: p.planting.id, status: 'done', date: '2027-08-18' });
    const result = await completeStep({ stepId: (await p.step('seed')).id, plantingId: p.planting.id, status: 'done', date: '2027-09-01' });
    const check = result.steps.find((s) => s.kind === 'check-germination')!;
    expect(check.date > '2027-09-01').toBe(true);

    const before = new Date(`${check.date}T11:59:00Z`); // 06:59 CDT
    clock.set(before);
    await settle(before);
    expect(await notificationsFor(check.id)).toEqual([]);

    clock.set(new Date(`${check.date}T12:00:00Z`)); // 07:00 CDT
    const tag = `germination:${plot.id}`;
    const push = await waitFor('the germination push', async () => (await fakes.pushes()).find((m) => (m.payload as { tag?: string }).tag === tag));
    const payload = await decryptPush(push.subscriptionId, push.rawBody);
    expect(payload).toMatchObject({ title: 'Check germination on North corner today', url: `${BASE}/plots/${plot.id}/check?step=${check.id}` });
    expect(push.subscriptionId).toBe(ada.deviceId);
    const mail = await waitFor('the germination e-mail', async () => (await fakes.inbox()).find((m) => m.subject === 'Check germination on North corner today'));
    expect(mail.text).toContain(`${BASE}/settings`);
  }, 120_000);
});

describe('across the November change', () => {
  it('a kill wait ending Sun 7 Nov is told at 07:00 CST (13:00Z): not at 12:00Z or 12:59Z', async () => {
    clock.set('2027-10-24T15:00:00Z'); // 10:00 CDT
    const { createPlot } = await import('@/lib/data/plots');
    const plot = await createPlot(club.property.id, { name: 'Bottom field', acres: 1, cover: 'grass-weeds', sun: 'full' } as never);
    const p = await makePlanting({ plotId: plot.id, form: fallForm('2027-11-12'), now: clock.get(), createdBy: ada.id });
    const result = await completeStep({ stepId: (await p.step('spray')).id, plantingId: p.planting.id, status: 'done', date: '2027-10-24' });
    const killWait = result.steps.find((s) => s.kind === 'kill-wait')!;
    expect(killWait.date).toBe('2027-11-07');
    const subject = 'The kill wait on Bottom field is over — seed or till now';

    for (const iso of ['2027-11-07T12:00:00Z', '2027-11-07T12:59:00Z']) {
      const at = new Date(iso); // 06:00 and 06:59 CST — 07:00 and 07:59 had the zone stayed on CDT
      clock.set(at);
      await settle(at);
      expect(await notificationsFor(killWait.id), iso).toEqual([]);
    }
    clock.set('2027-11-07T13:00:00Z');
    await waitFor('the November kill-wait e-mail', async () => (await fakes.inbox()).find((m) => m.subject === subject));
    await waitFor('the November kill-wait push', async () => (await fakes.pushes()).find((m) => (m.payload as { tag?: string }).tag === `kill-wait:${killWait.id}`));
    await settle(new Date('2027-11-07T13:00:00Z'));
    expect((await fakes.inbox()).filter((m) => m.subject === subject)).toHaveLength(1);
    expect((await fakes.pushes()).filter((m) => (m.payload as { tag?: string }).tag === `kill-wait:${killWait.id}`)).toHaveLength(1);
    const rows = await notificationsFor(killWait.id);
    expect(rows.map((r) => new Date(r.send_after).toISOString())).toEqual(['2027-11-07T13:00:00.000Z', '2027-11-07T13:00:00.000Z']);
  }, 120_000);

  it('a phone the push service no longer knows (410) is forgotten; its message is closed, the e-mail still goes', async () => {
    clock.set('2027-11-20T15:00:00Z'); // Sat 20 Nov, 09:00 CST
    const { createPlot } = await import('@/lib/data/plots');
    const { createUser } = await import('@/lib/data/users');
    const { saveSubscription } = await import('@/lib/data/push-subscriptions');
    const { getDb } = await import('@/db');
    // Gus, a member with a phone, does the work on this plot: the kill wait's messages are his alone.
    const gus = (await createUser({ email: 'gus.member.reminders@example.test', name: 'Gus Member', passwordHash: 'not-used' }))!;
    await getDb().insertInto('memberships').values({ property_id: club.property.id, user_id: gus.id, role: 'member' }).execute();
    const device = await fakes.subscribe("Gus's phone");
    await saveSubscription(gus.id, { endpoint: device.endpoint, keys: device.keys, label: "Gus's phone" });
    const plot = await createPlot(club.property.id, { name: 'Far meadow', acres: 1, cover: 'grass-weeds', sun: 'full' } as never);
    const p = await makePlanting({ plotId: plot.id, form: fallForm('2027-11-22'), now: clock.get(), createdBy: ada.id });
    const killWaitStep = await p.step('kill-wait');
    await getDb().updateTable('steps').set({ assignee_id: gus.id }).where('id', '=', killWaitStep.id).execute();
    await fakes.unsubscribe(device.id); // the push service answers 410 Gone from now on (RFC 8030 §7.3)
    // Sprayed 6 Nov: the kill wait ends today, and 07:00 has passed, so the reminder is due at once.
    const result = await completeStep({ stepId: (await p.step('spray')).id, plantingId: p.planting.id, status: 'done', date: '2027-11-06' });
    expect(result.steps.find((s) => s.id === killWaitStep.id)!.date).toBe('2027-11-20');
    const subject = 'The kill wait on Far meadow is over — seed or till now';
    const mail = await waitFor('the e-mail', async () => (await fakes.inbox()).find((m) => m.subject === subject));
    expect(mail.to).toEqual(['gus.member.reminders@example.test']);
    const push = await waitFor('the push row to close', async () => {
      const row = (await notificationsFor(killWaitStep.id)).find((r) => r.channel === 'push');
      return row?.failed_at ? row : null;
    });
    expect([push.user_id, push.sent_at]).toEqual([gus.id, null]);
    expect(push.last_error).toMatch(/unsubscribed/);
    expect(await getDb().selectFrom('push_subscriptions').select('id').where('user_id', '=', gus.id).execute()).toEqual([]);
    expect((await fakes.pushes()).filter((m) => m.subscriptionId === device.id)).toEqual([]);
  }, 120_000);

  it('the worker is still running and stops cleanly on SIGTERM', async () => {
    expect(worker.alive()).toBe(true);
    expect(worker.lines.filter((l) => l.level === 'error')).toEqual([]);
    expect(await worker.stop()).toBe(0);
    expect(worker.lines.some((l) => l.msg === 'worker stopped')).toBe(true);
  });
});

/** RFC 8291: the device's private key and auth secret decrypt the aes128gcm body (RFC 8188) — via http_ece. */
async function decryptPush(subscriptionId: string, rawBodyBase64: string): Promise<unknown> {
  const keys = await fakes.devicePrivateKey(subscriptionId);
  const ecdh = createECDH('prime256v1');
  ecdh.setPrivateKey(Buffer.from(keys.privateKey, 'base64url'));
  expect(ecdh.getPublicKey().toString('base64url')).toBe(keys.p256dh);
  const plain = decrypt(Buffer.from(rawBodyBase64, 'base64'), { version: 'aes128gcm', privateKey: ecdh, authSecret: keys.auth });
  return JSON.parse(plain.toString('utf8'));
}
