// Forecast refresh → replan → "moved" message, and a provider that fails: real PostgreSQL (this file's own
// database), real pg-boss, a real worker process, the fake weather service speaking Open-Meteo's API.
// Outside references:
// - The request and answer shape are Open-Meteo's forecast API (open-meteo.com/en/docs): hourly precipitation
//   in mm for the hour ending at each stamp.
// - A quarter inch (6.35 mm) of rain within about 48 h after broadcasting settles the seed: common practice, no
//   source (lib/schedule/rules/seed-before-rain.ts). The rain put in here, 25 mm, is well above it.
// - The e-mail is parsed with mailparser (RFC 5322 / MIME).
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FreshDatabase } from '../support/db';
import {
  ClockFile, makeClub, makePlanting, mark, queueClient, startFakes, startWorker, useDatabase, waitFor, workerDatabase,
  type ClubPerson, type Fakes, type WorkerProcess,
} from '../support/worker';

const ZONE = 'America/Chicago';
const PLACE = { latitude: 36.41, longitude: -90.12, timeZone: ZONE };

let database: FreshDatabase;
let fakes: Fakes;
let clock: ClockFile;
let worker: WorkerProcess;
let queue: Awaited<ReturnType<typeof queueClient>>;
let ada: ClubPerson;
let ben: ClubPerson;
let plantingId: string;
let seedId: string;
let gridKey: string;

const db = async () => (await import('@/db')).getDb();
const seedDate = async () => (await (await db()).selectFrom('steps').select('local_date').where('id', '=', seedId).executeTakeFirstOrThrow()).local_date;
const forecastCount = async () => Number((await (await db()).selectFrom('forecasts').select((eb) => eb.fn.countAll().as('n')).executeTakeFirstOrThrow()).n);

/** Puts a forecast refresh on the queue, as the schedule (or a property edit) does, and waits for its outcome. */
async function refresh(expect: 'forecast stored' | 'forecast refresh failed; the last good forecast stays', timeoutMs = 20_000) {
  const from = mark(worker);
  const { forecastRefreshJob } = await import('@/jobs/queues');
  const job = forecastRefreshJob();
  const id = await queue.boss.send(job.name, job.data, job.options);
  if (!id) throw new Error('the refresh was not queued');
  return worker.waitForLog(expect, (l) => l.msg === expect, timeoutMs, from);
}

async function replanned(from: number) {
  return worker.waitForLog('the replan', (l) => l.queue === 'replan' && (l.msg === 'planting replanned' || l.msg === 'job done'), 20_000, from);
}

beforeAll(async () => {
  database = await workerDatabase('worker_replan');
  useDatabase(database.url);
  fakes = await startFakes();
  clock = new ClockFile(path.join(fakes.dir, 'clock'));
  clock.set('2027-08-22T15:00:00Z'); // Sun 22 Aug, 10:00 CDT: planned, and sprayed the same day
  const club = await makeClub({
    fakes,
    tag: 'replan',
    people: [
      { name: 'Ada Owner', role: 'owner' },
      { name: 'Ben Member', role: 'member' },
    ],
  });
  [ada, ben] = club.people;
  const p = await makePlanting({
    plotId: club.plot.id,
    form: {
      season: 'fall',
      method: 'prepared-seedbed',
      blend: [{ speciesId: 'cereal-rye', share: 1 }],
      targetSeedDate: '2027-09-10',
      herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
      sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
    },
    now: clock.get(),
    createdBy: ada.id,
  });
  plantingId = p.planting.id;
  const { completeStep } = await import('@/lib/planning/complete-step');
  await completeStep({ stepId: (await p.step('spray')).id, plantingId, status: 'done', date: '2027-08-22', userId: ada.id, now: clock.get() });
  seedId = (await p.step('seed')).id;
  // Ben does the seeding: as its assignee he hears of its moves, beside the owner.
  await (await db()).updateTable('steps').set({ assignee_id: ben.id }).where('id', '=', seedId).execute();
  clock.set('2027-09-05T14:00:00Z'); // Sun 5 Sep, 09:00 CDT: the kill wait ends today
  const { gridCellKey } = await import('@/lib/weather/grid');
  gridKey = gridCellKey(PLACE.latitude, PLACE.longitude);

  // A dry fortnight to start from, so the first plan keeps the planned seeding date.
  await fakes.weatherEvent({ kind: 'dry', ...PLACE, date: '2027-09-05', days: 16 });
  worker = await startWorker({ id: 'replan-1', databaseUrl: database.url, clock, env: fakes.env });
  queue = await queueClient(database.url);
  await worker.waitForLog('the first forecast', (l) => l.msg === 'forecast stored', 20_000);
  await replanned(0);
});

