// GET /api/dashboard over real HTTP: signed-in only; each person sees only the properties they belong to;
// "my steps" are the steps given to me, or nobody's on a property where I am manager or owner; moves are
// listed once, on the first visit after them, with their reasons (users.last_seen_at); a failing forecast
// refresh shows for the properties that share the grid cell. "Today" is the property's local date, read
// through Intl's IANA zone data, independent of the code under test.
import { randomInt } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { recordForecastFailure } from '@/lib/data/forecasts';
import { gridCellKey } from '@/lib/weather/grid';
import { testDb } from '../support/db';
import { addMember, Client, createPlot, createProperty, signedInUser, type TestUser } from '../support/http';

type Person = { user: TestUser; client: Client };
type Step = { id: string; kind: string; date: string; status: string; recurrence?: string | null };
type Dash = {
  asOf: string;
  since: string;
  firstVisit: boolean;
  today: { stepId: string; plotId: string; start: string; recurring?: true }[];
  thisWeek: { stepId: string; plotId: string; start: string; recurring?: true }[];
  moves: { stepId: string; fromDate: string; toDate: string; reason: string; movedBy: string | null }[];
  germination: { plotId: string }[];
  staleForecasts: { propertyId: string }[];
};

const db = testDb();
const TZ = 'America/Chicago';
const localDay = (offsetDays = 0) =>
  new Intl.DateTimeFormat('en-CA', { timeZone: TZ, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date(Date.now() + offsetDays * 86_400_000));
// Random places keep this file's grid cells apart from other files' forecasts.
const lonelyPlace = () => ({ latitude: 30 + randomInt(0, 800) / 100, longitude: -(80 + randomInt(0, 1500) / 100) });

let owner: Person, member: Person, stranger: Person;
let property: { id: string };
let place: { latitude: number; longitude: number };
let plotId: string;
let steps: Step[];

/** What the page does: read the dashboard, then mark it seen with its `asOf`. */
const dashboard = async (p: Person) => {
  const res = await p.client.get('/api/dashboard');
  expect(res.status, res.text).toBe(200);
  const seen = await p.client.post('/api/dashboard/visit', { seenAt: res.body.asOf });
  expect(seen.status, seen.text).toBe(204);
  return res.body as Dash;
};
const mineIds = (d: Dash) => [...d.today, ...d.thisWeek].map((e) => e.stepId);

beforeAll(async () => {
  [owner, member, stranger] = await Promise.all(['dash-owner', 'dash-member', 'dash-stranger'].map((p) => signedInUser(p)));
  place = lonelyPlace();
  property = await createProperty(owner.client, { ...place, timeZone: TZ });
  // The stranger has ground of their own, so their answer is empty because of access, not for want of data.
  await createProperty(stranger.client, { ...lonelyPlace(), timeZone: TZ });
  await addMember(owner.client, property.id, member, 'member');
  plotId = (await createPlot(owner.client, property.id)).id;
  const res = await owner.client.post(`/api/plots/${plotId}/plantings`, {
    season: 'spring',
    method: 'spray-and-seed',
    blend: [{ speciesId: 'white-clover', share: 1 }],
    targetSeedDate: localDay(5),
    herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
    sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
  });
  if (res.status !== 201) throw new Error(`planting answered ${res.status}: ${res.text}`);
  steps = res.body.steps as Step[];
});

afterAll(async () => {
  await db.destroy();
});

describe('GET /api/dashboard', () => {
  it('answers 401 to someone signed out', async () => {
    const res = await new Client().get('/api/dashboard');
    expect(res.status).toBe(401);
  });

  it('lists the unassigned steps of this week for the owner, none for a member until one is given to them', async () => {
    const today = localDay(0);
    const weekEnd = localDay(6);
    const expected = steps.filter((s) => !s.recurrence && s.status === 'planned' && s.date >= today && s.date <= weekEnd).map((s) => s.id);
    // A seeding five days out puts the spray and the seeding inside the week; without them this check proves nothing.
    expect(expected.length).toBeGreaterThan(0);
    const own = await dashboard(owner);
    expect(new Set(mineIds(own).filter((id) => steps.some((s) => s.id === id)))).toEqual(new Set(expected));
    for (const e of own.today) expect(e.start).toBe(today);
    for (const e of own.thisWeek) expect(e.start > today && e.start <= weekEnd).toBe(true);

    expect(mineIds(await dashboard(member))).toEqual([]);
    const given = expected[0];
    expect((await owner.client.patch(`/api/steps/${given}`, { assigneeId: member.user.id })).status).toBe(200);
    expect(mineIds(await dashboard(member))).toEqual([given]);
    // Given to someone, it is no longer the owner's to do.
    expect(mineIds(await dashboard(owner))).not.toContain(given);
  });

  it('shows a move with its reason once, on the next visit, and only to people of that property', async () => {
    await dashboard(owner);
    await dashboard(stranger);
    const seed = steps.find((s) => s.kind === 'seed')!;
    const current = await db.selectFrom('steps').select('local_date').where('id', '=', seed.id).executeTakeFirstOrThrow();
    const to = new Date(Date.parse(`${current.local_date}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
    const moved = await owner.client.post(`/api/steps/${seed.id}/move`, { date: to, confirm: true });
    expect(moved.status, moved.text).toBe(200);

    const next = await dashboard(owner);
    expect(next.firstVisit).toBe(false);
    const move = next.moves.find((m) => m.stepId === seed.id);
    expect(move).toMatchObject({ fromDate: current.local_date, toDate: to, movedBy: owner.user.name });
    expect(move!.reason).toMatch(new RegExp(`^moved by ${owner.user.name}`));
    expect((await dashboard(owner)).moves.map((m) => m.stepId)).not.toContain(seed.id);
    expect((await dashboard(stranger)).moves.map((m) => m.stepId)).not.toContain(seed.id);
  });

  it('reading the dashboard changes nothing (a GET is safe, RFC 9110 §9.2.1); the visit is the explicit POST', async () => {
    const lastSeen = async () =>
      (await db.selectFrom('users').select('last_seen_at').where('id', '=', owner.user.id).executeTakeFirstOrThrow()).last_seen_at;
    await dashboard(owner);
    const seed = steps.find((s) => s.kind === 'seed')!;
    const current = await db.selectFrom('steps').select('local_date').where('id', '=', seed.id).executeTakeFirstOrThrow();
    const to = new Date(Date.parse(`${current.local_date}T00:00:00Z`) - 86_400_000).toISOString().slice(0, 10);
    expect((await owner.client.post(`/api/steps/${seed.id}/move`, { date: to, confirm: true })).status).toBe(200);

    const before = await lastSeen();
    // A top-level link from another site is a plain GET with the cookie: it must not mark anything seen.
    const first = await owner.client.get('/api/dashboard', { headers: { 'sec-fetch-site': 'cross-site' } });
    const second = await owner.client.get('/api/dashboard');
    expect(await lastSeen()).toEqual(before);
    expect(first.body.since).toBe(second.body.since);
    expect(first.body.moves.map((m: { stepId: string }) => m.stepId)).toContain(seed.id);
    expect(second.body.moves.map((m: { stepId: string }) => m.stepId)).toContain(seed.id);

    // A forged visit from another page is refused; the page's own visit marks it.
    const forged = await owner.client.post('/api/dashboard/visit', { seenAt: second.body.asOf }, { headers: { origin: 'http://127.0.0.1:1' } });
    expect(forged.status).toBe(403);
    expect(await lastSeen()).toEqual(before);
    expect((await owner.client.post('/api/dashboard/visit', { seenAt: second.body.asOf })).status).toBe(204);
    expect(new Date((await lastSeen())!).toISOString()).toBe(second.body.asOf);
    expect((await dashboard(owner)).moves.map((m) => m.stepId)).not.toContain(seed.id);
  });

  it('a visit that is not an instant is a 400 naming seenAt; an older one never moves the mark back', async () => {
    const bad = await owner.client.post('/api/dashboard/visit', { seenAt: 'yesterday' });
    expect(bad.status).toBe(400);
    expect(bad.body.fields).toHaveProperty('seenAt');
    const mark = async () => (await db.selectFrom('users').select('last_seen_at').where('id', '=', owner.user.id).executeTakeFirstOrThrow()).last_seen_at;
    const now = await mark();
    expect((await owner.client.post('/api/dashboard/visit', { seenAt: '2020-01-01T00:00:00Z' })).status).toBe(204);
    expect(await mark()).toEqual(now);
  });

  it('names a property whose forecast refresh is failing, to its people only', async () => {
    await recordForecastFailure(gridCellKey(place.latitude, place.longitude), new Date(Date.now() - 3 * 3_600_000), 'test: refresh failing');
    expect((await dashboard(owner)).staleForecasts.map((f) => f.propertyId)).toContain(property.id);
    expect((await dashboard(member)).staleForecasts.map((f) => f.propertyId)).toContain(property.id);
    const strangers = await dashboard(stranger);
    expect(strangers.staleForecasts.map((f) => f.propertyId)).not.toContain(property.id);
    expect(mineIds(strangers)).toEqual([]);
    expect(strangers.germination).toEqual([]);
  });
});
