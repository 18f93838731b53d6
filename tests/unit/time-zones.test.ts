// Time zone names against the IANA tz database as shipped in Node's ICU, read through Intl
// (ECMA-402: Intl.supportedValuesOf('timeZone') and Intl.DateTimeFormat's timeZoneName: 'shortOffset').
import { describe, expect, it } from 'vitest';
import { canonicalTimeZone, isKnownTimeZone, propertySchema, timeZoneNames } from '@/lib/validations/property';

/** The UTC offset a zone's clock shows at an instant, e.g. 'GMT-6' or 'GMT+5:30'. */
function offsetAt(timeZone: string, isoInstant: string): string {
  const parts = new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'shortOffset' }).formatToParts(new Date(isoInstant));
  return parts.find((p) => p.type === 'timeZoneName')!.value;
}

const LISTED = Intl.supportedValuesOf('timeZone');

describe('isKnownTimeZone agrees with the runtime IANA database (Intl)', () => {
  it('the runtime lists a full database (hundreds of zones)', () => {
    expect(LISTED.length).toBeGreaterThan(300);
  });

  it('accepts every zone Intl lists, under its own name', () => {
    const refused = LISTED.filter((zone) => !isKnownTimeZone(zone));
    expect(refused).toEqual([]);
    const renamed = LISTED.filter((zone) => canonicalTimeZone(zone) !== zone);
    expect(renamed).toEqual([]);
  });

  it('accepts UTC and Etc/UTC (IANA "etcetera" file), which Intl does not list', () => {
    expect(isKnownTimeZone('UTC')).toBe(true);
    expect(isKnownTimeZone('Etc/UTC')).toBe(true);
  });

  it('rejects made-up and malformed names', () => {
    for (const name of [
      'Mars/Olympus', 'US/Fake', 'America/Chicag', 'America/Springfield', 'Chicago', '', ' ', 'America/Chicago ',
      '+05:00', 'GMT+5', 'UTC+2', 'America/../Chicago', 'America/Chicago\u0000', 'Europe/Atlantis',
    ]) {
      expect(isKnownTimeZone(name), JSON.stringify(name)).toBe(false);
      expect(canonicalTimeZone(name), JSON.stringify(name)).toBeNull();
    }
  });

  it("accepts current IANA names that ICU lists under older spellings (IANA tz 'northamerica', 'asia', 'europe')", () => {
    // In the IANA database these are the zone names; the others are kept in its 'backward' file.
    const pairs = [
      ['America/Indiana/Indianapolis', 'America/Indianapolis'],
      ['America/Kentucky/Louisville', 'America/Louisville'],
      ['Asia/Kolkata', 'Asia/Calcutta'],
      ['Europe/Kyiv', 'Europe/Kiev'],
    ];
    for (const [current, older] of pairs) {
      expect(isKnownTimeZone(current), current).toBe(true);
      // Whichever spelling this runtime lists is the one kept.
      const kept = canonicalTimeZone(current)!;
      expect(LISTED).toContain(kept);
      expect([current, older]).toContain(kept);
    }
  });

  it("accepts links from the IANA 'backward' file and maps them to the zone they name", () => {
    expect(canonicalTimeZone('US/Central')).toBe('America/Chicago');
    expect(canonicalTimeZone('US/Eastern')).toBe('America/New_York');
    expect(canonicalTimeZone('US/Arizona')).toBe('America/Phoenix');
  });

  it('the property schema stores the listed spelling for a link', () => {
    const base = { name: 'Z', latitude: 40, longitude: -90, elevationM: 0, tenure: 'owned' };
    expect(propertySchema.parse({ ...base, timeZone: 'US/Central' }).timeZone).toBe('America/Chicago');
    expect(propertySchema.parse({ ...base, timeZone: '  America/Chicago  ' }).timeZone).toBe('America/Chicago');
    const bad = propertySchema.safeParse({ ...base, timeZone: 'Mars/Olympus' });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]).toMatchObject({ path: ['timeZone'], message: 'Time zone must be an IANA name such as America/Chicago' });
  });

  it('timeZoneNames() is the Intl list plus UTC and Etc/UTC, sorted, without repeats', () => {
    const names = timeZoneNames();
    expect(names).toEqual([...new Set([...LISTED, 'UTC', 'Etc/UTC'])].sort());
    expect(names).toContain('America/Chicago');
    expect(names).toContain('America/New_York');
  });
});