afterAll(async () => {
  await worker?.stop();
  await queue?.close();
  await fakes?.close();
  await (await db()).destroy().catch(() => {});
  await database?.drop();
});

describe('a qualifying rain two days out', () => {
  it('moves seeding ahead of it, writes the move as history and tells the owner and the assignee once', async () => {
    expect(await seedDate()).toBe('2027-09-10');

    await fakes.weatherEvent({ kind: 'rain', ...PLACE, date: '2027-09-07', totalMm: 25, startHour: 14, hours: 4 });
    const from = mark(worker);
    await refresh('forecast stored');
    await worker.waitForLog('the move', (l) => l.msg === 'planting replanned', 20_000, from);

    const moved = await seedDate();
    expect(moved < '2027-09-10').toBe(true);
    expect(moved <= '2027-09-07').toBe(true); // before the rain (on the day, the rain starts at 14:00 local)
    const history = await (await db()).selectFrom('step_moves').selectAll().where('step_id', '=', seedId).orderBy('created_at').execute();
    const last = history.at(-1)!;
    expect([last.from_date, last.to_date, last.moved_by]).toEqual(['2027-09-10', moved, null]);
    expect(last.reason).toMatch(/rain/);
    const { latestForecast } = await import('@/lib/data/forecasts');
    expect(new Date(last.forecast_fetched_at!).toISOString()).toBe((await latestForecast(gridKey))!.fetchedAt);

    // One "moved" message per person and channel for this forecast; the Message-ID comes from its dedupe key.
    const { messageIdFor } = await import('@/lib/notify/email');
    const forecastId = (await latestForecast(gridKey))!.id;
    const rows = await (await db()).selectFrom('notifications').selectAll().where('kind', '=', 'moved').where('dedupe_key', 'like', `%:${forecastId}`).execute();
    expect(rows.map((r) => r.dedupe_key).sort()).toEqual([ada.id, ben.id].map((u) => `moved:${plantingId}:${u}:email:${forecastId}`).sort());
    const messageId = (u: ClubPerson) => messageIdFor(`moved:${plantingId}:${u.id}:email:${forecastId}`);
    const withId = async (u: ClubPerson) => (await fakes.inbox()).filter((m) => m.messageId === messageId(u));
    await waitFor('the moved e-mails', async () => (await withId(ada)).length > 0 && (await withId(ben)).length > 0);
    await new Promise((r) => setTimeout(r, 2500)); // further reminder runs must not send them again
    expect((await withId(ada)).map((m) => m.to)).toEqual([[ada.email]]);
    expect((await withId(ben)).map((m) => m.to)).toEqual([[ben.email]]);
    const adaMail = await withId(ada);

    const mail = adaMail.at(-1)!;
    const parsed = await simpleParser(await fakes.rawMail(mail.id));
    expect(parsed.text).toContain(last.reason);
    expect(parsed.text).toContain('Broadcast seed');
    expect(parsed.text).toContain('http://sowcast.test/settings');
    expect(parsed.html as string).toContain(`http://sowcast.test/steps/${seedId}`);
  });
});

