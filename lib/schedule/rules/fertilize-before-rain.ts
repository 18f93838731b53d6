// Fertilize before rain: granular fertilizer on the surface needs rain to move it to the roots, and a
// downpour on it washes it off toward water. So: ahead of a soaking rain, never ahead of a washout.
// Nitrogen in urea form needs more: about half an inch in one rain carries it in before it is lost as ammonia.
// When: worked into the seedbed before the final pass on a prepared seedbed; after the stand is up for
// spray-and-seed and frost seeding.
import { shortDay } from '../local-dates';
import { localInstantMs, rainInInterval, type ForecastIndex } from '../forecast-days';
import { formatNumber, inchesOfRain, inchesPrecise } from '../format';
import type { RuleDecision } from '../types';
import { washoutNear } from './seed-before-rain';

const HOUR_MS = 3_600_000;

export interface FertilizeBeforeRainParams {
  rainMm: number;
  /** A fertilizer carrying nitrogen (urea in most blends): the rain it needs in one event. */
  nitrogenRainMm: number;
  withinHours: number;
  washoutDayMm: number;
  spreadClock: string;
  /** How far after the earliest day Sowcast looks for a rain to spread ahead of. */
  searchDays: number;
}

export const FERTILIZE_BEFORE_RAIN_DEFAULTS: FertilizeBeforeRainParams = {
  rainMm: 6.35, // 0.25 in
  nitrogenRainMm: 12.7, // 0.5 in
  withinHours: 48,
  washoutDayMm: 50.8, // 2 in
  spreadClock: '12:00',
  searchDays: 7,
};

export const FERTILIZE_BEFORE_RAIN_SOURCES: Record<keyof FertilizeBeforeRainParams, string> = {
  rainMm: 'common practice, no source: about a quarter inch of rain dissolves surface-applied granules and carries them in',
  nitrogenRainMm:
    'NDSU Extension, "Understanding Urea": if surface applied, you need one half inch of rain to wash the urea into the soil; Montana State University (Engel, urea volatilization studies, "what we learned"): at least 0.5 in of rain in a single event is needed — light scattered rain may increase rather than prevent losses',
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

/** `nitrogen`: the product carries nitrogen, so the rain must be the urea amount in one event. */
export function fertilizeBeforeRain(fc: ForecastIndex, date: string, params: FertilizeBeforeRainParams, nitrogen = false): FertilizeVerdict {
  const washout = washoutNear(fc, date, params.washoutDayMm, params.withinHours);
  if (washout) {
    const summary = `${inchesOfRain(washout.rainMm)} of rain forecast ${shortDay(washout.date)} would wash fertilizer off`;
    return { qualifies: false, washout: true, rainMm: washout.rainMm, summary, decision: { rule: 'fertilize-before-rain', ok: false, reason: `avoid: ${summary}` } };
  }
  const fromMs = localInstantMs(fc, date, params.spreadClock);
  const toMs = fromMs + params.withinHours * HOUR_MS;
  const within = `${formatNumber(params.withinHours)} h`;
  const needMm = nitrogen ? params.nitrogenRainMm : params.rainMm;
  // Urea: the biggest single rain event counts, not scattered showers added up.
  const eventMm = Math.max(0, ...fc.rainEvents.filter((e) => e.startMs >= fromMs && e.startMs <= toMs).map((e) => e.totalMm));
  const rainMm = nitrogen ? eventMm : rainInInterval(fc, fromMs, toMs);
  const inOne = nitrogen ? ' in one rain' : '';
  if (rainMm >= needMm) {
    const summary = `${inchesOfRain(rainMm)} of rain forecast${inOne} in the ${within} after spreading`;
    const enough = nitrogen ? 'enough to carry the nitrogen in before it is lost to the air' : 'enough to carry it in';
    return { qualifies: true, washout: false, rainMm, summary, decision: { rule: 'fertilize-before-rain', ok: true, reason: `${summary}, ${enough}` } };
  }
  const summary = rainMm > 0 ? `only ${inchesOfRain(rainMm)} of rain forecast${inOne} in the ${within} after spreading` : `no rain forecast in the ${within} after spreading`;
  const needs = nitrogen
    ? `${inchesPrecise(needMm)} or more in one rain carries urea nitrogen in; spread it just before a good rain`
    : `${inchesPrecise(needMm)} or more carries it in`;
  return {
    qualifies: false,
    washout: false,
    rainMm,
    summary,
    decision: { rule: 'fertilize-before-rain', ok: false, reason: `${summary} (${needs})` },
  };
}
