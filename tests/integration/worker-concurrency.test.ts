// Two worker processes on one database at once: every reminder is made once, claimed once and delivered once —
// none twice, none lost — and a mail relay that is down only delays e-mail. Real PostgreSQL (this file's own
// database), real pg-boss, real worker processes, the local fakes over loopback.
// Outside references:
// - RFC 5322 §3.6.4: a Message-ID names exactly one message, so "unique Message-IDs in the inbox = rows" is
//   the count of distinct messages delivered.
// - RFC 5321 §4.2.3: 421 is the relay's "not available now", a temporary failure the sender retries.
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FreshDatabase } from '../support/db';
import {
  ClockFile, makeClub, makePlanting, reminderRunAt, startFakes, startWorker, useDatabase, waitFor, workerDatabase,
  type Fakes, type WorkerProcess,
} from '../support/worker';

let database: FreshDatabase;
let fakes: Fakes;
let clock: ClockFile;
let workers: WorkerProcess[] = [];
let club: Awaited<ReturnType<typeof makeClub>>;

const PLANTINGS = 10;
const INVITEE = 'new.person@example.test';
const db = async () => (await import('@/db')).getDb();

async function sprayedPlantings(count: number, sprayedOn: string, targetSeedDate: string) {
  const { createPlot } = await import('@/lib/data/plots');
  const { completeStep } = await import('@/lib/planning/complete-step');
  for (let i = 0; i < count; i++) {
    const plot = await createPlot(club.property.id, { name: `Plot ${sprayedOn} ${i + 1}`, acres: 0.5, cover: 'grass-weeds', sun: 'full' } as never);
    const p = await makePlanting({
      plotId: plot.id,
      form: {
        season: 'fall',
        method: 'prepared-seedbed',
        blend: [{ speciesId: 'cereal-rye', share: 1 }],
        targetSeedDate,
        herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
        sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
      },
      now: clock.get(),
      createdBy: club.owner.id,
    });
    await completeStep({ stepId: (await p.step('spray')).id, plantingId: p.planting.id, status: 'done', date: sprayedOn, userId: club.owner.id, now: clock.get() });
  }
}

/** A reminders run by either worker (pg-boss gives each run to whichever worker fetches it first). */
async function anyRunAt(iso: string) {
  const at = new Date(iso);
  const marks = workers.map((w) => w.lines.length);
  await Promise.any(workers.map((w, i) => reminderRunAt(w, at, 30_000, marks[i])));
}

/** What is still waiting, and what the workers complained about: the message of a failed wait. */
async function diagnose(error: unknown): Promise<never> {
  const rows = await (await db()).selectFrom('notifications').select(['kind', 'channel', 'attempts', 'claimed_by', 'claimed_at', 'send_after', 'last_error', 'failed_at']).where('sent_at', 'is', null).execute();
  const complaints = workers.flatMap((w) => w.lines.filter((l) => l.level === 'warn' || l.level === 'error').slice(-10));
  throw new Error(`${(error as Error).message}\nunsent: ${JSON.stringify(rows.slice(0, 10))}\nworkers: ${JSON.stringify(complaints)}`);
}

/** Every row delivered exactly once: one inbox message per e-mail row (by Message-ID), one push per push row. */
async function expectEachDeliveredOnce() {
  const { messageIdFor } = await import('@/lib/notify/email');
  const rows = await (await db()).selectFrom('notifications').selectAll().execute();
  const inbox = await fakes.inbox();
  const pushes = await fakes.pushes();
  const emailRows = rows.filter((r) => r.channel === 'email');
  const pushRows = rows.filter((r) => r.channel === 'push');
  const ids = inbox.map((m) => m.messageId);
  expect(new Set(ids).size).toBe(ids.length); // no message twice
  expect(ids.sort()).toEqual(emailRows.map((r) => messageIdFor(r.dedupe_key)).sort()); // none lost, none extra
  expect(pushes.length).toBe(pushRows.length);
  for (const person of club.people) {
    expect(pushes.filter((p) => p.subscriptionId === person.deviceId).length, person.email).toBe(pushRows.filter((r) => r.user_id === person.id).length);
  }
  for (const r of rows) expect(r.sent_at, r.dedupe_key).not.toBeNull();
  return { rows, emailRows, pushRows };
}

