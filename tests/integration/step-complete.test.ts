// POST /api/steps/[stepId]/complete over real HTTP: a step marked done on its real date re-places the steps that
// follow (the kill wait counts 14 days from the real spray date — the engine's documented default, common practice,
// no source), the move is kept as history by the person who made it, and bad input changes nothing.
// "Today" is the property's local date (America/Chicago here), read through Intl's IANA zone data.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPlanting, getStepRows, listStepMoves } from '@/lib/data/plantings';
import { buildPlantingInput } from '@/lib/planning/input';
import { planPlanting } from '@/lib/schedule/plan';
import { plantingSchema } from '@/lib/validations/planting';
import { testDb } from '../support/db';
import { addMember, createPlot, createProperty, signedInUser, type Client, type TestUser } from '../support/http';

const db = testDb();
let owner: { user: TestUser; client: Client };
let member: { user: TestUser; client: Client };
let plotId: string;

const form = plantingSchema.parse({
  season: 'fall',
  method: 'prepared-seedbed',
  blend: [{ speciesId: 'cereal-rye', share: 1 }],
  targetSeedDate: '2099-09-15',
  herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
  sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
});

/** The local date in a zone, by Intl (the IANA database), independent of the code under test. */
const localToday = (timeZone: string, offsetDays = 0) =>
  new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date(Date.now() + offsetDays * 86_400_000));

async function freshPlanting() {
  const plot = await db.selectFrom('plots').selectAll().where('id', '=', plotId).executeTakeFirstOrThrow();
  const property = await db.selectFrom('properties').selectAll().where('id', '=', plot.property_id).executeTakeFirstOrThrow();
  const plan = planPlanting(buildPlantingInput(property, plot, form), null, new Date());
  const planting = await createPlanting({ plotId, form, plan, createdBy: owner.user.id });
  const steps = await getStepRows(planting.id);
  return { planting, step: (kind: string) => steps.find((s) => s.kind === kind)! };
}

beforeAll(async () => {
  owner = await signedInUser('complete-owner');
  member = await signedInUser('complete-member');
  const property = await createProperty(owner.client, { timeZone: 'America/Chicago' });
  await addMember(owner.client, property.id, member, 'member');
  plotId = (await createPlot(owner.client, property.id)).id;
});

afterAll(async () => {
  await db.destroy();
});

describe('POST /api/steps/[stepId]/complete', () => {
  it('marks the spraying done on its real date and counts the kill wait from it', async () => {
    const p = await freshPlanting();
    const sprayedOn = localToday('America/Chicago', -3);
    const res = await member.client.post(`/api/steps/${p.step('spray').id}/complete`, { status: 'done', date: sprayedOn, notes: 'calm morning' });
    expect(res.status, res.text).toBe(200);
    expect(res.body.step).toMatchObject({ status: 'done', doneOn: sprayedOn, date: sprayedOn, notes: 'calm morning' });
    const killWait = res.body.steps.find((s: { kind: string }) => s.kind === 'kill-wait');
    const expected = new Date(Date.parse(`${sprayedOn}T00:00:00Z`) + 14 * 86_400_000).toISOString().slice(0, 10);
    expect(killWait.date).toBe(expected);

    const row = await db.selectFrom('steps').selectAll().where('id', '=', p.step('spray').id).executeTakeFirstOrThrow();
    expect([row.status, row.done_on, row.done_by]).toEqual(['done', sprayedOn, member.user.id]);
    const sprayMoves = await listStepMoves(row.id);
    expect(sprayMoves.map((m) => [m.from_date, m.to_date, m.moved_by])).toEqual([[p.step('spray').local_date, sprayedOn, member.user.id]]);
    const killMoves = await listStepMoves(p.step('kill-wait').id);
    expect(killMoves.at(-1)).toMatchObject({ from_date: p.step('kill-wait').local_date, to_date: expected, moved_by: member.user.id });
    expect(killMoves.at(-1)!.reason).toMatch(/kill wait/);
  });

  it('defaults the date to today in the property’s zone', async () => {
    const p = await freshPlanting();
    const res = await owner.client.post(`/api/steps/${p.step('spray').id}/complete`, { status: 'done' });
    expect(res.status, res.text).toBe(200);
    // Around local midnight the two reads may straddle the day; either side of it is today.
    expect([localToday('America/Chicago', 0), localToday('America/Chicago', -1 / 24)]).toContain(res.body.step.doneOn);
  });

  it('a skipped spraying leaves no kill wait to count', async () => {
    const p = await freshPlanting();
    const res = await member.client.post(`/api/steps/${p.step('spray').id}/complete`, { status: 'skipped' });
    expect(res.status, res.text).toBe(200);
    expect(res.body.step).toMatchObject({ status: 'skipped', doneOn: null });
    expect(res.body.steps.find((s: { kind: string }) => s.kind === 'kill-wait').reason).toMatch(/skipped/);
  });

  it('refuses a date after today, a status it does not know and fields it does not take — and changes nothing', async () => {
    const p = await freshPlanting();
    const id = p.step('spray').id;
    const before = await getStepRows(p.planting.id);
    const future = await member.client.post(`/api/steps/${id}/complete`, { status: 'done', date: localToday('America/Chicago', 2) });
    expect(future.status).toBe(400);
    expect(future.body.fields.date).toMatch(/after today/);
    const status = await member.client.post(`/api/steps/${id}/complete`, { status: 'finished' });
    expect(status.status).toBe(400);
    expect(status.body.fields.status).toMatch(/done or skipped/);
    const date = await member.client.post(`/api/steps/${id}/complete`, { status: 'done', date: '2027-02-30' });
    expect(date.status).toBe(400);
    expect(date.body.fields.date).toMatch(/real date/);
    const extra = await member.client.post(`/api/steps/${id}/complete`, { status: 'done', assignee: 'me' });
    expect(extra.status).toBe(400);
    expect(await getStepRows(p.planting.id)).toEqual(before);
    expect(await listStepMoves(id)).toEqual([]);
  });

  it('an unknown step is 404, like a step of a property one is not in', async () => {
    const res = await member.client.post('/api/steps/00000000-0000-4000-8000-000000000000/complete', { status: 'done' });
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: 'Not found' });
  });
});
