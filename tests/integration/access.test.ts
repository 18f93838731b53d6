// The role matrix for every JSON route handler, over real HTTP with real sessions.
// Expected behaviour (DEVELOPERS.md, "Access control"): signed out → 401; not a member → 404 (the property's
// existence is never revealed); a member whose role is too low → 403. Owner ⊃ manager ⊃ member ⊃ viewer.
// To add a route: add one entry to CASES.
import { createECDH, createHash, randomBytes, randomUUID } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql, type Kysely } from 'kysely';
import type { Database } from '@/db/database';
import {
  addMember, baseUrl, Client, createPlot, createProperty, invite, plotBody, propertyBody, signedInUser, uniqueEmail,
  type ApiResponse, type RequestOptions, type TestUser,
} from '../support/http';
import { countPlotsOf, testDb } from '../support/db';

const ACTORS = ['owner', 'manager', 'member', 'viewer', 'outsider', 'signedOut'] as const;
type Actor = (typeof ACTORS)[number];
type Expected = Record<Actor, number>;
type Person = { user: TestUser; client: Client };

// The shapes of the matrix, named once.
const READ: Expected = { owner: 200, manager: 200, member: 200, viewer: 200, outsider: 404, signedOut: 401 };
const managerWrite = (ok: number): Expected => ({ owner: ok, manager: ok, member: 403, viewer: 403, outsider: 404, signedOut: 401 });
const ownerOnly = (ok: number): Expected => ({ owner: ok, manager: 403, member: 403, viewer: 403, outsider: 404, signedOut: 401 });
const memberWrite = (ok: number): Expected => ({ owner: ok, manager: ok, member: ok, viewer: 403, outsider: 404, signedOut: 401 });
const anySignedIn = (ok: number): Expected => ({ owner: ok, manager: ok, member: ok, viewer: ok, outsider: ok, signedOut: 401 });
const anyone = (ok: number): Expected => ({ owner: ok, manager: ok, member: ok, viewer: ok, outsider: ok, signedOut: ok });

interface Fixture {
  db: Kysely<Database>;
  people: Record<Exclude<Actor, 'signedOut'> | 'spare' | 'ownerB', Person>;
  clients: Record<Actor, Client>;
  /** Property A: owner, manager, member, viewer (and spare as a member). */
  propertyA: { id: string; name: string };
  plotA: { id: string; name: string };
  /** Property B: another owner, none of A's people. */
  propertyB: { id: string; name: string };
  plotB: { id: string; name: string };
  /** A planted step on B's plot. */
  stepB: { id: string };
  /** Ids made by a describe block's own setup. */
  context: Record<string, string>;
}

interface Target {
  path: string;
  body?: unknown;
  /** Sent as is instead of a JSON body (a multipart upload). */
  options?: RequestOptions;
  /** Anything the checks need to know about what the target set up. */
  context?: Record<string, string>;
}

interface Case {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  route: string;
  expect: Expected;
  /** The request to send; may create fresh rows first when the request changes or removes things. */
  target: (fx: Fixture, actor: Actor) => Target | Promise<Target>;
  /** Database state the request may change: it must be identical after a refused request. */
  snapshot?: (fx: Fixture, target: Target) => Promise<unknown>;
  /** Checks on an allowed request's answer. */
  check?: (response: ApiResponse, fx: Fixture, actor: Actor, target: Target) => void | Promise<void>;
}

/** A spray-and-seed clover planting, as the planner form sends it. */
const PREVIEW_BODY = {
  season: 'fall',
  method: 'spray-and-seed',
  blend: [{ speciesId: 'white-clover', share: 1 }],
  targetSeedDate: '2027-09-10',
};

/** A browser-like push subscription (W3C Push API toJSON): https endpoint, P-256 point and 16-octet secret. */
function pushSubscriptionBody() {
  const ecdh = createECDH('prime256v1');
  ecdh.generateKeys();
  return {
    endpoint: `https://push.example.test/send/${randomUUID()}`,
    keys: { p256dh: ecdh.getPublicKey().toString('base64url'), auth: randomBytes(16).toString('base64url') },
  };
}

/** A fresh prepared-seedbed planting on a plot, stored the way the planner stores it; its spray step. */
async function sprayStepOf(fx: Fixture, plotId: string) {
  const { createPlanting, getStepRows } = await import('@/lib/data/plantings');
  const { buildPlantingInput } = await import('@/lib/planning/input');
  const { planPlanting } = await import('@/lib/schedule/plan');
  const { plantingSchema } = await import('@/lib/validations/planting');
  const form = plantingSchema.parse({
    ...PREVIEW_BODY,
    method: 'prepared-seedbed',
    herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
    sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
  });
  const plot = await fx.db.selectFrom('plots').selectAll().where('id', '=', plotId).executeTakeFirstOrThrow();
  const property = await fx.db.selectFrom('properties').selectAll().where('id', '=', plot.property_id).executeTakeFirstOrThrow();
  const plan = planPlanting(buildPlantingInput(property, plot, form), null, new Date());
  const planting = await createPlanting({ plotId, form, plan, createdBy: fx.people.owner.user.id });
  return (await getStepRows(planting.id)).find((s) => s.kind === 'spray')!;
}

/** An application record body for a plot (lib/validations/application-record.ts). */
const recordBody = (plotId: string, over: Record<string, unknown> = {}) => ({
  kind: 'herbicide', plotId, appliedOn: '2026-05-04', appliedTime: '08:15', areaAcres: 0.5, productName: 'Glyphosate 41% (generic)',
  rateValue: 48, rateUnit: 'fl oz/acre', totalProductValue: 24, totalProductUnit: 'fl oz', applicatorName: 'Access test', ...over,
});

/** A stored application record on a plot, written straight into the table. */
async function recordOf(fx: Fixture, propertyId: string, plotId: string) {
  return fx.db
    .insertInto('application_records')
    .values({
      property_id: propertyId, plot_id: plotId, plot_name: 'Access plot', kind: 'herbicide', applied_at: new Date('2026-05-04T13:15:00Z'),
      applied_on: '2026-05-04', time_zone: 'America/Chicago', area_acres: 0.5, product_name: 'Glyphosate 41% (generic)', rate_value: 48,
      rate_unit: 'fl oz/acre', total_product_value: 24, total_product_unit: 'fl oz', applicator_name: 'Access test',
    })
    .returning('id')
    .executeTakeFirstOrThrow();
}

const recordsOf = (fx: Fixture, propertyId: string) =>
  fx.db.selectFrom('application_records').select('id').where('property_id', '=', propertyId).orderBy('id').execute();

/** A property of A's owner with the same four roles (and spare as a member), for requests that change people. */
async function propertyWithRoles(fx: Fixture) {
  const property = await createProperty(fx.people.owner.client);
  await Promise.all([
    addMember(fx.people.owner.client, property.id, fx.people.manager, 'manager'),
    addMember(fx.people.owner.client, property.id, fx.people.member, 'member'),
    addMember(fx.people.owner.client, property.id, fx.people.viewer, 'viewer'),
    addMember(fx.people.owner.client, property.id, fx.people.spare, 'member'),
  ]);
  return property;
}

