// Property-based fuzzing (fast-check) of every JSON route handler: one field of a valid body is replaced at a
// time by a value it can never take (wrong JSON type, huge or empty text, unknown enum value, numbers out of
// range, NaN and 1e309 as JSON carries them, dates that do not exist or fall outside the range). Each answer
// must be 400 with `fields[<that field>]` set (DEVELOPERS.md, "Errors and input"), never 500, and the
// database rows that belong to this file's fixture must be identical before and after.
// The routes are discovered from app/api, so a new JSON route fails the discovery test until it has a SPEC.
// Query strings get the same treatment (QUERY_SPECS, discovered from the handlers that read searchParams),
// and every string field is also sent with control characters, NUL above all: PostgreSQL refuses U+0000 in
// text ("invalid byte sequence for encoding UTF8: 0x00", PostgreSQL docs §8.3 Character Types), so a NUL
// that reaches the database is a 500 unless the zod layer refuses it first.
// Runs are bounded (RUNS per route) and seeded: set FUZZ_SEED to replay a failure; the seed is printed.
import { createECDH, randomBytes, randomUUID } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Database } from '@/db/database';
import { SPECIES } from '@/lib/agronomy/species';
import { STEP_KINDS } from '@/lib/schedule/step-kinds';
import { addMember, Client, createPlot, createProperty, plotBody, propertyBody, signedInUser, uniqueEmail } from '../support/http';
import { testDb } from '../support/db';

const SEED = Number(process.env.FUZZ_SEED ?? 20270910);
const RUNS = Number(process.env.FUZZ_RUNS ?? 30);
/** In every base body's free text, so a row written by a fuzzed request carries it even with no fixture id. */
const MARK = `fuzz${randomBytes(6).toString('hex')}`;

// ---- what a field can never be -------------------------------------------------------------------------------

type Kind =
  | { t: 'text'; max: number; required?: boolean; min?: number; /** hashed, never stored as text: any character is its owner's choice */ hashed?: boolean }
  | { t: 'enum'; known: readonly string[]; required?: boolean; /** text that is trimmed before the check */ trims?: boolean }
  | { t: 'num'; min: number; max: number; minExcluded?: boolean; int?: boolean; required?: boolean; /** strings of digits are read as numbers */ numericText?: boolean }
  | { t: 'money' }
  | { t: 'date'; required?: boolean }
  | { t: 'instant' }
  | { t: 'bool'; required?: boolean }
  | { t: 'uuid'; required?: boolean }
  | { t: 'email' }
  | { t: 'pattern'; bad: readonly string[]; required?: boolean }
  | { t: 'list'; required?: boolean; maxItems?: number; item?: unknown }
  | { t: 'object'; required?: boolean };

const junkObject = fc.dictionary(fc.string({ maxLength: 6 }), fc.oneof(fc.string({ maxLength: 6 }), fc.integer()), { maxKeys: 3 });
const junkArray = fc.array(fc.oneof(fc.string({ maxLength: 6 }), fc.integer()), { maxLength: 3 });
const nonString = fc.oneof(fc.integer(), fc.double({ noNaN: true, noDefaultInfinity: true }), fc.boolean(), junkArray, junkObject);
const nonNumber = fc.oneof(
  // What a JSON text can carry for numbers JSON has no literal for (RFC 8259 §6: NaN and Infinity are not
  // allowed; JSON.stringify turns them, and 1e309, into null), and text that only looks like a number.
  fc.constantFrom('NaN', '1e309', 'Infinity', '-Infinity', '12abc', '0x1F', '١٢', '1,5', ' '),
  fc.string({ unit: 'grapheme', minLength: 1, maxLength: 12 }).filter((s) => !Number.isFinite(Number(s))),
  fc.boolean(),
  junkArray,
  junkObject,
);
const nonBoolean = fc.oneof(fc.constantFrom('true', 'false', 'yes', 'on', 1, 0), fc.string({ maxLength: 8 }), junkArray, junkObject);
const nonArray = fc.oneof(fc.string({ maxLength: 8 }), fc.integer(), fc.boolean(), junkObject);
const nonObject = fc.oneof(fc.string({ maxLength: 8 }), fc.integer(), fc.boolean(), junkArray);
/**
 * Visible characters (nothing `trim` removes), more than `max` of them. zod 4 counts a string's length in
 * code points, as PostgreSQL counts varchar characters, so an emoji outside the BMP is one character.
 */
const tooLong = (max: number) =>
  fc.oneof(
    fc.integer({ min: max + 1, max: max + 40 }).map((n) => 'x'.repeat(n)),
    fc.integer({ min: max + 1, max: max + 40 }).map((n) => '🌱'.repeat(n)),
    fc.string({ unit: 'grapheme', maxLength: 30 }).map((s) => `ä${s}${'é'.repeat(max + 1)}ä`),
    // A huge string: 200,000 characters, well under the 1 MB body limit of lib/http.ts.
    fc.constant(`${'ß'.repeat(200_000)}`),
  );
const blankText = fc.constantFrom('', ' ', '\t\n', '\u00a0\u2003');
/** C0 controls other than tab, LF and CR, and DEL: never typed by a person; NUL breaks PostgreSQL text. */
const CONTROL_CHARACTERS = ['\u0000', '\u0001', '\u0007', '\u0008', '\u000b', '\u000c', '\u001b', '\u001f', '\u007f'];
const withControl = fc
  .tuple(fc.string({ unit: 'grapheme', maxLength: 8 }), fc.constantFrom(...CONTROL_CHARACTERS), fc.string({ unit: 'grapheme', maxLength: 8 }))
  .map(([a, c, b]) => `x${a}${c}${b}`);
