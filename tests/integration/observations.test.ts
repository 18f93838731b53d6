// Germination checks over HTTP: a check saves its counts, links its photos and marks the check step done;
// a poor stand comes back with a reseeding the engine planned; a manager accepts it once as a new planting.
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addMember, baseUrl, createPlot, createProperty, SESSION_COOKIE, signedInUser, type Client } from '../support/http';
import { testDb } from '../support/db';

const db = testDb();
type Person = Awaited<ReturnType<typeof signedInUser>>;
let owner: Person;
let manager: Person;
let member: Person;
let viewer: Person;
let plotId: string;
let plantingId: string;
let checkStepId: string;

const today = new Date().toISOString().slice(0, 10);

beforeAll(async () => {
  [owner, manager, member, viewer] = await Promise.all(['ob-owner', 'ob-manager', 'ob-member', 'ob-viewer'].map((p) => signedInUser(p)));
  const property = await createProperty(owner.client, { timeZone: 'UTC' });
  plotId = (await createPlot(owner.client, property.id, { acres: 0.5 })).id;
  await addMember(owner.client, property.id, manager, 'manager');
  await addMember(owner.client, property.id, member, 'member');
  await addMember(owner.client, property.id, viewer, 'viewer');
  const planted = await owner.client.post(`/api/plots/${plotId}/plantings`, {
    season: 'fall',
    method: 'spray-and-seed',
    blend: [{ speciesId: 'white-clover', share: 1 }],
    targetSeedDate: today,
    herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
    sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
  });
  expect(planted.status, planted.text).toBe(201);
  plantingId = planted.body.planting.id;
  checkStepId = planted.body.steps.find((s: { kind: string }) => s.kind === 'check-germination').id;
});

afterAll(async () => {
  await db.destroy();
});

async function photo(client: Client) {
  const form = new FormData();
  const bytes = await sharp({ create: { width: 60, height: 40, channels: 3, background: '#7f9bb0' } }).jpeg().toBuffer();
  form.append('file', new Blob([new Uint8Array(bytes)], { type: 'image/jpeg' }), 'spot.jpg');
  const res = await fetch(`${baseUrl()}/api/plots/${plotId}/photos`, {
    method: 'POST',
    headers: { cookie: `${SESSION_COOKIE}=${client.cookie(SESSION_COOKIE)}` },
    body: form,
  });
  expect(res.status).toBe(201);
  return (await res.json()).upload.id as string;
}

const observationCount = async () =>
  Number((await db.selectFrom('observations').select((eb) => eb.fn.countAll<string>().as('n')).where('planting_id', '=', plantingId).executeTakeFirstOrThrow()).n);

