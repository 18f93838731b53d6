// Bad input over HTTP: 400 with {error, fields: {field: message}} naming the field, and nothing written.
// Limits come from the schemas' own promises and outside references named beside each case:
// latitude/longitude ranges are WGS 84 degrees (ISO 6709); time zones are the IANA tz database names
// (via Intl); dates are ISO 8601 calendar dates with the Gregorian leap-year rule.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Kysely } from 'kysely';
import type { Database } from '@/db/database';
import {
  Client, createPlot, createProperty, plotBody, propertyBody, signedInUser, uniqueEmail, type TestUser,
} from '../support/http';
import { countPlotsOf, countPropertiesOf, countUsersWithEmail, testDb } from '../support/db';

interface BadInput {
  why: string;
  body: Record<string, unknown>;
  field: string;
  /** The field's label as people read it; the message must contain it. */
  label: string;
}

const LONG_NAME = 'N'.repeat(500);
const LONG_NOTES = 'n'.repeat(5000);

const PROPERTY_POST: BadInput[] = [
  // WGS 84 latitude is −90…90 and longitude −180…180 degrees (ISO 6709).
  { why: 'latitude 91', body: { latitude: 91 }, field: 'latitude', label: 'Latitude' },
  { why: 'latitude −90.5', body: { latitude: -90.5 }, field: 'latitude', label: 'Latitude' },
  { why: "latitude 'abc'", body: { latitude: 'abc' }, field: 'latitude', label: 'Latitude' },
  { why: 'latitude as a numeric string', body: { latitude: '45' }, field: 'latitude', label: 'Latitude' },
  { why: 'latitude missing', body: { latitude: undefined }, field: 'latitude', label: 'Latitude' },
  { why: 'longitude 181', body: { longitude: 181 }, field: 'longitude', label: 'Longitude' },
  { why: 'longitude missing', body: { longitude: null }, field: 'longitude', label: 'Longitude' },
  // Not names in the IANA tz database (checked against Intl in tests/unit/time-zones.test.ts).
  { why: "time zone 'Mars/Olympus'", body: { timeZone: 'Mars/Olympus' }, field: 'timeZone', label: 'Time zone' },
  { why: "time zone 'US/Fake'", body: { timeZone: 'US/Fake' }, field: 'timeZone', label: 'Time zone' },
  { why: 'time zone as an offset', body: { timeZone: '+05:00' }, field: 'timeZone', label: 'Time zone' },
  { why: 'time zone empty', body: { timeZone: '' }, field: 'timeZone', label: 'Time zone' },
  { why: 'time zone a number', body: { timeZone: 6 }, field: 'timeZone', label: 'Time zone' },
  { why: 'elevation 10000 m (schema limit 9000 m; the highest summit is about 8849 m)', body: { elevationM: 10000 }, field: 'elevationM', label: 'Elevation' },
  { why: 'name missing', body: { name: undefined }, field: 'name', label: 'Name' },
  { why: 'name only spaces', body: { name: '    ' }, field: 'name', label: 'Name' },
  { why: 'name of 500 characters', body: { name: LONG_NAME }, field: 'name', label: 'Name' },
  { why: 'name a number', body: { name: 42 }, field: 'name', label: 'Name' },
  // February has at most 29 days and there is no month 13 (Gregorian calendar).
  { why: "frost '02-30'", body: { avgLastSpringFrost: '02-30' }, field: 'avgLastSpringFrost', label: 'Average last spring frost' },
  { why: "frost '13-01'", body: { avgLastSpringFrost: '13-01' }, field: 'avgLastSpringFrost', label: 'Average last spring frost' },
  { why: "frost '00-10'", body: { avgFirstFallFrost: '00-10' }, field: 'avgFirstFallFrost', label: 'Average first fall frost' },
  { why: "frost '11-31' (November has 30 days)", body: { avgFirstFallFrost: '11-31' }, field: 'avgFirstFallFrost', label: 'Average first fall frost' },
  { why: "frost '4-15'", body: { avgFirstFallFrost: '4-15' }, field: 'avgFirstFallFrost', label: 'Average first fall frost' },
  { why: "hard freeze '12-32'", body: { avgFirstHardFreeze: '12-32' }, field: 'avgFirstHardFreeze', label: 'Average first hard freeze' },
  // ISO 8601 calendar dates, YYYY-MM-DD; 2025 is not a leap year (not divisible by 4).
  { why: "season date '2026-02-30'", body: { seasonOpensOn: '2026-02-30' }, field: 'seasonOpensOn', label: 'Season opening date' },
  { why: "season date '2026-13-01'", body: { seasonOpensOn: '2026-13-01' }, field: 'seasonOpensOn', label: 'Season opening date' },
  { why: "season date 'next week'", body: { seasonOpensOn: 'next week' }, field: 'seasonOpensOn', label: 'Season opening date' },
  { why: "season date '2026-2-3'", body: { seasonOpensOn: '2026-2-3' }, field: 'seasonOpensOn', label: 'Season opening date' },
  { why: 'season date a number', body: { seasonOpensOn: 20260203 }, field: 'seasonOpensOn', label: 'Season opening date' },
  { why: "permission date '2025-02-29'", body: { permissionGrantedOn: '2025-02-29' }, field: 'permissionGrantedOn', label: 'Permission date' },
  { why: "tenure 'rented'", body: { tenure: 'rented' }, field: 'tenure', label: 'Tenure' },
  { why: 'tenure missing', body: { tenure: undefined }, field: 'tenure', label: 'Tenure' },
  { why: 'landowner name of 500 characters', body: { landownerName: LONG_NAME }, field: 'landownerName', label: 'Landowner name' },
  { why: 'landowner contact of 5000 characters', body: { landownerContact: LONG_NOTES }, field: 'landownerContact', label: 'Landowner contact' },
];