/** Strings that are not a real YYYY-MM-DD date between 1900 and 2200 (Sowcast's own range, lib/validations/common.ts). */
const badDates = fc.oneof(
  fc.constantFrom(
    '2027-02-29', '2027-02-30', '2027-04-31', '2027-13-01', '2027-00-10', '2027-09-00', '2027-09-32',
    '1899-12-31', '2201-01-01', '0000-01-01', '+275760-09-13', '-000001-01-01', '27-09-10', '2027/09/10', '2027-9-1',
    '2027-09-10T00:00:00Z', '10.09.2027', '٢٠٢٧-٠٩-١٠', '2027-09-10\u0000', 'September 10',
  ),
  // Never '': an optional date reads an empty form field as "not given".
  fc.string({ unit: 'grapheme', minLength: 1, maxLength: 14 }).filter((s) => !/^\d{4}-\d{2}-\d{2}$/.test(s)),
);
/** Instants that are not RFC 3339 date-times with an offset (RFC 3339 §5.6), or name a day that does not exist. */
const badInstants = fc.constantFrom(
  '2027-09-14T08:30:00', '2027-09-14', '2027-02-30T08:30:00Z', '2027-09-14T25:00:00Z', '2027-09-14T08:61:00Z',
  '2027-09-14 08:30', 'yesterday', '1e309', '+275760-09-13T00:00:00Z', '2027-09-14T08:30:00+25:00',
);
const badUuids = fc.oneof(
  fc.constantFrom('not-a-uuid', '12345', '00000000-0000-0000-0000-00000000000g', "1' or '1'='1", randomUUID().slice(0, 35), `${randomUUID()}x`),
  fc.string({ unit: 'grapheme', minLength: 1, maxLength: 40 }),
  fc.integer(),
);
const badEmails = fc.oneof(
  fc.constantFrom('plain', 'a@', '@example.test', 'a@@example.test', 'a b@example.test', 'a@example..test', `${'a'.repeat(250)}@example.test`),
  fc.string({ unit: 'grapheme', maxLength: 20 }).filter((s) => !s.includes('@')),
);

function numbersOutside(kind: Extract<Kind, { t: 'num' }>) {
  const below = fc
    .double({ min: -1e12, max: kind.min, noNaN: true })
    .filter((v) => (kind.minExcluded ? v <= kind.min : v < kind.min) && !Object.is(v, -0));
  const above = fc.double({ min: kind.max, max: 1e15, noNaN: true }).filter((v) => v > kind.max);
  const arbs = [below, above, fc.constantFrom(-1, -1e308, 1e308).filter((v) => v < kind.min || v > kind.max)];
  if (kind.int) {
    arbs.push(fc.double({ min: kind.min, max: kind.max, noNaN: true }).filter((v) => !Number.isInteger(v)));
  }
  return fc.oneof(...arbs);
}

/** Values the field must refuse, each with a label for the report. */
function badValues(kind: Kind): fc.Arbitrary<unknown> {
  const required = 'required' in kind ? kind.required !== false : true;
  const missing = required ? [fc.constant(null)] : [];
  switch (kind.t) {
    case 'text':
      return fc.oneof(nonString, tooLong(kind.max), ...(kind.hashed ? [] : [withControl]), ...(required ? [blankText, fc.constant(null)] : []), ...(kind.min ? [fc.constant('x'.repeat(kind.min - 1))] : []));
    case 'enum':
      return fc.oneof(
        nonString,
        ...missing,
        fc.string({ unit: 'grapheme', maxLength: 20 }).filter((s) => !kind.known.includes(s)),
        fc.constantFrom(...kind.known).map((v) => v.toUpperCase()).filter((s) => !kind.known.includes(s)),
        ...(kind.trims ? [] : [fc.constantFrom(...kind.known).map((v) => ` ${v}`)]),
        fc.constantFrom(...kind.known).map((v) => `${v}\u200b`),
      );
    case 'num':
      return fc.oneof(
        numbersOutside(kind),
        (kind.numericText ? nonNumber.filter((v) => typeof v !== 'string' || !Number.isFinite(Number(v.trim() || 'x'))) : nonNumber),
        ...missing,
      );
    case 'money':
      // Dollars and cents as typed or as a JSON number (lib/validations/expense.ts takes both).
      return fc.oneof(fc.constantFrom('NaN', '1e309', 'Infinity', '-5', '-0.01', '12.345', '$1,00', '1.2.3', '', 'twelve', 1e12, -1, 0.001), fc.constant(null), fc.boolean(), junkArray, junkObject);
    case 'date':
      return fc.oneof(badDates, nonString, ...missing);
    case 'instant':
      return fc.oneof(badInstants, fc.integer(), fc.boolean(), junkArray, junkObject);
    case 'bool':
      return fc.oneof(nonBoolean, ...missing);
    case 'uuid':
      return fc.oneof(badUuids, ...missing, fc.boolean(), junkObject);
    case 'email':
      return fc.oneof(badEmails, nonString, fc.constant(null));
    case 'pattern':
      return fc.oneof(fc.constantFrom(...kind.bad), nonString, ...missing);
    case 'list':
      return fc.oneof(nonArray, ...missing, ...(kind.maxItems && kind.item !== undefined ? [fc.constant(Array.from({ length: kind.maxItems + 1 }, () => kind.item))] : []));
    case 'object':
      return fc.oneof(nonObject, ...missing);
  }
}

// ---- the fixture --------------------------------------------------------------------------------------------

interface Fixture {
  db: Kysely<Database>;
  owner: { user: { id: string; email: string }; client: Client };
  member: { user: { id: string; email: string }; client: Client };
  propertyId: string;
  plotId: string;
  plantingId: string;
  stepId: string;
  recordId: string;
  observationId: string;
}

