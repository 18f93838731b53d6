// Frost deadline. Every planting, whatever its season label, must give each species of its blend the growing
// days it needs before the freeze that kills it or ends its fall (lib/agronomy/growing-days.ts): the first
// 32 °F freeze for frost-tender species, a hard freeze (28 °F) for hardy ones, which survive a light freeze.
// A frost-tender spring planting also waits until the average last spring frost is safely past. Past the
// fall deadline Sowcast warns and names the latest date — it does not quietly move the seeding.
import {
  FREEZE_THRESHOLDS_F,
  FREEZE_THRESHOLD_SOURCES,
  blendFreezeNeeds,
  type KillingFreeze,
  type SpeciesFreezeNeed,
} from '@/lib/agronomy/growing-days';
import type { BlendProfile } from '@/lib/agronomy/species';
import { addDays, dayWithMonth, daysBetween, monthDayInYear } from '../local-dates';
import type { PlantingInput, RuleDecision } from '../types';

export interface FrostDeadlineParams {
  springMarginDays: number;
  /** Used only when the property records no average first hard freeze. */
  hardFreezeAfterFirstFrostDays: number;
}

export const FROST_DEADLINE_DEFAULTS: FrostDeadlineParams = { springMarginDays: 7, hardFreezeAfterFirstFrostDays: 14 };

export const FROST_DEADLINE_SOURCES: Record<keyof FrostDeadlineParams, string> & { growingDays: string; freezeThresholds: string } = {
  springMarginDays:
    'common practice, no source: the average last frost is a date with about even odds of a later frost, so frost-tender seed waits a week more',
  hardFreezeAfterFirstFrostDays:
    'derived from NOAA/NCEI station freeze-probability tables as reprinted by a seed company (secondary): at the 50 % dates the first ' +
    '28 °F night follows the first 32 °F night by 12 days at East Lansing, 13 at Lake City, 16 at Mount Pleasant, 17 at Midland and ' +
    "20 at Frankfort (Michigan); the South's gap is longer (NWS Tallahassee, 1981–2010: first freeze 20 Nov, first hard freeze at its " +
    '25 °F criterion 23 Dec), so two weeks errs early — record the property\'s own hard-freeze date where it is known',
  growingDays:
    "each species' growing days before its killing freeze, sourced in lib/agronomy/growing-days.ts; the blend's deadline is set by the species that must go in first",
  freezeThresholds: `frost ${FREEZE_THRESHOLDS_F.frost} °F, freeze ${FREEZE_THRESHOLDS_F.freeze} °F, hard freeze ${FREEZE_THRESHOLDS_F.hardFreeze} °F: ${FREEZE_THRESHOLD_SOURCES.hardFreeze}`,
};

/** One species of the blend against the freeze that ends its fall. */
export interface SpeciesDeadline extends SpeciesFreezeNeed {
  freezeDate: string;
  /** freezeDate less the growing days: the latest seeding date for this species. */
  latest: string;
}

export interface FrostBounds {
  season: PlantingInput['season'];
  applies: boolean;
  /** The average first fall frost (32 °F) that a seeding on the target date faces; null when none is recorded. */
  firstFallFrost: string | null;
  /** The first hard freeze (28 °F) of the same fall: recorded, or estimated from the first frost. */
  firstHardFreeze: string | null;
  hardFreezeEstimated: boolean;
  lastSpringFrost: string | null;
  /** The latest seeding date for the blend: the earliest of its species' latest dates. */
  fallLatest: string | null;
  /** The species that sets fallLatest (or, with no frost date recorded, the one needing the most days). */
  limiting: SpeciesDeadline | SpeciesFreezeNeed;
  species: SpeciesDeadline[];
  springEarliest: string | null;
  growingDaysNeeded: number;
  frostTender: boolean;
}

// Half a year after the average first frost a seeding belongs to the next fall, not to this winter.
const SAME_WINTER_DAYS = 183;

/**
 * The average first fall frost and hard freeze that a seeding on `seedDate` faces: this year's when the seeding
 * comes before it (or within the winter it begins), otherwise next year's — a January first frost, as in central
 * Florida, is the one after a November seeding.
 */