const PROPERTY_PATCH: BadInput[] = [
  { why: 'latitude 91', body: { latitude: 91 }, field: 'latitude', label: 'Latitude' },
  { why: "latitude 'abc'", body: { latitude: 'abc' }, field: 'latitude', label: 'Latitude' },
  // A required field cannot be cleared: sent blank it must be refused, not stored as nothing.
  { why: 'latitude null', body: { latitude: null }, field: 'latitude', label: 'Latitude' },
  { why: "latitude ''", body: { latitude: '' }, field: 'latitude', label: 'Latitude' },
  { why: 'elevation null', body: { elevationM: null }, field: 'elevationM', label: 'Elevation' },
  { why: 'name empty', body: { name: '' }, field: 'name', label: 'Name' },
  { why: 'name null', body: { name: null }, field: 'name', label: 'Name' },
  { why: 'name of 500 characters', body: { name: LONG_NAME }, field: 'name', label: 'Name' },
  { why: "time zone 'US/Fake'", body: { timeZone: 'US/Fake' }, field: 'timeZone', label: 'Time zone' },
  { why: "time zone 'Mars/Olympus'", body: { timeZone: 'Mars/Olympus' }, field: 'timeZone', label: 'Time zone' },
  { why: "frost '02-30'", body: { avgLastSpringFrost: '02-30' }, field: 'avgLastSpringFrost', label: 'Average last spring frost' },
  { why: "season date '2026-04-31'", body: { seasonOpensOn: '2026-04-31' }, field: 'seasonOpensOn', label: 'Season opening date' },
  { why: "tenure 'squatting'", body: { tenure: 'squatting' }, field: 'tenure', label: 'Tenure' },
  { why: 'tenure null', body: { tenure: null }, field: 'tenure', label: 'Tenure' },
  { why: 'a good name beside a bad latitude (all or nothing)', body: { name: 'Renamed', latitude: 200 }, field: 'latitude', label: 'Latitude' },
];

