// Germination check: the day to walk the plot and look for seedlings. Seed starts once the seed zone is wet (the
// FAO-56 seed-zone balance, lib/agronomy/water-balance.ts, wetted by a soaking rain); from then each day brings every
// species of the blend 1 / daysToEmergence(soil °F) of the way up (lib/agronomy/emergence.ts), and the check goes on
// the day the slowest species is up. Past the forecast the soil is taken to stay as the forecast's last week.
import { daysToEmergence, emergenceDay, EMERGENCE_SOURCES } from '@/lib/agronomy/emergence';
import { getSpecies, type BlendProfile } from '@/lib/agronomy/species';
import { cToF } from '@/lib/agronomy/units';
import { firstDrySpell, type SoilTexture } from '@/lib/agronomy/water-balance';
import type { ForecastIndex } from '../forecast-days';
import { formatNumber } from '../format';
import { addDays, dayPair, maxDate, shortDay } from '../local-dates';
import { seedZoneOutlook } from '../seed-zone';
import type { RuleDecision } from '../types';
import type { SeedBeforeRainParams } from './seed-before-rain';

export interface GerminationCheckParams {
  /** Look after this many days even if the seedlings are not expected yet: a dormant or failed seeding shows by then. */
  maxDaysAfterMoisture: number;
  /** Days after expected emergence before the check, so seedlings are big enough to count. */
  checkDelayDays: number;
  /** Days in a row with a dry seed zone that count as a dry spell. */
  drySpellDays: number;
}

export const GERMINATION_CHECK_DEFAULTS: GerminationCheckParams = { maxDaysAfterMoisture: 45, checkDelayDays: 0, drySpellDays: 3 };

/** Days at the end of the forecast whose mean soil temperature is carried past it. */
const OUTLOOK_DAYS = 7;

export const GERMINATION_CHECK_SOURCES: Record<keyof GerminationCheckParams, string> & { model: string; outlook: string; frostSeeding: string } = {
  maxDaysAfterMoisture: "Sowcast's cap, no source: by six weeks a seeding has come up, is dormant in cold soil, or has failed",
  checkDelayDays: "Sowcast's default: the days to emergence are medians, so the check goes on the day itself",
  drySpellDays:
    "Sowcast's default, no source: three days in a row with the seed zone dry — holding less than a soaking rain's water above air-dry " +
    '(FAO-56 two-stage evaporation, lib/agronomy/water-balance.ts) — after it was first wet',
  model: `${EMERGENCE_SOURCES.model}; each species calibrated in lib/agronomy/emergence.ts; the blend is up when its slowest species is`,
  outlook:
    `Sowcast's choice, no source: past the forecast the soil is taken to stay at the mean of the forecast's last ${OUTLOOK_DAYS} days ` +
    '(persistence; no climate normals are stored); with no forecast for the weeks after seeding, or for frost-seeded seed waiting ' +
    'for spring, at the middle of the blend’s optimum band',
  frostSeeding:
    'common practice, no source: frost-seeded clover lies dormant until the soil warms in spring and comes up around the average last frost',
};

export interface GerminationInput {
  seedDate: string;
  fc: ForecastIndex | null;
  profile: BlendProfile;
  params: GerminationCheckParams;
  soak: SeedBeforeRainParams;
  frostSeeding: boolean;
  lastSpringFrost: string | null;
  texture: SoilTexture;
  latitudeDeg: number;
}

export interface GerminationResult {
  date: string;
  moistDate: string;
  decision: RuleDecision;
  warnings: string[];
  /** The blend's slowest species to come up, which sets the date. */
  emergenceSpeciesId: string;
}

/** Soil °F for each day after the seed zone is wet: the forecast's, then the outlook's. */
function soilSeries(g: GerminationInput, moistDate: string, days: number) {
  const fc = g.fc;
  const known = (fc?.days ?? []).filter((d) => d.soilTempC !== null);
  const recent = known.slice(-OUTLOOK_DAYS);
  const [optLow, optHigh] = g.profile.optimumSoilTempF;
  // Persistence only reaches a little past the forecast; a seeding months out is counted at the blend's optimum, and so
  // is frost-seeded seed, which waits in cold ground for spring warmth rather than for winter soil to hold.
  const persists = !g.frostSeeding && recent.length > 0 && fc?.lastDate && moistDate <= addDays(fc.lastDate, 1);
  const outlookF = persists ? recent.reduce((sum, d) => sum + cToF(d.soilTempC as number), 0) / recent.length : (optLow + optHigh) / 2;
  const outlookWords = persists
    ? `${formatNumber(outlookF, 0)} °F held past the forecast (the mean of its last ${recent.length} days)`
    : `${formatNumber(outlookF, 0)} °F, the middle of the blend's optimum (no forecast for those days)`;
  const temps: number[] = [];
  const forecast: boolean[] = [];
  for (let i = 1; i <= days; i++) {
    const soilC = fc?.byDate.get(addDays(moistDate, i))?.soilTempC ?? null;
    temps.push(soilC === null ? outlookF : cToF(soilC));
    forecast.push(soilC !== null);
  }
  return { temps, forecast, outlookF, outlookWords };
}