beforeAll(async () => {
  database = await workerDatabase('worker_concurrency');
  useDatabase(database.url);
  fakes = await startFakes();
  clock = new ClockFile(path.join(fakes.dir, 'clock'));
  clock.set('2027-08-18T15:00:00Z'); // Wed 18 Aug, 10:00 CDT
  club = await makeClub({
    fakes,
    tag: 'concurrency',
    people: [
      { name: 'Ada Owner', role: 'owner', phone: true },
      { name: 'Dee Manager', role: 'manager', phone: true },
      { name: 'Eli Manager', role: 'manager', phone: true },
    ],
  });
  // Ten plots sprayed today: ten kill waits end on Wed 1 Sep, each told to three people on two channels.
  await sprayedPlantings(PLANTINGS, '2027-08-18', '2027-09-06');
  clock.set('2027-09-01T11:00:00Z'); // 06:00 CDT: nothing due yet
  // An invitation, as POST /api/properties/[id]/invitations queues it: to an address without an account.
  const { insertNotifications } = await import('@/lib/data/notifications');
  const { invitation } = await import('@/lib/notify/messages');
  await insertNotifications([
    {
      dedupeKey: 'invitation:concurrency-test',
      userId: null,
      emailTo: INVITEE,
      propertyId: club.property.id,
      stepId: null,
      kind: 'invitation',
      channel: 'email',
      message: invitation({ baseUrl: 'http://sowcast.test', propertyName: club.property.name, inviterName: 'Ada Owner', role: 'member', link: 'http://sowcast.test/invitations/abc' }),
      sendAfter: clock.get(),
    },
  ]);
  // A dry fortnight: the plans stay where they are, so the reminders are the kill waits this test counts.
  await fakes.weatherEvent({ kind: 'dry', latitude: 36.41, longitude: -90.12, timeZone: 'America/Chicago', date: '2027-09-01', days: 16 });
  const env = { ...fakes.env, SOWCAST_CLAIM_BATCH: '25' }; // small claims, so both workers take turns
  workers = await Promise.all(['north', 'south'].map((id) => startWorker({ id, databaseUrl: database.url, clock, env })));
});

afterAll(async () => {
  await Promise.all(workers.map((w) => w.stop()));
  await fakes?.close();
  await (await db()).destroy().catch(() => {});
  await database?.drop();
});