const PLOT_POST: BadInput[] = [
  { why: 'zero acres (a plot has area; schema says more than 0)', body: { acres: 0 }, field: 'acres', label: 'Acres' },
  { why: 'negative acres', body: { acres: -0.5 }, field: 'acres', label: 'Acres' },
  { why: "acres 'abc'", body: { acres: 'abc' }, field: 'acres', label: 'Acres' },
  { why: 'acres missing', body: { acres: undefined }, field: 'acres', label: 'Acres' },
  { why: 'acres 10001', body: { acres: 10001 }, field: 'acres', label: 'Acres' },
  { why: 'name missing', body: { name: undefined }, field: 'name', label: 'Name' },
  { why: 'name of 500 characters', body: { name: LONG_NAME }, field: 'name', label: 'Name' },
  { why: 'notes of 5000 characters', body: { notes: LONG_NOTES }, field: 'notes', label: 'Notes' },
  { why: "cover 'gravel'", body: { cover: 'gravel' }, field: 'cover', label: 'Cover' },
  { why: 'cover missing', body: { cover: undefined }, field: 'cover', label: 'Cover' },
  { why: "sun 'dark'", body: { sun: 'dark' }, field: 'sun', label: 'Sun' },
  // Soil pH runs 0–14 in chemistry; agricultural soils lie within about 3–10 (schema limits).
  { why: 'soil pH 2.5', body: { soilPh: 2.5 }, field: 'soilPh', label: 'Soil pH' },
  { why: 'soil pH 11', body: { soilPh: 11 }, field: 'soilPh', label: 'Soil pH' },
  { why: "soil pH 'acid'", body: { soilPh: 'acid' }, field: 'soilPh', label: 'Soil pH' },
];

const PLOT_PATCH: BadInput[] = [
  { why: 'zero acres', body: { acres: 0 }, field: 'acres', label: 'Acres' },
  { why: 'negative acres', body: { acres: -2 }, field: 'acres', label: 'Acres' },
  { why: 'acres null (cannot be cleared)', body: { acres: null }, field: 'acres', label: 'Acres' },
  { why: "acres ''", body: { acres: '' }, field: 'acres', label: 'Acres' },
  { why: 'name empty', body: { name: '' }, field: 'name', label: 'Name' },
  { why: 'notes of 5000 characters', body: { notes: LONG_NOTES }, field: 'notes', label: 'Notes' },
  { why: "sun 'dark'", body: { sun: 'dark' }, field: 'sun', label: 'Sun' },
  { why: 'cover null', body: { cover: null }, field: 'cover', label: 'Cover' },
];

/** Drops keys whose override is undefined, so "missing" means absent from the JSON. */
function withOverrides(base: Record<string, unknown>, overrides: Record<string, unknown>) {
  const out: Record<string, unknown> = { ...base, ...overrides };
  for (const [k, v] of Object.entries(overrides)) if (v === undefined) delete out[k];
  return out;
}

function expectFieldError(res: { status: number; body: any; text: string }, field: string, label: string) {
  expect(res.status, res.text).toBe(400);
  expect(typeof res.body.error).toBe('string');
  expect(res.body.fields, res.text).toHaveProperty(field);
  expect(res.body.fields[field]).toContain(label);
}

let db: Kysely<Database>;
let owner: { user: TestUser; client: Client };
let property: { id: string };
let plot: { id: string };

const propertyRow = () => db.selectFrom('properties').selectAll().where('id', '=', property.id).executeTakeFirst();
const plotRow = () => db.selectFrom('plots').selectAll().where('id', '=', plot.id).executeTakeFirst();

beforeAll(async () => {
  db = testDb();
  owner = await signedInUser('validation');
  property = await createProperty(owner.client, { avgLastSpringFrost: '04-02', seasonOpensOn: '2027-09-25' });
  plot = await createPlot(owner.client, property.id, { soilPh: 6.1, notes: 'keep me' });
});

afterAll(async () => {
  await db?.destroy();
});

