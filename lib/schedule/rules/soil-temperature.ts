// Soil temperature: seed never goes into a seed zone colder than the blend's minimum — the most demanding
// species sets it, or that species fails — and days in the blend's optimum band are preferred.
import { getSpecies, type BlendProfile } from '@/lib/agronomy/species';
import { SOIL_ESTIMATE_METHOD } from '@/lib/agronomy/soil-temperature';
import { cToF } from '@/lib/agronomy/units';
import type { ForecastIndex } from '../forecast-days';
import { shortDay } from '../local-dates';
import type { RuleDecision } from '../types';

export interface SoilTemperatureParams {
  /** Extra °F above the blend's minimum before a day counts as warm enough. */
  marginF: number;
}

export const SOIL_TEMPERATURE_DEFAULTS: SoilTemperatureParams = { marginF: 0 };

export const SOIL_TEMPERATURE_SOURCES: Record<keyof SoilTemperatureParams, string> & { minimum: string; estimate: string } = {
  marginF: "Sowcast's default: none — the species minimums in the catalog already are the published lower limits",
  minimum: 'each species carries its own sourced minimum and optimum (lib/agronomy/species.ts); the blend takes the highest minimum',
  estimate: `when the forecast gives no soil temperature: ${SOIL_ESTIMATE_METHOD}`,
};

export type SoilLevel = 'optimum' | 'warm-enough' | 'cold' | 'unknown';

export interface SoilVerdict {
  level: SoilLevel;
  soilTempF: number | null;
  decision: RuleDecision;
  /** Short form for a move's reason: 'soil 58 °F'. */
  summary: string;
}

export function soilTemperatureOn(
  fc: ForecastIndex | null,
  date: string,
  profile: BlendProfile,
  params: SoilTemperatureParams,
): SoilVerdict {
  const day = fc?.byDate.get(date);
  const minF = profile.minSoilTempF + params.marginF;
  const [optLow, optHigh] = profile.optimumSoilTempF;
  const limiting = getSpecies(profile.limitingSpeciesId).name.toLowerCase();
  if (!day || day.soilTempC === null) {
    return {
      level: 'unknown',
      soilTempF: null,
      summary: 'soil temperature not yet forecast',
      decision: {
        rule: 'soil-temperature',
        ok: true,
        reason: `soil temperature on ${shortDay(date)} is not forecast yet; the blend needs ${minF} °F or more (${limiting})`,
      },
    };
  }
  const soilTempF = cToF(day.soilTempC);
  const shown = Math.round(soilTempF);
  const how = day.soilSource === 'forecast' ? 'forecast' : 'estimated from air temperatures';
  const summary = `soil ${shown} °F`;
  if (soilTempF < minF) {
    return {
      level: 'cold',
      soilTempF,
      summary: `${summary}, below the ${minF} °F minimum for ${limiting}`,
      decision: {
        rule: 'soil-temperature',
        ok: false,
        reason: `soil ${shown} °F (${how}), below the ${minF} °F minimum for ${limiting}`,
      },
    };
  }
  const inBand = soilTempF >= optLow && soilTempF <= optHigh;
  return {
    level: inBand ? 'optimum' : 'warm-enough',
    soilTempF,
    summary,
    decision: {
      rule: 'soil-temperature',
      ok: true,
      reason: inBand
        ? `soil ${shown} °F (${how}), in the blend's ${optLow}–${optHigh} °F optimum`
        : `soil ${shown} °F (${how}), at or above the ${minF} °F minimum${soilTempF < optLow ? `, under the ${optLow}–${optHigh} °F optimum` : `, above the ${optLow}–${optHigh} °F optimum`}`,
    },
  };
}
