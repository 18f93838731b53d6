// The plantings routes and the what-if comparison over real HTTP: a planting is saved with its steps through the
// engine, listed and read back; bad input answers 400 naming the field and writes nothing. The frost margin is
// checked against dates worked by hand: average first fall frost 2027-10-20 less white clover's 8 weeks (the
// species catalog's sourced value) is 2027-08-25.
import { randomInt } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { addMember, createPlot, createProperty, signedInUser, type Client, type TestUser } from '../support/http';

type Person = { user: TestUser; client: Client };
const db = testDb();
let owner: Person, member: Person;
let plotId: string;
let property: { id: string };

const BODY = {
  season: 'fall',
  method: 'prepared-seedbed',
  blend: [{ speciesId: 'white-clover', share: 1 }],
  targetSeedDate: '2027-08-20',
  herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
  sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
};

const plantingCount = async () =>
  Number((await db.selectFrom('plantings').select((eb) => eb.fn.countAll<number>().as('n')).where('plot_id', '=', plotId).executeTakeFirstOrThrow()).n);

beforeAll(async () => {
  owner = await signedInUser('plantings-owner');
  member = await signedInUser('plantings-member');
  property = await createProperty(owner.client, {
    // A grid cell of its own, so no other test's stored forecast reaches this property.
    latitude: 40 + randomInt(0, 800) / 100,
    longitude: -(100 + randomInt(0, 2000) / 100),
    timeZone: 'America/Chicago',
    avgFirstFallFrost: '10-20',
  });
  await addMember(owner.client, property.id, member, 'member');
  plotId = (await createPlot(owner.client, property.id)).id;
});

afterAll(async () => {
  await db.destroy();
});

describe('plantings', () => {
  it('are saved with their steps, listed with the plot and read back one by one', async () => {
    const created = await owner.client.post(`/api/plots/${plotId}/plantings`, BODY);
    expect(created.status, created.text).toBe(201);
    expect(created.body.planting).toMatchObject({ plotId, season: 'fall', method: 'prepared-seedbed', targetSeedDate: '2027-08-20', createdBy: owner.user.id });
    const kinds = created.body.steps.map((s: { kind: string }) => s.kind);
    expect(kinds).toEqual(expect.arrayContaining(['spray', 'kill-wait', 'rake-till', 'seed', 'check-germination']));
    const rows = await db.selectFrom('steps').select(['id', 'local_date']).where('planting_id', '=', created.body.planting.id).execute();
    expect(rows.map((r) => r.id).sort()).toEqual(created.body.steps.map((s: { id: string }) => s.id).sort());

    const list = await member.client.get(`/api/plots/${plotId}/plantings`);
    expect(list.status).toBe(200);
    const listed = list.body.plantings.find((p: { id: string }) => p.id === created.body.planting.id);
    expect(listed.steps.map((s: { id: string }) => s.id)).toEqual(created.body.steps.map((s: { id: string }) => s.id));

    const one = await member.client.get(`/api/plantings/${created.body.planting.id}`);
    expect(one.status).toBe(200);
    expect(one.body.steps.length).toBe(rows.length);
    expect(Array.isArray(one.body.warnings)).toBe(true);
  });

  it('refuse bad input with 400 naming the field, and write nothing', async () => {
    const before = await plantingCount();
    const cases: [Record<string, unknown>, string][] = [
      [{ ...BODY, blend: [] }, 'blend'],
      [{ ...BODY, blend: [{ speciesId: 'kudzu', share: 1 }] }, 'blend.0.speciesId'],
      [{ ...BODY, targetSeedDate: '2027-02-30' }, 'targetSeedDate'],
      [{ ...BODY, sprayer: null }, 'sprayer'],
      [{ ...BODY, method: 'hydroseed' }, 'method'],
    ];
    for (const [body, field] of cases) {
      const res = await owner.client.post(`/api/plots/${plotId}/plantings`, body);
      expect(res.status, field).toBe(400);
      expect(Object.keys(res.body.fields), field).toContain(field);
    }
    expect(await plantingCount()).toBe(before);
    // A member may plan on paper but not save.
    expect((await member.client.post(`/api/plots/${plotId}/plantings`, BODY)).status).toBe(403);
    expect(await plantingCount()).toBe(before);
  });

  it('are removed with their steps by a manager', async () => {
    const created = await owner.client.post(`/api/plots/${plotId}/plantings`, BODY);
    const id = created.body.planting.id;
    expect((await member.client.delete(`/api/plantings/${id}`)).status).toBe(403);
    expect((await owner.client.delete(`/api/plantings/${id}`)).status).toBe(204);
    expect((await owner.client.get(`/api/plantings/${id}`)).status).toBe(404);
    expect(await db.selectFrom('steps').select('id').where('planting_id', '=', id).execute()).toEqual([]);
  });
});

