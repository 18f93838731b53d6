// The zod schemas in lib/validations, directly: what passes, and the message each field gives.
import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { fieldErrors, isRealDate, optionalMonthDay } from '@/lib/validations/common';
import {
  emailSchema, invitationSchema, ROLE_RANK, ROLES, roleAtLeast, roleChangeSchema,
} from '@/lib/validations/membership';
import { plotSchema, plotUpdateSchema } from '@/lib/validations/plot';
import { propertySchema, propertyUpdateSchema } from '@/lib/validations/property';
import { signInSchema, signUpSchema } from '@/lib/validations/user';

/** The message for one field, or undefined when that field passed. */
function messageFor(schema: z.ZodType, input: unknown, field: string): string | undefined {
  const result = schema.safeParse(input);
  if (result.success) return undefined;
  return fieldErrors(result.error)[field];
}

const PROPERTY = {
  name: 'Ridge ground',
  latitude: 36.41,
  longitude: -90.12,
  timeZone: 'America/Chicago',
  elevationM: 105,
  tenure: 'owned',
};

const PLOT = { name: 'Creek strip', acres: 0.5, cover: 'grass-weeds', sun: 'full' };

describe('propertySchema', () => {
  it('accepts a minimal property and leaves optional fields out', () => {
    const parsed = propertySchema.parse(PROPERTY);
    expect(parsed).toEqual(PROPERTY);
  });

  it('treats empty form fields as not given', () => {
    const parsed = propertySchema.parse({ ...PROPERTY, avgLastSpringFrost: '', landownerName: '   ', seasonOpensOn: null });
    expect(parsed.avgLastSpringFrost).toBeUndefined();
    expect(parsed.landownerName).toBeUndefined();
    expect(parsed.seasonOpensOn).toBeUndefined();
  });

  // WGS 84 coordinates in degrees: latitude −90…90, longitude −180…180 (ISO 6709).
  const CASES: [string, Record<string, unknown>, string, string][] = [
    ['name', { name: undefined }, 'name', 'Name is required'],
    ['name', { name: '  ' }, 'name', 'Name is required'],
    ['name', { name: 'x'.repeat(121) }, 'name', 'Name must be at most 120 characters'],
    ['latitude', { latitude: 90.0001 }, 'latitude', 'Latitude must be at most 90°'],
    ['latitude', { latitude: -91 }, 'latitude', 'Latitude must be at least -90°'],
    ['latitude', { latitude: 'abc' }, 'latitude', 'Latitude must be a number'],
    ['latitude', { latitude: undefined }, 'latitude', 'Latitude must be a number'],
    ['longitude', { longitude: 180.5 }, 'longitude', 'Longitude must be at most 180°'],
    ['timeZone', { timeZone: 'Mars/Olympus' }, 'timeZone', 'Time zone must be an IANA name such as America/Chicago'],
    ['timeZone', { timeZone: '' }, 'timeZone', 'Time zone is required'],
    ['timeZone', { timeZone: undefined }, 'timeZone', 'Time zone is required'],
    ['elevationM', { elevationM: 9001 }, 'elevationM', 'Elevation must be at most 9000 m'],
    ['elevationM', { elevationM: -501 }, 'elevationM', 'Elevation must be at least -500 m'],
    ['avgLastSpringFrost', { avgLastSpringFrost: '02-30' }, 'avgLastSpringFrost', 'Average last spring frost is not a real day of the year'],
    ['avgLastSpringFrost', { avgLastSpringFrost: '13-01' }, 'avgLastSpringFrost', 'Average last spring frost is not a real day of the year'],
    ['avgLastSpringFrost', { avgLastSpringFrost: 'April 2' }, 'avgLastSpringFrost', 'Average last spring frost must be a month and day like 04-15'],
    ['avgFirstFallFrost', { avgFirstFallFrost: 1029 }, 'avgFirstFallFrost', 'Average first fall frost must be a month and day'],
    ['avgFirstHardFreeze', { avgFirstHardFreeze: '12-32' }, 'avgFirstHardFreeze', 'Average first hard freeze is not a real day of the year'],
    ['seasonOpensOn', { seasonOpensOn: '2026-02-30' }, 'seasonOpensOn', 'Season opening date must be a real date (YYYY-MM-DD)'],
    ['seasonOpensOn', { seasonOpensOn: 20260930 }, 'seasonOpensOn', 'Season opening date must be a date'],
    ['tenure', { tenure: 'rented' }, 'tenure', 'Tenure must be owned, leased or permission'],
    ['landownerName', { landownerName: 'x'.repeat(121) }, 'landownerName', 'Landowner name must be at most 120 characters'],
    ['landownerContact', { landownerContact: 'x'.repeat(201) }, 'landownerContact', 'Landowner contact must be at most 200 characters'],
    ['landownerContact', { landownerContact: 5551234 }, 'landownerContact', 'Landowner contact must be text'],
    ['permissionGrantedOn', { permissionGrantedOn: '2026-04-31' }, 'permissionGrantedOn', 'Permission date must be a real date (YYYY-MM-DD)'],
  ];
  for (const [label, override, field, message] of CASES) {
    it(`${label}: ${JSON.stringify(override).slice(0, 60)} → "${message}"`, () => {
      const input: Record<string, unknown> = { ...PROPERTY, ...override };
      for (const [k, v] of Object.entries(override)) if (v === undefined) delete input[k];
      expect(messageFor(propertySchema, input, field)).toBe(message);
    });
  }

  it('the update schema accepts any subset but still refuses a blanked required field', () => {
    expect(propertyUpdateSchema.parse({})).toEqual({});
    expect(propertyUpdateSchema.parse({ name: 'New name' })).toEqual({ name: 'New name' });
    expect(messageFor(propertyUpdateSchema, { latitude: null }, 'latitude')).toBe('Latitude must be a number');
    expect(messageFor(propertyUpdateSchema, { name: '' }, 'name')).toBe('Name is required');
  });
});

