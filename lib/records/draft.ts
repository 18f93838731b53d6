// The application record a spray, fertilize or lime step suggests: what the plan said (product, rate, the
// step's worked-out quantities, the plot's acres) and the stored forecast's weather for the hour of the work.
// Pure: the caller reads the step, planting, plot and forecast and passes the instant of the work in.
import { cToF, kmhToMph } from '@/lib/agronomy/units';
import { localClock, localDateOf } from '@/lib/schedule/local-dates';
import type { ForecastHour, Quantity, StepKind } from '@/lib/schedule/types';
import type { ApplicationKind } from '@/lib/validations/application-record';
import type { PlantingFormInput } from '@/lib/validations/planting';

export const RECORD_KIND_OF_STEP: Partial<Record<StepKind, ApplicationKind>> = {
  spray: 'herbicide',
  'spot-spray-grass': 'herbicide',
  fertilize: 'fertilizer',
  lime: 'lime',
};

/** The site most food-plot work is on; a record may say more (the blend, "field edge"). */
export const DEFAULT_SITE = 'Wildlife food plot';

export interface RecordDraft {
  kind: ApplicationKind;
  plotId: string;
  plotName: string;
  stepId: string;
  appliedOn: string;
  appliedTime: string;
  areaAcres: number;
  site: string;
  productName: string | null;
  activeIngredientPct: number | null;
  rateValue: number | null;
  rateUnit: string | null;
  totalProductValue: number | null;
  totalProductUnit: string | null;
  waterGal: number | null;
  sprayer: string | null;
  applicatorName: string;
  windMph: number | null;
  windDirection: null;
  airTempF: number | null;
  humidityPct: number | null;
  weatherSource: 'forecast' | null;
}

export interface DraftWeather {
  /** The forecast hour used (ISO instant) and when that forecast was fetched. */
  hour: string;
  forecastFetchedAt: string;
  windMph: number;
  airTempF: number;
  humidityPct: number;
}

const HOUR_MS = 3_600_000;
const round = (value: number, digits: number) => Math.round(value * 10 ** digits) / 10 ** digits;

/**
 * The forecast hour nearest to `at`, when the forecast covers it (within half an hour of a stored hour):
 * wind km/h → mph and °C → °F through lib/agronomy/units.ts, to the tenth a hand-held meter shows.
 */
export function weatherAt(hours: readonly ForecastHour[], fetchedAt: string, at: Date): DraftWeather | null {
  let best: ForecastHour | null = null;
  let bestGap = Infinity;
  for (const hour of hours) {
    const gap = Math.abs(Date.parse(hour.time) - at.getTime());
    if (gap < bestGap) {
      best = hour;
      bestGap = gap;
    }
  }
  if (!best || bestGap > HOUR_MS / 2) return null;
  return {
    hour: new Date(best.time).toISOString(),
    forecastFetchedAt: fetchedAt,
    windMph: round(kmhToMph(best.windKmh), 1),
    airTempF: round(cToF(best.airTempC), 1),
    humidityPct: Math.round(best.relativeHumidityPct),
  };
}

const quantity = (quantities: readonly Quantity[], match: (q: Quantity) => boolean) => quantities.find(match) ?? null;

export function buildRecordDraft(o: {
  step: { id: string; kind: StepKind; quantities: readonly Quantity[] };
  form: PlantingFormInput | null;
  plot: { id: string; name: string; acres: number };
  applicatorName: string;
  at: Date;
  timeZone: string;
  weather: DraftWeather | null;
}): RecordDraft | null {
  const kind = RECORD_KIND_OF_STEP[o.step.kind];
  if (!kind) return null;
  const acres = o.plot.acres;
  const base = {
    kind,
    plotId: o.plot.id,
    plotName: o.plot.name,
    stepId: o.step.id,
    appliedOn: localDateOf(o.at, o.timeZone),
    appliedTime: localClock(o.at.getTime(), o.timeZone),
    areaAcres: acres,
    site: DEFAULT_SITE,
    applicatorName: o.applicatorName,
    windMph: o.weather?.windMph ?? null,
    windDirection: null,
    airTempF: o.weather?.airTempF ?? null,
    humidityPct: o.weather?.humidityPct ?? null,
    weatherSource: o.weather ? ('forecast' as const) : null,
  };
  const none = { productName: null, activeIngredientPct: null, rateValue: null, rateUnit: null, totalProductValue: null, totalProductUnit: null, waterGal: null, sprayer: null };
  const form = o.form;

  // The planting's herbicide is its burndown; a grass spot-spray uses another product, so it starts blank.
  if (o.step.kind === 'spray' && form?.herbicide) {
    const h = form.herbicide;
    const product = quantity(o.step.quantities, (q) => q.unit === 'fl oz' && q.item === h.productName);
    const water = quantity(o.step.quantities, (q) => q.item === 'water' && q.unit === 'gal');
    return {
      ...base,
      ...none,
      productName: h.productName,
      activeIngredientPct: h.activeIngredientPct ?? null,
      rateValue: h.rate,
      rateUnit: h.rateKind === 'percent-solution' ? '% v/v' : 'fl oz/acre',
      totalProductValue: product ? round(product.amount, 2) : null,
      totalProductUnit: product ? 'fl oz' : null,
      waterGal: water ? round(water.amount, 2) : null,
      sprayer: form.sprayer ? `${form.sprayer.tankGal} gal tank at ${form.sprayer.carrierGalPerAcre} gal/acre` : null,
    };
  }
  if (o.step.kind === 'fertilize' && form?.fertilizer) {
    const grade = form.fertilizer.grade.join('-');
    const total = quantity(o.step.quantities, (q) => q.unit === 'lb' && q.item.startsWith('fertilizer'));
    return {
      ...base,
      ...none,
      productName: `Fertilizer ${grade}`,
      rateValue: total && acres > 0 ? round(total.amount / acres, 1) : null,
      rateUnit: 'lb/acre',
      totalProductValue: total ? round(total.amount, 1) : null,
      totalProductUnit: total ? 'lb' : null,
    };
  }
  if (o.step.kind === 'lime' && form?.lime) {
    const total = quantity(o.step.quantities, (q) => q.unit === 'lb' && q.item === 'lime');
    return {
      ...base,
      ...none,
      productName: 'Agricultural lime',
      rateValue: form.lime.tonsPerAcre,
      rateUnit: 'tons/acre',
      totalProductValue: total ? round(total.amount, 1) : null,
      totalProductUnit: total ? 'lb' : null,
    };
  }
  return { ...base, ...none };
}