export function fallFreezeDates(
  seedDate: string,
  frost: Pick<PlantingInput, 'avgFirstFallFrost' | 'avgFirstHardFreeze'>,
  params: Pick<FrostDeadlineParams, 'hardFreezeAfterFirstFrostDays'>,
): { firstFallFrost: string; firstHardFreeze: string; hardFreezeEstimated: boolean } | null {
  if (!frost.avgFirstFallFrost) return null;
  const year = Number(seedDate.slice(0, 4));
  let firstFallFrost = monthDayInYear(frost.avgFirstFallFrost, year);
  if (daysBetween(firstFallFrost, seedDate) >= SAME_WINTER_DAYS) firstFallFrost = monthDayInYear(frost.avgFirstFallFrost, year + 1);
  if (!frost.avgFirstHardFreeze) {
    return { firstFallFrost, firstHardFreeze: addDays(firstFallFrost, params.hardFreezeAfterFirstFrostDays), hardFreezeEstimated: true };
  }
  const frostYear = Number(firstFallFrost.slice(0, 4));
  let firstHardFreeze = monthDayInYear(frost.avgFirstHardFreeze, frostYear);
  if (firstHardFreeze < firstFallFrost) firstHardFreeze = monthDayInYear(frost.avgFirstHardFreeze, frostYear + 1);
  return { firstFallFrost, firstHardFreeze, hardFreezeEstimated: false };
}

export function frostBounds(
  input: Pick<PlantingInput, 'season' | 'method' | 'avgFirstFallFrost' | 'avgFirstHardFreeze' | 'avgLastSpringFrost' | 'targetSeedDate'>,
  profile: BlendProfile,
  params: FrostDeadlineParams,
): FrostBounds {
  const applies = input.method !== 'frost-seeding';
  const year = Number(input.targetSeedDate.slice(0, 4));
  const lastSpringFrost = input.avgLastSpringFrost ? monthDayInYear(input.avgLastSpringFrost, year) : null;
  const needs = blendFreezeNeeds(profile.parts);
  const freezes = applies ? fallFreezeDates(input.targetSeedDate, input, params) : null;
  const species: SpeciesDeadline[] = freezes
    ? needs.map((n) => {
        const freezeDate = n.killedBy === 'freeze' ? freezes.firstFallFrost : freezes.firstHardFreeze;
        return { ...n, freezeDate, latest: addDays(freezeDate, -n.growingDays) };
      })
    : [];
  const byLatest = [...species].sort((a, b) => (a.latest < b.latest ? -1 : a.latest > b.latest ? 1 : 0));
  const limiting = byLatest[0] ?? needs.reduce((most, n) => (n.growingDays > most.growingDays ? n : most));
  return {
    season: input.season,
    applies,
    firstFallFrost: freezes?.firstFallFrost ?? null,
    firstHardFreeze: freezes?.firstHardFreeze ?? null,
    hardFreezeEstimated: freezes?.hardFreezeEstimated ?? false,
    lastSpringFrost,
    fallLatest: byLatest[0]?.latest ?? null,
    limiting,
    species,
    springEarliest:
      applies && input.season === 'spring' && profile.frostTender && lastSpringFrost ? addDays(lastSpringFrost, params.springMarginDays) : null,
    growingDaysNeeded: limiting.growingDays,
    frostTender: profile.frostTender,
  };
}

export interface FrostVerdict {
  decision: RuleDecision;
  warning: string | null;
}

const KILLING_FREEZE_WORDS: Record<KillingFreeze, string> = {
  freeze: 'a killing freeze',
  'hard-freeze': `a hard freeze (${FREEZE_THRESHOLDS_F.hardFreeze} °F)`,
};

/** "here is Sat 10 Oct, 20 days after seeding" / "here was Sat 10 Oct, 5 days before seeding". */
function whenAfter(date: string, freezeDate: string): string {
  const days = daysBetween(date, freezeDate);
  if (days >= 0) return `${dayWithMonth(freezeDate)}, ${days} day${days === 1 ? '' : 's'} after seeding`;
  return `${dayWithMonth(freezeDate)}, already ${-days} day${days === -1 ? '' : 's'} before seeding`;
}

function hardFreezeBasis(bounds: FrostBounds, params: FrostDeadlineParams): string {
  return bounds.hardFreezeEstimated
    ? `estimated as the average first frost, ${dayWithMonth(bounds.firstFallFrost as string)}, plus ${params.hardFreezeAfterFirstFrostDays} days`
    : "the property's average first hard freeze";
}

/** Why the species' killing freeze falls where it does, in a club member's words. */
function freezeWords(s: SpeciesDeadline, date: string, bounds: FrostBounds, params: FrostDeadlineParams): string {
  if (s.killedBy === 'freeze') return `the average first fall frost here is ${whenAfter(date, s.freezeDate)}`;
  return `it survives a light freeze; the hard freeze here is about ${whenAfter(date, s.freezeDate)} (${hardFreezeBasis(bounds, params)})`;
}

