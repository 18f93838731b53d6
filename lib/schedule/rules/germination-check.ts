// Germination check: the day to walk the plot and look for seedlings. Seed starts once the seed zone has had
// its first soaking rain; from then it needs a roughly constant amount of warmth — soil degree days above
// the blend's minimum — so cool soil pushes the check later and warm soil brings it closer.
import { et0Hargreaves } from '@/lib/agronomy/et0';
import { growingDegreeDays } from '@/lib/agronomy/gdd';
import type { BlendProfile } from '@/lib/agronomy/species';
import { cToF } from '@/lib/agronomy/units';
import { seedZoneMoisture, type SoilTexture } from '@/lib/agronomy/water-balance';
import { hourIndexAfter, localInstantMs, type ForecastIndex } from '../forecast-days';
import { formatNumber } from '../format';
import { addDays, dayOfYear, dayPair, maxDate, shortDay } from '../local-dates';
import type { RuleDecision } from '../types';
import type { SeedBeforeRainParams } from './seed-before-rain';

export interface GerminationCheckParams {
  /** Look after this many days even if the degree days are not reached: a dormant or failed seeding shows by then. */
  maxDaysAfterMoisture: number;
  /** Days after expected emergence before the check, so seedlings are big enough to count. */
  checkDelayDays: number;
  /** Days in a row with a dry seed-zone surface that count as a dry spell. */
  drySpellDays: number;
}

export const GERMINATION_CHECK_DEFAULTS: GerminationCheckParams = { maxDaysAfterMoisture: 45, checkDelayDays: 0, drySpellDays: 3 };

export const GERMINATION_CHECK_SOURCES: Record<keyof GerminationCheckParams, string> & { model: string; frostSeeding: string } = {
  maxDaysAfterMoisture: "Sowcast's cap, no source: by six weeks a seeding has come up, is dormant in cold soil, or has failed",
  checkDelayDays: "Sowcast's default: the blend's days to emergence already take its slowest species' upper end",
  drySpellDays:
    "Sowcast's default, no source: three days in a row with the seed-zone surface past its readily evaporable water (FAO-56 stage 2, lib/agronomy/water-balance.ts)",
  model:
    'thermal time for seedling emergence: seedlings emerge when soil degree days above a base temperature reach a constant sum ' +
    '(Angus, Cunningham, Moncur & Mackenzie 1981, Field Crops Research 3:365–378 — from memory). Sowcast takes the base as the blend’s ' +
    'germination minimum and the sum as days to emergence at the optimum × (optimum midpoint − base), with the optimum band’s top as ' +
    'an upper cap (the modified degree-day method); days past the forecast count at the optimum. This calibration is Sowcast’s own.',
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
  requiredDegreeDays: number;
}

/** The first soaking rain on or after seeding: the date it has delivered the soaking amount. */
function soakingDate(fc: ForecastIndex, seedDate: string, soak: SeedBeforeRainParams): { date: string; startDate: string } | null {
  const fromMs = localInstantMs(fc, seedDate, '00:00');
  const event = fc.rainEvents.find((e) => e.qualifies && e.startMs >= fromMs);
  if (!event) return null;
  let sum = 0;
  for (let i = hourIndexAfter(fc.hours, event.startMs); i < fc.hours.length; i++) {
    sum += fc.hours[i].rainMm;
    if (sum >= soak.soakingRainMm) return { date: fc.hours[i].rainDate, startDate: event.startDate };
  }
  return { date: event.startDate, startDate: event.startDate };
}

