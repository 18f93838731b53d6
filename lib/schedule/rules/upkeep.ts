// Upkeep: the recurring work that keeps a stand — mowing through summer, grass control in a broadleaf
// stand, frost seeding thin spots in late winter, a soil test every few years — as RFC 5545 recurrences.
// rrule keeps a recurrence's UTC time fixed across DST changes, so recurrences are expanded as floating
// local date-times (the UTC fields of rrule's dates stand for the wall clock) and only then turned into
// instants in the property's zone with date-fns-tz.
import * as rruleModule from 'rrule';
import type { Options } from 'rrule';
import { getSpecies, type BlendPart } from '@/lib/agronomy/species';
import { addDays, dayWithMonth, instantOf, isLeapYear, maxDate, monthDayInYear } from '../local-dates';
import type { RuleDecision, StepKind } from '../types';

export interface UpkeepParams {
  mowMonths: number[];
  /** Days after the germination check before the first mowing: a young stand is left alone. */
  firstMowAfterCheckDays: number;
  grassSprayMonths: number[];
  firstGrassSprayAfterCheckDays: number;
  soilTestEveryYears: number;
  frostSeedDaysBeforeLastFrost: number;
  /** 'MM-DD' for frost seeding when the property has no last-frost date. */
  frostSeedFallback: string;
  firstFrostSeedAfterCheckDays: number;
  /** Local time a recurring step is put at (reminders take it from here). */
  startClock: string;
}

export const UPKEEP_DEFAULTS: UpkeepParams = {
  mowMonths: [5, 6, 7, 8],
  firstMowAfterCheckDays: 45,
  grassSprayMonths: [4, 9],
  firstGrassSprayAfterCheckDays: 30,
  soilTestEveryYears: 3,
  frostSeedDaysBeforeLastFrost: 60,
  frostSeedFallback: '02-15',
  firstFrostSeedAfterCheckDays: 60,
  startClock: '08:00',
};

export const UPKEEP_SOURCES: Record<keyof UpkeepParams, string> = {
  mowMonths: 'common practice, no source: clover and chicory stands are mowed about monthly through summer to hold back weeds and keep growth tender',
  firstMowAfterCheckDays: 'common practice, no source: let a new stand establish for about six weeks before the first mowing',
  grassSprayMonths: 'common practice, no source: grass-selective herbicide in a broadleaf stand works on actively growing grass, in spring and early fall',
  firstGrassSprayAfterCheckDays: 'common practice, no source: wait about a month after emergence; the label sets crop-stage limits',
  soilTestEveryYears: 'common practice (extension soil-testing guidance commonly says every 2–3 years; from memory)',
  frostSeedDaysBeforeLastFrost: 'common practice, no source: frost seeding goes on in late winter while nights still freeze, roughly two months before the last frost',
  frostSeedFallback: 'common practice, no source: mid-February, for the central US, when no frost date is recorded',
  firstFrostSeedAfterCheckDays: "Sowcast's default: the first late winter at least two months after the stand came up",
  startClock: "Sowcast's default: a morning start for outdoor work",
};

// rrule ships CommonJS to plain Node (names on the default export) and ESM to bundlers (named exports).
const { RRule } = ((rruleModule as unknown as { default?: typeof rruleModule }).default ?? rruleModule) as typeof rruleModule;

const RRULE_DAYS = [RRule.SU, RRule.MO, RRule.TU, RRule.WE, RRule.TH, RRule.FR, RRule.SA];

export interface UpkeepSpec {
  key: string;
  kind: StepKind;
  date: string; // DTSTART's local date: the first occurrence
  recurrence: string;
  reason: string;
  decision: RuleDecision;
  /** Blend parts this step sows (frost seeding). */
  parts?: BlendPart[];
}

function floating(date: string, clock: string): Date {
  return new Date(`${date}T${clock}:00.000Z`);
}

function stamp(d: Date): string {
  return d.toISOString().slice(0, 19).replace(/[-:]/g, '');
}

