// POST /api/plots/[plotId]/plan/preview: the engine reachable over HTTP. Checks what a planner reads off
// the preview for the classic half-acre spray-and-seed plot, and that bad input names its field and
// writes nothing.
import { beforeAll, describe, expect, it } from 'vitest';
import { Client, createPlot, createProperty, signedInUser } from '../support/http';
import { testDb } from '../support/db';

const db = testDb();
let client: Client;
let plotId: string;

const halfAcreSprayAndSeed = {
  season: 'fall',
  method: 'spray-and-seed',
  blend: [{ speciesId: 'white-clover', share: 1 }],
  targetSeedDate: '2027-09-10',
  herbicide: { productName: 'Generic glyphosate 41%', activeIngredientPct: 41, rateKind: 'percent-solution', rate: 2, rainfastHours: 6 },
  // 15 gal/acre: one 4-gallon fill covers 0.267 acre, a little over a quarter acre.
  sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
  seedBagLb: 8.5,
  // The bag's label: 8.5 lb covers one acre.
  seedBag: { lb: 8.5, acres: 1 },
};

beforeAll(async () => {
  ({ client } = await signedInUser('planner'));
  const property = await createProperty(client);
  const plot = await createPlot(client, property.id, { name: 'Half-acre strip', acres: 0.5, cover: 'grass-weeds', sun: 'full' });
  plotId = plot.id;
});

const plantingCount = async () =>
  Number((await db.selectFrom('plantings').select((eb) => eb.fn.countAll<number>().as('n')).where('plot_id', '=', plotId).executeTakeFirstOrThrow()).n);

describe('plan preview', () => {
  it('returns the steps in order with doubled seed, two sprayer fills and spray cautions, saving nothing', async () => {
    const res = await client.post(`/api/plots/${plotId}/plan/preview`, halfAcreSprayAndSeed);
    expect(res.status).toBe(200);
    const steps = res.body.plan.steps as Array<{ kind: string; date: string; quantities: { item: string; amount: number; unit: string; detail: string }[]; cautions: { topic: string }[] }>;
    const kinds = steps.map((s) => s.kind);
    expect(kinds.indexOf('spray')).toBeLessThan(kinds.indexOf('seed'));
    expect(kinds.indexOf('seed')).toBeLessThan(kinds.indexOf('check-germination'));
    const dates = steps.filter((s) => s.kind !== 'mow').map((s) => s.date);
    expect([...dates].sort()).toEqual(dates);

    const spray = steps.find((s) => s.kind === 'spray')!;
    // 0.5 acre × 15 gal/acre = 7.5 gal → ceil(7.5 / 4) = 2 fills (derived).
    const fills = spray.quantities.find((q) => /fill|tank/i.test(q.item) || /fill/i.test(q.detail));
    expect(fills?.detail).toMatch(/2 sprayer fills|2 fills/);
    expect(spray.cautions.map((c) => c.topic)).toContain('herbicide');

    const seed = steps.find((s) => s.kind === 'seed')!;
    const pounds = seed.quantities.find((q) => q.unit === 'lb');
    // Into standing cover at twice the bag's label rate (common practice): 2 × 8.5 lb/acre × 0.5 acre = 8.5 lb, one bag.
    expect(pounds?.amount).toBeCloseTo(8.5, 6);
    expect(pounds?.detail).toContain('2× the bag rate of 8.5 lb/acre');
    expect(await plantingCount()).toBe(0);
  });

  it.each([
    ['unknown species', { blend: [{ speciesId: 'moon-clover', share: 1 }] }, 'blend.0.speciesId'],
    ['share above 1', { blend: [{ speciesId: 'white-clover', share: 1.5 }] }, 'blend.0.share'],
    ['bad date', { targetSeedDate: '2027-02-30' }, 'targetSeedDate'],
    ['unknown method', { method: 'helicopter' }, 'method'],
    ['herbicide without sprayer', { sprayer: null }, 'sprayer'],
    ['bag label covering no acres', { seedBag: { lb: 8.5, acres: 0 } }, 'seedBag.acres'],
  ])('refuses %s with a message naming the field and writes nothing', async (_label, change, field) => {
    const res = await client.post(`/api/plots/${plotId}/plan/preview`, { ...halfAcreSprayAndSeed, ...change });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.fields)).toContain(field);
    expect(await plantingCount()).toBe(0);
  });
});