/** A $12.34 whole-property expense on a property, paid by `paidBy`; its id. */
async function expenseOf(fx: Fixture, propertyId: string, paidBy: string) {
  const row = await fx.db
    .insertInto('expenses')
    .values({ property_id: propertyId, season: 'fall', year: 2027, spent_on: '2027-08-01', category: 'fuel', description: `Fuel ${randomUUID()}`, amount_cents: 1_234, paid_by: paidBy })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

const roleOf = async (fx: Fixture, propertyId: string, userId: string) =>
  (
    await fx.db
      .selectFrom('memberships')
      .select('role')
      .where('property_id', '=', propertyId)
      .where('user_id', '=', userId)
      .executeTakeFirst()
  )?.role ?? null;

const ROLE_OF_ACTOR: Partial<Record<Actor, string>> = { owner: 'owner', manager: 'manager', member: 'member', viewer: 'viewer' };

/** A multipart/form-data body (RFC 7578) carrying a small JPEG made with sharp, as exact bytes. */
async function multipartPhoto(): Promise<RequestOptions> {
  const { default: sharp } = await import('sharp');
  const jpeg = await sharp({ create: { width: 24, height: 16, channels: 3, background: '#3d7a3a' } }).jpeg().toBuffer();
  const boundary = `----sowcast-${randomUUID()}`;
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="spot.jpg"\r\nContent-Type: image/jpeg\r\n\r\n`);
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  return { bytes: new Uint8Array(Buffer.concat([head, jpeg, tail])), contentType: `multipart/form-data; boundary=${boundary}` };
}

/** A photo of plot A stored the way the upload route stores it (bytes through lib/storage, then the row). */
async function storedPhotoOf(fx: Fixture) {
  const { storage } = await import('@/lib/storage');
  const { default: sharp } = await import('sharp');
  const webp = new Uint8Array(await sharp({ create: { width: 8, height: 8, channels: 3, background: '#2d6a98' } }).webp().toBuffer());
  const storageKey = await storage().put('photos', webp, 'image/webp');
  const thumbKey = await storage().put('thumbs', webp, 'image/webp');
  return fx.db
    .insertInto('uploads')
    .values({
      property_id: fx.propertyA.id, plot_id: fx.plotA.id, kind: 'photo', filename: 'spot.webp', content_type: 'image/webp',
      size_bytes: webp.byteLength, sha256: createHash('sha256').update(webp).digest('hex'), storage_key: storageKey, thumb_key: thumbKey,
      width: 8, height: 8, uploaded_by: fx.people.owner.user.id,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

let cloverPlantingA: Promise<string> | null = null;
/** One spray-and-seed white clover planting on plot A, made once, for the germination-check routes. */
function cloverPlantingOf(fx: Fixture): Promise<string> {
  cloverPlantingA ??= (async () => {
    const { createPlanting } = await import('@/lib/data/plantings');
    const { buildPlantingInput } = await import('@/lib/planning/input');
    const { planPlanting } = await import('@/lib/schedule/plan');
    const { plantingSchema } = await import('@/lib/validations/planting');
    const form = plantingSchema.parse(PREVIEW_BODY);
    const plot = await fx.db.selectFrom('plots').selectAll().where('id', '=', fx.plotA.id).executeTakeFirstOrThrow();
    const property = await fx.db.selectFrom('properties').selectAll().where('id', '=', plot.property_id).executeTakeFirstOrThrow();
    const plan = planPlanting(buildPlantingInput(property, plot, form), null, new Date());
    return (await createPlanting({ plotId: fx.plotA.id, form, plan, createdBy: fx.people.owner.user.id })).id;
  })();
  return cloverPlantingA;
}

/** A poor-stand check of that planting, written straight into the table. */
async function poorCheckOf(fx: Fixture, plantingId: string) {
  return fx.db
    .insertInto('observations')
    .values({
      planting_id: plantingId, plot_id: fx.plotA.id, observed_on: '2027-09-20', observed_at: new Date(), stand_rating: 1,
      frame_counts: JSON.stringify([1, 2, 0]), frame_sq_ft: 1, plants_per_sq_ft: 1, weed_pressure: 'light', verdict: 'poor',
    })
    .returning('id')
    .executeTakeFirstOrThrow();
}

const countOf = (fx: Fixture, table: 'uploads' | 'observations' | 'plantings', column: 'plot_id' | 'planting_id', id: string) =>
  fx.db.selectFrom(table).select((eb) => eb.fn.countAll<string>().as('n')).where(column, '=', id).executeTakeFirst();

// A 0.001° square at 45° N as GeoJSON (about 2.17 acres; see tests/unit/geo/boundary.test.ts).
const SQUARE_GEOJSON = JSON.stringify({ type: 'Polygon', coordinates: [[[-100, 45], [-99.999, 45], [-99.999, 45.001], [-100, 45.001], [-100, 45]]] });

/** A multipart/form-data body (RFC 7578) with one text file in the "file" field. */
function multipartFile(filename: string, content: string): RequestOptions {
  const boundary = `----access${randomUUID()}`;
  const raw = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${filename}"\r\nContent-Type: application/octet-stream\r\n\r\n${content}\r\n--${boundary}--\r\n`;
  return { raw, contentType: `multipart/form-data; boundary=${boundary}` };
}

const CASES: Case[] = [
  {
    method: 'GET',
    route: '/api/properties',
    expect: anySignedIn(200),
    target: () => ({ path: '/api/properties' }),
    check: (res, fx, actor) => {
      const mine = res.body.properties.find((p: { id: string }) => p.id === fx.propertyA.id);
      if (actor === 'outsider') expect(mine).toBeUndefined();
      else expect(mine?.role).toBe(ROLE_OF_ACTOR[actor]);
      expect(res.body.properties.map((p: { id: string }) => p.id)).not.toContain(fx.propertyB.id);
    },
  },
  {
    method: 'POST',
    route: '/api/properties',
    expect: anySignedIn(201),
    target: () => ({ path: '/api/properties', body: propertyBody() }),
    check: async (res, fx, actor) => {
      expect(await roleOf(fx, res.body.property.id, fx.people[actor as 'owner'].user.id)).toBe('owner');
    },
  },
  {
    method: 'GET',
    route: '/api/properties/[propertyId]',
    expect: READ,
    target: (fx) => ({ path: `/api/properties/${fx.propertyA.id}` }),
    check: (res, fx, actor) => {
      expect(res.body.property.id).toBe(fx.propertyA.id);
      expect(res.body.role).toBe(ROLE_OF_ACTOR[actor]);
    },
  },
  {
    method: 'PATCH',
    route: '/api/properties/[propertyId]',
    expect: managerWrite(200),
    target: (fx, actor) => ({ path: `/api/properties/${fx.propertyA.id}`, body: { landownerContact: `set by ${actor} ${randomUUID()}` } }),
    snapshot: (fx) => fx.db.selectFrom('properties').selectAll().where('id', '=', fx.propertyA.id).executeTakeFirst(),
    check: async (res, fx, _actor, target) => {
      const row = await fx.db.selectFrom('properties').select('landowner_contact').where('id', '=', fx.propertyA.id).executeTakeFirst();
      expect(row?.landowner_contact).toBe((target.body as { landownerContact: string }).landownerContact);
      expect(res.body.property.landownerContact).toBe(row?.landowner_contact);
    },
  },
  {
    method: 'DELETE',
    route: '/api/properties/[propertyId]',
    expect: ownerOnly(204),
    target: async (fx) => {
      const property = await propertyWithRoles(fx);
      await createPlot(fx.people.owner.client, property.id);
      return { path: `/api/properties/${property.id}`, context: { propertyId: property.id } };
    },
    snapshot: async (fx, t) => ({
      property: await fx.db.selectFrom('properties').select('id').where('id', '=', t.context!.propertyId).executeTakeFirst(),
      plots: await countPlotsOf(fx.db, t.context!.propertyId),
    }),
    check: async (_res, fx, _actor, t) => {
      expect(await fx.db.selectFrom('properties').select('id').where('id', '=', t.context!.propertyId).executeTakeFirst()).toBeUndefined();
      expect(await countPlotsOf(fx.db, t.context!.propertyId)).toBe(0);
    },
  },
  {
    method: 'GET',
    route: '/api/properties/[propertyId]/plots',
    expect: READ,
    target: (fx) => ({ path: `/api/properties/${fx.propertyA.id}/plots` }),
    check: (res, fx) => {
      const ids = res.body.plots.map((p: { id: string }) => p.id);
      expect(ids).toContain(fx.plotA.id);
      expect(ids).not.toContain(fx.plotB.id);
    },
  },
  {
    method: 'POST',
    route: '/api/properties/[propertyId]/plots',
    expect: managerWrite(201),
    target: (fx) => ({ path: `/api/properties/${fx.propertyA.id}/plots`, body: plotBody() }),
    snapshot: (fx) => countPlotsOf(fx.db, fx.propertyA.id),
    check: (res, fx) => expect(res.body.plot.propertyId).toBe(fx.propertyA.id),
  },
  {
    method: 'GET',
    route: '/api/properties/[propertyId]/blends',
    expect: READ,
    target: async (fx) => {
      await fx.db
        .insertInto('blends')
        .values({ property_id: fx.propertyB.id, name: `Other ${randomUUID()}`, parts: JSON.stringify([{ speciesId: 'white-clover', share: 1 }]) })
        .execute();
      return { path: `/api/properties/${fx.propertyA.id}/blends` };
    },
    check: (res, fx) => {
      for (const b of res.body.blends) expect(b.propertyId).toBe(fx.propertyA.id);
    },
  },
  {
    method: 'POST',
    route: '/api/properties/[propertyId]/blends',
    expect: managerWrite(201),
    target: (fx) => ({
      path: `/api/properties/${fx.propertyA.id}/blends`,
      body: { name: `Blend ${randomUUID()}`, parts: [{ speciesId: 'white-clover', share: 0.5 }, { speciesId: 'winter-wheat', share: 0.5 }] },
    }),
    snapshot: (fx) => fx.db.selectFrom('blends').select((eb) => eb.fn.countAll<string>().as('n')).where('property_id', '=', fx.propertyA.id).executeTakeFirst(),
    check: (res, fx) => expect(res.body.blend.propertyId).toBe(fx.propertyA.id),
  },
  {
    method: 'DELETE',
    route: '/api/properties/[propertyId]/blends/[blendId]',
    expect: managerWrite(204),
    target: async (fx) => {
      const row = await fx.db
        .insertInto('blends')
        .values({ property_id: fx.propertyA.id, name: `Doomed ${randomUUID()}`, parts: JSON.stringify([{ speciesId: 'white-clover', share: 1 }]) })
        .returning('id')
        .executeTakeFirstOrThrow();
      return { path: `/api/properties/${fx.propertyA.id}/blends/${row.id}`, context: { blendId: row.id } };
    },
    snapshot: (fx, t) => fx.db.selectFrom('blends').select('id').where('id', '=', t.context!.blendId).executeTakeFirst(),
    check: async (_res, fx, _actor, t) => {
      expect(await fx.db.selectFrom('blends').select('id').where('id', '=', t.context!.blendId).executeTakeFirst()).toBeUndefined();
    },
  },
  {
    method: 'GET',
    route: '/api/properties/[propertyId]/records',
    expect: READ,
    target: async (fx) => {
      await recordOf(fx, fx.propertyB.id, fx.plotB.id);
      await recordOf(fx, fx.propertyA.id, fx.plotA.id);
      return { path: `/api/properties/${fx.propertyA.id}/records` };
    },
    check: (res, fx) => {
      expect(res.body.records.length).toBeGreaterThan(0);
      for (const r of res.body.records) expect(r.propertyId).toBe(fx.propertyA.id);
    },
  },
  {
    method: 'POST',
    route: '/api/properties/[propertyId]/records',
    expect: memberWrite(201),
    target: (fx) => ({ path: `/api/properties/${fx.propertyA.id}/records`, body: recordBody(fx.plotA.id) }),
    snapshot: (fx) => recordsOf(fx, fx.propertyA.id),
    check: (res, fx, actor) => {
      expect(res.body.record).toMatchObject({ propertyId: fx.propertyA.id, plotId: fx.plotA.id });
      expect(res.body.record.recordedBy.id).toBe(fx.people[actor as 'owner'].user.id);
    },
  },
  {
    method: 'GET',
    route: '/api/properties/[propertyId]/records/export',
    expect: READ,
    target: async (fx) => {
      await recordOf(fx, fx.propertyB.id, fx.plotB.id);
      const row = await recordOf(fx, fx.propertyA.id, fx.plotA.id);
      return { path: `/api/properties/${fx.propertyA.id}/records/export`, context: { recordId: row.id } };
    },
    check: (res, fx, _actor, t) => {
      expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
      expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename=/);
      expect(res.text).toContain(t.context!.recordId);
      expect(res.text).not.toContain(fx.propertyB.id);
    },
  },
  {
    method: 'GET',
    route: '/api/records/[recordId]',
    expect: READ,
    target: async (fx) => {
      const row = await recordOf(fx, fx.propertyA.id, fx.plotA.id);
      return { path: `/api/records/${row.id}`, context: { recordId: row.id } };
    },
    check: (res, _fx, _actor, t) => expect(res.body.record.id).toBe(t.context!.recordId),
  },
  {
    method: 'POST',
    route: '/api/records/[recordId]/corrections',
    expect: memberWrite(201),
    target: async (fx) => {
      const row = await recordOf(fx, fx.propertyA.id, fx.plotA.id);
      return { path: `/api/records/${row.id}/corrections`, body: recordBody(fx.plotA.id, { correctionReason: 'Rate was 32' }), context: { recordId: row.id } };
    },
    snapshot: (fx) => recordsOf(fx, fx.propertyA.id),
    check: (res, _fx, _actor, t) => expect(res.body.record.supersedesId).toBe(t.context!.recordId),
  },
  {
    method: 'GET',
    route: '/api/steps/[stepId]/record-draft',
    expect: memberWrite(200),
    target: async (fx) => {
      const spray = await sprayStepOf(fx, fx.plotA.id);
      return { path: `/api/steps/${spray.id}/record-draft`, context: { stepId: spray.id } };
    },
    check: (res, fx, _actor, t) => expect(res.body.draft).toMatchObject({ stepId: t.context!.stepId, plotId: fx.plotA.id, kind: 'herbicide' }),
  },
  {
    method: 'GET',
    route: '/api/plots/[plotId]',
    expect: READ,
    target: (fx) => ({ path: `/api/plots/${fx.plotA.id}` }),
    check: (res, fx, actor) => {
      expect(res.body.plot.id).toBe(fx.plotA.id);
      expect(res.body.role).toBe(ROLE_OF_ACTOR[actor]);
    },
  },
  {
    method: 'PATCH',
    route: '/api/plots/[plotId]',
    expect: managerWrite(200),
    target: (fx, actor) => ({ path: `/api/plots/${fx.plotA.id}`, body: { notes: `noted by ${actor} ${randomUUID()}` } }),
    snapshot: (fx) => fx.db.selectFrom('plots').selectAll().where('id', '=', fx.plotA.id).executeTakeFirst(),
    check: (res, _fx, _actor, target) => expect(res.body.plot.notes).toBe((target.body as { notes: string }).notes),
  },
  {
    method: 'DELETE',
    route: '/api/plots/[plotId]',
    expect: managerWrite(204),
    target: async (fx) => {
      const plot = await createPlot(fx.people.owner.client, fx.propertyA.id);
      return { path: `/api/plots/${plot.id}`, context: { plotId: plot.id } };
    },
    snapshot: (fx, t) => fx.db.selectFrom('plots').selectAll().where('id', '=', t.context!.plotId).executeTakeFirst(),
    check: async (_res, fx, _actor, t) =>
      expect(await fx.db.selectFrom('plots').select('id').where('id', '=', t.context!.plotId).executeTakeFirst()).toBeUndefined(),
  },
  {
    method: 'POST',
    route: '/api/plots/[plotId]/plan/preview',
    expect: memberWrite(200),
    target: (fx) => ({ path: `/api/plots/${fx.plotA.id}/plan/preview`, body: PREVIEW_BODY }),
    snapshot: (fx) => fx.db.selectFrom('plantings').select('id').execute(),
    check: (res) => expect(res.body.plan.steps.map((s: { kind: string }) => s.kind)).toContain('seed'),
  },
  {
    // Marking work done is for members and up; the engine then re-places what follows (step-complete.test.ts).
    method: 'POST',
    route: '/api/steps/[stepId]/complete',
    expect: memberWrite(200),
    target: async (fx) => {
      const spray = await sprayStepOf(fx, fx.plotA.id);
      return { path: `/api/steps/${spray.id}/complete`, body: { status: 'done' }, context: { stepId: spray.id } };
    },
    snapshot: (fx, t) => fx.db.selectFrom('steps').selectAll().where('id', '=', t.context!.stepId).executeTakeFirst(),
    check: async (res, fx, actor, t) => {
      const row = await fx.db.selectFrom('steps').selectAll().where('id', '=', t.context!.stepId).executeTakeFirstOrThrow();
      expect(row.status).toBe('done');
      expect(row.done_by).toBe(fx.people[actor as 'owner'].user.id);
      expect(res.body.step).toMatchObject({ id: t.context!.stepId, status: 'done', doneOn: row.done_on });
    },
  },
  {
    method: 'GET',
    route: '/api/properties/[propertyId]/members',
    expect: READ,
    target: (fx) => ({ path: `/api/properties/${fx.propertyA.id}/members` }),
    check: (res, fx, actor) => {
      const members = res.body.members as { userId: string; role: string; email: string | null }[];
      expect(members.map((m) => m.role).sort()).toEqual(['manager', 'member', 'member', 'owner', 'viewer']);
      const manager = members.find((m) => m.userId === fx.people.manager.user.id);
      // E-mail addresses are only for the people who manage membership.
      expect(manager?.email).toBe(actor === 'owner' ? fx.people.manager.user.email : null);
    },
  },
  {
    method: 'PATCH',
    route: '/api/properties/[propertyId]/members/[userId]',
    expect: ownerOnly(200),
    target: async (fx) => {
      const property = await propertyWithRoles(fx);
      return {
        path: `/api/properties/${property.id}/members/${fx.people.spare.user.id}`,
        body: { role: 'manager' },
        context: { propertyId: property.id },
      };
    },
    snapshot: (fx, t) => roleOf(fx, t.context!.propertyId, fx.people.spare.user.id),
    check: async (_res, fx, _actor, t) => expect(await roleOf(fx, t.context!.propertyId, fx.people.spare.user.id)).toBe('manager'),
  },
  {
    method: 'DELETE',
    route: '/api/properties/[propertyId]/members/[userId]',
    expect: ownerOnly(204),
    target: async (fx) => {
      const property = await propertyWithRoles(fx);
      return { path: `/api/properties/${property.id}/members/${fx.people.spare.user.id}`, context: { propertyId: property.id } };
    },
    snapshot: (fx, t) => roleOf(fx, t.context!.propertyId, fx.people.spare.user.id),
    check: async (_res, fx, _actor, t) => {
      expect(await roleOf(fx, t.context!.propertyId, fx.people.spare.user.id)).toBeNull();
      // Being removed by an owner ends the person's sessions (account-security.test.ts): spare signs in again.
      expect((await fx.people.spare.client.get('/api/properties')).status).toBe(401);
      expect((await fx.people.spare.client.signIn(fx.people.spare.user.email, fx.people.spare.user.password)).ok).toBe(true);
    },
  },
  {
    method: 'GET',
    route: '/api/properties/[propertyId]/invitations',
    expect: ownerOnly(200),
    target: (fx) => ({ path: `/api/properties/${fx.propertyA.id}/invitations` }),
    check: (res, fx) => {
      const invitations = res.body.invitations as Record<string, unknown>[];
      const emails = invitations.map((i) => i.email);
      expect(emails).toContain(fx.people.viewer.user.email);
      // The list never carries a token or its hash.
      for (const i of invitations) {
        expect(Object.keys(i)).not.toContain('token');
        expect(Object.keys(i)).not.toContain('tokenHash');
        expect(JSON.stringify(i)).not.toMatch(/[0-9a-f]{64}/);
      }
    },
  },
  {
    method: 'POST',
    route: '/api/properties/[propertyId]/invitations',
    expect: ownerOnly(201),
    target: (fx) => ({ path: `/api/properties/${fx.propertyA.id}/invitations`, body: { email: uniqueEmail('invitee'), role: 'member' } }),
    snapshot: async (fx) =>
      Number(
        (
          await fx.db
            .selectFrom('invitations')
            .select((eb) => eb.fn.countAll<number>().as('n'))
            .where('property_id', '=', fx.propertyA.id)
            .executeTakeFirstOrThrow()
        ).n,
      ),
    check: (res, _fx, _actor, target) => {
      expect(res.body.invitation.email).toBe((target.body as { email: string }).email);
      expect(res.body.link).toMatch(/\/invitations\/[A-Za-z0-9_-]{20,}$/);
    },
  },
  {
    method: 'DELETE',
    route: '/api/properties/[propertyId]/invitations/[invitationId]',
    expect: ownerOnly(204),
    target: async (fx) => {
      const invitation = await invite(fx.people.owner.client, fx.propertyA.id, uniqueEmail('revoked'), 'viewer');
      return { path: `/api/properties/${fx.propertyA.id}/invitations/${invitation.id}`, context: { invitationId: invitation.id } };
    },
    snapshot: (fx, t) => fx.db.selectFrom('invitations').select('revoked_at').where('id', '=', t.context!.invitationId).executeTakeFirst(),
    check: async (_res, fx, _actor, t) => {
      const row = await fx.db.selectFrom('invitations').select('revoked_at').where('id', '=', t.context!.invitationId).executeTakeFirst();
      expect(row?.revoked_at).toBeInstanceOf(Date);
    },
  },
  {
    // Holding the secret token is what lets one see the invitation, signed in or not.
    method: 'GET',
    route: '/api/invitations/[token]',
    expect: anyone(200),
    target: async (fx) => {
      const email = uniqueEmail('looked-up');
      const invitation = await invite(fx.people.owner.client, fx.propertyA.id, email, 'member');
      return { path: `/api/invitations/${invitation.token}`, context: { email } };
    },
    check: (res, fx, _actor, t) => {
      expect(res.body.invitation).toMatchObject({ propertyName: fx.propertyA.name, role: 'member', email: t.context!.email, state: 'open' });
    },
  },
  {
    // Any signed-in person may accept an invitation addressed to their own e-mail.
    method: 'POST',
    route: '/api/invitations/[token]/accept',
    expect: anySignedIn(200),
    target: async (fx, actor) => {
      const property = await createProperty(fx.people.ownerB.client);
      const email = actor === 'signedOut' ? uniqueEmail('nobody') : fx.people[actor].user.email;
      const invitation = await invite(fx.people.ownerB.client, property.id, email, 'member');
      return { path: `/api/invitations/${invitation.token}/accept`, context: { propertyId: property.id, invitationId: invitation.id } };
    },
    snapshot: (fx, t) => fx.db.selectFrom('invitations').select(['accepted_at', 'accepted_by']).where('id', '=', t.context!.invitationId).executeTakeFirst(),
    check: async (res, fx, actor, t) => {
      expect(res.body).toEqual({ propertyId: t.context!.propertyId, role: 'member' });
      expect(await roleOf(fx, t.context!.propertyId, fx.people[actor as 'owner'].user.id)).toBe('member');
    },
  },
  {
    // The forecast is for everyone who may see the property, the landowner (viewer) included.
    method: 'GET',
    route: '/api/properties/[propertyId]/weather',
    expect: READ,
    target: (fx) => ({ path: `/api/properties/${fx.propertyA.id}/weather` }),
    check: (res, fx) => {
      expect(res.body.timeZone).toBe('America/Chicago');
      expect(Array.isArray(res.body.days)).toBe(true);
      expect(res.text).not.toContain(fx.propertyB.id);
    },
  },
  {
    // Plot boundary: anyone on the property reads the outline; managers upload and clear it (boundary-upload.test.ts).
    method: 'GET',
    route: '/api/plots/[plotId]/boundary',
    expect: READ,
    target: (fx) => ({ path: `/api/plots/${fx.plotA.id}/boundary` }),
    check: (res) => expect(res.body).toHaveProperty('boundary'),
  },
  {
    method: 'POST',
    route: '/api/plots/[plotId]/boundary',
    expect: managerWrite(201),
    target: (fx) => ({ path: `/api/plots/${fx.plotA.id}/boundary`, options: multipartFile('square.geojson', SQUARE_GEOJSON) }),
    snapshot: async (fx) => [
      await fx.db.selectFrom('plots').select(['boundary', 'boundary_acres', 'boundary_upload_id']).where('id', '=', fx.plotA.id).executeTakeFirst(),
      await fx.db.selectFrom('uploads').select('id').where('plot_id', '=', fx.plotA.id).where('kind', '=', 'boundary').execute(),
    ],
    check: (res) => expect(res.body.boundary.acres).toBeGreaterThan(2),
  },
  {
    method: 'DELETE',
    route: '/api/plots/[plotId]/boundary',
    expect: managerWrite(204),
    target: (fx) => ({ path: `/api/plots/${fx.plotA.id}/boundary` }),
    snapshot: (fx) => fx.db.selectFrom('plots').select(['boundary', 'boundary_acres', 'boundary_upload_id']).where('id', '=', fx.plotA.id).executeTakeFirst(),
    check: async (_res, fx) =>
      expect((await fx.db.selectFrom('plots').select('boundary').where('id', '=', fx.plotA.id).executeTakeFirstOrThrow()).boundary).toBeNull(),
  },
  {
    // Soil tests: read by everyone on the property, uploaded by managers (soil-tests.test.ts).
    method: 'GET',
    route: '/api/plots/[plotId]/soil-tests',
    expect: READ,
    target: (fx) => ({ path: `/api/plots/${fx.plotA.id}/soil-tests` }),
    check: (res) => expect(Array.isArray(res.body.soilTests)).toBe(true),
  },
  {
    method: 'POST',
    route: '/api/plots/[plotId]/soil-tests',
    expect: managerWrite(201),
    target: (fx) => ({ path: `/api/plots/${fx.plotA.id}/soil-tests`, options: multipartFile('lab.csv', 'pH,P (ppm),K (ppm)\n6.1,25,130\n') }),
    snapshot: async (fx) => [
      await fx.db.selectFrom('soil_tests').select('id').where('plot_id', '=', fx.plotA.id).execute(),
      await fx.db.selectFrom('uploads').select('id').where('plot_id', '=', fx.plotA.id).where('kind', '=', 'soil-test').execute(),
    ],
    check: (res) => expect(res.body.soilTest).toMatchObject({ ph: 6.1, pPpm: 25, kPpm: 130 }),
  },
  {
    // The plot's weather chart: read-only, for everyone who may see the plot.
    method: 'GET',
    route: '/api/plots/[plotId]/weather',
    expect: READ,
    target: (fx) => ({ path: `/api/plots/${fx.plotA.id}/weather` }),
    check: (res, fx) => {
      expect(res.body.timeZone).toBe('America/Chicago');
      expect(['no-forecast', 'ready', 'no-days']).toContain(res.body.state);
      expect(res.text).not.toContain(fx.plotB.id);
    },
  },
  {
    // A person's own settings: any signed-in person, nobody else's.
    method: 'GET',
    route: '/api/settings/notifications',
    expect: anySignedIn(200),
    target: () => ({ path: '/api/settings/notifications' }),
    check: (res) => expect(typeof res.body.settings.reminderHour).toBe('number'),
  },
  {
    method: 'PUT',
    route: '/api/settings/notifications',
    expect: anySignedIn(200),
    target: (_fx, actor) => ({
      path: '/api/settings/notifications',
      body: { emailEnabled: true, pushEnabled: true, reminderHour: 5 + ACTORS.indexOf(actor), quietStartHour: null, quietEndHour: null, dueReminders: true, digest: false },
    }),
    check: async (res, fx, actor, t) => {
      const row = await fx.db.selectFrom('notification_settings').select('reminder_hour').where('user_id', '=', fx.people[actor as 'owner'].user.id).executeTakeFirst();
      expect(row?.reminder_hour).toBe((t.body as { reminderHour: number }).reminderHour);
      expect(res.body.settings.reminderHour).toBe(row?.reminder_hour);
    },
  },
  {
    method: 'GET',
    route: '/api/settings/push',
    expect: anySignedIn(200),
    target: () => ({ path: '/api/settings/push' }),
    check: (res) => {
      expect(res.body.publicKey).toMatch(/^[A-Za-z0-9_-]{87}$/);
      expect(Array.isArray(res.body.devices)).toBe(true);
    },
  },
  {
    method: 'POST',
    route: '/api/settings/push-subscriptions',
    expect: anySignedIn(201),
    target: () => ({ path: '/api/settings/push-subscriptions', body: pushSubscriptionBody() }),
    snapshot: (fx, t) => fx.db.selectFrom('push_subscriptions').select('id').where('endpoint', '=', (t.body as { endpoint: string }).endpoint).execute(),
    check: async (_res, fx, actor, t) => {
      const row = await fx.db.selectFrom('push_subscriptions').select('user_id').where('endpoint', '=', (t.body as { endpoint: string }).endpoint).executeTakeFirst();
      expect(row?.user_id).toBe(fx.people[actor as 'owner'].user.id);
    },
  },
  {
    // Only one's own device is removed; another person's endpoint gets the same 204 and stays (settings.test.ts).
    method: 'DELETE',
    route: '/api/settings/push-subscriptions',
    expect: anySignedIn(204),
    target: async (fx, actor) => {
      const body = pushSubscriptionBody();
      const owner = actor === 'signedOut' ? fx.people.spare : fx.people[actor];
      const saved = await owner.client.post('/api/settings/push-subscriptions', body);
      if (saved.status !== 201) throw new Error(`saving a subscription answered ${saved.status}: ${saved.text}`);
      return { path: '/api/settings/push-subscriptions', body: { endpoint: body.endpoint } };
    },
    snapshot: (fx, t) => fx.db.selectFrom('push_subscriptions').select('id').where('endpoint', '=', (t.body as { endpoint: string }).endpoint).execute(),
    check: async (_res, fx, _actor, t) => {
      const rows = await fx.db.selectFrom('push_subscriptions').select('id').where('endpoint', '=', (t.body as { endpoint: string }).endpoint).execute();
      expect(rows).toEqual([]);
    },
  },
  {
    method: 'GET',
    route: '/api/plots/[plotId]/plantings',
    expect: READ,
    target: async (fx) => {
      const spray = await sprayStepOf(fx, fx.plotA.id);
      return { path: `/api/plots/${fx.plotA.id}/plantings`, context: { plantingId: spray.planting_id } };
    },
    check: (res, fx, _actor, t) => {
      const mine = res.body.plantings.find((p: { id: string }) => p.id === t.context!.plantingId);
      expect(mine.steps.map((s: { kind: string }) => s.kind)).toContain('spray');
      expect(res.body.plantings.every((p: { plotId: string }) => p.plotId === fx.plotA.id)).toBe(true);
    },
  },
  {
    // Saving a planting is for managers and up; members may only preview and compare.
    method: 'POST',
    route: '/api/plots/[plotId]/plantings',
    expect: managerWrite(201),
    target: (fx) => ({ path: `/api/plots/${fx.plotA.id}/plantings`, body: PREVIEW_BODY }),
    snapshot: (fx) => fx.db.selectFrom('plantings').select('id').where('plot_id', '=', fx.plotA.id).orderBy('id').execute(),
    check: async (res, fx, actor) => {
      expect(res.body.planting).toMatchObject({ plotId: fx.plotA.id, createdBy: fx.people[actor as 'owner'].user.id });
      expect(res.body.steps.map((s: { kind: string }) => s.kind)).toContain('seed');
      const rows = await fx.db.selectFrom('steps').select('id').where('planting_id', '=', res.body.planting.id).execute();
      expect(rows).toHaveLength(res.body.steps.length);
    },
  },
  {
    method: 'GET',
    route: '/api/plantings/[plantingId]',
    expect: READ,
    target: async (fx) => {
      const spray = await sprayStepOf(fx, fx.plotA.id);
      return { path: `/api/plantings/${spray.planting_id}`, context: { plantingId: spray.planting_id } };
    },
    check: (res, _fx, _actor, t) => {
      expect(res.body.planting.id).toBe(t.context!.plantingId);
      expect(Array.isArray(res.body.warnings)).toBe(true);
      expect(res.body.steps.map((s: { kind: string }) => s.kind)).toContain('seed');
    },
  },
  {
    method: 'DELETE',
    route: '/api/plantings/[plantingId]',
    expect: managerWrite(204),
    target: async (fx) => {
      const spray = await sprayStepOf(fx, fx.plotA.id);
      return { path: `/api/plantings/${spray.planting_id}`, context: { plantingId: spray.planting_id } };
    },
    snapshot: async (fx, t) => ({
      planting: await fx.db.selectFrom('plantings').select('id').where('id', '=', t.context!.plantingId).executeTakeFirst(),
      steps: await fx.db.selectFrom('steps').select('id').where('planting_id', '=', t.context!.plantingId).orderBy('id').execute(),
    }),
    check: async (_res, fx, _actor, t) => {
      expect(await fx.db.selectFrom('plantings').select('id').where('id', '=', t.context!.plantingId).executeTakeFirst()).toBeUndefined();
      expect(await fx.db.selectFrom('steps').select('id').where('planting_id', '=', t.context!.plantingId).execute()).toEqual([]);
    },
  },
  {
    method: 'GET',
    route: '/api/dashboard',
    expect: anySignedIn(200),
    target: () => ({ path: '/api/dashboard' }),
    check: (res, fx, actor) => {
      // Only steps of properties the person belongs to: an outsider's dashboard never shows property A.
      if (actor === 'outsider') expect(JSON.stringify(res.body)).not.toContain(fx.propertyA.id);
    },
  },
  {
    // Marking the dashboard seen is the person's own business: any signed-in person, only their own row.
    method: 'POST',
    route: '/api/dashboard/visit',
    expect: anySignedIn(204),
    target: () => ({ path: '/api/dashboard/visit', body: { seenAt: new Date().toISOString() } }),
    check: async (_res, fx, actor) => {
      const row = await fx.db.selectFrom('users').select('last_seen_at').where('id', '=', fx.people[actor as Exclude<Actor, 'signedOut'>].user.id).executeTakeFirstOrThrow();
      expect(row.last_seen_at).not.toBeNull();
    },
  },
  {
    // Everyone signed in gets their phone list; it holds only steps of their own properties where they may
    // work — a viewer's list has none of A's unassigned steps (my-steps.test.ts).
    method: 'GET',
    route: '/api/my-steps',
    expect: anySignedIn(200),
    target: async (fx) => {
      const spray = await sprayStepOf(fx, fx.plotA.id);
      const tomorrow = new Intl.DateTimeFormat('en-CA', { timeZone: 'America/Chicago', year: 'numeric', month: '2-digit', day: '2-digit' }).format(Date.now() + 86_400_000);
      await fx.db.updateTable('steps').set({ local_date: tomorrow, assignee_id: null }).where('id', '=', spray.id).execute();
      return { path: '/api/my-steps', context: { stepId: spray.id } };
    },
    check: (res, fx, actor, t) => {
      const ids = res.body.steps.map((s: { stepId: string }) => s.stepId);
      expect(ids.includes(t.context!.stepId)).toBe(actor === 'owner' || actor === 'manager' || actor === 'member');
      expect(res.text).not.toContain(fx.plotB.id);
    },
  },
  {
    // Everyone signed in gets a calendar; it holds only the plots of their own properties (calendar.test.ts).
    method: 'GET',
    route: '/api/calendar',
    expect: anySignedIn(200),
    target: async (fx) => {
      await sprayStepOf(fx, fx.plotA.id);
      return { path: '/api/calendar?from=2027-06-01&to=2027-12-31' };
    },
    check: (res, fx, actor) => {
      const plots = new Set(res.body.events.map((e: { plotId: string }) => e.plotId));
      expect(plots.has(fx.plotB.id)).toBe(false);
      expect(plots.has(fx.plotA.id)).toBe(actor !== 'outsider');
    },
  },
  {
    method: 'GET',
    route: '/api/steps/[stepId]',
    expect: READ,
    target: async (fx) => {
      const spray = await sprayStepOf(fx, fx.plotA.id);
      return { path: `/api/steps/${spray.id}`, context: { stepId: spray.id } };
    },
    check: (res, fx, _actor, t) => {
      expect(res.body.step.id).toBe(t.context!.stepId);
      expect(res.body.plot).toEqual({ id: fx.plotA.id, name: fx.plotA.name });
      expect(res.body.property).toEqual({ id: fx.propertyA.id, name: fx.propertyA.name, timeZone: 'America/Chicago' });
      expect(res.body.moves).toEqual([]);
    },
  },
  {
    method: 'PATCH',
    route: '/api/steps/[stepId]',
    expect: managerWrite(200),
    target: async (fx) => {
      const spray = await sprayStepOf(fx, fx.plotA.id);
      return { path: `/api/steps/${spray.id}`, body: { pinned: true, assigneeId: fx.people.member.user.id }, context: { stepId: spray.id } };
    },
    snapshot: (fx, t) => fx.db.selectFrom('steps').selectAll().where('id', '=', t.context!.stepId).executeTakeFirst(),
    check: async (res, fx, _actor, t) => {
      const row = await fx.db.selectFrom('steps').selectAll().where('id', '=', t.context!.stepId).executeTakeFirstOrThrow();
      expect([row.pinned, row.assignee_id]).toEqual([true, fx.people.member.user.id]);
      expect(res.body.step).toMatchObject({ id: t.context!.stepId, pinned: true, assigneeId: fx.people.member.user.id });
    },
  },
  {
    // Managers move any step; a member only the steps given to them (this one is nobody's), a viewer none
    // (step-move.test.ts has the member's own step and the rules' refusals).
    method: 'POST',
    route: '/api/steps/[stepId]/move',
    expect: managerWrite(200),
    target: async (fx) => {
      const spray = await sprayStepOf(fx, fx.plotA.id);
      const next = new Date(Date.parse(`${spray.local_date}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
      return { path: `/api/steps/${spray.id}/move`, body: { date: next, confirm: true }, context: { stepId: spray.id, date: next } };
    },
    snapshot: async (fx, t) => ({
      step: await fx.db.selectFrom('steps').selectAll().where('id', '=', t.context!.stepId).executeTakeFirst(),
      moves: await fx.db.selectFrom('step_moves').select('id').where('step_id', '=', t.context!.stepId).execute(),
    }),
    check: async (res, fx, actor, t) => {
      const row = await fx.db.selectFrom('steps').selectAll().where('id', '=', t.context!.stepId).executeTakeFirstOrThrow();
      expect([row.local_date, row.pinned]).toEqual([t.context!.date, true]);
      const moves = await fx.db.selectFrom('step_moves').selectAll().where('step_id', '=', t.context!.stepId).execute();
      expect(moves.map((m) => [m.to_date, m.moved_by])).toEqual([[t.context!.date, fx.people[actor as 'owner'].user.id]]);
      expect(res.body.step).toMatchObject({ id: t.context!.stepId, date: t.context!.date, pinned: true });
    },
  },
  {
    method: 'POST',
    route: '/api/plots/[plotId]/plan/compare',
    expect: memberWrite(200),
    target: (fx) => ({ path: `/api/plots/${fx.plotA.id}/plan/compare`, body: { planting: PREVIEW_BODY, seedDates: ['2027-09-01', '2027-09-10'] } }),
    snapshot: (fx) => fx.db.selectFrom('plantings').select('id').where('plot_id', '=', fx.plotA.id).orderBy('id').execute(),
    check: (res) => expect(res.body.options.map((o: { seedDate: string }) => o.seedDate)).toEqual(['2027-09-01', '2027-09-10']),
  },
  {
    // Money is the club's business: owners and managers only (expenses.test.ts has the totals and the split).
    method: 'GET',
    route: '/api/properties/[propertyId]/expenses',
    expect: managerWrite(200),
    target: async (fx) => {
      await expenseOf(fx, fx.propertyB.id, fx.people.ownerB.user.id);
      return { path: `/api/properties/${fx.propertyA.id}/expenses` };
    },
    check: (res, fx) => {
      for (const e of res.body.expenses) expect(e.propertyId).toBe(fx.propertyA.id);
      expect(res.body.sharers.map((s: { id: string }) => s.id)).not.toContain(fx.people.viewer.user.id);
      expect(typeof res.body.summary.totalCents).toBe('number');
    },
  },
  {
    method: 'POST',
    route: '/api/properties/[propertyId]/expenses',
    expect: managerWrite(201),
    target: (fx) => ({
      path: `/api/properties/${fx.propertyA.id}/expenses`,
      body: { plotId: fx.plotA.id, season: 'fall', year: 2027, spentOn: '2027-08-20', category: 'seed', description: `Seed ${randomUUID()}`, amount: '45.10', paidBy: fx.people.member.user.id },
    }),
    snapshot: (fx) => fx.db.selectFrom('expenses').select('id').where('property_id', '=', fx.propertyA.id).orderBy('id').execute(),
    check: (res, fx) => expect(res.body.expense).toMatchObject({ propertyId: fx.propertyA.id, plotId: fx.plotA.id, amountCents: 4_510, paidBy: fx.people.member.user.id }),
  },
  {
    method: 'DELETE',
    route: '/api/properties/[propertyId]/expenses/[expenseId]',
    expect: managerWrite(204),
    target: async (fx) => {
      const id = await expenseOf(fx, fx.propertyA.id, fx.people.owner.user.id);
      return { path: `/api/properties/${fx.propertyA.id}/expenses/${id}`, context: { expenseId: id } };
    },
    snapshot: (fx, t) => fx.db.selectFrom('expenses').select('id').where('id', '=', t.context!.expenseId).executeTakeFirst(),
    check: async (_res, fx, _actor, t) =>
      expect(await fx.db.selectFrom('expenses').select('id').where('id', '=', t.context!.expenseId).executeTakeFirst()).toBeUndefined(),
  },
  {
    method: 'GET',
    route: '/api/properties/[propertyId]/expenses/export',
    expect: managerWrite(200),
    target: async (fx) => {
      await expenseOf(fx, fx.propertyA.id, fx.people.owner.user.id);
      return { path: `/api/properties/${fx.propertyA.id}/expenses/export` };
    },
    check: (res) => {
      expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
      expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="sowcast-expenses-[a-z0-9-]+\.csv"$/);
      expect(res.text.split('\r\n')[0]).toBe('Date,Season,Year,Plot,Category,Description,Amount (USD),Labour hours,Paid by,Split among');
    },
  },
  {
    // Every actor here has confirmed their address; an unconfirmed one is in account-security.test.ts.
    method: 'POST',
    route: '/api/settings/email-verification',
    expect: anySignedIn(409),
    target: () => ({ path: '/api/settings/email-verification' }),
  },
  {
    // A wrong current password changes nothing for anyone; a right one ends the actor's sessions, so it is
    // tested on its own people in account-security.test.ts.
    method: 'POST',
    route: '/api/settings/password',
    expect: anySignedIn(400),
    target: () => ({ path: '/api/settings/password', body: { currentPassword: 'not the current password', newPassword: `new-${randomUUID()}` } }),
    check: (res) => expect(res.body.fields.currentPassword).toBeTruthy(),
  },
  {
    // A person's own calendar feeds; the list never carries a token or its hash (ical-feed.test.ts).
    method: 'GET',
    route: '/api/settings/calendar-feeds',
    expect: anySignedIn(200),
    target: () => ({ path: '/api/settings/calendar-feeds' }),
    check: (res) => {
      expect(Array.isArray(res.body.feeds)).toBe(true);
      expect(res.text).not.toMatch(/[0-9a-f]{64}/);
    },
  },
  {
    method: 'POST',
    route: '/api/settings/calendar-feeds',
    expect: anySignedIn(201),
    target: (_fx, actor) => ({ path: '/api/settings/calendar-feeds', body: { label: `Phone of ${actor} ${randomUUID()}` } }),
    snapshot: (fx, t) => fx.db.selectFrom('calendar_feeds').select('id').where('label', '=', (t.body as { label: string }).label).execute(),
    check: async (res, fx, actor) => {
      expect(res.body.url).toMatch(/\/api\/calendar-feed\/[A-Za-z0-9_-]{43}$/);
      const row = await fx.db.selectFrom('calendar_feeds').select('user_id').where('id', '=', res.body.feed.id).executeTakeFirstOrThrow();
      expect(row.user_id).toBe(fx.people[actor as 'owner'].user.id);
    },
  },
  {
    // Only one's own feed: the signed-out request names spare's feed and must leave it working.
    method: 'DELETE',
    route: '/api/settings/calendar-feeds/[feedId]',
    expect: anySignedIn(204),
    target: async (fx, actor) => {
      const holder = actor === 'signedOut' ? fx.people.spare : fx.people[actor];
      const made = await holder.client.post('/api/settings/calendar-feeds', {});
      if (made.status !== 201) throw new Error(`making a feed answered ${made.status}: ${made.text}`);
      return { path: `/api/settings/calendar-feeds/${made.body.feed.id}`, context: { feedId: made.body.feed.id } };
    },
    snapshot: (fx, t) => fx.db.selectFrom('calendar_feeds').select('revoked_at').where('id', '=', t.context!.feedId).executeTakeFirst(),
    check: async (_res, fx, _actor, t) => {
      const row = await fx.db.selectFrom('calendar_feeds').select('revoked_at').where('id', '=', t.context!.feedId).executeTakeFirstOrThrow();
      expect(row.revoked_at).toBeInstanceOf(Date);
    },
  },
  {
    // Like an invitation link, the secret token is the credential: whoever holds it reads the owner's steps,
    // signed in or not, and sees only that person's properties (no session is looked at).
    method: 'GET',
    route: '/api/calendar-feed/[token]',
    expect: anyone(200),
    target: async (fx) => {
      await sprayStepOf(fx, fx.plotA.id);
      const made = await fx.people.owner.client.post('/api/settings/calendar-feeds', {});
      return { path: new URL(made.body.url).pathname };
    },
    check: (res, fx) => {
      expect(res.headers.get('content-type')).toBe('text/calendar; charset=utf-8');
      expect(res.text.startsWith('BEGIN:VCALENDAR\r\n')).toBe(true);
      expect(res.text).toContain(fx.plotA.name);
      expect(res.text).not.toContain(fx.plotB.name);
    },
  },
  {
    method: 'POST',
    route: '/api/plots/[plotId]/photos',
    expect: memberWrite(201),
    target: async (fx) => ({ path: `/api/plots/${fx.plotA.id}/photos`, options: await multipartPhoto() }),
    snapshot: (fx) => countOf(fx, 'uploads', 'plot_id', fx.plotA.id),
    check: (res, fx) => expect(res.body.upload).toMatchObject({ kind: 'photo', plotId: fx.plotA.id, contentType: 'image/webp' }),
  },
  {
    method: 'GET',
    route: '/api/uploads/[uploadId]',
    expect: READ,
    target: async (fx) => ({ path: `/api/uploads/${(await storedPhotoOf(fx)).id}` }),
    check: (res) => {
      expect(res.headers.get('content-type')).toBe('image/webp');
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    },
  },
  {
    method: 'DELETE',
    route: '/api/uploads/[uploadId]',
    expect: managerWrite(204),
    target: async (fx) => {
      const row = await storedPhotoOf(fx);
      return { path: `/api/uploads/${row.id}`, context: { uploadId: row.id } };
    },
    snapshot: (fx, t) => fx.db.selectFrom('uploads').select('id').where('id', '=', t.context!.uploadId).executeTakeFirst(),
    check: async (_res, fx, _actor, t) => {
      expect(await fx.db.selectFrom('uploads').select('id').where('id', '=', t.context!.uploadId).executeTakeFirst()).toBeUndefined();
    },
  },
  {
    method: 'GET',
    route: '/api/uploads/[uploadId]/thumb',
    expect: READ,
    target: async (fx) => ({ path: `/api/uploads/${(await storedPhotoOf(fx)).id}/thumb` }),
    check: (res) => expect(res.headers.get('cache-control')).toMatch(/^private/),
  },
  {
    method: 'GET',
    route: '/api/plantings/[plantingId]/observations',
    expect: READ,
    target: async (fx) => ({ path: `/api/plantings/${await cloverPlantingOf(fx)}/observations` }),
    check: (res) => expect(Array.isArray(res.body.observations)).toBe(true),
  },
  {
    method: 'POST',
    route: '/api/plantings/[plantingId]/observations',
    expect: memberWrite(201),
    target: async (fx) => {
      const plantingId = await cloverPlantingOf(fx);
      return { path: `/api/plantings/${plantingId}/observations`, body: { standRating: 4, frameCounts: [40, 38], frameSqFt: 1, weedPressure: 'none' }, context: { plantingId } };
    },
    snapshot: (fx, t) => countOf(fx, 'observations', 'planting_id', t.context!.plantingId),
    check: (res) => expect(res.body.stand.verdict).toBe('good'),
  },
  {
    method: 'POST',
    route: '/api/plantings/[plantingId]/reseed/preview',
    expect: memberWrite(200),
    target: async (fx) => {
      const plantingId = await cloverPlantingOf(fx);
      const check = await poorCheckOf(fx, plantingId);
      return { path: `/api/plantings/${plantingId}/reseed/preview`, body: { observationId: check.id }, context: { plantingId } };
    },
    snapshot: (fx) => countOf(fx, 'plantings', 'plot_id', fx.plotA.id),
    check: (res) => expect(res.body.reseed.plan.steps.some((s: { kind: string; status: string }) => s.kind === 'seed' && s.status === 'planned')).toBe(true),
  },
  {
    method: 'POST',
    route: '/api/plantings/[plantingId]/reseed',
    expect: managerWrite(201),
    target: async (fx) => {
      const plantingId = await cloverPlantingOf(fx);
      const check = await poorCheckOf(fx, plantingId);
      return { path: `/api/plantings/${plantingId}/reseed`, body: { observationId: check.id }, context: { observationId: check.id } };
    },
    snapshot: (fx) => countOf(fx, 'plantings', 'plot_id', fx.plotA.id),
    check: async (res, fx, _actor, t) => {
      const row = await fx.db.selectFrom('observations').select('reseed_planting_id').where('id', '=', t.context!.observationId).executeTakeFirstOrThrow();
      expect(row.reseed_planting_id).toBe(res.body.planting.id);
    },
  },
];

let fx: Fixture;

beforeAll(async () => {
  const db = testDb();
  const [owner, manager, member, viewer, outsider, spare, ownerB] = await Promise.all(
    ['owner', 'manager', 'member', 'viewer', 'outsider', 'spare', 'owner-b'].map((p) => signedInUser(`access-${p}`)),
  );
  const propertyA = await createProperty(owner.client, { name: `Access A ${randomUUID()}` });
  const plotA = await createPlot(owner.client, propertyA.id);
  await Promise.all([
    addMember(owner.client, propertyA.id, manager, 'manager'),
    addMember(owner.client, propertyA.id, member, 'member'),
    addMember(owner.client, propertyA.id, viewer, 'viewer'),
    addMember(owner.client, propertyA.id, spare, 'member'),
  ]);
  const propertyB = await createProperty(ownerB.client, { name: `Access B ${randomUUID()}` });
  const plotB = await createPlot(ownerB.client, propertyB.id);
  const people = { owner, manager, member, viewer, outsider, spare, ownerB };
  fx = {
    db,
    people,
    clients: {
      owner: owner.client,
      manager: manager.client,
      member: member.client,
      viewer: viewer.client,
      outsider: outsider.client,
      signedOut: new Client('signed out'),
    },
    propertyA,
    plotA,
    propertyB,
    plotB,
    stepB: { id: '' },
    context: {},
  };
  fx.stepB = { id: (await sprayStepOf(fx, plotB.id)).id };
});

afterAll(async () => {
  await fx?.db.destroy();
});

// Routes that are not about a property: sign-in (tests/integration/auth.test.ts), sign-up
// (validation.test.ts, account-security.test.ts), the e-mail confirmation link (its token is the proof, no session;
// account-security.test.ts), "sign out everywhere" (it would end the actors' own sessions; account-security.test.ts)
// and the health probe.
const OUTSIDE_THE_MATRIX = ['/api/auth/[...nextauth]', '/api/users', '/api/users/verification', '/api/settings/sessions', '/api/health'];

function routeHandlers(): string[] {
  const apiDir = path.resolve(__dirname, '../../app/api');
  const found: string[] = [];
  for (const entry of readdirSync(apiDir, { recursive: true, encoding: 'utf8' })) {
    if (path.basename(entry) !== 'route.ts') continue;
    const route = `/api/${path.dirname(entry).split(path.sep).join('/')}`;
    const source = readFileSync(path.join(apiDir, entry), 'utf8');
    for (const m of source.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g)) {
      found.push(`${m[1]} ${route}`);
    }
    for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
      for (const name of m[1].matchAll(/\bas\s+(GET|POST|PUT|PATCH|DELETE)\b/g)) found.push(`${name[1]} ${route}`);
    }
  }
  return found.sort();
}

it('the matrix covers every method of every route handler under app/api', () => {
  const handlers = routeHandlers().filter((h) => !OUTSIDE_THE_MATRIX.includes(h.split(' ')[1]));
  expect(handlers.length).toBeGreaterThanOrEqual(18);
  expect(handlers).toEqual(CASES.map((c) => `${c.method} ${c.route}`).sort());
});

describe('role matrix: every route handler, every kind of person', () => {
  for (const c of CASES) {
    describe(`${c.method} ${c.route}`, () => {
      for (const actor of ACTORS) {
        const status = c.expect[actor];
        it(`${actor} → ${status}`, async () => {
          const target = await c.target(fx, actor);
          const before = c.snapshot ? await c.snapshot(fx, target) : undefined;
          const res = await fx.clients[actor].request(c.method, target.path, target.options ?? (target.body === undefined ? {} : { json: target.body }));
          expect(res.status, res.text).toBe(status);
          if (status >= 400) {
            expect(typeof res.body.error).toBe('string');
            if (status === 401) expect(res.body.error).toBe('Sign in first');
            if (status === 404) {
              // No leak: the same answer a property that does not exist gets, nothing of A's data.
              expect(res.body).toEqual({ error: 'Not found' });
              expect(res.text).not.toContain(fx.propertyA.name);
            }
            if (c.snapshot) expect(await c.snapshot(fx, target)).toEqual(before);
          } else {
            await c.check?.(res, fx, actor, target);
          }
        });
      }
    });
  }
});

describe('same-site request forgery: every state-changing route, sent by the owner’s browser from another page', () => {
  // A page on a sibling port (or subdomain) is "same site", so the session cookie goes along; the Origin
  // header names the page (Fetch Standard, "origin header"). OWASP CSRF Prevention Cheat Sheet: verify it.
  const SIBLING = { origin: new URL(baseUrl()).origin.replace(/:(\d+)$/, (_m, port) => `:${Number(port) + 1}`) };
  for (const c of CASES.filter((k) => k.method !== 'GET')) {
    it(`${c.method} ${c.route}: 403 from another origin, 415 for a JSON body as text/plain, nothing changed`, async () => {
      const target = await c.target(fx, 'owner');
      const before = c.snapshot ? await c.snapshot(fx, target) : undefined;
      const sent = target.options ?? (target.body === undefined ? {} : { json: target.body });
      const forged = await fx.clients.owner.request(c.method, target.path, { ...sent, headers: { ...sent.headers, ...SIBLING } });
      expect(forged.status, forged.text).toBe(403);
      const fetchSite = await fx.clients.owner.request(c.method, target.path, { ...sent, headers: { ...sent.headers, 'sec-fetch-site': 'same-site' } });
      expect(fetchSite.status, fetchSite.text).toBe(403);
      if (target.body !== undefined) {
        // What an HTML form can post without a CORS preflight: the JSON text as text/plain.
        const plain = await fx.clients.owner.request(c.method, target.path, { raw: JSON.stringify(target.body), contentType: 'text/plain' });
        expect(plain.status, plain.text).toBe(415);
      }
      if (c.snapshot) expect(await c.snapshot(fx, target)).toEqual(before);
    });
  }
});

describe('a member of property A using the ids of property B', () => {
  const MEMBERS = ['owner', 'manager', 'member', 'viewer'] as const;
  const REQUESTS = [
    { method: 'GET', path: (f: Fixture) => `/api/plots/${f.plotB.id}` },
    { method: 'PATCH', path: (f: Fixture) => `/api/plots/${f.plotB.id}`, body: { notes: 'not yours' } },
    { method: 'DELETE', path: (f: Fixture) => `/api/plots/${f.plotB.id}` },
    { method: 'GET', path: (f: Fixture) => `/api/properties/${f.propertyB.id}` },
    { method: 'PATCH', path: (f: Fixture) => `/api/properties/${f.propertyB.id}`, body: { name: 'Taken over' } },
    { method: 'DELETE', path: (f: Fixture) => `/api/properties/${f.propertyB.id}` },
    { method: 'GET', path: (f: Fixture) => `/api/properties/${f.propertyB.id}/plots` },
    { method: 'POST', path: (f: Fixture) => `/api/properties/${f.propertyB.id}/plots`, body: plotBody() },
    { method: 'GET', path: (f: Fixture) => `/api/properties/${f.propertyB.id}/members` },
    { method: 'GET', path: (f: Fixture) => `/api/properties/${f.propertyB.id}/invitations` },
    { method: 'POST', path: (f: Fixture) => `/api/steps/${f.stepB.id}/complete`, body: { status: 'done' } },
    { method: 'GET', path: (f: Fixture) => `/api/properties/${f.propertyB.id}/weather` },
    { method: 'GET', path: (f: Fixture) => `/api/plots/${f.plotB.id}/weather` },
  ] as const;

  for (const actor of MEMBERS) {
    for (const r of REQUESTS) {
      it(`${actor} of A: ${r.method} ${r.path({ plotB: { id: '[plot of B]' }, propertyB: { id: '[B]' }, stepB: { id: '[step of B]' } } as Fixture)} → 404`, async () => {
        const plotBefore = await fx.db.selectFrom('plots').selectAll().where('property_id', '=', fx.propertyB.id).execute();
        const propertyBefore = await fx.db.selectFrom('properties').selectAll().where('id', '=', fx.propertyB.id).executeTakeFirst();
        const res = await fx.clients[actor].request(r.method, r.path(fx), 'body' in r ? { json: r.body } : {});
        expect(res.status, res.text).toBe(404);
        expect(res.body).toEqual({ error: 'Not found' });
        expect(res.text).not.toContain(fx.plotB.name);
        expect(await fx.db.selectFrom('plots').selectAll().where('property_id', '=', fx.propertyB.id).execute()).toEqual(plotBefore);
        expect(await fx.db.selectFrom('properties').selectAll().where('id', '=', fx.propertyB.id).executeTakeFirst()).toEqual(propertyBefore);
      });
    }
  }

  it("B's owner cannot change or remove A's people through B's address", async () => {
    const owner = fx.people.ownerB.client;
    const patch = await owner.patch(`/api/properties/${fx.propertyB.id}/members/${fx.people.member.user.id}`, { role: 'viewer' });
    expect(patch.status).toBe(404);
    const remove = await owner.delete(`/api/properties/${fx.propertyB.id}/members/${fx.people.member.user.id}`);
    expect(remove.status).toBe(404);
    expect(await roleOf(fx, fx.propertyA.id, fx.people.member.user.id)).toBe('member');
  });

  it("B's owner cannot revoke A's invitation through B's address", async () => {
    const invitation = await invite(fx.people.owner.client, fx.propertyA.id, uniqueEmail('cross'), 'viewer');
    const res = await fx.people.ownerB.client.delete(`/api/properties/${fx.propertyB.id}/invitations/${invitation.id}`);
    expect(res.status).toBe(404);
    const state = await new Client().get(`/api/invitations/${invitation.token}`);
    expect(state.body.invitation.state).toBe('open');
  });

  it('a non-member gets exactly the answer a property that does not exist gets', async () => {
    const outsider = fx.clients.outsider;
    const missing = randomUUID();
    for (const suffix of ['', '/plots', '/members', '/invitations', '/weather']) {
      const real = await outsider.get(`/api/properties/${fx.propertyA.id}${suffix}`);
      const none = await outsider.get(`/api/properties/${missing}${suffix}`);
      expect([real.status, real.text]).toEqual([none.status, none.text]);
    }
    const realPlot = await outsider.get(`/api/plots/${fx.plotA.id}`);
    const nonePlot = await outsider.get(`/api/plots/${randomUUID()}`);
    expect([realPlot.status, realPlot.text]).toEqual([nonePlot.status, nonePlot.text]);
  });
});

describe('malformed ids in the path answer 404, never 500', () => {
  const BAD_IDS = ['not-a-uuid', '12345', '00000000-0000-0000-0000-00000000000g', "1' or '1'='1", '%00'];
  const REQUESTS: { method: string; path: (id: string, f: Fixture) => string; body?: unknown }[] = [
    { method: 'GET', path: (id) => `/api/properties/${id}` },
    { method: 'PATCH', path: (id) => `/api/properties/${id}`, body: { name: 'X' } },
    { method: 'DELETE', path: (id) => `/api/properties/${id}` },
    { method: 'GET', path: (id) => `/api/properties/${id}/plots` },
    { method: 'POST', path: (id) => `/api/properties/${id}/plots`, body: plotBody() },
    { method: 'GET', path: (id) => `/api/plots/${id}` },
    { method: 'PATCH', path: (id) => `/api/plots/${id}`, body: { notes: 'x' } },
    { method: 'DELETE', path: (id) => `/api/plots/${id}` },
    { method: 'GET', path: (id) => `/api/properties/${id}/members` },
    { method: 'PATCH', path: (id, f) => `/api/properties/${f.propertyA.id}/members/${id}`, body: { role: 'viewer' } },
    { method: 'DELETE', path: (id, f) => `/api/properties/${f.propertyA.id}/members/${id}` },
    { method: 'PATCH', path: (id) => `/api/properties/${id}/members/${randomUUID()}`, body: { role: 'viewer' } },
    { method: 'GET', path: (id) => `/api/properties/${id}/invitations` },
    { method: 'POST', path: (id) => `/api/properties/${id}/invitations`, body: { email: 'x@example.test', role: 'viewer' } },
    { method: 'DELETE', path: (id, f) => `/api/properties/${f.propertyA.id}/invitations/${id}` },
    { method: 'DELETE', path: (id) => `/api/properties/${id}/invitations/${randomUUID()}` },
    { method: 'GET', path: (id) => `/api/invitations/${id}` },
    { method: 'POST', path: (id) => `/api/invitations/${id}/accept` },
    { method: 'POST', path: (id) => `/api/steps/${id}/complete`, body: { status: 'done' } },
    { method: 'GET', path: (id) => `/api/properties/${id}/weather` },
  ];
  for (const r of REQUESTS) {
    it(`${r.method} ${r.path('{bad}', { propertyA: { id: '[A]' } } as Fixture)}`, async () => {
      for (const id of BAD_IDS) {
        const res = await fx.clients.owner.request(r.method, r.path(encodeURIComponent(id), fx), r.body === undefined ? {} : { json: r.body });
        expect(res.status, `${id}: ${res.text}`).toBe(404);
        expect(res.body).toEqual({ error: 'Not found' });
      }
    });
  }

  it('a well-formed token that matches no invitation is 404', async () => {
    const token = randomUUID().replaceAll('-', '');
    expect((await fx.clients.member.get(`/api/invitations/${token}`)).status).toBe(404);
    expect((await fx.clients.member.post(`/api/invitations/${token}/accept`)).status).toBe(404);
  });
});

describe('owners and people', () => {
  it('the last owner can be neither demoted nor removed (409), and nothing changes', async () => {
    const property = await propertyWithRoles(fx);
    const owner = fx.people.owner;
    const demote = await owner.client.patch(`/api/properties/${property.id}/members/${owner.user.id}`, { role: 'manager' });
    expect(demote.status).toBe(409);
    expect(demote.body.error).toMatch(/at least one owner/);
    const leave = await owner.client.delete(`/api/properties/${property.id}/members/${owner.user.id}`);
    expect(leave.status).toBe(409);
    expect(await roleOf(fx, property.id, owner.user.id)).toBe('owner');
  });

  it('with a second owner, the first may step down; then the second is the last and is held', async () => {
    const property = await propertyWithRoles(fx);
    const { owner, spare } = fx.people;
    expect((await owner.client.patch(`/api/properties/${property.id}/members/${spare.user.id}`, { role: 'owner' })).status).toBe(200);
    expect((await owner.client.patch(`/api/properties/${property.id}/members/${owner.user.id}`, { role: 'viewer' })).status).toBe(200);
    expect(await roleOf(fx, property.id, owner.user.id)).toBe('viewer');
    // The former owner is now a viewer: 403 on people.
    expect((await owner.client.get(`/api/properties/${property.id}/invitations`)).status).toBe(403);
    expect((await spare.client.patch(`/api/properties/${property.id}/members/${spare.user.id}`, { role: 'manager' })).status).toBe(409);
    expect((await spare.client.delete(`/api/properties/${property.id}/members/${spare.user.id}`)).status).toBe(409);
    expect(await roleOf(fx, property.id, spare.user.id)).toBe('owner');
  });

  it('manager, member and viewer may each leave on their own (204), and then see 404', async () => {
    const property = await propertyWithRoles(fx);
    for (const actor of ['manager', 'member', 'viewer'] as const) {
      const { user, client } = fx.people[actor];
      const res = await client.delete(`/api/properties/${property.id}/members/${user.id}`);
      expect(res.status, actor).toBe(204);
      expect(await roleOf(fx, property.id, user.id)).toBeNull();
      expect((await client.get(`/api/properties/${property.id}`)).status).toBe(404);
    }
  });

  it('a role change to a role that does not exist is refused and names the field', async () => {
    const res = await fx.clients.owner.patch(`/api/properties/${fx.propertyA.id}/members/${fx.people.viewer.user.id}`, { role: 'admin' });
    expect(res.status).toBe(400);
    expect(res.body.fields.role).toMatch(/Role/);
    expect(await roleOf(fx, fx.propertyA.id, fx.people.viewer.user.id)).toBe('viewer');
  });
});

describe('invitations', () => {
  it('queue one e-mail to the invitee, with the acceptance link, for the worker to send', async () => {
    const email = uniqueEmail('mailed');
    const { id, link } = await invite(fx.people.owner.client, fx.propertyA.id, email, 'member');
    const rows = await fx.db.selectFrom('notifications').selectAll().where('dedupe_key', '=', `invitation:${id}`).execute();
    expect(rows).toHaveLength(1);
    const [row] = rows;
    expect(row).toMatchObject({ channel: 'email', email_to: email, user_id: null, kind: 'invitation', property_id: fx.propertyA.id, sent_at: null });
    expect(new Date(row.send_after as Date).getTime()).toBeLessThanOrEqual(Date.now() + 1000);
    const message = row.message as { subject: string; text: string; html: string };
    expect(message.subject).toContain(fx.propertyA.name);
    expect(message.text).toContain(link);
    expect(message.html).toContain(link);
    // The inviter still sees the link, to pass it on by hand if the e-mail does not arrive.
    expect(link).toMatch(/\/invitations\/[A-Za-z0-9_-]{20,}$/);
  });

  it('are stored as a SHA-256 of the token only (FIPS 180-4 via node:crypto); no column holds the token', async () => {
    const { token, id } = await invite(fx.people.owner.client, fx.propertyA.id, uniqueEmail('hashed'), 'member');
    const row = await fx.db.selectFrom('invitations').selectAll().where('id', '=', id).executeTakeFirstOrThrow();
    expect(row.token_hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(row)).not.toContain(token);
    const found = await fx.db.selectFrom('invitations').select('id').where('token_hash', '=', token).execute();
    expect(found).toEqual([]);
  });

  it('accepting with an account of another e-mail is 403 and leaves the invitation open', async () => {
    const invitee = uniqueEmail('intended');
    const { token } = await invite(fx.people.owner.client, fx.propertyA.id, invitee, 'manager');
    const res = await fx.clients.outsider.post(`/api/invitations/${token}/accept`);
    expect(res.status).toBe(403);
    expect(res.body.error).toContain(invitee);
    expect(await roleOf(fx, fx.propertyA.id, fx.people.outsider.user.id)).toBeNull();
    expect((await new Client().get(`/api/invitations/${token}`)).body.invitation.state).toBe('open');
  });

  it('matches the invited address whatever its letter case', async () => {
    const invited = await signedInUser('case');
    const { token } = await invite(fx.people.owner.client, fx.propertyA.id, invited.user.email.toUpperCase(), 'viewer');
    const res = await invited.client.post(`/api/invitations/${token}/accept`);
    expect(res.status, res.text).toBe(200);
  });

  it('accepting twice is 410 the second time', async () => {
    const property = await createProperty(fx.people.ownerB.client);
    const { token } = await invite(fx.people.ownerB.client, property.id, fx.people.viewer.user.email, 'viewer');
    expect((await fx.clients.viewer.post(`/api/invitations/${token}/accept`)).status).toBe(200);
    const again = await fx.clients.viewer.post(`/api/invitations/${token}/accept`);
    expect(again.status).toBe(410);
    expect(again.body.error).toMatch(/already been used/);
    expect((await new Client().get(`/api/invitations/${token}`)).body.invitation.state).toBe('accepted');
  });

  it('two racing acceptances of one invitation: exactly one succeeds', async () => {
    const property = await createProperty(fx.people.ownerB.client);
    const { token, id } = await invite(fx.people.ownerB.client, property.id, fx.people.member.user.email, 'member');
    const answers = await Promise.all([1, 2, 3].map(() => fx.clients.member.post(`/api/invitations/${token}/accept`)));
    expect(answers.map((a) => a.status).sort()).toEqual([200, 410, 410]);
    const row = await fx.db.selectFrom('invitations').select('accepted_by').where('id', '=', id).executeTakeFirstOrThrow();
    expect(row.accepted_by).toBe(fx.people.member.user.id);
  });

  it('a revoked invitation is 410 and grants nothing', async () => {
    const property = await createProperty(fx.people.ownerB.client);
    const { token, id } = await invite(fx.people.ownerB.client, property.id, fx.people.outsider.user.email, 'manager');
    expect((await fx.people.ownerB.client.delete(`/api/properties/${property.id}/invitations/${id}`)).status).toBe(204);
    const res = await fx.clients.outsider.post(`/api/invitations/${token}/accept`);
    expect(res.status).toBe(410);
    expect(res.body.error).toMatch(/withdrawn/);
    expect(await roleOf(fx, property.id, fx.people.outsider.user.id)).toBeNull();
    // Revoking again finds nothing open.
    expect((await fx.people.ownerB.client.delete(`/api/properties/${property.id}/invitations/${id}`)).status).toBe(404);
  });

  it('an expired invitation is 410', async () => {
    const property = await createProperty(fx.people.ownerB.client);
    const { token, id } = await invite(fx.people.ownerB.client, property.id, fx.people.outsider.user.email, 'viewer');
    await fx.db.updateTable('invitations').set({ expires_at: new Date(Date.now() - 60_000) }).where('id', '=', id).execute();
    expect((await new Client().get(`/api/invitations/${token}`)).body.invitation.state).toBe('expired');
    const res = await fx.clients.outsider.post(`/api/invitations/${token}/accept`);
    expect(res.status).toBe(410);
    expect(res.body.error).toMatch(/expired/);
    expect(await roleOf(fx, property.id, fx.people.outsider.user.id)).toBeNull();
  });

  it('accepting a lower role keeps the higher role one already has', async () => {
    const { token } = await invite(fx.people.owner.client, fx.propertyA.id, fx.people.manager.user.email, 'viewer');
    expect((await fx.clients.manager.post(`/api/invitations/${token}/accept`)).status).toBe(200);
    expect(await roleOf(fx, fx.propertyA.id, fx.people.manager.user.id)).toBe('manager');
  });
});

// ---- server actions ------------------------------------------------------------------------------------------

// Server actions are reachable by POST from any page, so they are held to the same matrix. Sowcast has none
// today (every form posts to a route handler above); the scan below still looks, and fails when one appears
// without an entry here. An entry names the file and export ('app/x/actions.ts#saveThing').
const SERVER_ACTION_CASES: Record<string, Expected> = {};

/** Files whose first statement is 'use server', and functions whose body starts with it (React's directive). */
function serverActions(): string[] {
  const root = path.resolve(__dirname, '../..');
  const found: string[] = [];
  for (const dir of ['app', 'components', 'lib']) {
    for (const entry of readdirSync(path.join(root, dir), { recursive: true, encoding: 'utf8' })) {
      if (!/\.(ts|tsx|js|jsx|mjs)$/.test(entry)) continue;
      const file = `${dir}/${entry.split(path.sep).join('/')}`;
      const source = readFileSync(path.join(root, file), 'utf8');
      if (!/['"]use server['"]/.test(source)) continue;
      // Comments and leading whitespace aside, the directive is the file's first statement.
      const body = source.replace(/^(\s|\/\/[^\n]*\n|\/\*[\s\S]*?\*\/)*/, '');
      if (/^['"]use server['"]/.test(body)) {
        const names = [...source.matchAll(/export\s+(?:async\s+)?(?:function|const)\s+(\w+)/g)].map((m) => m[1]);
        for (const name of names.length ? names : ['(no named export)']) found.push(`${file}#${name}`);
      }
      for (const m of source.matchAll(/(?:function\s+(\w+)|(?:const|let)\s+(\w+)\s*=\s*async)[^{]*\{\s*['"]use server['"]/g)) {
        found.push(`${file}#${m[1] ?? m[2]}`);
      }
      if (!found.some((f) => f.startsWith(`${file}#`))) found.push(`${file}#(unrecognised 'use server')`);
    }
  }
  return found.sort();
}

it('the matrix covers every server action under app/, components/ and lib/ (none today)', () => {
  const actions = serverActions();
  expect(actions).toEqual(Object.keys(SERVER_ACTION_CASES).sort());
  // The scan itself must work: it recognises both forms of the directive in a sample.
  expect(/['"]use server['"]/.test(`'use server';\nexport async function save() {}`)).toBe(true);
});

// ---- every id-taking route, with ids of another property ---------------------------------------------------

interface Foreign {
  blendId: string;
  recordId: string;
  expenseId: string;
  uploadId: string;
  plantingId: string;
  observationId: string;
  invitationId: string;
  feedId: string;
}

type CrossRequest = { path: string; body?: unknown; options?: RequestOptions };

const recordBodyB = (f: Fixture) => recordBody(f.plotB.id);
/**
 * For each route with an id in its path: the request with B's ids, sent by each of A's people (who belong
 * to none of B). Nested routes also get A's property with B's child id, sent by A's owner: the child must be
 * looked up within the property named in the path, not anywhere.
 */
const CROSS: Record<string, { b: (f: Fixture, x: Foreign) => CrossRequest; mixed?: (f: Fixture, x: Foreign) => CrossRequest }> = {
  'GET /api/properties/[propertyId]': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}` }) },
  'PATCH /api/properties/[propertyId]': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}`, body: { name: 'Taken over' } }) },
  'DELETE /api/properties/[propertyId]': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}` }) },
  'GET /api/properties/[propertyId]/plots': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}/plots` }) },
  'POST /api/properties/[propertyId]/plots': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}/plots`, body: plotBody() }) },
  'GET /api/properties/[propertyId]/blends': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}/blends` }) },
  'POST /api/properties/[propertyId]/blends': {
    b: (f) => ({ path: `/api/properties/${f.propertyB.id}/blends`, body: { name: 'Not yours', parts: [{ speciesId: 'white-clover', share: 1 }] } }),
  },
  'DELETE /api/properties/[propertyId]/blends/[blendId]': {
    b: (f, x) => ({ path: `/api/properties/${f.propertyB.id}/blends/${x.blendId}` }),
    mixed: (f, x) => ({ path: `/api/properties/${f.propertyA.id}/blends/${x.blendId}` }),
  },
  'GET /api/properties/[propertyId]/records': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}/records` }) },
  'POST /api/properties/[propertyId]/records': {
    b: (f) => ({ path: `/api/properties/${f.propertyB.id}/records`, body: recordBodyB(f) }),
    // A's own property, naming B's plot in the body.
    mixed: (f) => ({ path: `/api/properties/${f.propertyA.id}/records`, body: recordBodyB(f) }),
  },
  'GET /api/properties/[propertyId]/records/export': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}/records/export` }) },
  'GET /api/records/[recordId]': { b: (_f, x) => ({ path: `/api/records/${x.recordId}` }) },
  'POST /api/records/[recordId]/corrections': {
    b: (f, x) => ({ path: `/api/records/${x.recordId}/corrections`, body: { ...recordBodyB(f), correctionReason: 'Not yours' } }),
  },
  'GET /api/steps/[stepId]/record-draft': { b: (f) => ({ path: `/api/steps/${f.stepB.id}/record-draft` }) },
  'GET /api/plots/[plotId]': { b: (f) => ({ path: `/api/plots/${f.plotB.id}` }) },
  'PATCH /api/plots/[plotId]': { b: (f) => ({ path: `/api/plots/${f.plotB.id}`, body: { notes: 'not yours' } }) },
  'DELETE /api/plots/[plotId]': { b: (f) => ({ path: `/api/plots/${f.plotB.id}` }) },
  'POST /api/plots/[plotId]/plan/preview': { b: (f) => ({ path: `/api/plots/${f.plotB.id}/plan/preview`, body: PREVIEW_BODY }) },
  'POST /api/plots/[plotId]/plan/compare': {
    b: (f) => ({ path: `/api/plots/${f.plotB.id}/plan/compare`, body: { planting: PREVIEW_BODY, seedDates: ['2027-09-01', '2027-09-10'] } }),
  },
  'POST /api/steps/[stepId]/complete': { b: (f) => ({ path: `/api/steps/${f.stepB.id}/complete`, body: { status: 'done' } }) },
  'GET /api/properties/[propertyId]/members': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}/members` }) },
  'PATCH /api/properties/[propertyId]/members/[userId]': {
    b: (f) => ({ path: `/api/properties/${f.propertyB.id}/members/${f.people.ownerB.user.id}`, body: { role: 'viewer' } }),
    mixed: (f) => ({ path: `/api/properties/${f.propertyA.id}/members/${f.people.ownerB.user.id}`, body: { role: 'viewer' } }),
  },
  'DELETE /api/properties/[propertyId]/members/[userId]': {
    b: (f) => ({ path: `/api/properties/${f.propertyB.id}/members/${f.people.ownerB.user.id}` }),
    mixed: (f) => ({ path: `/api/properties/${f.propertyA.id}/members/${f.people.ownerB.user.id}` }),
  },
  'GET /api/properties/[propertyId]/invitations': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}/invitations` }) },
  'POST /api/properties/[propertyId]/invitations': {
    b: (f) => ({ path: `/api/properties/${f.propertyB.id}/invitations`, body: { email: uniqueEmail('cross'), role: 'owner' } }),
  },
  'DELETE /api/properties/[propertyId]/invitations/[invitationId]': {
    b: (f, x) => ({ path: `/api/properties/${f.propertyB.id}/invitations/${x.invitationId}` }),
    mixed: (f, x) => ({ path: `/api/properties/${f.propertyA.id}/invitations/${x.invitationId}` }),
  },
  'GET /api/properties/[propertyId]/weather': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}/weather` }) },
  'GET /api/plots/[plotId]/boundary': { b: (f) => ({ path: `/api/plots/${f.plotB.id}/boundary` }) },
  'POST /api/plots/[plotId]/boundary': { b: (f) => ({ path: `/api/plots/${f.plotB.id}/boundary`, options: multipartFile('field.geojson', SQUARE_GEOJSON) }) },
  'DELETE /api/plots/[plotId]/boundary': { b: (f) => ({ path: `/api/plots/${f.plotB.id}/boundary` }) },
  'GET /api/plots/[plotId]/soil-tests': { b: (f) => ({ path: `/api/plots/${f.plotB.id}/soil-tests` }) },
  'POST /api/plots/[plotId]/soil-tests': {
    b: (f) => ({ path: `/api/plots/${f.plotB.id}/soil-tests`, options: multipartFile('lab.csv', 'pH,P (ppm),K (ppm)\n6.1,22,140\n') }),
  },
  'GET /api/plots/[plotId]/weather': { b: (f) => ({ path: `/api/plots/${f.plotB.id}/weather` }) },
  'GET /api/plots/[plotId]/plantings': { b: (f) => ({ path: `/api/plots/${f.plotB.id}/plantings` }) },
  'POST /api/plots/[plotId]/plantings': { b: (f) => ({ path: `/api/plots/${f.plotB.id}/plantings`, body: PREVIEW_BODY }) },
  'GET /api/plantings/[plantingId]': { b: (_f, x) => ({ path: `/api/plantings/${x.plantingId}` }) },
  'DELETE /api/plantings/[plantingId]': { b: (_f, x) => ({ path: `/api/plantings/${x.plantingId}` }) },
  'GET /api/steps/[stepId]': { b: (f) => ({ path: `/api/steps/${f.stepB.id}` }) },
  'PATCH /api/steps/[stepId]': { b: (f) => ({ path: `/api/steps/${f.stepB.id}`, body: { pinned: true } }) },
  'POST /api/steps/[stepId]/move': { b: (f) => ({ path: `/api/steps/${f.stepB.id}/move`, body: { date: '2027-09-02', confirm: true } }) },
  'GET /api/properties/[propertyId]/expenses': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}/expenses` }) },
  'POST /api/properties/[propertyId]/expenses': {
    b: (f) => ({
      path: `/api/properties/${f.propertyB.id}/expenses`,
      body: { season: 'fall', year: 2027, spentOn: '2027-08-01', category: 'fuel', description: 'Not yours', amount: '1', paidBy: f.people.ownerB.user.id },
    }),
    // A's property, B's plot and B's owner in the body.
    mixed: (f) => ({
      path: `/api/properties/${f.propertyA.id}/expenses`,
      body: { plotId: f.plotB.id, season: 'fall', year: 2027, spentOn: '2027-08-01', category: 'fuel', description: 'Not yours', amount: '1', paidBy: f.people.owner.user.id },
    }),
  },
  'DELETE /api/properties/[propertyId]/expenses/[expenseId]': {
    b: (f, x) => ({ path: `/api/properties/${f.propertyB.id}/expenses/${x.expenseId}` }),
    mixed: (f, x) => ({ path: `/api/properties/${f.propertyA.id}/expenses/${x.expenseId}` }),
  },
  'GET /api/properties/[propertyId]/expenses/export': { b: (f) => ({ path: `/api/properties/${f.propertyB.id}/expenses/export` }) },
  'DELETE /api/settings/calendar-feeds/[feedId]': { b: (_f, x) => ({ path: `/api/settings/calendar-feeds/${x.feedId}` }) },
  'POST /api/plots/[plotId]/photos': { b: (f) => ({ path: `/api/plots/${f.plotB.id}/photos`, options: multipartFile('spot.jpg', 'not even a photo') }) },
  'GET /api/uploads/[uploadId]': { b: (_f, x) => ({ path: `/api/uploads/${x.uploadId}` }) },
  'DELETE /api/uploads/[uploadId]': { b: (_f, x) => ({ path: `/api/uploads/${x.uploadId}` }) },
  'GET /api/uploads/[uploadId]/thumb': { b: (_f, x) => ({ path: `/api/uploads/${x.uploadId}/thumb` }) },
  'GET /api/plantings/[plantingId]/observations': { b: (_f, x) => ({ path: `/api/plantings/${x.plantingId}/observations` }) },
  'POST /api/plantings/[plantingId]/observations': {
    b: (_f, x) => ({ path: `/api/plantings/${x.plantingId}/observations`, body: { standRating: 3, frameCounts: [4], frameSqFt: 1, weedPressure: 'light' } }),
  },
  'POST /api/plantings/[plantingId]/reseed/preview': {
    b: (_f, x) => ({ path: `/api/plantings/${x.plantingId}/reseed/preview`, body: { observationId: x.observationId } }),
    // A's planting, B's check.
    mixed: (f, x) => ({ path: `/api/plantings/${f.context.cloverA}/reseed/preview`, body: { observationId: x.observationId } }),
  },
  'POST /api/plantings/[plantingId]/reseed': {
    b: (_f, x) => ({ path: `/api/plantings/${x.plantingId}/reseed`, body: { observationId: x.observationId } }),
    mixed: (f, x) => ({ path: `/api/plantings/${f.context.cloverA}/reseed`, body: { observationId: x.observationId } }),
  },
};

