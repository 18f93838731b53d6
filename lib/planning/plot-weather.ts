// The plot's weather chart, read the way the engine reads the forecast: the same local days, rain totals,
// soil temperatures, spray-window rule and seed-zone water balance the plan was placed with — so the chart
// shows why seeding sits where it does, never a second opinion. Pure: no database, no clock (`now` is passed).
import { blendProfile, getSpecies, type BlendProfile } from '@/lib/agronomy/species';
import { cToF, fToC, mmToIn } from '@/lib/agronomy/units';
import type { SoilTexture } from '@/lib/agronomy/water-balance';
import { sunTimes } from '@/lib/schedule/daylight';
import { indexForecast, type ForecastIndex } from '@/lib/schedule/forecast-days';
import { formatNumber, inchesPrecise } from '@/lib/schedule/format';
import { daysBetween, dayWithMonth, localDateOf, shortDay } from '@/lib/schedule/local-dates';
import { DEFAULT_SCHEDULE_PARAMETERS, resolveParameters, type ScheduleParameters } from '@/lib/schedule/parameters';
import { soilTemperatureOn, type SoilLevel } from '@/lib/schedule/rules/soil-temperature';
import { seedZoneOutlook } from '@/lib/schedule/seed-zone';
import { evaluateSprayHour, sprayDay, sprayLimits, type SprayContext, type SprayDay } from '@/lib/schedule/rules/spray-window';
import type { Forecast, PlanStep, PlantingInput, StepStatus } from '@/lib/schedule/types';

/**
 * A forecast counts as stale once it is 12 hours old even if no refresh failed — the property's forecast panel
 * (app/api/properties/[propertyId]/weather) uses the same threshold. Sowcast's own choice, no source.
 */
export const FORECAST_STALE_AFTER_HOURS = 12;

export interface PlotWeatherDay {
  date: string;
  /** 'Tue 8', the axis label. */
  label: string;
  isToday: boolean;
  /** Forecast hours stamped in the local day. */
  hours: number;
  rainMm: number;
  rainIn: number;
  /** The highest hourly chance of rain of the day; null when the provider gives none. */
  rainProbabilityMaxPct: number | null;
  airMinC: number;
  airMaxC: number;
  airMinF: number;
  airMaxF: number;
  soilTempC: number | null;
  soilTempF: number | null;
  soilSource: 'forecast' | 'estimated' | null;
  /** The soil-temperature rule's verdict against the blend; null without a planting. */
  soilLevel: SoilLevel | null;
  spray: {
    /** Hours the spray-window rule passes (good or marginal). */
    suitableHours: number;
    goodHours: number;
    level: SprayDay['level'];
    window: { start: string; end: string } | null;
    reason: string;
  };
  /** The seed-zone water balance on this day, from seeding on; null before seeding or without a planting. */
  moisture: { state: 'moist' | 'dry'; depletionMm: number } | null;
}

export interface PlotWeatherSeeding {
  key: 'seed' | 'frost-seed';
  /** The real date when done, the planned one otherwise. */
  date: string;
  status: StepStatus;
  /** The engine's own reason for the date. */
  reason: string;
  inForecast: boolean;
}

export interface PlotWeather {
  timeZone: string;
  today: string;
  /** The last local day the forecast covers in full. */
  forecastThrough: string | null;
  days: PlotWeatherDay[];
  blend: {
    minSoilTempF: number;
    minSoilTempC: number;
    optimumSoilTempF: [number, number];
    limitingSpecies: string;
  } | null;
  seeding: PlotWeatherSeeding | null;
  moisture: {
    fromDate: string;
    throughDate: string;
    days: number;
    /** Days moist in all: the layer holds at least a soaking rain's water above air-dry (water-balance.ts). */
    moistDays: number;
    /** The first dry day after the seed zone was first wet. */
    firstDryDate: string | null;
    /** The first moist day, and how many days are moist in all (the same count as moistDays). */
    firstMoistDate: string | null;
    moistDaysInAll: number;
    /** Seeding came before the forecast's first day, so the balance starts there instead. */
    startsAtForecast: boolean;
    texture: SoilTexture;
    readilyEvaporableMm: number;
    totalEvaporableMm: number;
  } | null;
  spray: {
    productName: string | null;
    rainfastHours: number;
    windMinMph: number;
    windMaxMph: number;
    tempMinF: number;
    tempMaxF: number;
    /** The planting's herbicide label gave at least one of the limits. */
    fromLabel: boolean;
  };
  summary: string[];
}