const PLANTING = {
  season: 'fall',
  method: 'spray-and-seed',
  blend: [{ speciesId: 'white-clover', share: 1 }],
  targetSeedDate: '2027-09-10',
};
const PLANTING_FULL = {
  ...PLANTING,
  method: 'prepared-seedbed',
  readyBy: '2027-09-20',
  killWaitDays: 7,
  herbicide: { productName: `Generic glyphosate 41% ${MARK}`, rateKind: 'percent-solution', rate: 2 },
  sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
  fertilizer: { grade: [10, 10, 10], target: { n: 40, p2o5: 40, k2o: 40 }, bagLb: 50 },
  lime: { tonsPerAcre: 1, bagLb: 40 },
  seedBagLb: 50,
  seedBag: { lb: 8.5, acres: 1 },
  soilTexture: 'loam',
  clearBrush: false,
};
const SEASONS = ['spring', 'fall'];
const METHODS = ['spray-and-seed', 'prepared-seedbed', 'frost-seeding'];
// Filtering only: a generated string that happens to be a catalog id is left out.
const SPECIES_IDS = SPECIES.map((s) => s.id);
const plantingFields = (prefix = ''): Record<string, Kind> => ({
  [`${prefix}season`]: { t: 'enum', known: SEASONS },
  [`${prefix}method`]: { t: 'enum', known: METHODS },
  [`${prefix}blend`]: { t: 'list', maxItems: 8, item: { speciesId: 'white-clover', share: 0.1 } },
  [`${prefix}blend.0.speciesId`]: { t: 'enum', known: SPECIES_IDS, trims: true },
  [`${prefix}blend.0.share`]: { t: 'num', min: 0, max: 1, minExcluded: true },
  [`${prefix}targetSeedDate`]: { t: 'date' },
  [`${prefix}readyBy`]: { t: 'date', required: false },
  [`${prefix}killWaitDays`]: { t: 'num', min: 0, max: 60, int: true, required: false },
  [`${prefix}herbicide.productName`]: { t: 'text', max: 120 },
  [`${prefix}herbicide.rateKind`]: { t: 'enum', known: ['percent-solution', 'fl-oz-per-acre'] },
  [`${prefix}herbicide.rate`]: { t: 'num', min: 0, max: 100, minExcluded: true },
  [`${prefix}sprayer.tankGal`]: { t: 'num', min: 0.5, max: 2000 },
  [`${prefix}sprayer.carrierGalPerAcre`]: { t: 'num', min: 1, max: 200 },
  [`${prefix}fertilizer.grade.0`]: { t: 'num', min: 0, max: 100 },
  [`${prefix}fertilizer.target.n`]: { t: 'num', min: 0, max: 500, required: false },
  [`${prefix}lime.tonsPerAcre`]: { t: 'num', min: 0.1, max: 10 },
  [`${prefix}seedBagLb`]: { t: 'num', min: 0.5, max: 200, required: false },
  [`${prefix}seedBag.lb`]: { t: 'num', min: 0.1, max: 500 },
  [`${prefix}seedBag.acres`]: { t: 'num', min: 0.01, max: 100 },
  [`${prefix}soilTexture`]: { t: 'enum', known: ['sand', 'loamy-sand', 'sandy-loam', 'loam', 'silt-loam', 'silt', 'silty-clay-loam', 'silty-clay', 'clay'], required: false },
  [`${prefix}clearBrush`]: { t: 'bool', required: false },
});

const recordBase = (fx: Fixture) => ({
  kind: 'herbicide', plotId: fx.plotId, appliedOn: '2026-05-04', appliedTime: '08:15', areaAcres: 0.5, productName: `Glyphosate 41% ${MARK}`,
  epaRegNo: '524-445', rateValue: 48, rateUnit: 'fl oz/acre', totalProductValue: 24, totalProductUnit: 'fl oz', applicatorName: 'Fuzz test',
  restrictedUse: false, windMph: 4, windDirection: 'NW', airTempF: 70, humidityPct: 50, weatherSource: 'entered', notes: MARK,
});
const recordFields: Record<string, Kind> = {
  kind: { t: 'enum', known: ['herbicide', 'fertilizer', 'lime'] },
  plotId: { t: 'uuid' },
  appliedOn: { t: 'date' },
  appliedTime: { t: 'pattern', bad: ['24:00', '8:15', '08:60', '08:15:00', '0815', 'noon', '٠٨:١٥'] },
  areaAcres: { t: 'num', min: 0.001, max: 10_000 },
  productName: { t: 'text', max: 120 },
  epaRegNo: { t: 'pattern', bad: ['524', '524-', 'abc-def', '524-445-12345-1', '524_445', '５２４-４４５'], required: false },
  rateValue: { t: 'num', min: 0, max: 100_000, minExcluded: true },
  rateUnit: { t: 'enum', known: ['fl oz/acre', 'pt/acre', 'qt/acre', 'gal/acre', 'oz/acre', 'lb/acre', 'tons/acre', '% v/v'] },
  totalProductValue: { t: 'num', min: 0, max: 1_000_000, minExcluded: true },
  totalProductUnit: { t: 'enum', known: ['fl oz', 'pt', 'qt', 'gal', 'oz', 'lb', 'tons'] },
  applicatorName: { t: 'text', max: 120 },
  restrictedUse: { t: 'bool', required: false },
  windMph: { t: 'num', min: 0, max: 100, required: false },
  windDirection: { t: 'enum', known: ['N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSW', 'SW', 'WSW', 'W', 'WNW', 'NW', 'NNW', 'calm', 'variable', ''], required: false },
  airTempF: { t: 'num', min: -40, max: 130, required: false },
  humidityPct: { t: 'num', min: 0, max: 100, required: false },
  weatherSource: { t: 'enum', known: ['forecast', 'observation', 'entered', ''], required: false },
  notes: { t: 'text', max: 2000, required: false },
};

function pushSubscriptionBody() {
  const ecdh = createECDH('prime256v1');
  ecdh.generateKeys();
  return {
    endpoint: `https://push.example.test/send/${MARK}/${randomUUID()}`,
    keys: { p256dh: ecdh.getPublicKey().toString('base64url'), auth: randomBytes(16).toString('base64url') },
    label: `Phone ${MARK}`,
  };
}

interface Spec {
  /** Who sends it: the property's owner, or a signed-out visitor (sign-up). */
  as?: 'owner' | 'signedOut';
  path: (fx: Fixture) => string;
  base: (fx: Fixture) => Record<string, unknown>;
  fields: Record<string, Kind>;
}

