// lib/data/plantings.ts against real PostgreSQL: a plan saved and loaded back is the same plan, and a
// replan writes its moves as history while done steps keep their record.
import { beforeAll, describe, expect, it } from 'vitest';
import { createPlanting, getStepRows, listStepMoves, loadPlan, saveReplan } from '@/lib/data/plantings';
import { buildPlantingInput } from '@/lib/planning/input';
import { planPlanting } from '@/lib/schedule/plan';
import type { Plan } from '@/lib/schedule/types';
import { plantingSchema } from '@/lib/validations/planting';
import { createPlot, createProperty, signedInUser } from '../support/http';
import { testDb } from '../support/db';

const db = testDb();
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
});