describe('POST /api/properties refuses bad input and creates nothing', () => {
  for (const c of PROPERTY_POST) {
    it(c.why, async () => {
      const before = await countPropertiesOf(db, owner.user.id);
      const res = await owner.client.post('/api/properties', withOverrides(propertyBody(), c.body));
      expectFieldError(res, c.field, c.label);
      expect(await countPropertiesOf(db, owner.user.id)).toBe(before);
    });
  }

  it('an overflowing number (1e999 parses as Infinity) is refused', async () => {
    const raw = JSON.stringify(propertyBody({ latitude: 12345 })).replace('12345', '1e999');
    const res = await owner.client.request('POST', '/api/properties', { raw, contentType: 'application/json' });
    expectFieldError(res, 'latitude', 'Latitude');
  });

  it('an empty object names every required field at once', async () => {
    const before = await countPropertiesOf(db, owner.user.id);
    const res = await owner.client.post('/api/properties', {});
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.fields).sort()).toEqual(['elevationM', 'latitude', 'longitude', 'name', 'tenure', 'timeZone']);
    expect(await countPropertiesOf(db, owner.user.id)).toBe(before);
  });

  it('the summary message names the first field', async () => {
    const res = await owner.client.post('/api/properties', propertyBody({ latitude: 91 }));
    expect(res.body.error).toMatch(/Latitude.*\(latitude\)/);
  });
});

describe('PATCH /api/properties/[id] refuses bad input and changes nothing', () => {
  for (const c of PROPERTY_PATCH) {
    it(c.why, async () => {
      const before = await propertyRow();
      const res = await owner.client.patch(`/api/properties/${property.id}`, c.body);
      expectFieldError(res, c.field, c.label);
      expect(await propertyRow()).toEqual(before);
    });
  }

  it('an empty PATCH is refused: nothing to change', async () => {
    const before = await propertyRow();
    const res = await owner.client.patch(`/api/properties/${property.id}`, {});
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/Nothing to change/);
    expect(await propertyRow()).toEqual(before);
  });
});

describe('POST /api/properties/[id]/plots refuses bad input and creates nothing', () => {
  for (const c of PLOT_POST) {
    it(c.why, async () => {
      const before = await countPlotsOf(db, property.id);
      const res = await owner.client.post(`/api/properties/${property.id}/plots`, withOverrides(plotBody(), c.body));
      expectFieldError(res, c.field, c.label);
      expect(await countPlotsOf(db, property.id)).toBe(before);
    });
  }

  it('a second plot with the same name on one property is 409 on the name field', async () => {
    const first = await createPlot(owner.client, property.id);
    const before = await countPlotsOf(db, property.id);
    const res = await owner.client.post(`/api/properties/${property.id}/plots`, plotBody({ name: first.name }));
    expect(res.status).toBe(409);
    expect(res.body.fields).toHaveProperty('name');
    expect(await countPlotsOf(db, property.id)).toBe(before);
    // Renaming another plot onto it is refused the same way.
    const rename = await owner.client.patch(`/api/plots/${plot.id}`, { name: first.name });
    expect(rename.status).toBe(409);
  });
});

describe('PATCH /api/plots/[id] refuses bad input and changes nothing', () => {
  for (const c of PLOT_PATCH) {
    it(c.why, async () => {
      const before = await plotRow();
      const res = await owner.client.patch(`/api/plots/${plot.id}`, c.body);
      expectFieldError(res, c.field, c.label);
      expect(await plotRow()).toEqual(before);
    });
  }
});

