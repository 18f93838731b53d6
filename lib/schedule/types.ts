// The planning engine's data: the forecast it reads, the planting it is asked about, and the plan it returns.
// Plain data only, so a plan can be stored as JSON and compared between runs.
import type { BlendPart } from '@/lib/agronomy/species';
import type { PlantingMethod } from '@/lib/agronomy/quantities';
import type { SoilTexture } from '@/lib/agronomy/water-balance';
import type { ScheduleParameterOverrides } from './parameters';

export type { BlendPart, PlantingMethod, SoilTexture };

/** One forecast hour. Instants are UTC ISO strings; the property's IANA zone turns them into local days. */
export interface ForecastHour {
  time: string; // ISO instant, e.g. '2027-08-20T14:00:00Z'
  /** Rain in the hour that ENDS at `time` (the convention of Open-Meteo's hourly `precipitation`). */
  rainMm: number;
  rainProbabilityPct: number | null;
  airTempC: number; // at 2 m
  relativeHumidityPct: number;
  windKmh: number; // mean wind at 10 m
  windGustKmh?: number | null;
  soilTempC?: number | null; // near-surface, when the provider gives it
}

/** Hourly, up to 16 days. */
export interface Forecast {
  timeZone: string;
  fetchedAt: string; // ISO instant
  hours: ForecastHour[];
}

export type StepKind =
  | 'clear-brush'
  | 'spray'
  | 'kill-wait'
  | 'burn'
  | 'rake-till'
  | 'seed'
  | 'cover-seed'
  | 'fertilize'
  | 'lime'
  | 'check-germination'
  | 'mow'
  | 'spot-spray-grass'
  | 'frost-seed'
  | 'soil-test';

export interface HerbicidePlan {
  productName: string;
  /** Ids of the product's actives (lib/agronomy/herbicides.ts): they set plant-back, kill wait and rainfast. */
  activeIngredients?: string[];
  activeIngredientPct?: number | null;
  /** As the label gives it: percent of the spray volume (v/v), or fluid ounces of product per acre. */
  rate: { percentSolution: number } | { flOzPerAcre: number };
  rainfastHours?: number | null; // from the label; absent → the actives' longest, else SPRAY_WINDOW_DEFAULTS.rainfastHours
  maxWindMph?: number | null; // label limit; absent → the 3–8 mph stewardship band
  minTempF?: number | null;
  maxTempF?: number | null;
}

export interface PlantingInput {
  timeZone: string; // the property's IANA zone
  latitudeDeg: number;
  /** East positive. Sets solar noon for daylight; absent → the zone's standard meridian (less exact). */
  longitudeDeg?: number | null;
  elevationM: number;
  avgLastSpringFrost: string | null; // 'MM-DD'
  avgFirstFallFrost: string | null; // 'MM-DD'
  /** 'MM-DD': the average first 28 °F night (NWS hard freeze); absent → the first frost plus FROST_DEADLINE_DEFAULTS' estimate. */
  avgFirstHardFreeze?: string | null;
  acres: number;
  cover: 'grass-weeds' | 'brush' | 'bare-soil' | 'tilled' | 'existing-stand';
  soilTexture?: SoilTexture; // default 'loam'
  season: 'spring' | 'fall';
  method: PlantingMethod;
  blend: BlendPart[];
  targetSeedDate: string; // the planned seeding date (YYYY-MM-DD, local)
  readyBy?: string | null; // e.g. the season opening (YYYY-MM-DD, local)
  clearBrush?: boolean; // default: cover === 'brush'
  burn?: { planned: boolean; permitInHand: boolean } | null;
  rakeOrTill?: boolean; // default: true for a prepared seedbed
  coverSeed?: boolean; // default: true for a prepared seedbed, false otherwise
  killWaitDays?: number; // default KILL_WAIT_DEFAULTS.killWaitDays (14)
  herbicide?: HerbicidePlan | null;
  sprayer?: { tankGal: number; carrierGalPerAcre: number } | null;
  fertilizer?: { grade: [number, number, number]; target: { n?: number; p2o5?: number; k2o?: number }; bagLb?: number } | null;
  lime?: { tonsPerAcre: number; bagLb?: number } | null;
  seedBagLb?: number; // default 50
  /** What the seed bag's label says it covers (`lb` plants `acres`); sets the seeding rate (lib/agronomy/seeding-rate.ts). */
  seedBag?: { lb: number; acres: number } | null;
  upkeep?: boolean; // add recurring upkeep (RRULE) steps
  /** Per-planting changes to the rules' documented defaults (see lib/schedule/parameters.ts). */
  parameters?: ScheduleParameterOverrides | null;
}

export type RuleName =
  | 'sequence'
  | 'spray-window'
  | 'kill-wait'
  | 'seed-before-rain'
  | 'soil-temperature'
  | 'frost-deadline'
  | 'fertilize-before-rain'
  | 'germination-check'
  | 'burn-window'
  | 'frozen-ground'
  | 'plant-back'
  | 'upkeep'
  | 'lime-timing';

/** A rule's verdict on one date. `marginal` marks "allowed, with care" (e.g. Delta T 8–10 °C). */
export interface RuleDecision {
  rule: RuleName;
  ok: boolean;
  reason: string; // a person can read it
  marginal?: boolean;
}

export interface Caution {
  topic: 'herbicide' | 'fire' | 'chainsaw' | 'fertilizer';
  text: string;
}

/** What to carry for a step. `detail` is the line a person reads: "17 lb of seed — 2 bags". */
export interface Quantity {
  item: string;
  amount: number;
  unit: string;
  detail: string;
}

export type StepStatus = 'planned' | 'done' | 'skipped';

export interface PlanStep {
  key: string; // stable within a planting ('spray', 'seed', 'upkeep-mow'); the database keys steps by it
  kind: StepKind;
  title: string; // 'Spray the burndown'
  date: string; // local date (YYYY-MM-DD) in the property's zone
  window: { earliest: string; latest: string } | null;
  hours?: { start: string; end: string } | null; // best local hours, e.g. a spray window '09:00'–'13:00'
  status: StepStatus;
  pinned: boolean;
  doneOn?: string | null; // the real date, when done
  after: string[]; // keys of the steps this one follows
  quantities: Quantity[];
  cautions: Caution[];
  reason: string; // why it sits there, in plain words
  rules: RuleDecision[]; // the rules that decided it
  warnings: string[];
  recurrence?: string | null; // RFC 5545 DTSTART;TZID=…\nRRULE:… for upkeep steps
}

export interface Plan {
  steps: PlanStep[];
  warnings: string[];
  forecastThrough: string | null; // last local date the forecast covers in full
}

export interface StepChange {
  key: string;
  kind: StepKind;
  from: string;
  to: string;
  reason: string; // "moved seeding from Tue 14 to Sun 12: 0.6 in of rain forecast Mon 13; soil 58 °F"
}
