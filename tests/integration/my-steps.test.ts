// GET /api/my-steps and the field side of POST /api/steps/[stepId]/complete, over real HTTP:
// - the list holds the steps assigned to the person and the unassigned ones of properties where they are
//   member or more (DEVELOPERS.md, "Access control": a viewer does no work), nothing of a property they are not in;
// - each step is placed by its own property's today: "today" is read here with Intl's IANA zone data
//   (ECMA-402), independently of the code under test, in zones 25 hours apart (UTC+14 and UTC−11);
// - a repeat of the same completion (an offline queue retrying) is answered as done and writes nothing;
// - the seed actually broadcast is stored in steps.done_record; the moment it was done in steps.done_at;
// - the engine counts from the real dates: the kill wait 14 days from the real spray date (the engine's
//   documented default, common practice, no source) and the germination check from the real seeding date.
import { randomInt } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPlanting, getStepRows, listStepMoves } from '@/lib/data/plantings';
import { buildPlantingInput } from '@/lib/planning/input';
import { planPlanting } from '@/lib/schedule/plan';
import { plantingSchema } from '@/lib/validations/planting';
import { testDb } from '../support/db';
import { addMember, createPlot, createProperty, signedInUser, type Client, type TestUser } from '../support/http';

const db = testDb();
type Person = { user: TestUser; client: Client };
let owner: Person;
let me: Person;
let other: Person;
let east: { id: string; plotId: string }; // Pacific/Kiritimati, UTC+14: I am a member
let west: { id: string; plotId: string }; // Pacific/Pago_Pago, UTC−11: I am a member
let watched: { id: string; plotId: string }; // I am only a viewer
let foreign: { id: string; plotId: string }; // not mine at all

const localToday = (timeZone: string, offsetDays = 0) =>
  new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date(Date.now() + offsetDays * 86_400_000));
/** A civil date plus days (UTC arithmetic on the date alone, no zone involved). */
const plusDays = (date: string, days: number) => new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);

const sprayForm = plantingSchema.parse({
  season: 'fall',
  method: 'prepared-seedbed',
  blend: [{ speciesId: 'cereal-rye', share: 1 }],
  targetSeedDate: '2099-09-15',
  herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
  sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
});
const seedForm = plantingSchema.parse({
  season: 'fall',
  method: 'prepared-seedbed',
  blend: [{ speciesId: 'cereal-rye', share: 0.6 }, { speciesId: 'crimson-clover', share: 0.4 }],
  targetSeedDate: '2099-09-15',
});
/** Spray-and-seed: the germination check follows the seeding itself (no covering step between). */
const germForm = plantingSchema.parse({ ...seedForm, method: 'spray-and-seed', herbicide: sprayForm.herbicide, sprayer: sprayForm.sprayer });

/** A stored planting (as the planner stores one); its steps by kind. */
async function planting(plotId: string, form = sprayForm) {
  const plot = await db.selectFrom('plots').selectAll().where('id', '=', plotId).executeTakeFirstOrThrow();
  const property = await db.selectFrom('properties').selectAll().where('id', '=', plot.property_id).executeTakeFirstOrThrow();
  const plan = planPlanting(buildPlantingInput(property, plot, form), null, new Date());
  const saved = await createPlanting({ plotId, form, plan, createdBy: owner.user.id });
  const steps = await getStepRows(saved.id);
  return { id: saved.id, steps, step: (kind: string) => steps.find((s) => s.kind === kind)! };
}

/** Puts a step on a local date with an assignee, as a manager would. */
async function place(stepId: string, date: string, assigneeId: string | null) {
  await db.updateTable('steps').set({ local_date: date, window_start: null, window_end: null, assignee_id: assigneeId, recurrence: null }).where('id', '=', stepId).execute();
}

/** A place of its own (no forecast stored for its 0.1° cell), so the engine works from the real dates alone. */
const lonely = () => ({ latitude: 44 + randomInt(0, 900) / 1000, longitude: -101 - randomInt(0, 900) / 1000 });