export interface PlotWeatherPlanting {
  input: PlantingInput;
  steps: PlanStep[];
}

const SEED_KEYS = ['seed', 'frost-seed'] as const;

/** The planting's seeding step (frost seeding has its own key); null when the plan has none. */
export function seedingStep(steps: PlanStep[]): PlanStep | null {
  for (const key of SEED_KEYS) {
    const step = steps.find((s) => s.key === key);
    if (step) return step;
  }
  return null;
}

/** The date seeding happened or is planned for. A skipped seeding has none. */
export function seedingDate(step: PlanStep | null): string | null {
  if (!step || step.status === 'skipped') return null;
  return step.status === 'done' ? (step.doneOn ?? step.date) : step.date;
}

/**
 * Which of a plot's plantings the chart is about: the active one whose seeding is nearest today (a seeding
 * just done and one coming up both matter more than one months away); on a tie, the coming one.
 */
export function currentPlanting<T extends { status: string; targetSeedDate: string; steps: PlanStep[] }>(plantings: T[], today: string): T | null {
  let best: { planting: T; distance: number; date: string } | null = null;
  for (const planting of plantings) {
    if (planting.status !== 'active') continue;
    const date = seedingDate(seedingStep(planting.steps)) ?? planting.targetSeedDate;
    const distance = Math.abs(daysBetween(today, date));
    if (!best || distance < best.distance || (distance === best.distance && date > best.date)) best = { planting, distance, date };
  }
  return best?.planting ?? null;
}

/** Fresh, stale because refreshes fail, or stale because it is old — the earlier of the two names the time. */
export function forecastFreshness(o: { fetchedAt: string; now: Date; failingSince: string | null }) {
  const oldSinceMs = Date.parse(o.fetchedAt) + FORECAST_STALE_AFTER_HOURS * 3_600_000;
  const tooOld = o.now.getTime() > oldSinceMs;
  const since = [...(o.failingSince ? [Date.parse(o.failingSince)] : []), ...(tooOld ? [oldSinceMs] : [])].sort((a, b) => a - b)[0];
  return {
    stale: o.failingSince !== null || tooOld,
    // Failing refreshes say more than age alone, so they are named whenever they apply.
    staleReason: o.failingSince ? ('failing' as const) : tooOld ? ('old' as const) : null,
    staleSince: since === undefined ? null : new Date(since).toISOString(),
  };
}