export function germinationCheck(g: GerminationInput): GerminationResult {
  const { fc, profile, params } = g;
  const warnings: string[] = [];
  let moistDate: string;
  let moistWords: string;
  const inForecast = fc && fc.firstDate && fc.lastDate && g.seedDate >= fc.firstDate && g.seedDate <= fc.lastDate;
  // The seed zone from seeding through the forecast (air-dry at the forecast's start): where it first holds a soaking
  // rain's water.
  const water = inForecast ? seedZoneOutlook(fc, g.seedDate, fc.lastDate as string, g.latitudeDeg, g.texture, g.soak.soakingRainMm) : null;
  if (inForecast) {
    if (water?.firstMoistDate) {
      moistDate = water.firstMoistDate;
      const stillWet = moistDate === g.seedDate && (fc.rainByDate.get(moistDate) ?? 0) < g.soak.soakingRainMm;
      moistWords = stillWet ? `seeding (${shortDay(moistDate)}) into a seed zone still wet from earlier rain` : `the first soaking rain (${shortDay(moistDate)})`;
    } else {
      moistDate = addDays(fc.lastDate as string, 1);
      moistWords = `a soaking rain, none in the forecast through ${shortDay(fc.lastDate as string)}`;
      warnings.push(`No soaking rain is forecast after seeding; seed on dry ground waits for rain, so the check counts from ${shortDay(moistDate)}.`);
    }
  } else if (fc && fc.firstDate && g.seedDate < fc.firstDate) {
    moistDate = g.seedDate;
    moistWords = 'the seeding date (rain since then is not in the forecast data)';
  } else {
    moistDate = g.seedDate;
    moistWords = 'the seeding date (seeding is timed ahead of rain)';
  }

  const series = soilSeries(g, moistDate, params.maxDaysAfterMoisture);
  let slowest = { speciesId: profile.parts[0].speciesId, days: 0 };
  let capped = false;
  for (const { speciesId } of profile.parts) {
    const days = emergenceDay(speciesId, series.temps);
    if (days === null) {
      if (!capped) slowest = { speciesId, days: params.maxDaysAfterMoisture };
      capped = true;
    } else if (!capped && days > slowest.days) slowest = { speciesId, days };
  }
  const name = getSpecies(slowest.speciesId).name.toLowerCase();
  let emergence = addDays(moistDate, slowest.days);
  let date = addDays(emergence, params.checkDelayDays);
  const fromForecast = series.temps.slice(0, slowest.days).filter((_, i) => series.forecast[i]);
  const range = (values: number[]) => {
    const [lo, hi] = [Math.min(...values), Math.max(...values)].map((v) => formatNumber(v, 0));
    return lo === hi ? `${lo} °F` : `${lo}–${hi} °F`;
  };
  const soilWords =
    fromForecast.length === 0
      ? `soil ${series.outlookWords}`
      : fromForecast.length === slowest.days
        ? `forecast soil ${range(fromForecast)}`
        : `forecast soil ${range(fromForecast)}, then ${series.outlookWords}`;
  const steady = daysToEmergence(slowest.speciesId, series.outlookF);
  const steadyWords = Number.isFinite(steady) ? `; ${name} takes about ${formatNumber(steady, 0)} days at a steady ${formatNumber(series.outlookF, 0)} °F` : '';
  const blendWords = profile.parts.length > 1 ? `, ${name} the slowest of the blend` : '';
  let reason = `seedlings expected ${slowest.days} days after ${moistWords}${blendWords}: ${soilWords}${steadyWords}`;
  if (capped) {
    reason = `soil too cool for ${name} to come up within ${params.maxDaysAfterMoisture} days of ${moistWords}: ${soilWords}; look anyway`;
    warnings.push(`Cool soil may hold the seed back; check on ${shortDay(date)} and again as it warms.`);
  }
  if (g.frostSeeding && g.lastSpringFrost && g.lastSpringFrost > date) {
    date = maxDate(date, g.lastSpringFrost);
    emergence = date;
    reason = `frost-seeded seed comes up as the soil warms in spring, around the average last frost (${shortDay(g.lastSpringFrost)})`;
  }

  if (water) {
    const beforeEmergence = { ...water, days: water.days.filter((d) => d.date <= emergence) };
    const spell = firstDrySpell(beforeEmergence, params.drySpellDays);
    if (spell && spell.startDate < emergence) {
      const [dry, up] = dayPair(spell.startDate, emergence);
      warnings.push(
        `The seed zone dries out from about ${dry} (${params.drySpellDays} days or more without a soaking rain's water left) before seedlings are up (about ${up}); sprouted seed can die in it.`,
      );
    }
  }

  return {
    date,
    moistDate,
    emergenceSpeciesId: slowest.speciesId,
    warnings,
    decision: { rule: 'germination-check', ok: !capped, reason },
  };
}