describe('plotSchema', () => {
  it('accepts a plot; soil pH and notes are optional', () => {
    expect(plotSchema.parse(PLOT)).toEqual(PLOT);
    expect(plotSchema.parse({ ...PLOT, soilPh: 6.5, notes: '  wet in spring ' })).toMatchObject({ soilPh: 6.5, notes: 'wet in spring' });
  });

  const CASES: [Record<string, unknown>, string, string][] = [
    [{ name: '' }, 'name', 'Name is required'],
    [{ name: 'x'.repeat(81) }, 'name', 'Name must be at most 80 characters'],
    [{ acres: 0 }, 'acres', 'Acres must be more than 0'],
    [{ acres: -1 }, 'acres', 'Acres must be more than 0'],
    [{ acres: 10000.5 }, 'acres', 'Acres must be at most 10000'],
    [{ acres: '1.5' }, 'acres', 'Acres must be a number'],
    [{ acres: '' }, 'acres', 'Acres must be a number'],
    [{ cover: 'gravel' }, 'cover', 'Cover must be one of the listed kinds'],
    [{ sun: 'dark' }, 'sun', 'Sun must be full, partial or shade'],
    // Soil pH: the schema's 3–10 spans agricultural soils (common practice, no source).
    [{ soilPh: 2.9 }, 'soilPh', 'Soil pH must be at least 3'],
    [{ soilPh: 10.1 }, 'soilPh', 'Soil pH must be at most 10'],
    [{ soilPh: 'low' }, 'soilPh', 'Soil pH must be a number'],
    [{ notes: 'x'.repeat(4001) }, 'notes', 'Notes must be at most 4000 characters'],
  ];
  for (const [override, field, message] of CASES) {
    it(`${field}: ${JSON.stringify(override).slice(0, 40)} → "${message}"`, () => {
      expect(messageFor(plotSchema, { ...PLOT, ...override }, field)).toBe(message);
    });
  }

  it('accepts 4000 characters of notes exactly, and the smallest positive acreage', () => {
    expect(plotSchema.safeParse({ ...PLOT, notes: 'x'.repeat(4000) }).success).toBe(true);
    expect(plotSchema.safeParse({ ...PLOT, acres: 0.01 }).success).toBe(true);
  });

  it('the update schema refuses zero acres and a blanked acreage', () => {
    expect(messageFor(plotUpdateSchema, { acres: 0 }, 'acres')).toBe('Acres must be more than 0');
    expect(messageFor(plotUpdateSchema, { acres: null }, 'acres')).toBe('Acres must be a number');
  });
});