describe('two workers at once', () => {
  it('both are running on the same queues', async () => {
    await anyRunAt('2027-09-01T11:00:00Z');
    expect(workers.every((w) => w.alive())).toBe(true);
  });

  it('at 07:00 every kill-wait reminder reaches its person exactly once: no e-mail or push twice, none lost', async () => {
    clock.set('2027-09-01T12:00:00Z');
    const expected = PLANTINGS * club.people.length; // per channel
    await waitFor('every reminder delivered', async () => {
      const rows = await (await db()).selectFrom('notifications').select(['kind', 'sent_at']).execute();
      return rows.filter((r) => r.kind === 'kill-wait-over').length === expected * 2 && rows.every((r) => r.sent_at);
    }, 60_000, 500).catch(diagnose);
    // Let both workers run the reminders a few more times: nothing may be made or sent again.
    await anyRunAt('2027-09-01T12:00:00Z');
    await anyRunAt('2027-09-01T12:00:00Z');
    await new Promise((r) => setTimeout(r, 2000));

    const { rows } = await expectEachDeliveredOnce();
    // The invitation went to the bare address, once.
    expect((await fakes.inbox()).filter((m) => m.to.includes(INVITEE)).map((m) => m.subject)).toEqual([`Ada Owner invited you to ${club.property.name} on Sowcast`]);
    // The acceptance link is a bearer secret: once sent, the stored row no longer holds it.
    const sentInvitation = rows.find((r) => r.kind === 'invitation');
    expect(sentInvitation?.sent_at).toBeTruthy();
    expect(JSON.stringify(sentInvitation?.message)).not.toContain('/invitations/abc');
    expect(rows.filter((r) => r.kind === 'kill-wait-over').length).toBe(expected * 2);
    // Each row was claimed once — by one of the two workers — and never needed a second attempt.
    for (const r of rows.filter((x) => x.kind === 'kill-wait-over')) {
      expect(['north', 'south']).toContain(r.claimed_by);
      expect(r.attempts).toBe(1);
    }
    // Both workers did part of the work (pg-boss hands each job to whichever worker fetches it first).
    const sentBy = (w: WorkerProcess) => w.lines.filter((l) => l.msg === 'e-mail sent' || l.msg === 'push sent').length;
    expect(workers.map(sentBy).reduce((a, b) => a + b, 0)).toBe(rows.length);
    expect(workers.every((w) => sentBy(w) > 0), `sent: ${workers.map(sentBy)}`).toBe(true);
  }, 150_000);

  it('with the mail relay down, e-mail waits and is delivered once when it returns; pushes go meanwhile', async () => {
    const expectedPushRows = () => (PLANTINGS + 3) * club.people.length;
    // Three more plots, sprayed 19 Aug: their kill waits end Thu 2 Sep.
    clock.set('2027-09-01T15:00:00Z');
    const { getDb } = await import('@/db');
    const already = (await getDb().selectFrom('notifications').select('id').execute()).length;
    await sprayedPlantings(3, '2027-08-19', '2027-09-07');
    // Whatever those plantings make due today goes out first, with the relay up.
    await anyRunAt('2027-09-01T15:00:00Z');
    await waitFor('today’s messages sent', async () => (await getDb().selectFrom('notifications').select('sent_at').execute()).every((r) => r.sent_at), 30_000, 500).catch(diagnose);
    await fakes.setSmtp('down');
    clock.set('2027-09-02T12:00:00Z');
    await waitFor('the e-mail attempts to fail', async () => {
      const rows = await getDb().selectFrom('notifications').selectAll().where('kind', '=', 'kill-wait-over').where('channel', '=', 'email').where('sent_at', 'is', null).execute();
      return rows.length === 3 * club.people.length && rows.every((r) => r.attempts === 1 && r.last_error && !r.claimed_by);
    }, 30_000, 500).catch(diagnose);
    const waiting = await getDb().selectFrom('notifications').selectAll().where('kind', '=', 'kill-wait-over').where('channel', '=', 'email').where('sent_at', 'is', null).execute();
    expect(waiting.length).toBe(3 * club.people.length);
    for (const r of waiting) {
      // Backed off from the failed attempt, not dropped.
      expect(new Date(r.send_after).getTime()).toBeGreaterThan(Date.parse('2027-09-02T12:00:00Z'));
      expect(r.failed_at).toBeNull();
    }
    expect((await fakes.inbox()).length).toBe((await getDb().selectFrom('notifications').select('id').where('channel', '=', 'email').where('sent_at', 'is not', null).execute()).length);
    // The phones did not wait for the mail relay.
    await waitFor('the pushes', async () => {
      const rows = await getDb().selectFrom('notifications').select('sent_at').where('kind', '=', 'kill-wait-over').where('channel', '=', 'push').execute();
      return rows.length === expectedPushRows() && rows.every((r) => r.sent_at);
    }, 20_000, 500).catch(diagnose);

    await fakes.setSmtp('ok');
    clock.set('2027-09-02T12:05:00Z'); // past the backoff
    await waitFor('the e-mails after the relay returned', async () => {
      const rows = await getDb().selectFrom('notifications').select('sent_at').execute();
      return rows.length > already && rows.every((r) => r.sent_at);
    }, 60_000, 500).catch(diagnose);
    await anyRunAt('2027-09-02T12:05:00Z');
    await anyRunAt('2027-09-02T12:05:00Z');
    await new Promise((r) => setTimeout(r, 1500));
    await expectEachDeliveredOnce();
    expect(workers.every((w) => w.alive())).toBe(true);
  }, 150_000);
});
