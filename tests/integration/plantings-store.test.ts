// lib/data/plantings.ts against real PostgreSQL: a plan saved and loaded back is the same plan, and a
// replan writes its moves as history while done steps keep their record.
import { Kysely, PostgresDialect } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPool } from '@/db';
import type { Database } from '@/db/database';
import { createPlanting, getStepRows, listStepMoves, loadPlan, saveReplan } from '@/lib/data/plantings';
import { buildPlantingInput } from '@/lib/planning/input';
import { planPlanting } from '@/lib/schedule/plan';
import type { Plan } from '@/lib/schedule/types';
import { plantingSchema } from '@/lib/validations/planting';
import { createPlot, createProperty, signedInUser } from '../support/http';
import { testDb } from '../support/db';

const db = testDb();
// The same database through a Kysely that keeps every statement it sends, to see how saveReplan writes.
const sent: string[] = [];
const pool = createPool(process.env.DATABASE_URL);
const logged = new Kysely<Database>({
  dialect: new PostgresDialect({ pool }),
  log: (event) => {
    if (event.level === 'query') sent.push(event.query.sql);
  },
});
let plotId: string;
let userId: string;

const form = plantingSchema.parse({
  season: 'fall',
  method: 'prepared-seedbed',
  blend: [
    { speciesId: 'white-clover', share: 0.5 },
    { speciesId: 'chicory', share: 0.5 },
  ],
  targetSeedDate: '2027-09-15',
  herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
  sprayer: { tankGal: 25, carrierGalPerAcre: 20 },
  fertilizer: { grade: [13, 13, 13], target: { n: 40 } },
});

afterAll(async () => {
  await logged.destroy();
  await db.destroy();
});

beforeAll(async () => {
  const { client, user } = await signedInUser('store');
  userId = user.id;
  const property = await createProperty(client);
  plotId = (await createPlot(client, property.id, { acres: 1.5, cover: 'grass-weeds' })).id;
});

async function inputFor() {
  const plot = await db.selectFrom('plots').selectAll().where('id', '=', plotId).executeTakeFirstOrThrow();
  const property = await db.selectFrom('properties').selectAll().where('id', '=', plot.property_id).executeTakeFirstOrThrow();
  return buildPlantingInput(property, plot, form);
}

