// GET /api/calendar over real HTTP: who sees what (the role matrix: members of a property, any role, see its
// plots; nobody sees another property's), the range asked, each property's own local dates (checked against
// the IANA zone data through Intl), and recurring upkeep expanded per RFC 5545 (checked with the rrule library).
import * as rruleModule from 'rrule';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { addMember, createPlot, createProperty, signedInUser, type Client, type TestUser } from '../support/http';

const { rrulestr } = ((rruleModule as unknown as { default?: typeof rruleModule }).default ?? rruleModule) as typeof rruleModule;

type Person = { user: TestUser; client: Client };
const db = testDb();
let ownerA: Person, ownerB: Person, viewerA: Person, memberA: Person, both: Person;
let propertyA: { id: string; name: string }, propertyB: { id: string; name: string };
let plotA: { id: string; name: string }, plotB: { id: string; name: string };
let plantingA: { id: string }, plantingB: { id: string };

const FALL_CLOVER = {
  season: 'fall',
  method: 'spray-and-seed',
  blend: [{ speciesId: 'white-clover', share: 1 }],
  targetSeedDate: '2027-09-10',
  herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
  sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
  upkeep: true,
};

/** UTC offset (minutes) of a zone at an instant, read from Intl's IANA data, independent of the code under test. */
function offsetMinutes(timeZone: string, instant: Date): number {
  const parts = new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'longOffset' }).formatToParts(instant);
  const name = parts.find((p) => p.type === 'timeZoneName')!.value; // 'GMT-06:00'
  const m = /GMT([+-])(\d{2}):(\d{2})/.exec(name);
  return m ? (m[1] === '-' ? -1 : 1) * (Number(m[2]) * 60 + Number(m[3])) : 0;
}

async function plant(client: Client, plotId: string) {
  const res = await client.post(`/api/plots/${plotId}/plantings`, FALL_CLOVER);
  if (res.status !== 201) throw new Error(`planting answered ${res.status}: ${res.text}`);
  return res.body.planting as { id: string };
}

const calendar = (p: Person, query: string) => p.client.get(`/api/calendar?${query}`);

beforeAll(async () => {
  [ownerA, ownerB, viewerA, memberA, both] = await Promise.all(['cal-owner-a', 'cal-owner-b', 'cal-viewer', 'cal-member', 'cal-both'].map((p) => signedInUser(p)));
  propertyA = await createProperty(ownerA.client, { timeZone: 'America/Chicago', avgFirstFallFrost: '10-20' });
  propertyB = await createProperty(ownerB.client, { timeZone: 'America/Denver', latitude: 40.1, longitude: -105.2 });
  plotA = await createPlot(ownerA.client, propertyA.id);
  plotB = await createPlot(ownerB.client, propertyB.id);
  await addMember(ownerA.client, propertyA.id, viewerA, 'viewer');
  await addMember(ownerA.client, propertyA.id, memberA, 'member');
  await addMember(ownerA.client, propertyA.id, both, 'viewer');
  await addMember(ownerB.client, propertyB.id, both, 'manager');
  plantingA = await plant(ownerA.client, plotA.id);
  plantingB = await plant(ownerB.client, plotB.id);
});

afterAll(async () => {
  await db.destroy();
});