/** The RFC 5545 text of a rule whose first occurrence is on or after `notBefore`, with DTSTART on that occurrence. */
export function recurrenceFrom(rule: Partial<Options>, notBefore: string, clock: string, timeZone: string): { date: string; recurrence: string } {
  const probe = new RRule({ ...rule, dtstart: floating(notBefore, clock) });
  const first = probe.after(floating(notBefore, clock), true);
  if (!first) throw new Error('The recurrence has no occurrence.');
  const body = new RRule({ ...rule, dtstart: first }).toString().split('\n').find((line) => line.startsWith('RRULE:'));
  return { date: first.toISOString().slice(0, 10), recurrence: `DTSTART;TZID=${timeZone}:${stamp(first)}\n${body}` };
}

export interface Occurrence {
  date: string; // local date
  clock: string; // local 'HH:mm'
  startsAt: string; // ISO instant in UTC
}

interface ParsedRecurrence {
  rule: InstanceType<typeof RRule>;
  timeZone: string;
}

// A calendar of a thousand plots expands the same few hundred rule texts on every request: each is parsed
// once, and each (rule, range) expanded once. Both maps are emptied when full, so they stay bounded.
const CACHE_LIMIT = 5_000;
const parsedRules = new Map<string, ParsedRecurrence>();
const expansions = new Map<string, readonly Occurrence[]>();

function remember<V>(cache: Map<string, V>, key: string, value: V): V {
  if (cache.size >= CACHE_LIMIT) cache.clear();
  cache.set(key, value);
  return value;
}

function parseRecurrence(recurrence: string): ParsedRecurrence {
  const known = parsedRules.get(recurrence);
  if (known) return known;
  const dtstart = /DTSTART;TZID=([^:\s]+):(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})/.exec(recurrence);
  const rruleLine = recurrence.split(/\r?\n/).find((line) => line.startsWith('RRULE:'));
  if (!dtstart || !rruleLine) throw new Error('A recurrence needs DTSTART;TZID=… and an RRULE line.');
  const [, timeZone, y, mo, d, hh, mm] = dtstart;
  // noCache: rrule's own result cache would grow with every range ever asked; `expansions` is bounded.
  const rule = new RRule({ ...RRule.parseString(rruleLine.slice('RRULE:'.length)), dtstart: floating(`${y}-${mo}-${d}`, `${hh}:${mm}`) }, true);
  return remember(parsedRules, recurrence, { rule, timeZone });
}

function occurrence(o: Date, timeZone: string): Occurrence {
  const text = o.toISOString();
  const date = text.slice(0, 10);
  const clock = text.slice(11, 16);
  // The instant is worked out only when asked for: the calendar and My steps read the local date and clock
  // alone, and date-fns-tz's zone lookup costs more than the rest of an occurrence.
  return Object.freeze({
    date,
    clock,
    get startsAt() {
      return instantOf(date, clock, timeZone).toISOString();
    },
  });
}

/** Occurrences between two local dates (inclusive), with wall-clock time kept across DST changes. */
export function expandRecurrence(recurrence: string, from: string, to: string): Occurrence[] {
  const key = `${from}/${to}/${recurrence}`;
  let occurrences = expansions.get(key);
  if (!occurrences) {
    const { rule, timeZone } = parseRecurrence(recurrence);
    occurrences = remember(expansions, key, rule.between(floating(from, '00:00'), floating(to, '23:59'), true).map((o) => occurrence(o, timeZone)));
  }
  // The occurrences are frozen and shared; the array is the caller's own.
  return occurrences.slice();
}

function addYears(date: string, years: number): string {
  const y = Number(date.slice(0, 4)) + years;
  const md = date.slice(5);
  return md === '02-29' && !isLeapYear(y) ? `${y}-02-28` : `${y}-${md}`;
}