export function germinationCheck(g: GerminationInput): GerminationResult {
  const { fc, profile, params } = g;
  const warnings: string[] = [];
  let moistDate: string;
  let waterStart: string | null = null;
  let moistWords: string;
  if (fc && fc.firstDate && fc.lastDate && g.seedDate >= fc.firstDate && g.seedDate <= fc.lastDate) {
    const soaking = soakingDate(fc, g.seedDate, g.soak);
    if (soaking) {
      moistDate = soaking.date;
      waterStart = soaking.startDate;
      moistWords = `the first soaking rain (${shortDay(moistDate)})`;
    } else {
      moistDate = addDays(fc.lastDate, 1);
      moistWords = `a soaking rain, none in the forecast through ${shortDay(fc.lastDate)}`;
      warnings.push(`No soaking rain is forecast after seeding; seed on dry ground waits for rain, so the check counts from ${shortDay(moistDate)}.`);
    }
  } else if (fc && fc.firstDate && g.seedDate < fc.firstDate) {
    moistDate = g.seedDate;
    moistWords = 'the seeding date (rain since then is not in the forecast data)';
  } else {
    moistDate = g.seedDate;
    moistWords = 'the seeding date (seeding is timed ahead of rain)';
  }

  const base = profile.minSoilTempF;
  const [optLow, optHigh] = profile.optimumSoilTempF;
  const reference = Math.max((optLow + optHigh) / 2, base + 1);
  const referenceRate = reference - base;
  const daysAtOptimum = profile.daysToEmergence[1];
  const required = daysAtOptimum * referenceRate;
  const capOpts = optHigh > base ? { base, upperCap: optHigh } : { base };
  let sum = 0;
  let days = 0;
  let forecastDays = 0;
  // Round-trip °C → °F leaves float noise (65 °F comes back as 64.999…); it must not cost a day.
  const reached = () => sum >= required - 1e-9;
  while (!reached() && days < params.maxDaysAfterMoisture) {
    days += 1;
    const d = addDays(moistDate, days);
    const soilC = fc?.byDate.get(d)?.soilTempC ?? null;
    if (soilC !== null) {
      const f = cToF(soilC);
      sum += growingDegreeDays(f, f, capOpts);
      forecastDays += 1;
    } else sum += referenceRate;
  }
  const capped = !reached();
  let emergence = addDays(moistDate, days);
  let date = addDays(emergence, params.checkDelayDays);
  const pace =
    forecastDays === 0
      ? `${days} days at the blend's optimum`
      : days === daysAtOptimum
        ? `${days} days, as at the blend's optimum`
        : `${days} days at the forecast soil warmth (${daysAtOptimum} at the optimum)`;
  let reason = `seedlings expected after ${formatNumber(required, 0)} soil degree days above ${base} °F from ${moistWords}: ${pace}`;
  if (capped) {
    reason = `soil too cool to reach ${formatNumber(required, 0)} degree days above ${base} °F within ${params.maxDaysAfterMoisture} days of ${moistWords}; look anyway`;
    warnings.push(`Cool soil may hold the seed back; check on ${shortDay(date)} and again as it warms.`);
  }
  if (g.frostSeeding && g.lastSpringFrost && g.lastSpringFrost > date) {
    date = maxDate(date, g.lastSpringFrost);
    emergence = date;
    reason = `frost-seeded seed comes up as the soil warms in spring, around the average last frost (${shortDay(g.lastSpringFrost)})`;
  }

  if (fc && waterStart) {
    const waterDays = [];
    for (let d = waterStart; d <= emergence && fc.byDate.has(d) && (fc.lastDate === null || d <= fc.lastDate); d = addDays(d, 1)) {
      const day = fc.byDate.get(d)!;
      waterDays.push({
        date: d,
        rainMm: fc.rainByDate.get(d) ?? 0,
        et0Mm: et0Hargreaves({ tMaxC: day.airMaxC, tMinC: day.airMinC, latitudeDeg: g.latitudeDeg, dayOfYear: dayOfYear(d) }),
      });
    }
    if (waterDays.length) {
      const water = seedZoneMoisture(waterDays, { texture: g.texture });
      const firstMoist = water.days.findIndex((d) => d.moist);
      let spellStart = -1;
      for (let i = Math.max(0, firstMoist); firstMoist >= 0 && i + params.drySpellDays <= water.days.length; i++) {
        if (water.days.slice(i, i + params.drySpellDays).every((d) => !d.moist)) {
          spellStart = i;
          break;
        }
      }
      if (spellStart >= 0 && water.days[spellStart].date < emergence) {
        const [dry, up] = dayPair(water.days[spellStart].date, emergence);
        warnings.push(`A dry spell from about ${dry} may dry the seed zone before seedlings are up (about ${up}); sprouted seed can die in it.`);
      }
    }
  }

  return {
    date,
    moistDate,
    requiredDegreeDays: required,
    warnings,
    decision: { rule: 'germination-check', ok: !capped, reason },
  };
}