function fallVerdict(date: string, bounds: FrostBounds, params: FrostDeadlineParams): FrostVerdict {
  if (!bounds.firstFallFrost || !bounds.fallLatest) {
    return bounds.season === 'fall'
      ? {
          decision: { rule: 'frost-deadline', ok: true, reason: 'no average first fall frost recorded for the property, so the fall deadline is not checked' },
          warning: 'Record the average first fall frost date so Sowcast can check the fall planting deadline.',
        }
      : {
          decision: { rule: 'frost-deadline', ok: true, reason: 'no average first fall frost recorded, so the growing days before it are not checked' },
          warning: null,
        };
  }
  const late = bounds.species.filter((s) => date > s.latest).sort((a, b) => (a.latest < b.latest ? -1 : 1));
  if (late.length === 0) {
    const s = bounds.limiting as SpeciesDeadline;
    const days = daysBetween(date, s.freezeDate);
    const before =
      s.killedBy === 'freeze'
        ? `before the average first fall frost (${dayWithMonth(s.freezeDate)})`
        : `before a hard freeze (${FREEZE_THRESHOLDS_F.hardFreeze} °F) about ${dayWithMonth(s.freezeDate)} (${hardFreezeBasis(bounds, params)})`;
    return {
      decision: {
        rule: 'frost-deadline',
        ok: true,
        reason: `${days} days of growth ${before}; ${s.name} ${s.needs} about ${s.growingDays}, so the latest date is ${dayWithMonth(s.latest)}`,
      },
      warning: null,
    };
  }
  const s = late[0];
  const others = late.length > 1 ? ` (also too late for ${late.slice(1).map((x) => x.name).join(', ')})` : '';
  return {
    decision: {
      rule: 'frost-deadline',
      ok: false,
      reason:
        `${s.name} ${s.needs} about ${s.growingDays} days of growth before ${KILLING_FREEZE_WORDS[s.killedBy]}; ${freezeWords(s, date, bounds, params)} — ` +
        `past the fall deadline: latest date ${dayWithMonth(bounds.fallLatest)}${others}`,
    },
    warning:
      `Seeding on ${dayWithMonth(date)} is past the fall deadline: ${s.name} ${s.needs} about ${s.growingDays} days of growth before ` +
      `${KILLING_FREEZE_WORDS[s.killedBy]}, so the latest date is ${dayWithMonth(bounds.fallLatest)}.`,
  };
}

function springVerdict(date: string, bounds: FrostBounds, params: FrostDeadlineParams): FrostVerdict | null {
  if (bounds.season !== 'spring' || !bounds.frostTender) return null;
  if (!bounds.lastSpringFrost || !bounds.springEarliest) {
    return {
      decision: { rule: 'frost-deadline', ok: true, reason: 'no average last spring frost recorded, so the spring frost date is not checked' },
      warning: 'Record the average last spring frost date so Sowcast can keep frost-tender seed from going in too early.',
    };
  }
  if (date >= bounds.springEarliest) {
    return {
      decision: { rule: 'frost-deadline', ok: true, reason: `after the average last frost (${dayWithMonth(bounds.lastSpringFrost)}) plus ${params.springMarginDays} days` },
      warning: null,
    };
  }
  return {
    decision: {
      rule: 'frost-deadline',
      ok: false,
      reason: `too early for frost-tender seed: not before ${dayWithMonth(bounds.springEarliest)} (average last frost ${dayWithMonth(bounds.lastSpringFrost)} + ${params.springMarginDays} days)`,
    },
    warning: `Frost-tender seed on ${dayWithMonth(date)} risks a late frost; the earliest date is ${dayWithMonth(bounds.springEarliest)}.`,
  };
}

export function frostDeadlineOn(date: string, bounds: FrostBounds, params: FrostDeadlineParams): FrostVerdict {
  if (!bounds.applies) {
    return { decision: { rule: 'frost-deadline', ok: true, reason: 'frost seeding goes on in late winter; no frost deadline' }, warning: null };
  }
  const spring = springVerdict(date, bounds, params);
  if (spring && !spring.decision.ok) return spring;
  const fall = fallVerdict(date, bounds, params);
  if (!spring) return fall;
  return {
    decision: { ...fall.decision, reason: `${spring.decision.reason}; ${fall.decision.reason}` },
    warning: [spring.warning, fall.warning].filter(Boolean).join(' ') || null,
  };
}