export function plotWeather(o: {
  forecast: Forecast;
  /** The property: its IANA zone and where it lies (daylight for the spray window, ET₀). */
  place: { timeZone: string; latitudeDeg: number; longitudeDeg: number | null };
  /** The plot's current planting, when it has one: its blend, herbicide label and plan. */
  planting?: PlotWeatherPlanting | null;
  now: Date;
}): PlotWeather {
  const { place, now } = o;
  const input = o.planting?.input ?? null;
  const params: ScheduleParameters = input ? resolveParameters(input.parameters, input.killWaitDays) : DEFAULT_SCHEDULE_PARAMETERS;
  const soak = params.seedBeforeRain;
  const fc = indexForecast(o.forecast, place.timeZone, {
    measurableRainMm: soak.measurableRainMm,
    eventGapHours: soak.eventGapHours,
    soakingRainMm: soak.soakingRainMm,
    soakingWindowHours: soak.soakingWindowHours,
  });
  const today = localDateOf(now, place.timeZone);
  const profile: BlendProfile | null = input ? blendProfile(input.blend) : null;
  const limitingSpecies = profile ? getSpecies(profile.limitingSpeciesId).name : null;

  const product = input?.herbicide ?? null;
  const sprayCtx: SprayContext = {
    fc,
    latitudeDeg: place.latitudeDeg,
    longitudeDeg: place.longitudeDeg,
    product,
    params: params.sprayWindow,
    notBeforeMs: now.getTime(),
    cache: new Map<string, SprayDay>(),
  };
  const limits = sprayLimits(product, params.sprayWindow);

  const seedStep = o.planting ? seedingStep(o.planting.steps) : null;
  const seedDate = seedingDate(seedStep);
  const texture: SoilTexture = input?.soilTexture ?? 'loam';

  let moisture: PlotWeather['moisture'] = null;
  const moistureByDate = new Map<string, { state: 'moist' | 'dry'; depletionMm: number }>();
  if (seedDate && fc.firstDate && fc.lastDate && seedDate <= fc.lastDate) {
    const startsAtForecast = seedDate < fc.firstDate;
    const from = startsAtForecast ? fc.firstDate : seedDate;
    const water = seedZoneOutlook(fc, from, fc.lastDate, place.latitudeDeg, texture, soak.soakingRainMm);
    if (water) {
      for (const d of water.days) moistureByDate.set(d.date, { state: d.moist ? 'moist' : 'dry', depletionMm: d.depletionMm });
      moisture = {
        fromDate: from,
        throughDate: water.days.at(-1)!.date,
        days: water.days.length,
        moistDays: water.moistDays,
        firstDryDate: water.firstDryDate,
        firstMoistDate: water.firstMoistDate,
        moistDaysInAll: water.moistDays,
        startsAtForecast,
        texture,
        readilyEvaporableMm: water.readilyEvaporableMm,
        totalEvaporableMm: water.totalEvaporableMm,
      };
    }
  }

  const days: PlotWeatherDay[] = [];
  for (const day of fc.days) {
    // Past days and the partial day at the end of a fetch are not shown: neither says what is coming.
    if (day.date < today || fc.lastDate === null || day.date > fc.lastDate) continue;
    const dayHours = fc.hours.slice(day.firstHour, day.lastHour + 1);
    const chances = dayHours.map((h) => h.rainProbabilityPct).filter((p): p is number => typeof p === 'number');
    const sun = sunTimes(day.date, place.latitudeDeg, place.longitudeDeg, place.timeZone);
    let suitableHours = 0;
    let goodHours = 0;
    for (let i = day.firstHour; i <= day.lastHour; i++) {
      const level = evaluateSprayHour(sprayCtx, i, sun).level;
      if (level !== 'bad') suitableHours += 1;
      if (level === 'good') goodHours += 1;
    }
    const window = sprayDay(sprayCtx, day.date);
    days.push({
      date: day.date,
      label: shortDay(day.date),
      isToday: day.date === today,
      hours: dayHours.length,
      rainMm: day.rainMm,
      rainIn: mmToIn(day.rainMm),
      rainProbabilityMaxPct: chances.length ? Math.max(...chances) : null,
      airMinC: day.airMinC,
      airMaxC: day.airMaxC,
      airMinF: cToF(day.airMinC),
      airMaxF: cToF(day.airMaxC),
      soilTempC: day.soilTempC,
      soilTempF: day.soilTempC === null ? null : cToF(day.soilTempC),
      soilSource: day.soilSource,
      soilLevel: profile ? soilTemperatureOn(fc, day.date, profile, params.soilTemperature).level : null,
      spray: { suitableHours, goodHours, level: window.level, window: window.hours, reason: window.decision.reason },
      moisture: moistureByDate.get(day.date) ?? null,
    });
  }

  const minSoilTempF = profile ? profile.minSoilTempF + params.soilTemperature.marginF : null;
  const blend =
    profile && minSoilTempF !== null
      ? { minSoilTempF, minSoilTempC: fToC(minSoilTempF), optimumSoilTempF: profile.optimumSoilTempF, limitingSpecies: limitingSpecies! }
      : null;
  const seeding: PlotWeatherSeeding | null =
    seedStep && seedDate
      ? {
          key: seedStep.key as PlotWeatherSeeding['key'],
          date: seedDate,
          status: seedStep.status,
          reason: seedStep.reason,
          inForecast: days.some((d) => d.date === seedDate),
        }
      : null;

  return {
    timeZone: place.timeZone,
    today,
    forecastThrough: fc.lastDate,
    days,
    blend,
    seeding,
    moisture,
    spray: {
      productName: product?.productName ?? null,
      rainfastHours: limits.rainfastHours,
      windMinMph: limits.windMinMph,
      windMaxMph: limits.windMaxMph,
      tempMinF: limits.tempMinF,
      tempMaxF: limits.tempMaxF,
      fromLabel: product != null && (product.rainfastHours != null || product.maxWindMph != null || product.minTempF != null || product.maxTempF != null),
    },
    summary: summarize({ days, blend, seeding, moisture, measurableRainMm: params.sprayWindow.measurableRainMm, minWindowHours: params.sprayWindow.minWindowHours }),
  };
}