describe('GET /api/calendar', () => {
  it('shows each person only the plots of properties they belong to, across properties', async () => {
    const range = 'from=2027-06-01&to=2027-12-31';
    const plotsOf = async (p: Person) => new Set((await calendar(p, range)).body.events.map((e: { plotId: string }) => e.plotId));
    expect(await plotsOf(ownerA)).toEqual(new Set([plotA.id]));
    expect(await plotsOf(viewerA)).toEqual(new Set([plotA.id]));
    expect(await plotsOf(ownerB)).toEqual(new Set([plotB.id]));
    expect(await plotsOf(both)).toEqual(new Set([plotA.id, plotB.id]));
    const stranger = await signedInUser('cal-stranger');
    expect((await calendar(stranger, range)).body.events).toEqual([]);
    // Filtering by a property one does not belong to yields nothing, not an error.
    const sneaky = await calendar(ownerA, `${range}&property=${propertyB.id}`);
    expect([sneaky.status, sneaky.body.events]).toEqual([200, []]);
  });

  it('labels every event with plot and step and returns exactly the stored steps in the range', async () => {
    const res = await calendar(ownerA, 'from=2027-06-01&to=2027-12-31');
    expect(res.status, res.text).toBe(200);
    const rows = await db
      .selectFrom('steps')
      .select(['id', 'local_date', 'title', 'kind'])
      .where('planting_id', '=', plantingA.id)
      .where('recurrence', 'is', null)
      .where('local_date', '>=', '2027-06-01')
      .where('local_date', '<=', '2027-12-31')
      .execute();
    const single = res.body.events.filter((e: { recurring?: boolean }) => !e.recurring);
    expect(single.map((e: { id: string }) => e.id).sort()).toEqual(rows.map((r) => r.id).sort());
    for (const e of single) {
      const row = rows.find((r) => r.id === e.id)!;
      expect(e).toMatchObject({ stepId: row.id, start: row.local_date, allDay: true, kind: row.kind, title: `${plotA.name} · ${row.title}`, propertyName: propertyA.name, timeZone: 'America/Chicago' });
    }
    // A narrower range leaves out what is outside it.
    const seedDate = rows.find((r) => r.kind === 'seed')!.local_date;
    const narrow = await calendar(ownerA, `from=${seedDate}&to=${seedDate}`);
    expect(narrow.body.events.every((e: { start: string }) => e.start === seedDate)).toBe(true);
    expect(narrow.body.events.map((e: { kind: string }) => e.kind)).toContain('seed');
  });

  it('keeps the property’s local date on the day clocks change (2027-03-14 in America/Chicago)', async () => {
    // IANA via Intl: US daylight time starts the second Sunday of March, 2027-03-14; the offset changes that day.
    expect(offsetMinutes('America/Chicago', new Date('2027-03-14T06:00:00Z'))).toBe(-360);
    expect(offsetMinutes('America/Chicago', new Date('2027-03-14T18:00:00Z'))).toBe(-300);
    const step = await db.selectFrom('steps').select('id').where('planting_id', '=', plantingA.id).where('kind', '=', 'spray').executeTakeFirstOrThrow();
    await db.updateTable('steps').set({ local_date: '2027-03-14' }).where('id', '=', step.id).execute();
    const res = await calendar(ownerA, 'from=2027-03-14&to=2027-03-14');
    expect(res.body.events.map((e: { id: string; start: string }) => [e.id, e.start])).toEqual([[step.id, '2027-03-14']]);
    expect((await calendar(ownerA, 'from=2027-03-15&to=2027-03-20')).body.events.map((e: { id: string }) => e.id)).not.toContain(step.id);
  });

  it('expands recurring upkeep into its occurrences within the range (RFC 5545, via rrule)', async () => {
    const rows = await db.selectFrom('steps').select(['id', 'recurrence']).where('planting_id', '=', plantingA.id).where('recurrence', 'is not', null).execute();
    expect(rows.length).toBeGreaterThan(0);
    const from = '2028-01-01';
    const to = '2028-12-31';
    const res = await calendar(ownerA, `from=${from}&to=${to}`);
    for (const row of rows) {
      // The recurrence's wall-clock dates: DTSTART's TZID is dropped so rrule counts in floating local time.
      const floating = row.recurrence!.replace(/DTSTART;TZID=[^:]+:/, 'DTSTART:');
      const rule = rrulestr(floating);
      const expected = rule.between(new Date(`${from}T00:00:00Z`), new Date(`${to}T23:59:59Z`), true).map((d) => d.toISOString().slice(0, 10));
      const got = res.body.events.filter((e: { stepId: string }) => e.stepId === row.id);
      expect(got.map((e: { start: string }) => e.start)).toEqual(expected);
      for (const e of got) expect(e).toMatchObject({ id: `${row.id}:${e.start}`, recurring: true, recurrence: row.recurrence, canMove: false });
    }
    expect(res.body.events.some((e: { recurring?: boolean }) => e.recurring)).toBe(true);
  });

  it('filters by plot, kind and assignee, and says who may drag what', async () => {
    const range = 'from=2027-06-01&to=2027-12-31';
    const seeds = await calendar(both, `${range}&kind=seed`);
    expect(seeds.body.events.length).toBe(2);
    expect(seeds.body.events.every((e: { kind: string }) => e.kind === 'seed')).toBe(true);
    const onlyB = await calendar(both, `${range}&plot=${plotB.id}`);
    expect(onlyB.body.events.every((e: { plotId: string }) => e.plotId === plotB.id)).toBe(true);
    // Viewer on A, manager on B: drags only B's planned steps.
    for (const e of (await calendar(both, range)).body.events) {
      expect(e.canMove, `${e.plotName} ${e.kind}`).toBe(e.plotId === plotB.id && e.status === 'planned' && !e.recurring);
    }
    const seedA = seeds.body.events.find((e: { plotId: string }) => e.plotId === plotA.id);
    expect((await ownerA.client.patch(`/api/steps/${seedA.stepId}`, { assigneeId: memberA.user.id })).status).toBe(200);
    const mine = await calendar(memberA, `${range}&assignee=${memberA.user.id}`);
    expect(mine.body.events.map((e: { stepId: string; canMove: boolean; assigneeName: string }) => [e.stepId, e.canMove, e.assigneeName])).toEqual([[seedA.stepId, true, memberA.user.name]]);
    const others = (await calendar(memberA, range)).body.events.filter((e: { stepId: string }) => e.stepId !== seedA.stepId);
    expect(others.every((e: { canMove: boolean }) => !e.canMove)).toBe(true);
  });

  it('lists a day’s steps in the plan’s order, not by title', async () => {
    // A prepared seedbed on tilled ground, with a split lime rate, a cover pass and fertilizer: the second half of
    // the lime and the fertilizer go down, the final seedbed pass works them in, the seed is broadcast and
    // covered, all on one day (the method's order, lib/schedule/methods.ts; Virginia Cooperative Extension
    // 452-703 splits lime above 2 t/acre, the second half disked in; the first half goes on months ahead). By
    // title the day would read Broadcast seed, Cover the seed, Fertilize, Lime, Rake or till.
    // A property of its own, so the other checks' counts on property A stay as they are.
    const property = await createProperty(ownerA.client, { timeZone: 'America/Chicago' });
    const plot = await createPlot(ownerA.client, property.id, { cover: 'tilled' });
    const res = await ownerA.client.post(`/api/plots/${plot.id}/plantings`, {
      season: 'fall',
      method: 'prepared-seedbed',
      blend: [{ speciesId: 'white-clover', share: 1 }],
      targetSeedDate: '2027-09-08',
      coverSeed: true,
      lime: { tonsPerAcre: 3 },
      fertilizer: { grade: [13, 13, 13], target: { n: 20 } },
    });
    expect(res.status, res.text).toBe(201);
    const planned = res.body.steps as { id: string; kind: string; date: string }[];
    const seedDay = planned.find((s) => s.kind === 'seed')!.date;
    const sameDay = planned.filter((s) => s.date === seedDay);
    expect(sameDay.map((s) => s.kind)).toEqual(['lime', 'fertilize', 'rake-till', 'seed', 'cover-seed']);

    const events = (await calendar(ownerA, `from=${seedDay}&to=${seedDay}&plot=${plot.id}`)).body.events as { stepId: string; title: string; order: number; plantingId: string }[];
    expect(events.map((e) => e.stepId)).toEqual(sameDay.map((s) => s.id));
    expect(events.map((e) => e.title).sort()).not.toEqual(events.map((e) => e.title)); // title order would differ
    expect(new Set(events.map((e) => e.plantingId))).toEqual(new Set([res.body.planting.id]));
    // The order field is the stored position: increasing through the day, the way FullCalendar's eventOrder reads it.
    const positions = await db.selectFrom('steps').select(['id', 'position']).where('planting_id', '=', res.body.planting.id).execute();
    expect(events.map((e) => e.order)).toEqual(sameDay.map((s) => positions.find((p) => p.id === s.id)!.position));
    expect([...events.map((e) => e.order)].sort((a, b) => a - b)).toEqual(events.map((e) => e.order));
  });

  it('refuses a missing, reversed, too long or malformed range, naming the field', async () => {
    const cases: [string, string][] = [
      ['to=2027-01-31', 'from'],
      ['from=2027-01-01', 'to'],
      ['from=2027-02-30&to=2027-03-01', 'from'],
      ['from=2027-03-01&to=2027-02-01', 'to'],
      ['from=2027-01-01&to=2028-03-01', 'to'],
      ['from=2027-01-01&to=2027-02-01&kind=harvest', 'kind'],
      ['from=2027-01-01&to=2027-02-01&property=nope', 'property'],
    ];
    for (const [query, field] of cases) {
      const res = await calendar(ownerA, query);
      expect(res.status, query).toBe(400);
      expect(Object.keys(res.body.fields), query).toContain(field);
    }
    expect((await calendar(ownerA, 'from=2027-01-01&to=2028-02-05')).status).toBe(200); // 400 days
  });
});