// Ids that are secrets in their own right (a token is the permission), not ids of a property's rows.
const TOKEN_ROUTE = /\[token\]|\[\.\.\.nextauth\]/;

it('every route with an id in its path has a request with the ids of another property', () => {
  const withIds = CASES.map((c) => `${c.method} ${c.route}`).filter((k) => /\[\w+\]/.test(k) && !TOKEN_ROUTE.test(k)).sort();
  expect(withIds.length).toBeGreaterThanOrEqual(40);
  expect(Object.keys(CROSS).sort()).toEqual(withIds);
});

/** Count and md5 of every row, in every table, whose text names one of B's ids (PostgreSQL record output). */
async function rowsNaming(fx: Fixture, ids: string[]) {
  const { rows: tables } = await sql<{ t: string }>`
    select n.nspname || '.' || c.relname as t from pg_class c join pg_namespace n on n.oid = c.relnamespace
    where c.relkind in ('r', 'p') and not c.relispartition and n.nspname not in ('pg_catalog', 'information_schema') and n.nspname not like 'pg_toast%'
    order by 1`.execute(fx.db);
  const pattern = ids.join('|');
  const out: Record<string, string> = {};
  for (const { t } of tables) {
    const { rows } = await sql<{ n: number; sum: string | null }>`
      select count(*)::int as n, md5(string_agg(md5(r::text), ',' order by md5(r::text))) as sum from ${sql.table(t)} as r where r::text ~ ${pattern}`.execute(fx.db);
    if (rows[0].n) out[t] = `${rows[0].n}:${rows[0].sum}`;
  }
  return out;
}