const propertyFields = (required: boolean): Record<string, Kind> => ({
  name: { t: 'text', max: 120, required },
  latitude: { t: 'num', min: -90, max: 90, required },
  longitude: { t: 'num', min: -180, max: 180, required },
  // Unknown names: anything the runtime's IANA database (Intl, ECMA-402 §6.5) cannot resolve to a zone.
  timeZone: { t: 'pattern', bad: ['Mars/Olympus_Mons', 'America/Chicag', 'GMT+5:00', '+05:00', 'Europe/Berlin\u0000', 'Ameriça/Chicago', ''], required },
  elevationM: { t: 'num', min: -500, max: 9000, required },
  tenure: { t: 'enum', known: ['owned', 'leased', 'permission'], required },
  avgLastSpringFrost: { t: 'pattern', bad: ['02-30', '13-01', '00-10', '4-15', 'April 15', '04-15-2027'], required: false },
  seasonOpensOn: { t: 'date', required: false },
  landownerContact: { t: 'text', max: 200, required: false },
});
const plotFields = (required: boolean): Record<string, Kind> => ({
  name: { t: 'text', max: 80, required },
  acres: { t: 'num', min: 0, max: 10_000, minExcluded: true, required },
  cover: { t: 'enum', known: ['grass-weeds', 'brush', 'bare-soil', 'tilled', 'existing-stand'], required },
  sun: { t: 'enum', known: ['full', 'partial', 'shade'], required },
  soilPh: { t: 'num', min: 3, max: 10, required: false },
  notes: { t: 'text', max: 4000, required: false },
});