describe('stored plantings', () => {
  it('round-trips a plan through the steps table', async () => {
    const input = await inputFor();
    const plan = planPlanting(input, null, new Date('2027-07-01T12:00:00Z'));
    const planting = await createPlanting({ plotId, form, plan, createdBy: userId });
    const loaded = await loadPlan(planting.id);
    expect(loaded.steps).toEqual(plan.steps.map((s) => ({ ...s, hours: s.hours ?? null, doneOn: s.doneOn ?? null, recurrence: s.recurrence ?? null })));
  });

  it('writes each move as history and never rewrites a done step', async () => {
    const input = await inputFor();
    const plan = planPlanting(input, null, new Date('2027-07-01T12:00:00Z'));
    const planting = await createPlanting({ plotId, form, plan, createdBy: userId });
    const rows = await getStepRows(planting.id);
    const spray = rows.find((r) => r.kind === 'spray')!;
    await db.updateTable('steps').set({ status: 'done', done_on: spray.local_date }).where('id', '=', spray.id).execute();

    const seed = plan.steps.find((s) => s.kind === 'seed')!;
    const moved: Plan = {
      ...plan,
      steps: plan.steps.map((s) =>
        s.kind === 'seed' ? { ...s, date: '2027-09-13', reason: 'ahead of rain' } : s.kind === 'spray' ? { ...s, date: '2030-01-01' } : s,
      ),
    };
    const moves = await saveReplan({
      plantingId: planting.id,
      plan: moved,
      changes: [{ key: seed.key, kind: 'seed', from: seed.date, to: '2027-09-13', reason: 'moved seeding ahead of 0.6 in of rain' }],
      movedBy: null,
      forecastFetchedAt: '2027-09-10T06:00:00Z',
    });
    expect(moves).toHaveLength(1);
    const after = await getStepRows(planting.id);
    expect(after.find((r) => r.kind === 'seed')!.local_date).toBe('2027-09-13');
    expect(after.find((r) => r.kind === 'spray')!.local_date).toBe(spray.local_date);
    const history = await listStepMoves(after.find((r) => r.kind === 'seed')!.id);
    expect(history.map((h) => [h.from_date, h.to_date, h.moved_by])).toEqual([[seed.date, '2027-09-13', null]]);
  });

  it('writes only the steps that changed, each kind of write in one statement', async () => {
    const input = await inputFor();
    const plan = planPlanting(input, null, new Date('2027-07-01T12:00:00Z'));
    const planting = await createPlanting({ plotId, form, plan, createdBy: userId });
    // An old updated_at on every step, so a write shows as a newer one.
    const old = new Date('2020-01-01T00:00:00Z');
    await db.updateTable('steps').set({ updated_at: old }).where('planting_id', '=', planting.id).execute();
    const keys = plan.steps.map((s) => s.key);
    // The plan's last three steps: one done (then left out of the new plan), one dropped, one moved.
    const [done, dropped] = keys.slice(-2);
    const moved = plan.steps.find((s) => s.kind === 'seed')!;
    const sprayed = plan.steps.find((s) => s.kind === 'spray')!;
    expect(sprayed.quantities.length + sprayed.cautions.length).toBeGreaterThan(0);
    expect(keys.indexOf(moved.key)).toBeLessThan(keys.length - 2);
    await db.updateTable('steps').set({ status: 'done', done_on: '2027-09-01' }).where('planting_id', '=', planting.id).where('key', '=', done).execute();

    // jsonb keeps its own key order: the same quantities and cautions with their keys the other way round are
    // no change, so the spray step is not rewritten.
    const reverseKeys = (value: unknown): unknown =>
      Array.isArray(value)
        ? value.map(reverseKeys)
        : value && typeof value === 'object'
          ? Object.fromEntries(Object.entries(value).reverse().map(([k, v]) => [k, reverseKeys(v)]))
          : value;
    const added = { ...moved, key: 'extra-check', title: 'Walk the plot edge', date: '2027-09-20', after: [], reason: 'added by the test' };
    const next: Plan = {
      ...plan,
      steps: [
        ...plan.steps
          .filter((s) => s.key !== done && s.key !== dropped)
          .map((s) =>
            s.key === moved.key
              ? { ...s, date: '2027-09-25', reason: 'moved by the test' }
              : s.key === sprayed.key
                ? { ...s, quantities: reverseKeys(s.quantities) as typeof s.quantities, cautions: reverseKeys(s.cautions) as typeof s.cautions }
                : s,
          ),
        added,
      ],
    };
    sent.length = 0;
    const moves = await saveReplan(
      {
        plantingId: planting.id,
        plan: next,
        changes: [
          { key: moved.key, kind: moved.kind, from: moved.date, to: '2027-09-25', reason: 'moved by the test' },
          { key: added.key, kind: added.kind, from: '2027-09-19', to: '2027-09-20', reason: 'placed by the test' },
        ],
        movedBy: userId,
        forecastFetchedAt: null,
      },
      logged,
    );

    const after = await getStepRows(planting.id);
    const byKey = new Map(after.map((r) => [r.key, r]));
    expect(byKey.has(dropped)).toBe(false);
    expect(byKey.get(done)).toMatchObject({ status: 'done', done_on: '2027-09-01' }); // done, so it stays
    expect(byKey.get(moved.key)).toMatchObject({ local_date: '2027-09-25', reason: 'moved by the test' });
    expect(byKey.get(added.key)).toMatchObject({ title: 'Walk the plot edge', position: next.steps.length - 1, status: 'planned' });
    // Only the moved and the added step were written.
    expect(after.filter((r) => r.updated_at.getTime() !== old.getTime()).map((r) => r.key).sort()).toEqual([added.key, moved.key].sort());
    expect(await loadPlan(planting.id)).toMatchObject({ steps: expect.arrayContaining(next.steps.map((s) => expect.objectContaining({ key: s.key, date: s.date }))) });

    // One history row per move, with the step ids (the new step's too).
    expect(moves.map((m) => [m.step_id, m.from_date, m.to_date, m.reason, m.moved_by])).toEqual([
      [byKey.get(moved.key)!.id, moved.date, '2027-09-25', 'moved by the test', userId],
      [byKey.get(added.key)!.id, '2027-09-19', '2027-09-20', 'placed by the test', userId],
    ]);
    expect((await listStepMoves(byKey.get(added.key)!.id)).map((h) => h.reason)).toEqual(['placed by the test']);

    // Statements: the locked read, then one per kind of write, whatever the number of steps.
    const statements = sent.filter((q) => !/^(begin|commit)/i.test(q.trim()));
    expect(statements[0]).toMatch(/^select .* from "steps" .*for no key update$/s);
    const kinds = statements.slice(1).map((q) => q.trim().split(/\s+/).slice(0, 3).join(' ').toLowerCase().replaceAll('"', ''));
    expect(kinds).toEqual(['insert into steps', 'update steps set', 'delete from steps', 'update plantings set', 'insert into step_moves']);
  });

  it('a replan that changes nothing writes no step', async () => {
    const input = await inputFor();
    const plan = planPlanting(input, null, new Date('2027-07-01T12:00:00Z'));
    const planting = await createPlanting({ plotId, form, plan, createdBy: userId });
    const loaded = await loadPlan(planting.id);
    sent.length = 0;
    const moves = await saveReplan({ plantingId: planting.id, plan: loaded, changes: [], movedBy: null, forecastFetchedAt: null }, logged);
    expect(moves).toEqual([]);
    expect(sent.filter((q) => /\b(insert into|update|delete from) "?steps"?/i.test(q))).toEqual([]);
  });
});