async function ground(timeZone: string) {
  const property = await createProperty(owner.client, { timeZone, ...lonely() });
  const plot = await createPlot(owner.client, property.id);
  return { id: property.id, plotId: plot.id };
}

beforeAll(async () => {
  owner = await signedInUser('mysteps-owner');
  me = await signedInUser('mysteps-me');
  other = await signedInUser('mysteps-other');
  east = await ground('Pacific/Kiritimati');
  west = await ground('Pacific/Pago_Pago');
  watched = await ground('America/Chicago');
  for (const p of [east, west]) {
    await addMember(owner.client, p.id, me, 'member');
    await addMember(owner.client, p.id, other, 'member');
  }
  await addMember(owner.client, watched.id, me, 'viewer');
  const stranger = await signedInUser('mysteps-stranger');
  foreign = { id: (await createProperty(stranger.client, lonely())).id, plotId: '' };
  foreign.plotId = (await createPlot(stranger.client, foreign.id)).id;
});

afterAll(async () => {
  await db.destroy();
});

interface Listed {
  stepId: string;
  group: string;
  date: string;
  today: string;
  inDays: number;
  canComplete: boolean;
  propertyId: string;
  cautions: unknown[];
  quantities: { detail: string }[];
}

async function myList(person: Person = me): Promise<Listed[]> {
  const res = await person.client.get('/api/my-steps');
  expect(res.status, res.text).toBe(200);
  expect(res.body.userId).toBe(person.user.id);
  return res.body.steps;
}

describe('GET /api/my-steps', () => {
  it('lists my steps and the unassigned ones where I may work — not others’, not a viewer’s, not a stranger’s', async () => {
    const a = await planting(east.plotId);
    const eastToday = localToday('Pacific/Kiritimati');
    await place(a.step('spray').id, eastToday, me.user.id);
    await place(a.step('rake-till').id, eastToday, null);
    await place(a.step('seed').id, eastToday, other.user.id);
    const v = await planting(watched.plotId);
    await place(v.step('spray').id, localToday('America/Chicago'), null);
    const f = await planting(foreign.plotId);
    await place(f.step('spray').id, localToday('America/Chicago'), null);

    const ids = (await myList()).map((s) => s.stepId);
    expect(ids).toContain(a.step('spray').id);
    expect(ids).toContain(a.step('rake-till').id);
    expect(ids).not.toContain(a.step('seed').id);
    expect(ids).not.toContain(v.step('spray').id);
    expect(ids).not.toContain(f.step('spray').id);
    // The other member sees the one given to them and the unassigned one, not mine.
    const theirs = (await myList(other)).map((s) => s.stepId);
    expect(theirs).toEqual(expect.arrayContaining([a.step('seed').id, a.step('rake-till').id]));
    expect(theirs).not.toContain(a.step('spray').id);
  });

  it('places each step by its own property’s today, 25 hours apart; overdue first; nothing past 14 days', async () => {
    const e = await planting(east.plotId);
    const w = await planting(west.plotId);
    const eastToday = localToday('Pacific/Kiritimati');
    const westToday = localToday('Pacific/Pago_Pago');
    await place(e.step('spray').id, eastToday, me.user.id);
    await place(e.step('rake-till').id, plusDays(eastToday, 1), me.user.id);
    await place(e.step('seed').id, plusDays(eastToday, -2), me.user.id);
    await place(e.step('cover-seed').id, plusDays(eastToday, 10), me.user.id);
    await place(w.step('spray').id, westToday, me.user.id);
    await place(w.step('rake-till').id, plusDays(westToday, 5), me.user.id);
    await place(w.step('seed').id, plusDays(westToday, 15), me.user.id);

    const list = await myList();
    const of = (id: string) => list.find((s) => s.stepId === id);
    expect(of(e.step('spray').id)).toMatchObject({ group: 'today', date: eastToday, today: eastToday, inDays: 0, canComplete: true });
    expect(of(w.step('spray').id)).toMatchObject({ group: 'today', date: westToday, today: westToday, inDays: 0 });
    // The two "todays" are different calendar days at the same instant (UTC+14 and UTC−11 are 25 h apart).
    expect(eastToday).not.toBe(westToday);
    expect(of(e.step('rake-till').id)).toMatchObject({ group: 'tomorrow', inDays: 1 });
    expect(of(e.step('seed').id)).toMatchObject({ group: 'overdue', inDays: -2 });
    expect(of(e.step('cover-seed').id)).toMatchObject({ group: 'later', inDays: 10 });
    expect(of(w.step('rake-till').id)).toMatchObject({ group: 'this-week', inDays: 5 });
    expect(of(w.step('seed').id)).toBeUndefined();
    // Overdue comes first.
    expect(list[0].group).toBe('overdue');
    // What to carry and the herbicide cautions travel with the spray step.
    expect(of(e.step('spray').id)!.quantities.map((q) => q.detail).join(' ')).toMatch(/fl oz of Generic glyphosate/);
    expect(JSON.stringify(of(e.step('spray').id)!.cautions)).toMatch(/label is the law/);
  });
});