const SPECS: Record<string, Spec> = {
  'POST /api/properties': {
    path: () => '/api/properties',
    base: () => propertyBody({ name: `Fuzz ${MARK}`, avgLastSpringFrost: '04-15', seasonOpensOn: '2027-10-01', landownerContact: MARK }),
    fields: propertyFields(true),
  },
  'PATCH /api/properties/[propertyId]': {
    path: (fx) => `/api/properties/${fx.propertyId}`,
    base: () => ({ name: `Fuzz ${MARK}`, latitude: 36.4, longitude: -90.1, timeZone: 'America/Chicago', elevationM: 100, tenure: 'leased', avgLastSpringFrost: '04-10', seasonOpensOn: '2027-10-02', landownerContact: MARK }),
    fields: propertyFields(false),
  },
  'POST /api/properties/[propertyId]/plots': {
    path: (fx) => `/api/properties/${fx.propertyId}/plots`,
    base: () => plotBody({ name: `Plot ${MARK}`, soilPh: 6.2, notes: MARK }),
    fields: plotFields(true),
  },
  'PATCH /api/plots/[plotId]': {
    path: (fx) => `/api/plots/${fx.plotId}`,
    base: () => ({ name: `Plot ${MARK}`, acres: 1.5, cover: 'brush', sun: 'partial', soilPh: 6.5, notes: MARK }),
    fields: plotFields(false),
  },
  'POST /api/properties/[propertyId]/blends': {
    path: (fx) => `/api/properties/${fx.propertyId}/blends`,
    base: () => ({ name: `Blend ${MARK}`, parts: [{ speciesId: 'white-clover', share: 0.5 }, { speciesId: 'chicory', share: 0.5 }], notes: MARK }),
    fields: {
      name: { t: 'text', max: 80 },
      parts: { t: 'list', maxItems: 8, item: { speciesId: 'white-clover', share: 0.1 } },
      'parts.0.speciesId': { t: 'enum', known: SPECIES_IDS, trims: true },
      'parts.1.share': { t: 'num', min: 0, max: 1, minExcluded: true },
      notes: { t: 'text', max: 1000, required: false },
    },
  },
  'POST /api/properties/[propertyId]/records': {
    path: (fx) => `/api/properties/${fx.propertyId}/records`,
    base: recordBase,
    fields: recordFields,
  },
  'POST /api/records/[recordId]/corrections': {
    path: (fx) => `/api/records/${fx.recordId}/corrections`,
    base: (fx) => ({ ...recordBase(fx), correctionReason: `Rate was 32 ${MARK}` }),
    fields: { ...recordFields, correctionReason: { t: 'text', max: 500 } },
  },
  'POST /api/properties/[propertyId]/expenses': {
    path: (fx) => `/api/properties/${fx.propertyId}/expenses`,
    base: (fx) => ({
      plotId: fx.plotId, season: 'fall', year: 2027, spentOn: '2027-08-01', category: 'labour', description: `Fuel ${MARK}`,
      amount: '120.50', labourHours: 3, paidBy: fx.owner.user.id, splitAmong: [fx.owner.user.id, fx.member.user.id],
    }),
    fields: {
      plotId: { t: 'uuid', required: false },
      season: { t: 'enum', known: ['spring', 'fall'] },
      year: { t: 'num', min: 2000, max: 2200, int: true, numericText: true },
      spentOn: { t: 'date' },
      category: { t: 'enum', known: ['seed', 'herbicide', 'fertilizer', 'lime', 'fuel', 'equipment', 'labour', 'other'] },
      description: { t: 'text', max: 200 },
      amount: { t: 'money' },
      labourHours: { t: 'num', min: 0, max: 10_000 },
      paidBy: { t: 'uuid' },
      splitAmong: { t: 'list', required: false },
      'splitAmong.1': { t: 'uuid' },
    },
  },
  'POST /api/properties/[propertyId]/invitations': {
    path: (fx) => `/api/properties/${fx.propertyId}/invitations`,
    base: () => ({ email: uniqueEmail(MARK), role: 'viewer' }),
    fields: { email: { t: 'email' }, role: { t: 'enum', known: ['owner', 'manager', 'member', 'viewer'] } },
  },
  'PATCH /api/properties/[propertyId]/members/[userId]': {
    path: (fx) => `/api/properties/${fx.propertyId}/members/${fx.member.user.id}`,
    base: () => ({ role: 'viewer' }),
    fields: { role: { t: 'enum', known: ['owner', 'manager', 'member', 'viewer'] } },
  },
  'POST /api/plots/[plotId]/plan/preview': {
    path: (fx) => `/api/plots/${fx.plotId}/plan/preview`,
    base: () => structuredClone(PLANTING_FULL),
    fields: plantingFields(),
  },
  'POST /api/plots/[plotId]/plantings': {
    path: (fx) => `/api/plots/${fx.plotId}/plantings`,
    base: () => structuredClone(PLANTING_FULL),
    fields: plantingFields(),
  },
  'POST /api/plots/[plotId]/plan/compare': {
    path: (fx) => `/api/plots/${fx.plotId}/plan/compare`,
    base: () => ({ planting: structuredClone(PLANTING_FULL), seedDates: ['2027-09-01', '2027-09-10'] }),
    fields: {
      planting: { t: 'object' },
      ...Object.fromEntries(Object.entries(plantingFields('planting.')).filter(([k]) => /season|blend\.0\.share|targetSeedDate|herbicide\.rate$|tankGal/.test(k))),
      seedDates: { t: 'list', maxItems: 3, item: '2027-09-20' },
      'seedDates.1': { t: 'date' },
    },
  },
  'PATCH /api/steps/[stepId]': {
    path: (fx) => `/api/steps/${fx.stepId}`,
    base: (fx) => ({ pinned: true, assigneeId: fx.member.user.id }),
    fields: { pinned: { t: 'bool' }, assigneeId: { t: 'uuid', required: false } },
  },
  'POST /api/steps/[stepId]/move': {
    path: (fx) => `/api/steps/${fx.stepId}/move`,
    base: () => ({ date: '2027-09-03', confirm: true }),
    fields: { date: { t: 'date' }, confirm: { t: 'bool' } },
  },
  'POST /api/steps/[stepId]/complete': {
    path: (fx) => `/api/steps/${fx.stepId}/complete`,
    base: () => ({ status: 'done', date: '2027-09-03', doneAt: '2027-09-03T08:30:00-05:00', notes: MARK }),
    fields: {
      status: { t: 'enum', known: ['done', 'skipped'] },
      date: { t: 'date', required: false },
      doneAt: { t: 'instant' },
      notes: { t: 'text', max: 2000, required: false },
    },
  },
  'POST /api/plantings/[plantingId]/observations': {
    path: (fx) => `/api/plantings/${fx.plantingId}/observations`,
    base: () => ({ observedOn: '2027-09-25', standRating: 3, frameCounts: [4, 5, 6], frameSqFt: 1, weedPressure: 'light', notes: MARK, photoIds: [] }),
    fields: {
      observedOn: { t: 'date', required: false },
      standRating: { t: 'num', min: 1, max: 5, int: true },
      frameCounts: { t: 'list', maxItems: 30, item: 1 },
      'frameCounts.1': { t: 'num', min: 0, max: 10_000, int: true },
      frameSqFt: { t: 'num', min: 0, max: 100, minExcluded: true },
      weedPressure: { t: 'enum', known: ['none', 'light', 'moderate', 'heavy'] },
      notes: { t: 'text', max: 2000, required: false },
      photoIds: { t: 'list', maxItems: 12, item: randomUUID() },
    },
  },
  'POST /api/plantings/[plantingId]/reseed/preview': {
    path: (fx) => `/api/plantings/${fx.plantingId}/reseed/preview`,
    base: (fx) => ({ observationId: fx.observationId }),
    fields: { observationId: { t: 'uuid' } },
  },
  'POST /api/plantings/[plantingId]/reseed': {
    path: (fx) => `/api/plantings/${fx.plantingId}/reseed`,
    base: (fx) => ({ observationId: fx.observationId }),
    fields: { observationId: { t: 'uuid' } },
  },
  'PUT /api/settings/notifications': {
    path: () => '/api/settings/notifications',
    base: () => ({ emailEnabled: true, pushEnabled: false, reminderHour: 6, quietStartHour: 22, quietEndHour: 6, dueReminders: true, digest: true }),
    fields: {
      emailEnabled: { t: 'bool' },
      pushEnabled: { t: 'bool' },
      reminderHour: { t: 'num', min: 0, max: 23, int: true },
      quietStartHour: { t: 'num', min: 0, max: 23, int: true, required: false },
      dueReminders: { t: 'bool' },
      digest: { t: 'bool' },
    },
  },
  'POST /api/settings/push-subscriptions': {
    path: () => '/api/settings/push-subscriptions',
    base: pushSubscriptionBody,
    fields: {
      // The Push API's endpoint is an https URL (W3C Push API §3; RFC 8030 §5 over TLS).
      endpoint: { t: 'pattern', bad: ['http://push.example.test/send/1', 'javascript:alert(1)', 'push.example.test', 'https://', `https://push.example.test/${'a'.repeat(2100)}`, 'ｈｔｔｐｓ://x'] },
      keys: { t: 'object' },
      // p256dh: an uncompressed P-256 point, 65 octets = 87 base64url characters (RFC 8291 §3.1, RFC 4648 §5).
      'keys.p256dh': { t: 'pattern', bad: ['', 'abc', `${'A'.repeat(86)}=`, `${'A'.repeat(40)}+/${'A'.repeat(45)}`, 'é'.repeat(87)] },
      // auth: 16 octets = 22 base64url characters (RFC 8291 §3.2).
      'keys.auth': { t: 'pattern', bad: ['', 'short', `${'A'.repeat(21)}=`, 'é'.repeat(22), 'A'.repeat(40)] },
      label: { t: 'text', max: 120, required: false },
    },
  },
  'DELETE /api/settings/push-subscriptions': {
    path: () => '/api/settings/push-subscriptions',
    base: () => ({ endpoint: `https://push.example.test/send/${MARK}/${randomUUID()}` }),
    fields: { endpoint: { t: 'pattern', bad: ['http://push.example.test/send/1', 'javascript:alert(1)', 'not a url', `https://x.test/${'a'.repeat(2100)}`] } },
  },
  'POST /api/dashboard/visit': {
    path: () => '/api/dashboard/visit',
    base: () => ({ seenAt: '2027-09-03T08:30:00-05:00' }),
    fields: { seenAt: { t: 'instant' } },
  },
  'POST /api/settings/calendar-feeds': {
    path: () => '/api/settings/calendar-feeds',
    base: () => ({ label: `Phone ${MARK}`.slice(0, 40) }),
    fields: { label: { t: 'text', max: 60, required: false } },
  },
  'POST /api/users/verification': {
    as: 'signedOut',
    path: () => '/api/users/verification',
    base: () => ({ token: 'A'.repeat(43) }),
    fields: { token: { t: 'text', max: 100, min: 20 } },
  },
  'POST /api/settings/password': {
    path: () => '/api/settings/password',
    base: () => ({ currentPassword: `not-it-${MARK}`, newPassword: `pw-${MARK}-long-enough` }),
    fields: { currentPassword: { t: 'text', max: 200, hashed: true }, newPassword: { t: 'text', max: 200, min: 10, hashed: true } },
  },
  'POST /api/users': {
    as: 'signedOut',
    path: () => '/api/users',
    base: () => ({ name: `Fuzz ${MARK}`, email: uniqueEmail(MARK), password: `pw-${MARK}-long-enough` }),
    fields: { name: { t: 'text', max: 80 }, email: { t: 'email' }, password: { t: 'text', max: 200, min: 10, hashed: true } },
  },
};

