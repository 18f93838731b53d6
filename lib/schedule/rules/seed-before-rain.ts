// Seed before rain: broadcast seed lies on the surface until rain settles it into the soil, so seeding goes
// in the day or two before a soaking rain — and not right before a downpour that would wash it off.
import { SOAKING_RAIN_MM, SOAKING_RAIN_SOURCE } from '@/lib/agronomy/water-balance';
import { addDays, shortDay } from '../local-dates';
import { localInstantMs, rainInInterval, type ForecastIndex, type RainEvent } from '../forecast-days';
import { formatNumber, inchesOfRain, inchesPrecise } from '../format';
import type { RuleDecision } from '../types';

const HOUR_MS = 3_600_000;

export interface SeedBeforeRainParams {
  soakingRainMm: number;
  soakingWindowHours: number;
  leadMaxHours: number;
  washoutDayMm: number;
  /** Local time by which a day's seeding is taken to be done. */
  seedingClock: string;
  eventGapHours: number;
  measurableRainMm: number;
}

export const SEED_BEFORE_RAIN_DEFAULTS: SeedBeforeRainParams = {
  soakingRainMm: SOAKING_RAIN_MM, // 0.25 in; also the seed zone's "wet" in lib/agronomy/water-balance.ts
  soakingWindowHours: 72,
  leadMaxHours: 48,
  washoutDayMm: 50.8, // 2 in
  seedingClock: '12:00',
  eventGapHours: 6,
  measurableRainMm: 0.25,
};

export const SEED_BEFORE_RAIN_SOURCES: Record<keyof SeedBeforeRainParams, string> = {
  soakingRainMm: SOAKING_RAIN_SOURCE,
  soakingWindowHours: 'common practice, no source: the quarter inch may come over up to three days',
  leadMaxHours:
    'common practice, no source: seed left on the surface more than about two days before rain is lost to birds and drying',
  washoutDayMm:
    'common practice, no source: about 2 in (50 mm) in a day runs off a fresh seedbed and carries small seed with it; ' +
    'Sowcast avoids seeding on any day from which such a day falls inside the lead window',
  seedingClock: "Sowcast's assumption: a day's seeding is done by midday, so rain from then on counts as after it",
  eventGapHours:
    'from memory: six dry hours is the usual gap that separates one rain event from the next in rainfall analysis (stormwater practice)',
  measurableRainMm: 'US National Weather Service: measurable precipitation is 0.01 in (0.254 mm) or more',
};

export interface SeedRainVerdict {
  qualifies: boolean;
  washout: boolean;
  event: RainEvent | null;
  leadHours: number | null;
  decision: RuleDecision;
  /** Short form for a move's reason: '0.6 in of rain forecast Mon 13'. */
  summary: string;
}

/**
 * A washout-size day from the seeding day through the end of the lead window: seed (or fertilizer) spread
 * then is still on the surface when the downpour comes — the day before it most of all.
 */
export function washoutNear(fc: ForecastIndex, date: string, washoutDayMm: number, leadHours: number): { date: string; rainMm: number } | null {
  for (let i = 0; i <= Math.ceil(leadHours / 24); i++) {
    const d = addDays(date, i);
    const rainMm = fc.rainByDate.get(d) ?? 0;
    if (rainMm >= washoutDayMm) return { date: d, rainMm };
  }
  return null;
}

export function seedBeforeRain(fc: ForecastIndex, date: string, params: SeedBeforeRainParams): SeedRainVerdict {
  const washout = washoutNear(fc, date, params.washoutDayMm, params.leadMaxHours);
  if (washout) {
    const summary = `${inchesOfRain(washout.rainMm)} of rain forecast ${shortDay(washout.date)} would wash the seed off`;
    return {
      qualifies: false,
      washout: true,
      event: null,
      leadHours: null,
      summary,
      decision: { rule: 'seed-before-rain', ok: false, reason: `avoid: ${summary}` },
    };
  }
  const seedMs = localInstantMs(fc, date, params.seedingClock);
  const leadEndMs = seedMs + params.leadMaxHours * HOUR_MS;
  const event = fc.rainEvents.find((e) => e.qualifies && e.startMs >= seedMs && e.startMs <= leadEndMs) ?? null;
  if (event) {
    const leadHours = Math.round((event.startMs - seedMs) / HOUR_MS);
    const summary = `${inchesOfRain(event.totalMm)} of rain forecast ${shortDay(event.startDate)}`;
    return {
      qualifies: true,
      washout: false,
      event,
      leadHours,
      summary,
      decision: {
        rule: 'seed-before-rain',
        ok: true,
        reason: `${summary}, starting about ${event.startClock} — ${leadHours} h after a morning's seeding`,
      },
    };
  }
  const rainMm = rainInInterval(fc, seedMs, leadEndMs);
  const threshold = inchesPrecise(params.soakingRainMm);
  const summary =
    rainMm >= params.measurableRainMm
      ? `only ${inchesOfRain(rainMm)} of rain forecast in the ${formatNumber(params.leadMaxHours)} h after seeding`
      : `no rain in sight within ${formatNumber(params.leadMaxHours)} h`;
  return {
    qualifies: false,
    washout: false,
    event: null,
    leadHours: null,
    summary,
    decision: {
      rule: 'seed-before-rain',
      ok: false,
      reason: `${summary} (a soaking rain is ${threshold} or more within ${formatNumber(params.soakingWindowHours)} h)`,
    },
  };
}
