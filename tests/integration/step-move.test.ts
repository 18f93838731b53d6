// POST /api/steps/[stepId]/move and PATCH /api/steps/[stepId] over real HTTP: who may move what (managers any step,
// members only their own, viewers none), the engine's reasons for a bad day (409, nothing changed), a manager's
// confirmation (pinned, with history), and done steps that stay put. "Today" is the property's local date,
// read through Intl's IANA zone data. White clover needs about 56 days of growth before a hard freeze
// (lib/agronomy/growing-days.ts); with no hard freeze recorded it is the first frost + 14 days
// (FROST_DEADLINE_SOURCES): 2027-10-20 + 14 = 2027-11-03, − 56 days = 2027-09-08, by hand. (The old rule counted
// 8 weeks back from the first frost, 25 Aug; issue 11 replaced fixed weeks with growing days before the killing freeze.)
import { randomInt } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { storeForecast } from '@/lib/data/forecasts';
import type { ForecastHour } from '@/lib/schedule/types';
import { gridCellKey } from '@/lib/weather/grid';
import { testDb } from '../support/db';
import { addMember, createPlot, createProperty, signedInUser, type Client, type TestUser } from '../support/http';

type Person = { user: TestUser; client: Client };
const db = testDb();
let owner: Person, manager: Person, member: Person, other: Person, viewer: Person;
let frostPlotId: string;
let coldPlotId: string;