/** GET handlers that read a query string: each parameter, what it must be, and a valid query to start from. */
interface QuerySpec {
  path: (fx: Fixture) => string;
  base: Record<string, string>;
  params: Record<string, Kind>;
}

const recordQuery: Omit<QuerySpec, 'path'> = {
  base: { product: 'Glyphosate', from: '2026-01-01', to: '2026-12-31', kind: 'herbicide' },
  params: {
    plot: { t: 'uuid', required: false },
    product: { t: 'text', max: 120, required: false },
    from: { t: 'date', required: false },
    to: { t: 'date', required: false },
    kind: { t: 'enum', known: ['herbicide', 'fertilizer', 'lime'], required: false },
  },
};
const expenseQuery: Omit<QuerySpec, 'path'> = {
  base: { season: 'fall', year: '2027' },
  params: { season: { t: 'enum', known: ['spring', 'fall'], required: false }, year: { t: 'num', min: 2000, max: 2200, int: true, required: false, numericText: true } },
};

const QUERY_SPECS: Record<string, QuerySpec> = {
  'GET /api/calendar': {
    path: () => '/api/calendar',
    base: { from: '2027-06-01', to: '2027-12-31', kind: 'spray' },
    params: {
      from: { t: 'date' },
      to: { t: 'date' },
      property: { t: 'uuid', required: false },
      plot: { t: 'uuid', required: false },
      kind: { t: 'enum', known: Object.keys(STEP_KINDS), required: false },
      assignee: { t: 'uuid', required: false },
    },
  },
  'GET /api/properties/[propertyId]/records': { path: (fx) => `/api/properties/${fx.propertyId}/records`, ...recordQuery },
  'GET /api/properties/[propertyId]/records/export': { path: (fx) => `/api/properties/${fx.propertyId}/records/export`, ...recordQuery },
  'GET /api/properties/[propertyId]/expenses': { path: (fx) => `/api/properties/${fx.propertyId}/expenses`, ...expenseQuery },
  'GET /api/properties/[propertyId]/expenses/export': { path: (fx) => `/api/properties/${fx.propertyId}/expenses/export`, ...expenseQuery },
  'GET /api/steps/[stepId]/record-draft': {
    path: (fx) => `/api/steps/${fx.stepId}/record-draft`,
    base: { at: '2027-09-01T13:30:00Z' },
    params: { at: { t: 'instant' } },
  },
};

/** What a bad query parameter can be: a query string carries text only, so every bad value is sent as text. */
function badParams(kind: Kind): fc.Arbitrary<string> {
  // Any value is text in a query string, so only length and control characters make free text bad.
  if (kind.t === 'text') return fc.oneof(tooLong(kind.max), withControl);
  const asText = (v: unknown) => (typeof v === 'string' ? v : JSON.stringify(v));
  const text = badValues(kind)
    .filter((v) => v !== null && v !== undefined)
    .map(asText)
    // A blank optional parameter means "not given"; a number that reads as a valid one is not bad.
    .filter((v) => v.trim() !== '' || ('required' in kind && kind.required !== false))
    .filter((v) => kind.t !== 'num' || !(Number.isFinite(Number(v.trim())) && Number(v) >= kind.min && Number(v) <= kind.max && (!kind.int || Number.isInteger(Number(v)))));
  return fc.oneof(text, withControl);
}

// ---- discovery ------------------------------------------------------------------------------------------

/** Every handler under app/api whose own code reads a JSON body (parseBody, parsePatch or readJsonObject). */
function jsonRoutes(): string[] {
  const apiDir = path.resolve(__dirname, '../../app/api');
  const found: string[] = [];
  for (const entry of readdirSync(apiDir, { recursive: true, encoding: 'utf8' })) {
    if (path.basename(entry) !== 'route.ts') continue;
    const route = `/api/${path.dirname(entry).split(path.sep).join('/')}`;
    const source = readFileSync(path.join(apiDir, entry), 'utf8');
    // Cut the file at each exported handler; a handler's piece runs to the next export.
    const starts = [...source.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g)];
    starts.forEach((m, i) => {
      const piece = source.slice(m.index, starts[i + 1]?.index ?? source.length);
      if (/\b(parseBody|parsePatch|readJsonObject)\s*\(/.test(piece)) found.push(`${m[1]} ${route}`);
    });
    // next-auth's handler (app/api/auth/[...nextauth]) is re-exported and reads forms, not JSON (auth.test.ts).
    if (/export\s*\{[^}]*\bas\s+(POST|PUT|PATCH|DELETE)\b/.test(source) && /\b(parseBody|parsePatch|readJsonObject)\s*\(/.test(source)) {
      throw new Error(`${route}: re-exported handlers are not understood by this discovery; export them directly`);
    }
  }
  return found.sort();
}

/** Every GET handler under app/api whose own code reads the query string. */
function queryRoutes(): string[] {
  const apiDir = path.resolve(__dirname, '../../app/api');
  const found: string[] = [];
  for (const entry of readdirSync(apiDir, { recursive: true, encoding: 'utf8' })) {
    if (path.basename(entry) !== 'route.ts') continue;
    const route = `/api/${path.dirname(entry).split(path.sep).join('/')}`;
    const source = readFileSync(path.join(apiDir, entry), 'utf8');
    const starts = [...source.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g)];
    starts.forEach((m, i) => {
      const piece = source.slice(m.index, starts[i + 1]?.index ?? source.length);
      if (m[1] === 'GET' && /\b(searchParams|parseExpenseFilter)\b/.test(piece)) found.push(`GET ${route}`);
    });
  }
  return found.sort();
}

// ---- database state ----------------------------------------------------------------------------------------

type Snapshot = Record<string, { rows: number; md5: string }>;

let tables: { schema: string; name: string }[] = [];