describe('completing a step from the field', () => {
  it('answers a repeat of the same completion as done and writes nothing more', async () => {
    const p = await planting(east.plotId);
    const id = p.step('spray').id;
    const date = localToday('Pacific/Kiritimati', -1);
    const body = { status: 'done', date, doneAt: new Date(Date.parse(`${date}T08:30:00+14:00`)).toISOString(), notes: 'sent from the queue' };
    const first = await me.client.post(`/api/steps/${id}/complete`, body);
    expect(first.status, first.text).toBe(200);
    expect(first.body.repeated).toBe(false);
    const rowBefore = await db.selectFrom('steps').selectAll().where('id', '=', id).executeTakeFirstOrThrow();
    const movesBefore = await db.selectFrom('step_moves').selectAll().where('step_id', 'in', p.steps.map((s) => s.id)).execute();

    const again = await me.client.post(`/api/steps/${id}/complete`, body);
    expect(again.status, again.text).toBe(200);
    expect(again.body.repeated).toBe(true);
    expect(again.body.step).toMatchObject({ status: 'done', doneOn: date });
    expect(await db.selectFrom('steps').selectAll().where('id', '=', id).executeTakeFirstOrThrow()).toEqual(rowBefore);
    expect(await db.selectFrom('step_moves').selectAll().where('step_id', 'in', p.steps.map((s) => s.id)).execute()).toEqual(movesBefore);
    // The moment it was done is the one given, 08:30 at UTC+14 (RFC 3339 offset), not the moment it arrived.
    expect(new Date(rowBefore.done_at!).toISOString()).toBe(`${plusDays(date, -1)}T18:30:00.000Z`);
  });

  it('a different date is a new outcome, not a repeat', async () => {
    const p = await planting(east.plotId);
    const id = p.step('spray').id;
    await me.client.post(`/api/steps/${id}/complete`, { status: 'done', date: localToday('Pacific/Kiritimati', -2) });
    const res = await me.client.post(`/api/steps/${id}/complete`, { status: 'done', date: localToday('Pacific/Kiritimati', -1) });
    expect(res.status, res.text).toBe(200);
    expect(res.body.repeated).toBe(false);
    expect(res.body.step.doneOn).toBe(localToday('Pacific/Kiritimati', -1));
  });

  it('stores the seed actually broadcast, per species, in done_record', async () => {
    const p = await planting(east.plotId, seedForm);
    const id = p.step('seed').id;
    const record = { seedLb: 42.5, species: [{ speciesId: 'cereal-rye', lb: 30 }, { speciesId: 'crimson-clover', lb: 12.5 }] };
    const res = await me.client.post(`/api/steps/${id}/complete`, { status: 'done', record });
    expect(res.status, res.text).toBe(200);
    expect(res.body.record).toEqual(record);
    const row = await db.selectFrom('steps').select(['done_record', 'done_by']).where('id', '=', id).executeTakeFirstOrThrow();
    expect(row).toEqual({ done_record: record, done_by: me.user.id });
  });

  it('refuses a record that does not fit, a time in the future or on another day — and changes nothing', async () => {
    const p = await planting(east.plotId, seedForm);
    const before = await getStepRows(p.id);
    const zone = 'Pacific/Kiritimati';
    const cases: [string, Record<string, unknown>, string, RegExp][] = [
      [p.step('spray')?.id ?? p.step('rake-till').id, { status: 'done', record: { seedLb: 10 } }, 'record', /Only a seeding/],
      [p.step('seed').id, { status: 'skipped', record: { seedLb: 10 } }, 'record', /was done/],
      [p.step('seed').id, { status: 'done', record: { seedLb: 0 } }, 'record.seedLb', /more than 0 lb/],
      [p.step('seed').id, { status: 'done', record: { seedLb: 40, species: [{ speciesId: 'cereal-rye', lb: 10 }] } }, 'record.species', /add up to 10 lb/],
      [p.step('seed').id, { status: 'done', record: { seedLb: 10, species: [{ speciesId: 'kudzu', lb: 10 }] } }, 'record.species.0.speciesId', /not in the catalog/],
      [p.step('seed').id, { status: 'done', doneAt: new Date(Date.now() + 3_600_000).toISOString() }, 'doneAt', /cannot be after now/],
      [p.step('seed').id, { status: 'done', date: localToday(zone, -3), doneAt: new Date().toISOString() }, 'doneAt', /falls on/],
      [p.step('seed').id, { status: 'done', doneAt: 'yesterday morning' }, 'doneAt', /date and time with its offset/],
    ];
    for (const [id, body, field, message] of cases) {
      const res = await me.client.post(`/api/steps/${id}/complete`, body);
      expect(res.status, `${JSON.stringify(body)} → ${res.text}`).toBe(400);
      expect(res.body.fields[field], JSON.stringify(res.body)).toMatch(message);
    }
    expect(await getStepRows(p.id)).toEqual(before);
  });

  it('the kill wait counts from the real spray date and the germination check from the real seeding date', async () => {
    const zone = 'Pacific/Pago_Pago';
    // Kill wait: the same planting sprayed on two different real dates puts the end of the wait 14 days after each.
    for (const daysAgo of [1, 4]) {
      const p = await planting(west.plotId);
      const sprayedOn = localToday(zone, -daysAgo);
      const res = await me.client.post(`/api/steps/${p.step('spray').id}/complete`, { status: 'done', date: sprayedOn });
      expect(res.status, res.text).toBe(200);
      expect(res.body.steps.find((s: { kind: string }) => s.kind === 'kill-wait').date).toBe(plusDays(sprayedOn, 14));
    }
    // Germination check: without a stored forecast the wait after seeding is the blend's own; seeded on two real
    // dates two days apart, the check lands the same number of days after each — it follows the real date.
    const gaps: number[] = [];
    for (const daysAgo of [1, 3]) {
      const p = await planting(west.plotId, germForm);
      const seededOn = localToday(zone, -daysAgo);
      const planned = p.step('check-germination').local_date;
      const res = await me.client.post(`/api/steps/${p.step('seed').id}/complete`, { status: 'done', date: seededOn });
      expect(res.status, res.text).toBe(200);
      const check = res.body.steps.find((s: { kind: string }) => s.kind === 'check-germination');
      expect(check.date > seededOn).toBe(true);
      expect(check.date).not.toBe(planned);
      gaps.push((Date.parse(check.date) - Date.parse(seededOn)) / 86_400_000);
      const moves = await listStepMoves(p.step('check-germination').id);
      expect(moves.at(-1)).toMatchObject({ to_date: check.date, moved_by: me.user.id });
    }
    expect(gaps[0]).toBe(gaps[1]);
  });
});