describe('the listed zones are the real IANA zones (offsets from the IANA tz database, via Intl)', () => {
  // US daylight saving time: second Sunday in March to first Sunday in November (Energy Policy Act of 2005,
  // 15 U.S.C. §260a), as encoded in the tz 'northamerica' file. In 2026 that is 8 March and 1 November.
  it('America/Chicago is UTC−6 in January and UTC−5 in July 2026', () => {
    expect(offsetAt('America/Chicago', '2026-01-15T12:00:00Z')).toBe('GMT-6');
    expect(offsetAt('America/Chicago', '2026-07-15T12:00:00Z')).toBe('GMT-5');
  });

  it('America/Chicago springs forward at 02:00 local on 8 March 2026 and falls back on 1 November 2026', () => {
    expect(offsetAt('America/Chicago', '2026-03-08T07:59:00Z')).toBe('GMT-6');
    expect(offsetAt('America/Chicago', '2026-03-08T08:00:00Z')).toBe('GMT-5');
    expect(offsetAt('America/Chicago', '2026-11-01T06:59:00Z')).toBe('GMT-5');
    expect(offsetAt('America/Chicago', '2026-11-01T07:00:00Z')).toBe('GMT-6');
  });

  it('America/New_York is UTC−5 in January and UTC−4 in July 2026', () => {
    expect(offsetAt('America/New_York', '2026-01-15T12:00:00Z')).toBe('GMT-5');
    expect(offsetAt('America/New_York', '2026-07-15T12:00:00Z')).toBe('GMT-4');
  });

  it('America/Phoenix keeps UTC−7 all year (Arizona does not observe DST)', () => {
    expect(offsetAt('America/Phoenix', '2026-01-15T12:00:00Z')).toBe('GMT-7');
    expect(offsetAt('America/Phoenix', '2026-07-15T12:00:00Z')).toBe('GMT-7');
  });

  it('Asia/Kolkata is UTC+5:30 and Pacific/Chatham UTC+13:45 in January (tz files asia, australasia)', () => {
    expect(offsetAt(canonicalTimeZone('Asia/Kolkata')!, '2026-01-15T12:00:00Z')).toBe('GMT+5:30');
    expect(offsetAt('Pacific/Chatham', '2026-01-15T12:00:00Z')).toBe('GMT+13:45');
    expect(offsetAt('Pacific/Chatham', '2026-07-15T12:00:00Z')).toBe('GMT+12:45');
  });

  it('Australia/Lord_Howe moves its clock by half an hour: UTC+11 in January, UTC+10:30 in July', () => {
    expect(offsetAt('Australia/Lord_Howe', '2026-01-15T12:00:00Z')).toBe('GMT+11');
    expect(offsetAt('Australia/Lord_Howe', '2026-07-15T12:00:00Z')).toBe('GMT+10:30');
  });

  it('every listed zone has an offset within UTC−12…UTC+14 (the extremes in the tz database)', () => {
    for (const zone of LISTED) {
      const label = offsetAt(zone, '2026-01-15T12:00:00Z');
      const m = /^GMT(?:([+-])(\d{1,2})(?::(\d{2}))?)?$/.exec(label);
      expect(m, `${zone}: ${label}`).not.toBeNull();
      const minutes = m![1] ? (m![1] === '-' ? -1 : 1) * (Number(m![2]) * 60 + Number(m![3] ?? 0)) : 0;
      expect(minutes, zone).toBeGreaterThanOrEqual(-12 * 60);
      expect(minutes, zone).toBeLessThanOrEqual(14 * 60);
    }
  });
});