export function upkeepSpecs(o: {
  standFrom: string; // the germination check
  soilTestDate: string | null;
  blend: BlendPart[];
  avgLastSpringFrost: string | null;
  timeZone: string;
  params: UpkeepParams;
  /** No recurrence starts before this local date. */
  today: string;
}): UpkeepSpec[] {
  const { params } = o;
  const notBefore = (date: string) => maxDate(date, o.today);
  const species = o.blend.map((p) => ({ part: p, species: getSpecies(p.speciesId) }));
  const lasting = species.some((s) => s.species.lifeCycle !== 'annual');
  const hasGrass = species.some((s) => s.species.kind === 'grain' || s.species.kind === 'grass');
  const frostSeedable = species.filter((s) => s.species.frostSeedable && s.species.lifeCycle !== 'annual');
  const out: UpkeepSpec[] = [];
  const saturday = RRULE_DAYS[6];

  if (lasting) {
    const r = recurrenceFrom(
      { freq: RRule.MONTHLY, bymonth: params.mowMonths, byweekday: [saturday.nth(1)] },
      notBefore(addDays(o.standFrom, params.firstMowAfterCheckDays)),
      params.startClock,
      o.timeZone,
    );
    out.push({
      key: 'upkeep-mow',
      kind: 'mow',
      ...r,
      reason: `mow the stand on the first Saturday of each summer month, starting ${dayWithMonth(r.date)}`,
      decision: { rule: 'upkeep', ok: true, reason: UPKEEP_SOURCES.mowMonths },
    });
  }
  if (lasting && !hasGrass) {
    const r = recurrenceFrom(
      { freq: RRule.YEARLY, bymonth: params.grassSprayMonths, byweekday: [saturday.nth(2)] },
      notBefore(addDays(o.standFrom, params.firstGrassSprayAfterCheckDays)),
      params.startClock,
      o.timeZone,
    );
    out.push({
      key: 'upkeep-spot-spray-grass',
      kind: 'spot-spray-grass',
      ...r,
      reason:
        `spot-spray invading grass with a grass-selective herbicide (clethodim or sethoxydim, which spare clover and other broadleaf stands; ` +
        `typical — the label on your jug is the law) in spring and early fall, starting ${dayWithMonth(r.date)}`,
      decision: { rule: 'upkeep', ok: true, reason: UPKEEP_SOURCES.grassSprayMonths },
    });
  }
  if (frostSeedable.length) {
    const from = notBefore(addDays(o.standFrom, params.firstFrostSeedAfterCheckDays));
    // The first late winter on or after `from`, reckoned in that year's calendar.
    const lateWinter = (year: number) =>
      o.avgLastSpringFrost
        ? addDays(monthDayInYear(o.avgLastSpringFrost, year), -params.frostSeedDaysBeforeLastFrost)
        : monthDayInYear(params.frostSeedFallback, year);
    const fromYear = Number(from.slice(0, 4));
    const target = lateWinter(fromYear) >= from ? lateWinter(fromYear) : lateWinter(fromYear + 1);
    const month = Number(target.slice(5, 7));
    // A yearly rule on 29 February would skip three years in four.
    const day = month === 2 ? Math.min(28, Number(target.slice(8, 10))) : Number(target.slice(8, 10));
    const r = recurrenceFrom(
      { freq: RRule.YEARLY, bymonth: [month], bymonthday: [day] },
      from,
      params.startClock,
      o.timeZone,
    );
    out.push({
      key: 'upkeep-frost-seed',
      kind: 'frost-seed',
      ...r,
      parts: frostSeedable.map((s) => s.part),
      reason: `frost seed thin spots each late winter, starting ${dayWithMonth(r.date)}`,
      decision: { rule: 'upkeep', ok: true, reason: UPKEEP_SOURCES.frostSeedDaysBeforeLastFrost },
    });
  }
  const soilStart = notBefore(addYears(o.soilTestDate ?? o.standFrom, params.soilTestEveryYears));
  const soil = recurrenceFrom(
    { freq: RRule.YEARLY, interval: params.soilTestEveryYears, bymonth: [Number(soilStart.slice(5, 7))], bymonthday: [Number(soilStart.slice(8, 10))] },
    soilStart,
    params.startClock,
    o.timeZone,
  );
  out.push({
    key: 'upkeep-soil-test',
    kind: 'soil-test',
    ...soil,
    reason: `test the soil every ${params.soilTestEveryYears} years, next ${dayWithMonth(soil.date)}`,
    decision: { rule: 'upkeep', ok: true, reason: UPKEEP_SOURCES.soilTestEveryYears },
  });
  return out;
}