/**
 * Row count and md5 of every table's rows that name one of the fixture's ids or MARK (each row's text form,
 * PostgreSQL's record output). Other test files write to the same database at the same time; their rows name
 * none of these, so any difference is this file's doing.
 */
async function snapshot(fx: Fixture, ids: string[]): Promise<Snapshot> {
  const pattern = [MARK, ...ids].join('|');
  const out: Snapshot = {};
  for (const t of tables) {
    const { rows } = await sql<{ n: number; sum: string | null }>`
      select count(*)::int as n, md5(string_agg(md5(r::text), ',' order by md5(r::text))) as sum
      from ${sql.table(`${t.schema}.${t.name}`)} as r where r::text ~ ${pattern}`.execute(fx.db);
    out[`${t.schema}.${t.name}`] = { rows: rows[0].n, md5: rows[0].sum ?? '' };
  }
  return out;
}

// ---- the run -----------------------------------------------------------------------------------------------

function setPath(body: Record<string, unknown>, dotted: string, value: unknown) {
  const keys = dotted.split('.');
  let at: any = body;
  for (const key of keys.slice(0, -1)) {
    if (at[key] === undefined || at[key] === null || typeof at[key] !== 'object') throw new Error(`base body has no ${dotted}`);
    at = at[key];
  }
  at[keys.at(-1)!] = value;
}

/** The JSON text a browser would send: NaN, Infinity and 1e309 become null exactly as JSON.stringify makes them. */
const jsonText = (body: unknown) => JSON.stringify(body);

let fx: Fixture;
let fixtureIds: string[] = [];