describe('bodies that are not a JSON object', () => {
  const BODIES = [
    { why: 'not JSON at all', raw: 'name=Ridge&latitude=40', message: /must be JSON/ },
    { why: 'truncated JSON', raw: '{"name": "Ridge", ', message: /must be JSON/ },
    { why: 'a JSON array', raw: JSON.stringify([propertyBody()]), message: /JSON object/ },
    { why: 'JSON null', raw: 'null', message: /JSON object/ },
    { why: 'a JSON string', raw: '"Ridge"', message: /JSON object/ },
    { why: 'a JSON number', raw: '42', message: /JSON object/ },
  ];
  const ROUTES = [
    { method: 'POST', path: () => '/api/properties' },
    { method: 'PATCH', path: () => `/api/properties/${property.id}` },
    { method: 'POST', path: () => `/api/properties/${property.id}/plots` },
    { method: 'PATCH', path: () => `/api/plots/${plot.id}` },
    { method: 'POST', path: () => `/api/properties/${property.id}/invitations` },
    { method: 'PATCH', path: () => `/api/properties/${property.id}/members/${owner.user.id}` },
  ];
  for (const b of BODIES) {
    it(`${b.why} → 400 on every write route, nothing written`, async () => {
      const before = {
        properties: await countPropertiesOf(db, owner.user.id),
        plots: await countPlotsOf(db, property.id),
        property: await propertyRow(),
        plot: await plotRow(),
      };
      for (const r of ROUTES) {
        const res = await owner.client.request(r.method, r.path(), { raw: b.raw, contentType: 'application/json' });
        expect(res.status, `${r.method} ${r.path()}: ${res.text}`).toBe(400);
        expect(res.body.error).toMatch(b.message);
      }
      expect({
        properties: await countPropertiesOf(db, owner.user.id),
        plots: await countPlotsOf(db, property.id),
        property: await propertyRow(),
        plot: await plotRow(),
      }).toEqual(before);
    });
  }
});

describe('invitations and roles refuse bad input', () => {
  const countInvitations = async () =>
    Number(
      (
        await db
          .selectFrom('invitations')
          .select((eb) => eb.fn.countAll<number>().as('n'))
          .where('property_id', '=', property.id)
          .executeTakeFirstOrThrow()
      ).n,
    );
  const CASES: BadInput[] = [
    { why: 'e-mail without @', body: { email: 'not-an-email', role: 'member' }, field: 'email', label: 'E-mail' },
    { why: 'e-mail missing', body: { role: 'member' }, field: 'email', label: 'E-mail' },
    { why: "role 'admin'", body: { email: uniqueEmail('role'), role: 'admin' }, field: 'role', label: 'Role' },
    { why: 'role missing', body: { email: uniqueEmail('role') }, field: 'role', label: 'Role' },
  ];
  for (const c of CASES) {
    it(`invitation: ${c.why}`, async () => {
      const before = await countInvitations();
      const res = await owner.client.post(`/api/properties/${property.id}/invitations`, c.body);
      expectFieldError(res, c.field, c.label);
      expect(await countInvitations()).toBe(before);
    });
  }
});

describe('valid input round-trips', () => {
  it('every optional field is stored as sent; leap days are real days (Gregorian rule)', async () => {
    const body = propertyBody({
      timeZone: 'America/New_York',
      avgLastSpringFrost: '02-29',
      avgFirstFallFrost: '10-08',
      seasonOpensOn: '2028-02-29',
      tenure: 'permission',
      landownerName: 'A. Landholder',
      landownerContact: '+1 555 0100',
      permissionGrantedOn: '2026-03-01',
      latitude: -90,
      longitude: 180,
      elevationM: -20,
    });
    const res = await owner.client.post('/api/properties', body);
    expect(res.status, res.text).toBe(201);
    expect(res.body.property).toMatchObject(body);
  });

  it('an optional field sent empty is cleared; required fields stay', async () => {
    const res = await owner.client.patch(`/api/properties/${property.id}`, { avgLastSpringFrost: '', seasonOpensOn: null });
    expect(res.status, res.text).toBe(200);
    const row = await propertyRow();
    expect(row?.avg_last_spring_frost).toBeNull();
    expect(row?.season_opens_on).toBeNull();
    expect(row?.latitude).toBe(36.41);
    const plotRes = await owner.client.patch(`/api/plots/${plot.id}`, { notes: '   ', soilPh: '' });
    expect(plotRes.status, plotRes.text).toBe(200);
    expect(plotRes.body.plot).toMatchObject({ notes: null, soilPh: null, acres: 0.75 });
  });

  it('text is trimmed before it is stored', async () => {
    const res = await owner.client.post(`/api/properties/${property.id}/plots`, plotBody({ name: '  Spaced out  ' }));
    expect(res.status, res.text).toBe(201);
    expect(res.body.plot.name).toBe('Spaced out');
  });

  it('an IANA zone name that is a link or a newer spelling is accepted (IANA tz "backward" file)', async () => {
    // America/Indiana/Indianapolis is the zone's IANA name; Node's ICU lists it as America/Indianapolis.
    for (const timeZone of ['America/Indiana/Indianapolis', 'America/Kentucky/Louisville', 'US/Central']) {
      const res = await owner.client.post('/api/properties', propertyBody({ timeZone }));
      expect(res.status, `${timeZone}: ${res.text}`).toBe(201);
      const stored = res.body.property.timeZone;
      // Stored as the runtime's own name for the same zone, so every screen and date computation agrees.
      expect(new Intl.DateTimeFormat('en-US', { timeZone: stored }).resolvedOptions().timeZone).toBe(
        new Intl.DateTimeFormat('en-US', { timeZone }).resolvedOptions().timeZone,
      );
    }
  });
});