describe('every id-taking route, with the ids of property B', () => {
  let x: Foreign;
  let idsOfB: string[];

  beforeAll(async () => {
    const ownerB = fx.people.ownerB;
    const blend = await ownerB.client.post(`/api/properties/${fx.propertyB.id}/blends`, { name: `B blend ${randomUUID()}`, parts: [{ speciesId: 'white-clover', share: 1 }] });
    const record = await recordOf(fx, fx.propertyB.id, fx.plotB.id);
    const expenseId = await expenseOf(fx, fx.propertyB.id, ownerB.user.id);
    const { storage } = await import('@/lib/storage');
    const bytes = new TextEncoder().encode(`B's file ${randomUUID()}`);
    const key = await storage().put('photos', bytes, 'image/webp');
    const upload = await fx.db
      .insertInto('uploads')
      .values({
        property_id: fx.propertyB.id, plot_id: fx.plotB.id, kind: 'photo', filename: 'b.webp', content_type: 'image/webp', size_bytes: bytes.byteLength,
        sha256: createHash('sha256').update(bytes).digest('hex'), storage_key: key, thumb_key: key, width: 8, height: 8, uploaded_by: ownerB.user.id,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    const step = await fx.db.selectFrom('steps').select('planting_id').where('id', '=', fx.stepB.id).executeTakeFirstOrThrow();
    const observation = await fx.db
      .insertInto('observations')
      .values({
        planting_id: step.planting_id, plot_id: fx.plotB.id, observed_on: '2027-09-20', observed_at: new Date(), stand_rating: 1,
        frame_counts: JSON.stringify([1, 0, 0]), frame_sq_ft: 1, plants_per_sq_ft: 0.3, weed_pressure: 'light', verdict: 'poor',
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    const invitation = await invite(ownerB.client, fx.propertyB.id, uniqueEmail('b-invite'), 'viewer');
    const feed = await ownerB.client.post('/api/settings/calendar-feeds', { label: 'B phone' });
    x = {
      blendId: blend.body.blend.id, recordId: record.id, expenseId, uploadId: upload.id, plantingId: step.planting_id,
      observationId: observation.id, invitationId: invitation.id, feedId: feed.body.feed.id,
    };
    fx.context = { cloverA: await cloverPlantingOf(fx) };
    idsOfB = [fx.propertyB.id, fx.plotB.id, fx.stepB.id, ownerB.user.id, ...Object.values(x)];
  });

  for (const [key, cross] of Object.entries(CROSS)) {
    it(`${key}: 404 for A's owner, manager, member and viewer${cross.mixed ? "; A's path with B's id too" : ''}; B unchanged`, async () => {
      const method = key.split(' ')[0];
      const before = await rowsNaming(fx, idsOfB);
      const send = (actor: Actor, r: CrossRequest) =>
        fx.clients[actor].request(method, r.path, r.options ?? (r.body === undefined ? {} : { json: r.body }));
      const noLeak = (who: string, res: ApiResponse) => {
        expect(res.text, who).not.toContain(fx.plotB.name);
        expect(res.text, who).not.toContain(fx.propertyB.name);
      };
      for (const actor of ['owner', 'manager', 'member', 'viewer'] as const) {
        const res = await send(actor, cross.b(fx, x));
        expect(res.status, `${actor}: ${res.text.slice(0, 200)}`).toBe(404);
        expect(res.body, actor).toEqual({ error: 'Not found' });
        noLeak(actor, res);
      }
      if (cross.mixed) {
        // B's id inside A's path (or body) must get exactly the answer an id that exists nowhere gets.
        const real = cross.mixed(fx, x);
        let text = JSON.stringify(real);
        for (const id of idsOfB) text = text.replaceAll(id, randomUUID());
        const [withB, withNothing] = [await send('owner', real), await send('owner', JSON.parse(text))];
        expect([400, 404], withB.text.slice(0, 200)).toContain(withB.status);
        expect([withB.status, withB.body]).toEqual([withNothing.status, withNothing.body]);
        noLeak("A's owner, A's path", withB);
      }
      expect(await rowsNaming(fx, idsOfB)).toEqual(before);
    });
  }
});