describe('sign-up, sign-in and invitation schemas', () => {
  const SIGN_UP = { name: 'Someone', email: 'someone@example.test', password: 'long-enough-1' };

  it('sign-up lower-cases and trims the e-mail', () => {
    expect(signUpSchema.parse({ ...SIGN_UP, email: '  SomeOne@Example.TEST ' }).email).toBe('someone@example.test');
  });

  const CASES: [Record<string, unknown>, string, string][] = [
    [{ password: 'nine-char' }, 'password', 'Password must be at least 10 characters'],
    [{ password: 'x'.repeat(201) }, 'password', 'Password must be at most 200 characters'],
    [{ password: undefined }, 'password', 'Password is required'],
    // An address needs a local part, '@' and a domain (RFC 5322 §3.4.1).
    [{ email: 'someone.example.test' }, 'email', 'E-mail must be a valid address'],
    [{ email: 'someone@' }, 'email', 'E-mail must be a valid address'],
    [{ email: '@example.test' }, 'email', 'E-mail must be a valid address'],
    // At most 254 characters in a forward path (RFC 5321 §4.5.3.1.3, with RFC 3696 erratum 1690).
    [{ email: `${'a'.repeat(64)}@${'b'.repeat(186)}.test` }, 'email', 'E-mail must be at most 254 characters'],
    [{ email: undefined }, 'email', 'E-mail is required'],
    [{ name: undefined }, 'name', 'Name is required'],
    [{ name: 'x'.repeat(81) }, 'name', 'Name must be at most 80 characters'],
  ];
  for (const [override, field, message] of CASES) {
    it(`sign-up ${field}: ${JSON.stringify(override).slice(0, 40)} → "${message}"`, () => {
      const input: Record<string, unknown> = { ...SIGN_UP, ...override };
      for (const [k, v] of Object.entries(override)) if (v === undefined) delete input[k];
      expect(messageFor(signUpSchema, input, field)).toBe(message);
    });
  }

  it('sign-in needs a valid e-mail and a non-empty password', () => {
    expect(signInSchema.safeParse({ email: 'a@example.test', password: 'x' }).success).toBe(true);
    expect(messageFor(signInSchema, { email: 'a@example.test', password: '' }, 'password')).toBe('Password is required');
    expect(messageFor(signInSchema, { email: 'nope', password: 'x' }, 'email')).toBe('E-mail must be a valid address');
  });

  it('invitations need an address and one of the four roles', () => {
    expect(invitationSchema.parse({ email: 'A@Example.test', role: 'viewer' })).toEqual({ email: 'a@example.test', role: 'viewer' });
    expect(messageFor(invitationSchema, { email: 'a@example.test', role: 'admin' }, 'role')).toBe('Role must be owner, manager, member or viewer');
    expect(messageFor(roleChangeSchema, { role: 'boss' }, 'role')).toBe('Role must be owner, manager, member or viewer');
    expect(emailSchema.safeParse('x@y').success).toBe(false);
  });
});

describe('roles', () => {
  it('rank owner ⊃ manager ⊃ member ⊃ viewer, and each includes the ones below it', () => {
    expect([...ROLES].sort((a, b) => ROLE_RANK[b] - ROLE_RANK[a])).toEqual(['owner', 'manager', 'member', 'viewer']);
    for (const role of ROLES) {
      for (const needed of ROLES) {
        expect(roleAtLeast(role, needed), `${role} ≥ ${needed}`).toBe(ROLES.indexOf(role) <= ROLES.indexOf(needed));
      }
    }
  });
});

