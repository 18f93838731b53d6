// Fertilize before rain: granular fertilizer on the surface needs rain to move it to the roots, and a
// downpour on it washes it off toward water. So: ahead of a soaking rain, never ahead of a washout.
// When: with the seeding on a prepared seedbed; after the stand is up for spray-and-seed and frost seeding.
import { shortDay } from '../local-dates';
import { localInstantMs, rainInInterval, type ForecastIndex } from '../forecast-days';
import { formatNumber, inchesOfRain, inchesPrecise } from '../format';
import type { RuleDecision } from '../types';
import { washoutNear } from './seed-before-rain';

const HOUR_MS = 3_600_000;

export interface FertilizeBeforeRainParams {
  rainMm: number;
  withinHours: number;
  washoutDayMm: number;
  spreadClock: string;
  /** How far after the earliest day Sowcast looks for a rain to spread ahead of. */
  searchDays: number;
}

export const FERTILIZE_BEFORE_RAIN_DEFAULTS: FertilizeBeforeRainParams = {
  rainMm: 6.35, // 0.25 in
  withinHours: 48,
  washoutDayMm: 50.8, // 2 in
  spreadClock: '12:00',
  searchDays: 7,
};

export const FERTILIZE_BEFORE_RAIN_SOURCES: Record<keyof FertilizeBeforeRainParams, string> = {
  rainMm: 'common practice, no source: about a quarter inch of rain dissolves surface-applied granules and carries them in',
  withinHours: 'common practice, no source: within two days, before nitrogen on the surface is lost to the air',
  washoutDayMm: 'common practice, no source: about 2 in in a day runs off and carries fresh fertilizer toward water',
  spreadClock: "Sowcast's assumption: a day's spreading is done by midday",
  searchDays: "Sowcast's default: look up to a week past the earliest day for a rain to spread ahead of",
};

export interface FertilizeVerdict {
  qualifies: boolean;
  washout: boolean;
  rainMm: number;
  decision: RuleDecision;
  summary: string;
}

export function fertilizeBeforeRain(fc: ForecastIndex, date: string, params: FertilizeBeforeRainParams): FertilizeVerdict {
  const washout = washoutNear(fc, date, params.washoutDayMm, params.withinHours);
  if (washout) {
    const summary = `${inchesOfRain(washout.rainMm)} of rain forecast ${shortDay(washout.date)} would wash fertilizer off`;
    return { qualifies: false, washout: true, rainMm: washout.rainMm, summary, decision: { rule: 'fertilize-before-rain', ok: false, reason: `avoid: ${summary}` } };
  }
  const fromMs = localInstantMs(fc, date, params.spreadClock);
  const rainMm = rainInInterval(fc, fromMs, fromMs + params.withinHours * HOUR_MS);
  const within = `${formatNumber(params.withinHours)} h`;
  if (rainMm >= params.rainMm) {
    const summary = `${inchesOfRain(rainMm)} of rain forecast in the ${within} after spreading`;
    return { qualifies: true, washout: false, rainMm, summary, decision: { rule: 'fertilize-before-rain', ok: true, reason: `${summary}, enough to carry it in` } };
  }
  const summary = rainMm > 0 ? `only ${inchesOfRain(rainMm)} of rain forecast in the ${within} after spreading` : `no rain forecast in the ${within} after spreading`;
  return {
    qualifies: false,
    washout: false,
    rainMm,
    summary,
    decision: { rule: 'fertilize-before-rain', ok: false, reason: `${summary} (${inchesPrecise(params.rainMm)} or more carries it in)` },
  };
}