describe('sign-up refuses bad input and creates no account', () => {
  const CASES: BadInput[] = [
    { why: 'password of 9 characters (minimum 10)', body: { password: 'short-pw9' }, field: 'password', label: 'Password' },
    { why: 'password missing', body: { password: undefined }, field: 'password', label: 'Password' },
    { why: 'password of 201 characters', body: { password: 'p'.repeat(201) }, field: 'password', label: 'Password' },
    // RFC 5321/5322 addresses need a local part, '@' and a domain.
    { why: 'e-mail without @', body: { email: 'ridge.example.test' }, field: 'email', label: 'E-mail' },
    { why: 'e-mail without a domain', body: { email: 'someone@' }, field: 'email', label: 'E-mail' },
    { why: 'e-mail with a space', body: { email: 'some one@example.test' }, field: 'email', label: 'E-mail' },
    { why: 'e-mail missing', body: { email: undefined }, field: 'email', label: 'E-mail' },
    { why: 'name missing', body: { name: undefined }, field: 'name', label: 'Name' },
    { why: 'name of 500 characters', body: { name: LONG_NAME }, field: 'name', label: 'Name' },
  ];
  for (const c of CASES) {
    it(c.why, async () => {
      const email = uniqueEmail('signup-bad');
      const body = withOverrides({ name: 'Someone', email, password: `pw-${randomUUID()}` }, c.body);
      const res = await new Client().post('/api/users', body);
      expectFieldError(res, c.field, c.label);
      // A refused password is never echoed back (OWASP Authentication Cheat Sheet).
      if (typeof body.password === 'string' && body.password.length > 0) expect(res.text).not.toContain(body.password);
      expect(await countUsersWithEmail(db, email)).toBe(0);
    });
  }

  it('a duplicate e-mail, whatever its letter case, makes no second account and answers as a new one would (no enumeration)', async () => {
    const email = uniqueEmail('signup-dup');
    const first = await new Client().post('/api/users', { name: 'First', email, password: `pw-${randomUUID()}` });
    expect(first.status).toBe(202);
    for (const again of [email, email.toUpperCase(), `  ${email}  `]) {
      const res = await new Client().post('/api/users', { name: 'Second', email: again, password: `pw-${randomUUID()}` });
      expect(res.status, again).toBe(202);
      expect(res.text, again).toBe(first.text);
    }
    expect(await countUsersWithEmail(db, email)).toBe(1);
    const row = await db.selectFrom('users').select('name').where('email', '=', email).executeTakeFirstOrThrow();
    expect(row.name).toBe('First');
  });

  it('a non-JSON sign-up body is 415 (only application/json is read, RFC 9110 §15.5.16)', async () => {
    const res = await new Client().request('POST', '/api/users', { raw: 'email=a@b.test', contentType: 'application/x-www-form-urlencoded' });
    expect(res.status).toBe(415);
  });
});