const TZ = 'America/Chicago';
const localDay = (offsetDays = 0) =>
  new Intl.DateTimeFormat('en-CA', { timeZone: TZ, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date(Date.now() + offsetDays * 86_400_000));
const plusDays = (date: string, days: number) => new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
const lonelyPlace = () => ({ latitude: 40 + randomInt(0, 800) / 100, longitude: -(100 + randomInt(0, 2000) / 100) });

const CLOVER = {
  method: 'spray-and-seed',
  blend: [{ speciesId: 'white-clover', share: 1 }],
  herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
  sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
};

async function plant(plotId: string, body: Record<string, unknown>) {
  const res = await owner.client.post(`/api/plots/${plotId}/plantings`, { ...CLOVER, ...body });
  if (res.status !== 201) throw new Error(`planting answered ${res.status}: ${res.text}`);
  const steps = res.body.steps as { id: string; kind: string; date: string }[];
  return { id: res.body.planting.id as string, step: (kind: string) => steps.find((s) => s.kind === kind)! };
}

const stepRow = (id: string) => db.selectFrom('steps').selectAll().where('id', '=', id).executeTakeFirstOrThrow();
const movesOf = (id: string) => db.selectFrom('step_moves').selectAll().where('step_id', '=', id).orderBy('created_at').execute();

beforeAll(async () => {
  [owner, manager, member, other, viewer] = await Promise.all(['move-owner', 'move-manager', 'move-member', 'move-other', 'move-viewer'].map((p) => signedInUser(p)));
  const frostProperty = await createProperty(owner.client, { ...lonelyPlace(), timeZone: TZ, avgFirstFallFrost: '10-20' });
  for (const [p, role] of [[manager, 'manager'], [member, 'member'], [other, 'member'], [viewer, 'viewer']] as const) {
    await addMember(owner.client, frostProperty.id, p, role);
  }
  frostPlotId = (await createPlot(owner.client, frostProperty.id)).id;

  // A cold spell: 17 days of soil at 2 °C (35.6 °F), below white clover's 40 °F minimum, no rain.
  const place = lonelyPlace();
  const coldProperty = await createProperty(owner.client, { ...place, timeZone: TZ });
  await addMember(owner.client, coldProperty.id, manager, 'manager');
  coldPlotId = (await createPlot(owner.client, coldProperty.id)).id;
  const startMs = Date.parse(`${localDay(-1)}T00:00:00Z`);
  const hours: ForecastHour[] = Array.from({ length: 17 * 24 }, (_, i) => ({
    time: new Date(startMs + i * 3_600_000).toISOString(),
    rainMm: 0,
    rainProbabilityPct: 5,
    airTempC: i % 24 === 21 ? 12 : 3,
    relativeHumidityPct: 60,
    windKmh: 8,
    windGustKmh: null,
    soilTempC: 2,
  }));
  await storeForecast({ gridKey: gridCellKey(place.latitude, place.longitude), ...place, provider: 'open-meteo', forecast: { timeZone: TZ, fetchedAt: new Date().toISOString(), hours } });
});

afterAll(async () => {
  await db.destroy();
});

describe('POST /api/steps/[stepId]/move', () => {
  it('viewers cannot move anything and members cannot move another person’s step (403, nothing changes)', async () => {
    const p = await plant(frostPlotId, { season: 'fall', targetSeedDate: '2027-08-24' });
    const seed = p.step('seed');
    expect((await owner.client.patch(`/api/steps/${seed.id}`, { assigneeId: other.user.id })).status).toBe(200);
    const before = await stepRow(seed.id);
    for (const who of [viewer, member]) {
      const res = await who.client.post(`/api/steps/${seed.id}/move`, { date: '2027-08-25' });
      expect(res.status, res.text).toBe(403);
    }
    expect(await stepRow(seed.id)).toEqual(before);
    expect(await movesOf(seed.id)).toEqual([]);
  });

  it('a member moves their own step to a good day: pinned there, with history', async () => {
    const p = await plant(frostPlotId, { season: 'fall', targetSeedDate: '2027-08-24' });
    const seed = p.step('seed');
    expect(seed.date).toBe('2027-08-24');
    await owner.client.patch(`/api/steps/${seed.id}`, { assigneeId: member.user.id });
    const res = await member.client.post(`/api/steps/${seed.id}/move`, { date: '2027-08-25' });
    expect(res.status, res.text).toBe(200);
    expect(res.body.step).toMatchObject({ id: seed.id, date: '2027-08-25', pinned: true });
    const moves = await movesOf(seed.id);
    expect(moves.map((m) => [m.from_date, m.to_date, m.moved_by, m.reason])).toEqual([['2027-08-24', '2027-08-25', member.user.id, `moved by ${member.user.name}`]]);
    const detail = await viewer.client.get(`/api/steps/${seed.id}`);
    expect(detail.body.moves.map((m: { movedBy: { name: string } }) => m.movedBy?.name)).toEqual([member.user.name]);
    expect(detail.body.canMove).toBe(false);
  });

  it('a day past the fall frost deadline is refused with the reasons; a member cannot confirm, a manager can', async () => {
    const p = await plant(frostPlotId, { season: 'fall', targetSeedDate: '2027-08-24' });
    const seed = p.step('seed');
    await owner.client.patch(`/api/steps/${seed.id}`, { assigneeId: member.user.id });
    const before = await stepRow(seed.id);

    const refused = await member.client.post(`/api/steps/${seed.id}/move`, { date: '2027-09-20', confirm: true });
    expect(refused.status, refused.text).toBe(409);
    expect(refused.body.canConfirm).toBe(false);
    expect(refused.body.reasons.some((r: string) => /past the fall deadline/.test(r) && /Wed 8 Sep/.test(r))).toBe(true);
    const asked = await manager.client.post(`/api/steps/${seed.id}/move`, { date: '2027-09-20' });
    expect([asked.status, asked.body.canConfirm]).toEqual([409, true]);
    expect(await stepRow(seed.id)).toEqual(before);
    expect(await movesOf(seed.id)).toEqual([]);

    const confirmed = await manager.client.post(`/api/steps/${seed.id}/move`, { date: '2027-09-20', confirm: true });
    expect(confirmed.status, confirmed.text).toBe(200);
    expect(confirmed.body.step).toMatchObject({ date: '2027-09-20', pinned: true });
    const [move] = await movesOf(seed.id);
    expect(move).toMatchObject({ from_date: '2027-08-24', to_date: '2027-09-20', moved_by: manager.user.id });
    expect(move.reason).toMatch(new RegExp(`^moved by ${manager.user.name}, confirmed despite: .*past the fall deadline`));
    // The germination check follows the seeding it now counts from.
    const check = confirmed.body.steps.find((s: { kind: string }) => s.kind === 'check-germination');
    expect(check.date > '2027-09-20').toBe(true);
  });

  it('a day with the seed zone below the blend’s soil minimum is refused with that reason', async () => {
    const p = await plant(coldPlotId, { season: 'spring', targetSeedDate: localDay(6) });
    const seed = p.step('seed');
    const day = localDay(5);
    const res = await manager.client.post(`/api/steps/${seed.id}/move`, { date: day });
    expect(res.status, res.text).toBe(409);
    expect(res.body.reasons.some((r: string) => /soil/i.test(r) && /40 °F/.test(r))).toBe(true);
  });

  it('a spray-and-seed seeding dragged days later takes its unpinned spray along, with history; a pinned spray refuses', async () => {
    // Spray-and-seed sprays right before seeding, a day before by default and two at most (common practice,
    // no source; lib/schedule/methods.ts). 2027-08-24 − 1 day = 2027-08-23, by hand.
    const p = await plant(frostPlotId, { season: 'fall', targetSeedDate: '2027-08-20' });
    const [spray, seed] = [p.step('spray'), p.step('seed')];
    expect([spray.date, seed.date]).toEqual(['2027-08-19', '2027-08-20']);
    const res = await manager.client.post(`/api/steps/${seed.id}/move`, { date: '2027-08-24' });
    expect(res.status, res.text).toBe(200);
    expect(res.body.confirmedDespite).toEqual([]);
    expect(await stepRow(seed.id)).toMatchObject({ local_date: '2027-08-24', pinned: true });
    expect(await stepRow(spray.id)).toMatchObject({ local_date: '2027-08-23', pinned: false, status: 'planned' });
    const [sprayMove] = await movesOf(spray.id);
    expect(sprayMove).toMatchObject({ from_date: '2027-08-19', to_date: '2027-08-23', moved_by: manager.user.id });
    // Weekdays of 2027-08-19 and 2027-08-23 as Intl (ECMA-402) names them.
    const weekday = (date: string) => new Intl.DateTimeFormat('en-US', { weekday: 'short', timeZone: 'UTC' }).format(new Date(`${date}T12:00:00Z`));
    expect(sprayMove.reason).toContain(`moved spraying from ${weekday('2027-08-19')} 19 to ${weekday('2027-08-23')} 23: 1 day before seeding`);
    expect(sprayMove.reason).toMatch(new RegExp(`\\(with seeding moved by ${manager.user.name} to ${weekday('2027-08-24')} 24 Aug\\)$`));
    const detail = await viewer.client.get(`/api/steps/${spray.id}`);
    expect(detail.body.moves.map((m: { movedBy: { name: string } }) => m.movedBy?.name)).toEqual([manager.user.name]);

    // Pinned, the spray stays where it is, and four days past it is more than spray-and-seed allows.
    const q = await plant(frostPlotId, { season: 'fall', targetSeedDate: '2027-08-20' });
    const [pinnedSpray, otherSeed] = [q.step('spray'), q.step('seed')];
    expect((await owner.client.patch(`/api/steps/${pinnedSpray.id}`, { pinned: true })).status).toBe(200);
    const before = [await stepRow(pinnedSpray.id), await stepRow(otherSeed.id)];
    const refused = await manager.client.post(`/api/steps/${otherSeed.id}/move`, { date: '2027-08-24' });
    expect(refused.status, refused.text).toBe(409);
    expect(refused.body.reasons).toEqual(['5 days after spraying; spray-and-seed seeds within 2 days']);
    expect([await stepRow(pinnedSpray.id), await stepRow(otherSeed.id)]).toEqual(before);
    expect(await movesOf(pinnedSpray.id)).toEqual([]);
  });

  it('a done step cannot be moved (409), and bad input names the field', async () => {
    const p = await plant(frostPlotId, { season: 'fall', targetSeedDate: '2027-08-24' });
    const spray = p.step('spray');
    expect((await owner.client.post(`/api/steps/${spray.id}/complete`, { status: 'done' })).status).toBe(200);
    const res = await owner.client.post(`/api/steps/${spray.id}/move`, { date: '2027-08-20', confirm: true });
    expect(res.status, res.text).toBe(409);
    expect(res.body.error).toMatch(/done step cannot be moved/);
    const bad = await owner.client.post(`/api/steps/${p.step('seed').id}/move`, { date: '2027-02-30' });
    expect([bad.status, Object.keys(bad.body.fields)]).toEqual([400, ['date']]);
    const past = await owner.client.post(`/api/steps/${p.step('seed').id}/move`, { date: plusDays(localDay(), -2) });
    expect([past.status, Object.keys(past.body.fields)]).toEqual([400, ['date']]);
  });
});

describe('PATCH /api/steps/[stepId]', () => {
  it('assigns only to members and up (400 naming assigneeId), and unpinning hands the date back to the engine', async () => {
    const p = await plant(frostPlotId, { season: 'fall', targetSeedDate: '2027-08-24' });
    const seed = p.step('seed');
    const toViewer = await owner.client.patch(`/api/steps/${seed.id}`, { assigneeId: viewer.user.id });
    expect([toViewer.status, Object.keys(toViewer.body.fields)]).toEqual([400, ['assigneeId']]);
    const stranger = await signedInUser('move-stranger');
    expect((await owner.client.patch(`/api/steps/${seed.id}`, { assigneeId: stranger.user.id })).status).toBe(400);
    expect((await stepRow(seed.id)).assignee_id).toBeNull();
    expect((await member.client.patch(`/api/steps/${seed.id}`, { pinned: true })).status).toBe(403);

    await owner.client.post(`/api/steps/${seed.id}/move`, { date: '2027-08-25' });
    const unpinned = await owner.client.patch(`/api/steps/${seed.id}`, { pinned: false, assigneeId: null });
    expect(unpinned.status, unpinned.text).toBe(200);
    // With no forecast the engine keeps a step where it is; unpinned, it may move it again.
    expect(unpinned.body.step).toMatchObject({ pinned: false, assigneeId: null });
  });
});