describe('a germination check', () => {
  let observationId: string;

  it('refuses bad input naming the field, and saves nothing', async () => {
    const good = { standRating: 2, frameCounts: [2, 3, 1], frameSqFt: 1, weedPressure: 'light' };
    const cases: [Record<string, unknown>, string][] = [
      [{ ...good, standRating: 6 }, 'standRating'],
      [{ ...good, frameCounts: [] }, 'frameCounts'],
      [{ ...good, frameCounts: [2, -1] }, 'frameCounts.1'],
      [{ ...good, frameCounts: [2.5] }, 'frameCounts.0'],
      [{ ...good, frameSqFt: 0 }, 'frameSqFt'],
      [{ ...good, weedPressure: 'lots' }, 'weedPressure'],
      [{ ...good, observedOn: '2999-01-01' }, 'observedOn'],
      [{ ...good, stepId: '00000000-0000-4000-8000-000000000000' }, 'stepId'],
      [{ ...good, photoIds: ['00000000-0000-4000-8000-000000000000'] }, 'photoIds'],
    ];
    const before = await observationCount();
    for (const [body, field] of cases) {
      const res = await member.client.post(`/api/plantings/${plantingId}/observations`, body);
      expect(res.status, `${field}: ${res.text}`).toBe(400);
      expect(Object.keys(res.body.fields ?? {}), res.text).toContain(field);
    }
    expect(await observationCount()).toBe(before);
    expect((await db.selectFrom('steps').select('status').where('id', '=', checkStepId).executeTakeFirstOrThrow()).status).toBe('planned');
  });

  it('viewers may read checks but not record one', async () => {
    const res = await viewer.client.post(`/api/plantings/${plantingId}/observations`, { standRating: 3, frameCounts: [30], frameSqFt: 1, weedPressure: 'none' });
    expect(res.status).toBe(403);
    expect((await viewer.client.get(`/api/plantings/${plantingId}/observations`)).status).toBe(200);
  });

  it('saves a poor stand with its photos, marks the step done and proposes a reseeding', async () => {
    const photoId = await photo(member.client);
    const res = await member.client.post(`/api/plantings/${plantingId}/observations`, {
      stepId: checkStepId,
      standRating: 2,
      frameCounts: [2, 3, 1],
      frameSqFt: 1,
      weedPressure: 'moderate',
      notes: 'Bare on the ridge',
      photoIds: [photoId],
    });
    expect(res.status, res.text).toBe(201);
    observationId = res.body.observation.id;
    // (2 + 3 + 1) / 3 ÷ 1 ft² = 2 per ft² (arithmetic); white clover at 6 lb/acre (the middle of its published 4–8 lb/acre
    // broadcast range) should give 33.1–66.1 (lib/agronomy/stand.ts).
    expect(res.body.stand.plantsPerSqFt).toBe(2);
    expect(res.body.stand.expected.lowPerSqFt).toBeCloseTo(33.06, 1);
    expect(res.body.stand.verdict).toBe('poor');
    expect(res.body.observation.photos.map((p: { id: string }) => p.id)).toEqual([photoId]);
    expect(res.body.canAcceptReseed).toBe(false);
    const reseed = res.body.reseed;
    expect(reseed.rateShare).toBe(1); // 1 − 2 / 49.6 = 96.0 % missing → rounded up to 100 %
    const kinds = reseed.plan.steps.filter((s: { status: string }) => s.status === 'planned').map((s: { kind: string }) => s.kind);
    expect(kinds).toEqual(expect.arrayContaining(['seed', 'cover-seed', 'check-germination']));
    expect(kinds).not.toContain('spray');
    const seed = reseed.plan.steps.find((s: { kind: string }) => s.kind === 'seed');
    expect(seed.date >= today).toBe(true);
    expect(seed.quantities.length).toBeGreaterThan(0);

    const row = await db.selectFrom('observations').selectAll().where('id', '=', observationId).executeTakeFirstOrThrow();
    expect(row).toMatchObject({ stand_rating: 2, frame_counts: [2, 3, 1], plants_per_sq_ft: 2, verdict: 'poor', weed_pressure: 'moderate', step_id: checkStepId, observer_id: member.user.id });
    expect(row.expected_source).toMatch(/43,560/);
    const upload = await db.selectFrom('uploads').select('observation_id').where('id', '=', photoId).executeTakeFirstOrThrow();
    expect(upload.observation_id).toBe(observationId);
    const step = await db.selectFrom('steps').select(['status', 'done_on', 'done_by']).where('id', '=', checkStepId).executeTakeFirstOrThrow();
    expect(step).toMatchObject({ status: 'done', done_on: today, done_by: member.user.id });
  });

  it('a photo already linked to a check cannot be linked to another', async () => {
    const linked = await db.selectFrom('uploads').select('id').where('observation_id', '=', observationId).executeTakeFirstOrThrow();
    const res = await member.client.post(`/api/plantings/${plantingId}/observations`, { standRating: 4, frameCounts: [30], frameSqFt: 1, weedPressure: 'none', photoIds: [linked.id] });
    expect(res.status).toBe(400);
    expect(res.body.fields.photoIds).toMatch(/another check/);
  });

  it('lists the checks with their photos to everyone on the property', async () => {
    const res = await viewer.client.get(`/api/plantings/${plantingId}/observations`);
    expect(res.status).toBe(200);
    const mine = res.body.observations.find((o: { id: string }) => o.id === observationId);
    expect(mine).toMatchObject({ verdict: 'poor', plantsPerSqFt: 2, frameCounts: [2, 3, 1], observer: { id: member.user.id } });
    expect(mine.photos[0].thumbUrl).toBe(`/api/uploads/${mine.photos[0].id}/thumb`);
  });

  it('members see the reseeding but cannot accept it; a manager accepts it once as a new planting', async () => {
    const preview = await member.client.post(`/api/plantings/${plantingId}/reseed/preview`, { observationId });
    expect(preview.status, preview.text).toBe(200);
    expect(preview.body.canAcceptReseed).toBe(false);
    const before = await db.selectFrom('plantings').select('id').where('plot_id', '=', plotId).execute();
    expect((await member.client.post(`/api/plantings/${plantingId}/reseed`, { observationId })).status).toBe(403);
    expect((await viewer.client.post(`/api/plantings/${plantingId}/reseed/preview`, { observationId })).status).toBe(403);

    const [first, second] = await Promise.all([
      manager.client.post(`/api/plantings/${plantingId}/reseed`, { observationId }),
      manager.client.post(`/api/plantings/${plantingId}/reseed`, { observationId }),
    ]);
    const statuses = [first.status, second.status].sort();
    expect(statuses).toEqual([201, 409]);
    const made = first.status === 201 ? first : second;
    const after = await db.selectFrom('plantings').selectAll().where('plot_id', '=', plotId).execute();
    expect(after.length).toBe(before.length + 1);
    const planting = after.find((p) => p.id === made.body.planting.id)!;
    expect(planting).toMatchObject({ method: 'spray-and-seed', created_by: manager.user.id, status: 'active' });
    const steps = await db.selectFrom('steps').selectAll().where('planting_id', '=', planting.id).orderBy('position').execute();
    const byKind = Object.fromEntries(steps.map((s) => [s.kind, s.status]));
    expect(byKind).toMatchObject({ spray: 'skipped', seed: 'planned', 'cover-seed': 'planned', 'check-germination': 'planned' });
    expect((await db.selectFrom('observations').select('reseed_planting_id').where('id', '=', observationId).executeTakeFirstOrThrow()).reseed_planting_id).toBe(planting.id);

    // The engine keeps the reseeding as it is: marking its seeding done replans without bringing back a burndown.
    const seed = steps.find((s) => s.kind === 'seed')!;
    const done = await member.client.post(`/api/steps/${seed.id}/complete`, { status: 'done' });
    expect(done.status, done.text).toBe(200);
    const replanned = await db.selectFrom('steps').select(['kind', 'status']).where('planting_id', '=', planting.id).execute();
    expect(replanned.find((s) => s.kind === 'spray')?.status).toBe('skipped');
    expect(replanned.filter((s) => s.kind === 'kill-wait' || s.kind === 'spray').every((s) => s.status === 'skipped')).toBe(true);
  });

  it('a good stand has nothing to reseed (409)', async () => {
    const res = await member.client.post(`/api/plantings/${plantingId}/observations`, { standRating: 5, frameCounts: [40, 36, 44], frameSqFt: 1, weedPressure: 'none' });
    expect(res.status).toBe(201);
    expect(res.body.stand.verdict).toBe('good');
    expect(res.body.reseed).toBeNull();
    const preview = await manager.client.post(`/api/plantings/${plantingId}/reseed/preview`, { observationId: res.body.observation.id });
    expect(preview.status).toBe(409);
  });
});