describe('POST /api/plots/[plotId]/plan/compare', () => {
  it('judges each seeding date with the engine: frost margin, emergence, rules', async () => {
    const before = await plantingCount();
    const res = await member.client.post(`/api/plots/${plotId}/plan/compare`, { planting: BODY, seedDates: ['2027-08-20', '2027-09-15'] });
    expect(res.status, res.text).toBe(200);
    const [early, late] = res.body.options;
    // White clover needs about 56 days before a hard freeze (lib/agronomy/growing-days.ts), estimated as the first
    // frost + 14 days (FROST_DEADLINE_SOURCES). By hand: 2027-10-20 + 14 − 56 = 2027-09-08, 19 days after 2027-08-20;
    // 2027-09-15 is 7 days past it. (Before issue 11 the limit was a fixed 8 weeks before the first frost, 25 Aug.)
    expect(early.frost).toMatchObject({ limitDate: '2027-09-08', frostDate: '2027-10-20', growingDaysNeeded: 56, weeksNeeded: 8, marginDays: 19 });
    expect(late.frost.marginDays).toBe(-7);
    expect(early.decisions.find((d: { rule: string }) => d.rule === 'frost-deadline').ok).toBe(true);
    expect(late.decisions.find((d: { rule: string }) => d.rule === 'frost-deadline').ok).toBe(false);
    expect([early.ok, late.ok]).toEqual([true, false]);

    // With the property's own hard-freeze date, hardy white clover counts to it instead of the estimate:
    // 2027-11-24 − 56 days = 2027-09-29, so 2027-09-15 now has 14 days to spare and 2027-09-30 is a day late, by hand.
    expect((await owner.client.patch(`/api/properties/${property.id}`, { avgFirstHardFreeze: '11-24' })).status).toBe(200);
    const recorded = await member.client.post(`/api/plots/${plotId}/plan/compare`, { planting: BODY, seedDates: ['2027-09-15', '2027-09-30'] });
    expect(recorded.status, recorded.text).toBe(200);
    expect(recorded.body.options.map((o: { frost: { limitDate: string; marginDays: number } }) => [o.frost.limitDate, o.frost.marginDays])).toEqual([
      ['2027-09-29', 14],
      ['2027-09-29', -1],
    ]);
    expect((await owner.client.patch(`/api/properties/${property.id}`, { avgFirstHardFreeze: '' })).status).toBe(200);
    for (const o of res.body.options) {
      expect(o.germination.daysToEmergence).toBeGreaterThan(0);
      expect(o.germination.emergenceDate > o.seedDate).toBe(true);
      // No stored forecast for this place: no moisture outlook to give.
      expect(o.moisture).toBeNull();
    }
    expect(await plantingCount()).toBe(before);
  });

  it('asks for two or three distinct dates', async () => {
    for (const seedDates of [['2027-08-20'], ['2027-08-20', '2027-08-21', '2027-08-22', '2027-08-23'], ['2027-08-20', '2027-08-20']]) {
      const res = await member.client.post(`/api/plots/${plotId}/plan/compare`, { planting: BODY, seedDates });
      expect([res.status, Object.keys(res.body.fields)]).toEqual([400, ['seedDates']]);
    }
  });
});