describe('the weather provider misbehaves', () => {
  it('down, slow, then garbage: the last good forecast stays, the cell is marked failing since the first failure, the worker keeps running', async () => {
    const { forecastStatus, latestForecast } = await import('@/lib/data/forecasts');
    const good = await latestForecast(gridKey);
    const count = await forecastCount();

    clock.set('2027-09-05T15:00:00Z');
    await fakes.weatherMode('fail');
    const down = await refresh('forecast refresh failed; the last good forecast stays');
    expect(down.kind).toBe('http');

    clock.set('2027-09-05T15:30:00Z');
    await fakes.weatherMode('slow', { delayMs: 8000 }); // WEATHER_TIMEOUT_MS is 1500 for the worker
    const slow = await refresh('forecast refresh failed; the last good forecast stays', 30_000);
    expect(slow.kind).toBe('timeout');

    clock.set('2027-09-05T16:00:00Z');
    await fakes.weatherMode('garbage');
    const garbage = await refresh('forecast refresh failed; the last good forecast stays');
    expect(garbage.kind).toBe('invalid');

    expect(await forecastCount()).toBe(count); // nothing half-stored
    expect(await latestForecast(gridKey)).toEqual(good);
    const status = await forecastStatus(gridKey);
    expect(status).toMatchObject({ failingSince: '2027-09-05T15:00:00.000Z', consecutiveFailures: 3, lastSuccessAt: good!.fetchedAt });
    expect(status!.lastError).toMatch(/^invalid/);
    expect(worker.alive()).toBe(true);
  }, 120_000);

  it('back up: a new forecast is stored, the cell is healthy again, and replans resume', async () => {
    const { forecastStatus } = await import('@/lib/data/forecasts');
    const before = await seedDate();
    clock.set('2027-09-05T16:30:00Z');
    await fakes.weatherMode('ok');
    // The rain moves to Sun 12: seeding follows it.
    await fakes.weatherEvent({ kind: 'dry', ...PLACE, date: '2027-09-05', days: 16 });
    await fakes.weatherEvent({ kind: 'rain', ...PLACE, date: '2027-09-12', totalMm: 20, startHour: 10, hours: 6 });
    const from = mark(worker);
    await refresh('forecast stored');
    await worker.waitForLog('the move', (l) => l.msg === 'planting replanned', 20_000, from);
    const after = await seedDate();
    const history = await (await db()).selectFrom('step_moves').select(['from_date', 'to_date', 'reason']).where('step_id', '=', seedId).orderBy('created_at').execute();
    expect(after > before, JSON.stringify(history)).toBe(true);
    expect(after <= '2027-09-12').toBe(true);
    expect(await forecastStatus(gridKey)).toMatchObject({ failingSince: null, consecutiveFailures: 0, lastError: null });
    expect(worker.alive()).toBe(true);
    expect(worker.lines.filter((l) => l.level === 'error')).toEqual([]);
  });
});

describe('a new or moved property', () => {
  it('gets its forecast at the next minute heartbeat, not at the next three-hourly refresh, and its plantings are replanned', async () => {
    const { gridCellKey } = await import('@/lib/weather/grid');
    const { updateProperty } = await import('@/lib/data/properties');
    const club = await makeClub({ fakes, tag: 'elsewhere', people: [{ name: 'Fay Owner', role: 'owner' }], property: { latitude: 38.95, longitude: -92.33 } });
    const p = await makePlanting({
      plotId: club.plot.id,
      form: { season: 'fall', method: 'prepared-seedbed', blend: [{ speciesId: 'cereal-rye', share: 1 }], targetSeedDate: '2027-09-20' },
      now: clock.get(),
      createdBy: club.owner.id,
    });
    for (const [latitude, longitude] of [[38.95, -92.33], [37.21, -93.29]] as const) {
      const from = mark(worker);
      if (latitude !== 38.95) await updateProperty(club.property.id, { latitude, longitude }, ['latitude', 'longitude']);
      const key = gridCellKey(latitude, longitude);
      await worker.waitForLog(`the forecast for ${key}`, (l) => l.msg === 'forecast stored' && l.gridKey === key, 20_000, from);
      const replan = await worker.waitForLog(
        'its replan',
        (l) => l.queue === 'replan' && l.msg === 'job done' && (l.data as { plantingId?: string }).plantingId === p.planting.id,
        20_000,
        from,
      );
      expect((replan.result as { forecastId?: string }).forecastId).toBeDefined();
      expect(await (await db()).selectFrom('forecasts').select('id').where('grid_key', '=', key).execute()).toHaveLength(1);
    }
  });
});