/** The chart in sentences, for the text under it and for screen readers. */
function summarize(o: {
  days: PlotWeatherDay[];
  blend: PlotWeather['blend'];
  seeding: PlotWeatherSeeding | null;
  moisture: PlotWeather['moisture'];
  measurableRainMm: number;
  minWindowHours: number;
}): string[] {
  const { days, blend, seeding, moisture } = o;
  if (days.length === 0) return ['The stored forecast covers no days from today on.'];
  const last = days[days.length - 1].date;
  const out: string[] = [];

  const withSoil = days.filter((d) => d.soilTempF !== null);
  if (blend && withSoil.length) {
    const min = `${formatNumber(blend.minSoilTempF)} °F`;
    const what = `the blend minimum (${blend.limitingSpecies.toLowerCase()})`;
    const first = withSoil[0];
    if (first.soilLevel !== 'cold') {
      const cold = withSoil.find((d) => d.soilLevel === 'cold');
      out.push(
        cold
          ? `Soil is ${Math.round(first.soilTempF!)} °F on ${dayWithMonth(first.date)}, at or above ${min}, ${what}; it drops below on ${dayWithMonth(cold.date)}.`
          : `Soil stays at or above ${min}, ${what}, through ${dayWithMonth(last)}.`,
      );
    } else {
      const warm = withSoil.find((d) => d.soilLevel !== 'cold');
      out.push(warm ? `Soil reaches ${min}, ${what}, on ${dayWithMonth(warm.date)}.` : `Soil stays below ${min}, ${what}, through ${dayWithMonth(last)}.`);
    }
  } else if (withSoil.length) {
    const temps = withSoil.map((d) => Math.round(d.soilTempF!));
    out.push(`Soil ${Math.min(...temps)}–${Math.max(...temps)} °F through ${dayWithMonth(last)}.`);
  }

  const wettest = days.reduce((a, b) => (b.rainMm > a.rainMm ? b : a));
  const totalMm = days.reduce((sum, d) => sum + d.rainMm, 0);
  if (wettest.rainMm >= o.measurableRainMm) {
    // Hundredths of an inch, as a rain gauge reads and as the chart writes over its bars.
    const rest = totalMm - wettest.rainMm >= o.measurableRainMm ? `; ${inchesPrecise(totalMm)} in all through ${dayWithMonth(last)}` : '';
    out.push(`${inchesPrecise(wettest.rainMm)} of rain expected ${dayWithMonth(wettest.date)}${rest}.`);
  } else {
    out.push(`No measurable rain forecast through ${dayWithMonth(last)}.`);
  }

  if (seeding) {
    const verb = seeding.status === 'done' ? 'Seeded' : 'Seeding planned';
    if (moisture && moisture.startsAtForecast) {
      out.push(`${verb} ${dayWithMonth(seeding.date)}, before the forecast begins; the seed-zone outlook starts ${dayWithMonth(moisture.fromDate)}, taken as dry.`);
    } else if (!moisture) {
      out.push(`${verb} ${dayWithMonth(seeding.date)}, beyond the forecast; the seed-zone outlook appears once the forecast reaches it.`);
    }
    if (moisture) {
      const lead = moisture.startsAtForecast ? 'The seed zone' : `${verb} ${dayWithMonth(seeding.date)}: the seed zone`;
      const n = (count: number) => `${count} day${count === 1 ? '' : 's'}`;
      // The balance starts air-dry at the forecast's first day (as the plan's and the seeding comparison's do).
      const after = 'no rain in the forecast soaks it';
      if (!moisture.firstMoistDate) out.push(`${lead} stays dry through ${dayWithMonth(moisture.throughDate)}: ${after}.`);
      else {
        const wets = moisture.firstMoistDate === moisture.fromDate ? 'is moist from the start' : `is dry at first; rain wets it from ${dayWithMonth(moisture.firstMoistDate)}`;
        const dries = moisture.firstDryDate ? `dry again from ${dayWithMonth(moisture.firstDryDate)}` : `moist through ${dayWithMonth(moisture.throughDate)}, the end of the forecast`;
        out.push(`${lead} ${wets} (${n(moisture.moistDays)} moist in all), ${dries}.`);
      }
    }
  }

  const sprayDays = days.filter((d) => d.spray.window);
  if (sprayDays.length) {
    const first = sprayDays[0];
    out.push(
      `A spray window on ${sprayDays.length} of ${days.length} days, the first ${dayWithMonth(first.date)} ${first.spray.window!.start}–${first.spray.window!.end}.`,
    );
  } else {
    out.push(`No spray window of ${formatNumber(o.minWindowHours)} h through ${dayWithMonth(last)}.`);
  }
  return out;
}
