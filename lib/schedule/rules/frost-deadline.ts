// Frost deadline: a fall planting needs its establishment weeks before the average first fall frost; a
// frost-tender spring planting waits until the average last spring frost is safely past. Past the fall
// deadline Sowcast warns and names the latest date — it does not quietly move the seeding.
import type { BlendProfile } from '@/lib/agronomy/species';
import { addDays, dayWithMonth, daysBetween, monthDayInYear } from '../local-dates';
import type { PlantingInput, RuleDecision } from '../types';

export interface FrostDeadlineParams {
  springMarginDays: number;
}

export const FROST_DEADLINE_DEFAULTS: FrostDeadlineParams = { springMarginDays: 7 };

export const FROST_DEADLINE_SOURCES: Record<keyof FrostDeadlineParams, string> & { fallWeeks: string } = {
  springMarginDays:
    'common practice, no source: the average last frost is a date with about even odds of a later frost, so frost-tender seed waits a week more',
  fallWeeks: "each species' weeks before the average first fall frost, sourced in lib/agronomy/species.ts; the blend takes the longest",
};

export interface FrostBounds {
  season: PlantingInput['season'];
  applies: boolean;
  firstFallFrost: string | null;
  lastSpringFrost: string | null;
  fallLatest: string | null;
  springEarliest: string | null;
  weeksNeeded: number;
  frostTender: boolean;
}

export function frostBounds(
  input: Pick<PlantingInput, 'season' | 'method' | 'avgFirstFallFrost' | 'avgLastSpringFrost' | 'targetSeedDate'>,
  profile: BlendProfile,
  params: FrostDeadlineParams,
): FrostBounds {
  const year = Number(input.targetSeedDate.slice(0, 4));
  const applies = input.method !== 'frost-seeding';
  const firstFallFrost = input.avgFirstFallFrost ? monthDayInYear(input.avgFirstFallFrost, year) : null;
  const lastSpringFrost = input.avgLastSpringFrost ? monthDayInYear(input.avgLastSpringFrost, year) : null;
  const weeksNeeded = profile.fallWeeksBeforeFirstFrost;
  return {
    season: input.season,
    applies,
    firstFallFrost,
    lastSpringFrost,
    fallLatest: applies && input.season === 'fall' && firstFallFrost ? addDays(firstFallFrost, -7 * weeksNeeded) : null,
    springEarliest:
      applies && input.season === 'spring' && profile.frostTender && lastSpringFrost
        ? addDays(lastSpringFrost, params.springMarginDays)
        : null,
    weeksNeeded,
    frostTender: profile.frostTender,
  };
}

export interface FrostVerdict {
  decision: RuleDecision;
  warning: string | null;
}

export function frostDeadlineOn(date: string, bounds: FrostBounds, params: FrostDeadlineParams): FrostVerdict {
  if (!bounds.applies) {
    return { decision: { rule: 'frost-deadline', ok: true, reason: 'frost seeding goes on in late winter; no frost deadline' }, warning: null };
  }
  if (bounds.season === 'fall') {
    if (!bounds.firstFallFrost || !bounds.fallLatest) {
      return {
        decision: { rule: 'frost-deadline', ok: true, reason: 'no average first fall frost recorded for the property, so the fall deadline is not checked' },
        warning: 'Record the average first fall frost date so Sowcast can check the fall planting deadline.',
      };
    }
    const weeks = Math.floor(daysBetween(date, bounds.firstFallFrost) / 7);
    if (date <= bounds.fallLatest) {
      return {
        decision: {
          rule: 'frost-deadline',
          ok: true,
          reason: `${weeks} weeks before the average first frost (${dayWithMonth(bounds.firstFallFrost)}); the blend needs ${bounds.weeksNeeded}`,
        },
        warning: null,
      };
    }
    const warning =
      `Seeding on ${dayWithMonth(date)} is past the fall deadline: the blend needs ${bounds.weeksNeeded} weeks before the average first frost ` +
      `(${dayWithMonth(bounds.firstFallFrost)}), so the latest date is ${dayWithMonth(bounds.fallLatest)}.`;
    return {
      decision: {
        rule: 'frost-deadline',
        ok: false,
        reason: `past the fall deadline: latest date ${dayWithMonth(bounds.fallLatest)} (${bounds.weeksNeeded} weeks before the average first frost on ${dayWithMonth(bounds.firstFallFrost)})`,
      },
      warning,
    };
  }
  if (!bounds.frostTender) {
    return { decision: { rule: 'frost-deadline', ok: true, reason: 'no frost-tender species in the blend' }, warning: null };
  }
  if (!bounds.lastSpringFrost || !bounds.springEarliest) {
    return {
      decision: { rule: 'frost-deadline', ok: true, reason: 'no average last spring frost recorded, so the spring frost date is not checked' },
      warning: 'Record the average last spring frost date so Sowcast can keep frost-tender seed from going in too early.',
    };
  }
  if (date >= bounds.springEarliest) {
    return {
      decision: {
        rule: 'frost-deadline',
        ok: true,
        reason: `after the average last frost (${dayWithMonth(bounds.lastSpringFrost)}) plus ${params.springMarginDays} days`,
      },
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