beforeAll(async () => {
  const db = testDb();
  const [owner, member] = await Promise.all([signedInUser(`fuzz-owner-${MARK}`), signedInUser(`fuzz-member-${MARK}`)]);
  const property = await createProperty(owner.client, { name: `Fuzz ${MARK}` });
  await addMember(owner.client, property.id, member, 'member');
  const plot = await createPlot(owner.client, property.id, { name: `Plot ${MARK}` });

  const { createPlanting, getStepRows } = await import('@/lib/data/plantings');
  const { buildPlantingInput } = await import('@/lib/planning/input');
  const { planPlanting } = await import('@/lib/schedule/plan');
  const { plantingSchema } = await import('@/lib/validations/planting');
  const form = plantingSchema.parse(PLANTING_FULL);
  const plotRow = await db.selectFrom('plots').selectAll().where('id', '=', plot.id).executeTakeFirstOrThrow();
  const propertyRow = await db.selectFrom('properties').selectAll().where('id', '=', property.id).executeTakeFirstOrThrow();
  const plan = planPlanting(buildPlantingInput(propertyRow, plotRow, form), null, new Date());
  const planting = await createPlanting({ plotId: plot.id, form, plan, createdBy: owner.user.id });
  const steps = await getStepRows(planting.id);
  const spray = steps.find((s) => s.kind === 'spray')!;
  const record = await db
    .insertInto('application_records')
    .values({
      property_id: property.id, plot_id: plot.id, plot_name: plot.name, kind: 'herbicide', applied_at: new Date('2026-05-04T13:15:00Z'),
      applied_on: '2026-05-04', time_zone: 'America/Chicago', area_acres: 0.5, product_name: 'Glyphosate 41% (generic)', rate_value: 48,
      rate_unit: 'fl oz/acre', total_product_value: 24, total_product_unit: 'fl oz', applicator_name: 'Fuzz test',
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  const observation = await db
    .insertInto('observations')
    .values({
      planting_id: planting.id, plot_id: plot.id, observed_on: '2027-09-20', observed_at: new Date(), stand_rating: 1,
      frame_counts: JSON.stringify([1, 2, 0]), frame_sq_ft: 1, plants_per_sq_ft: 1, weed_pressure: 'light', verdict: 'poor',
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  fx = {
    db, owner, member, propertyId: property.id, plotId: plot.id, plantingId: planting.id, stepId: spray.id,
    recordId: record.id, observationId: observation.id,
  };
  fixtureIds = [owner.user.id, member.user.id, property.id, plot.id, planting.id, record.id, observation.id, ...steps.map((s) => s.id)];

  const { rows } = await sql<{ schema: string; name: string }>`
    select n.nspname as schema, c.relname as name from pg_class c join pg_namespace n on n.oid = c.relnamespace
    where c.relkind in ('r', 'p') and not c.relispartition
      and n.nspname not in ('pg_catalog', 'information_schema') and n.nspname not like 'pg_toast%'
    order by 1, 2`.execute(db);
  tables = rows;
  console.log(`fuzz: seed ${SEED}, ${RUNS} runs per route, ${tables.length} tables watched (FUZZ_SEED=${SEED} replays)`);
});

afterAll(async () => {
  await fx?.db.destroy();
});

it('every JSON route handler under app/api has a fuzz spec, and every spec is a JSON route', () => {
  const found = jsonRoutes();
  expect(found.length).toBeGreaterThanOrEqual(20);
  expect(found).toEqual(Object.keys(SPECS).sort());
});

it('every spec field exists in its base body', async () => {
  // A field missing from the base would be "mutated" into existence and test nothing.
  for (const [key, spec] of Object.entries(SPECS)) {
    const base = spec.base(fx);
    for (const field of Object.keys(spec.fields)) {
      const parent = field.split('.').slice(0, -1).reduce<any>((at, k) => at?.[k], base);
      expect(parent && typeof parent === 'object', `${key}: ${field}`).toBe(true);
      expect(field.split('.').reduce<any>((at, k) => at?.[k], base), `${key}: ${field}`).not.toBeUndefined();
    }
  }
});

describe('fuzzed bodies: 400 naming the field, nothing written', () => {
  for (const [key, spec] of Object.entries(SPECS)) {
    const method = key.split(' ')[0];
    it(key, async () => {
      const fields = Object.entries(spec.fields);
      const mutation = fc.oneof(...fields.map(([field, kind]) => badValues(kind).map((value) => ({ field, value }))));
      const before = await snapshot(fx, fixtureIds);
      const statuses: Record<number, number> = {};
      await fc.assert(
        fc.asyncProperty(mutation, async ({ field, value }) => {
          const body = spec.base(fx);
          setPath(body, field, value);
          const client = spec.as === 'signedOut' ? new Client('fuzz sign-up') : fx.owner.client;
          const res = await client.request(method, spec.path(fx), { raw: jsonText(body), contentType: 'application/json' });
          statuses[res.status] = (statuses[res.status] ?? 0) + 1;
          const shown = `${field} = ${JSON.stringify(value)?.slice(0, 120)} → ${res.status} ${res.text.slice(0, 300)}`;
          expect(res.status, shown).toBe(400);
          expect(typeof res.body.error, shown).toBe('string');
          const named = Object.keys(res.body.fields ?? {}).filter((k) => k === field || k.startsWith(`${field}.`) || field.startsWith(`${k}.`));
          expect(named.length, `no field error for ${shown}`).toBeGreaterThan(0);
          expect(String(res.body.fields[named[0]]).length, shown).toBeGreaterThan(3);
        }),
        { seed: SEED, numRuns: RUNS, endOnFailure: true },
      );
      const after = await snapshot(fx, fixtureIds);
      expect(after).toEqual(before);
      expect(statuses).toEqual({ 400: RUNS });
    }, 120_000);
  }
});

describe('bodies that are not a JSON object', () => {
  const BODIES: [string, string, number, RegExp][] = [
    ['not JSON', '{"name": ', 400, /must be JSON/],
    ['a JSON array', '[1, 2]', 400, /JSON object/],
    ['a JSON string', '"fall"', 400, /JSON object/],
    ['JSON null', 'null', 400, /JSON object/],
    ['NaN as a bare word', '{"acres": NaN}', 400, /must be JSON/],
    ['a body over 1 MB', JSON.stringify({ notes: 'x'.repeat(1_100_000) }), 413, /too large/],
  ];
  it('every JSON route answers 400/413 with a message and writes nothing', async () => {
    const before = await snapshot(fx, fixtureIds);
    for (const [key, spec] of Object.entries(SPECS)) {
      const method = key.split(' ')[0];
      for (const [what, raw, status, message] of BODIES) {
        const client = spec.as === 'signedOut' ? new Client('fuzz sign-up') : fx.owner.client;
        const res = await client.request(method, spec.path(fx), { raw, contentType: 'application/json' });
        expect(res.status, `${key}, ${what}: ${res.text.slice(0, 200)}`).toBe(status);
        expect(res.body.error, `${key}, ${what}`).toMatch(message);
      }
    }
    expect(await snapshot(fx, fixtureIds)).toEqual(before);
  }, 120_000);
});

it('every GET handler that reads a query string has a query spec, and every query spec is one', () => {
  const found = queryRoutes();
  expect(found.length).toBeGreaterThanOrEqual(6);
  expect(found).toEqual(Object.keys(QUERY_SPECS).sort());
});

describe('fuzzed query strings: 400 naming the parameter, never 500', () => {
  for (const [key, spec] of Object.entries(QUERY_SPECS)) {
    it(key, async () => {
      const ok = await fx.owner.client.get(`${spec.path(fx)}?${new URLSearchParams(spec.base)}`);
      expect(ok.status, `the base query must pass: ${ok.text.slice(0, 200)}`).toBe(200);
      const mutation = fc.oneof(...Object.entries(spec.params).map(([param, kind]) => badParams(kind).map((value) => ({ param, value }))));
      const statuses: Record<number, number> = {};
      await fc.assert(
        fc.asyncProperty(mutation, async ({ param, value }) => {
          const query = new URLSearchParams({ ...spec.base, [param]: value });
          const res = await fx.owner.client.get(`${spec.path(fx)}?${query}`);
          statuses[res.status] = (statuses[res.status] ?? 0) + 1;
          const shown = `?${param}=${JSON.stringify(value).slice(0, 80)} → ${res.status} ${res.text.slice(0, 300)}`;
          expect(res.status, shown).toBe(400);
          expect(Object.keys(res.body.fields ?? {}), shown).toContain(param);
        }),
        { seed: SEED, numRuns: RUNS, endOnFailure: true },
      );
      expect(statuses).toEqual({ 400: RUNS });
    }, 120_000);
  }

  it('a date range whose end is not a date is a 400 naming `to` (it was a 500)', async () => {
    const res = await fx.owner.client.get('/api/calendar?from=2027-06-01&to=x');
    expect(res.status, res.text).toBe(400);
    expect(res.body.fields.to).toMatch(/real date/);
  });

  it('an unknown query parameter is refused where the filter is strict, and names it', async () => {
    const res = await fx.owner.client.get(`/api/properties/${fx.propertyId}/records?colour=red`);
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.fields)).toMatch(/colour/);
  });
});

describe('a NUL (and other control characters) in any string field: 400 naming the field, nothing written', () => {
  it('every JSON route, every string field of its valid body', async () => {
    const before = await snapshot(fx, fixtureIds);
    let sent = 0;
    for (const [key, spec] of Object.entries(SPECS)) {
      const method = key.split(' ')[0];
      for (const field of Object.keys(spec.fields)) {
        const kind = spec.fields[field];
        if (kind.t === 'text' && kind.hashed) continue;
        const valid = field.split('.').reduce<any>((at, k) => at?.[k], spec.base(fx));
        if (typeof valid !== 'string') continue;
        for (const control of ['\u0000', '\u001b']) {
          const body = spec.base(fx);
          setPath(body, field, `${valid || 'x'}${control}`);
          const client = spec.as === 'signedOut' ? new Client('fuzz sign-up') : fx.owner.client;
          const res = await client.request(method, spec.path(fx), { raw: jsonText(body), contentType: 'application/json' });
          const shown = `${key} ${field} + U+${control.charCodeAt(0).toString(16).padStart(4, '0')} → ${res.status} ${res.text.slice(0, 200)}`;
          expect(res.status, shown).toBe(400);
          const named = Object.keys(res.body.fields ?? {}).filter((k) => k === field || k.startsWith(`${field}.`) || field.startsWith(`${k}.`));
          expect(named.length, shown).toBeGreaterThan(0);
          sent += 1;
        }
      }
    }
    expect(sent).toBeGreaterThan(40);
    expect(await snapshot(fx, fixtureIds)).toEqual(before);
  }, 180_000);
});