describe('calendar dates (Gregorian calendar, ISO 8601 YYYY-MM-DD)', () => {
  // Days per month with the Gregorian leap rule: divisible by 4, except centuries not divisible by 400.
  const isLeap = (y: number) => (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
  const daysIn = (y: number, m: number) => [31, isLeap(y) ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][m - 1];
  const pad = (n: number) => String(n).padStart(2, '0');

  it('accepts exactly the real days of 1900, 2000, 2024, 2025 and 2100', () => {
    for (const y of [1900, 2000, 2024, 2025, 2100]) {
      for (let m = 0; m <= 13; m++) {
        for (let d = 0; d <= 32; d++) {
          const real = m >= 1 && m <= 12 && d >= 1 && d <= daysIn(y, m);
          expect(isRealDate(`${y}-${pad(m)}-${pad(d)}`), `${y}-${m}-${d}`).toBe(real);
        }
      }
    }
  });

  it('refuses other shapes', () => {
    for (const v of ['2026-2-3', '26-02-03', '2026/02/03', '2026-02-03T00:00', ' 2026-02-03', '']) {
      expect(isRealDate(v), v).toBe(false);
    }
  });

  it('month-days allow 29 February (frost dates recur every year, leap years included)', () => {
    const schema = optionalMonthDay('Frost');
    expect(schema.parse('02-29')).toBe('02-29');
    expect(schema.safeParse('02-30').success).toBe(false);
    for (let m = 1; m <= 12; m++) {
      expect(schema.safeParse(`${pad(m)}-${pad(daysIn(2024, m))}`).success, `${m}`).toBe(true);
      expect(schema.safeParse(`${pad(m)}-${pad(daysIn(2024, m) + 1)}`).success, `${m}+1`).toBe(false);
    }
  });
});

describe('fieldErrors', () => {
  it('keys messages by field path and keeps the first message of each field', () => {
    const result = propertySchema.safeParse({});
    expect(result.success).toBe(false);
    const fields = fieldErrors(result.error!);
    expect(Object.keys(fields).sort()).toEqual(['elevationM', 'latitude', 'longitude', 'name', 'tenure', 'timeZone']);
    for (const message of Object.values(fields)) expect(typeof message).toBe('string');
  });
});

describe('control characters in text (PostgreSQL refuses U+0000 in text: "invalid byte sequence for encoding UTF8: 0x00")', () => {
  it('a NUL or another C0 control character in any free-text field is refused, naming the field', () => {
    for (const bad of ['Ridge\u0000', '\u0000', 'a\u0007b', 'x\u001by', 'del\u007f']) {
      expect(messageFor(propertySchema, { ...PROPERTY, name: bad }, 'name')).toBe('Name must not contain control characters');
      expect(messageFor(plotSchema, { ...PLOT, notes: bad }, 'notes')).toMatch(/must not contain control characters/);
    }
  });

  it('tab, line feed and carriage return stay allowed in multi-line text', () => {
    expect(messageFor(plotSchema, { ...PLOT, notes: 'first line\r\nsecond\tcolumn' }, 'notes')).toBeUndefined();
  });
});

describe('calendarQuerySchema with a date that is not a date', () => {
  it('answers a field error for `to` instead of throwing in the range check', async () => {
    const { calendarQuerySchema } = await import('@/lib/validations/step-edit');
    for (const to of ['x', '2027-13-45', '2027-01-01\u0000']) {
      expect(() => calendarQuerySchema.safeParse({ from: '2027-01-01', to })).not.toThrow();
      expect(messageFor(calendarQuerySchema, { from: '2027-01-01', to }, 'to')).toBe('To must be a real date (YYYY-MM-DD)');
    }
    expect(messageFor(calendarQuerySchema, { from: 'x', to: '2027-01-01' }, 'from')).toBe('From must be a real date (YYYY-MM-DD)');
    expect(messageFor(calendarQuerySchema, { from: 'x', to: '2027-01-01' }, 'to')).toBeUndefined();
  });
});
