import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addMember, createProperty, signedInUser, type Client } from '../support/http';
import { testDb } from '../support/db';

// Saved blends of a property: the planting form's own blend rules (lib/validations/planting.ts) decide what
// may be saved; names are unique per property whatever the letter case.
let owner: Client;
let viewer: Client;
let propertyId: string;
const db = testDb();

beforeAll(async () => {
  owner = (await signedInUser('blends-owner')).client;
  const v = await signedInUser('blends-viewer');
  viewer = v.client;
  propertyId = (await createProperty(owner)).id;
  await addMember(owner, propertyId, v, 'viewer');
});

afterAll(async () => {
  await db.destroy();
});

const mix = [
  { speciesId: 'white-clover', share: 0.5 },
  { speciesId: 'cereal-rye', share: 0.5 },
];

describe('saved blends', () => {
  it('saves a blend, lists it for every member, and deletes it', async () => {
    const created = await owner.post(`/api/properties/${propertyId}/blends`, { name: 'Clover and rye', parts: mix });
    expect(created.status).toBe(201);
    expect(created.body.blend).toMatchObject({ name: 'Clover and rye', parts: mix, propertyId });

    const listed = await viewer.get(`/api/properties/${propertyId}/blends`);
    expect(listed.status).toBe(200);
    expect(listed.body.blends.map((b: { name: string }) => b.name)).toContain('Clover and rye');

    const again = await owner.post(`/api/properties/${propertyId}/blends`, { name: 'CLOVER AND RYE', parts: mix });
    expect(again.status).toBe(409);
    expect(again.body.error).toMatch(/already has a blend with that name/);

    const gone = await owner.delete(`/api/properties/${propertyId}/blends/${created.body.blend.id}`);
    expect(gone.status).toBe(204);
    const twice = await owner.delete(`/api/properties/${propertyId}/blends/${created.body.blend.id}`);
    expect(twice.status).toBe(404);
  });

  it('refuses a blend the planting form would refuse, naming the field, and stores nothing', async () => {
    const before = await db.selectFrom('blends').select((eb) => eb.fn.countAll<string>().as('n')).where('property_id', '=', propertyId).executeTakeFirstOrThrow();
    const cases: [unknown, RegExp][] = [
      [{ name: '', parts: mix }, /Blend name is required/],
      [{ name: 'Bad species', parts: [{ speciesId: 'kudzu', share: 1 }] }, /Species must be one of the catalog/],
      [{ name: 'Twice', parts: [mix[0], mix[0]] }, /Each species may appear once/],
      [{ name: 'Too much', parts: [{ speciesId: 'white-clover', share: 2 }] }, /Share must be at most 1/],
      [{ name: 'Empty', parts: [] }, /Pick at least one species/],
      [{ name: 'Extra', parts: mix, colour: 'red' }, /colour|Unrecognized|unknown/i],
    ];
    for (const [body, message] of cases) {
      const res = await owner.post(`/api/properties/${propertyId}/blends`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(JSON.stringify(res.body)).toMatch(message);
    }
    const after = await db.selectFrom('blends').select((eb) => eb.fn.countAll<string>().as('n')).where('property_id', '=', propertyId).executeTakeFirstOrThrow();
    expect(after.n).toBe(before.n);
  });
});
