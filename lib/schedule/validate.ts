// Checks a planting before the engine plans it, so bad input gets one clear message per problem instead of a
// half-made plan. The route's zod schema catches shape errors first; this catches what only the engine knows
// (unknown species, a product rate larger than the spray volume, dates that do not exist).
import { HERBICIDE_ACTIVE_IDS, isHerbicideActive } from '@/lib/agronomy/herbicides';
import { fertilizerAmount, limeAmount, sprayMix } from '@/lib/agronomy/quantities';
import { seedBagRatePerAcreLb } from '@/lib/agronomy/seeding-rate';
import { blendProfile } from '@/lib/agronomy/species';
import { FAO56_TABLE_19 } from '@/lib/agronomy/water-balance';
import { isKnownTimeZone, isLocalDate, isMonthDay } from './local-dates';
import { standSafetyIssues } from './rules/plant-back';
import type { PlantingInput } from './types';

export class PlanInputError extends RangeError {
  constructor(readonly issues: string[]) {
    super(`The planting cannot be planned: ${issues.join(' ')}`);
    this.name = 'PlanInputError';
  }
}

const METHODS = ['spray-and-seed', 'prepared-seedbed', 'frost-seeding'];
const COVERS = ['grass-weeds', 'brush', 'bare-soil', 'tilled', 'existing-stand'];

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

export function plantingInputIssues(input: PlantingInput): string[] {
  const issues: string[] = [];
  const isNum = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);
  if (!input || typeof input !== 'object') return ['The planting is missing.'];
  if (typeof input.timeZone !== 'string' || !isKnownTimeZone(input.timeZone)) {
    issues.push(`Unknown time zone ${JSON.stringify(input.timeZone)}; use an IANA name such as America/Chicago.`);
  }
  if (!isNum(input.latitudeDeg) || input.latitudeDeg < -90 || input.latitudeDeg > 90) issues.push('Latitude must be between −90 and 90 degrees.');
  if (input.longitudeDeg != null && (!isNum(input.longitudeDeg) || input.longitudeDeg < -180 || input.longitudeDeg > 180)) {
    issues.push('Longitude must be between −180 and 180 degrees.');
  }
  if (!isNum(input.elevationM)) issues.push('Elevation must be a number of metres.');
  if (!isNum(input.acres) || input.acres <= 0) issues.push('Plot size must be more than 0 acres.');
  if (!METHODS.includes(input.method)) issues.push(`Unknown method ${JSON.stringify(input.method)}; use ${METHODS.join(', ')}.`);
  if (!COVERS.includes(input.cover)) issues.push(`Unknown cover ${JSON.stringify(input.cover)}; use ${COVERS.join(', ')}.`);
  if (input.season !== 'spring' && input.season !== 'fall') issues.push('Season must be spring or fall.');
  if (input.soilTexture !== undefined && !(input.soilTexture in FAO56_TABLE_19)) {
    issues.push(`Unknown soil texture ${JSON.stringify(input.soilTexture)}; use ${Object.keys(FAO56_TABLE_19).join(', ')}.`);
  }
  if (!isLocalDate(input.targetSeedDate)) issues.push(`Target seeding date ${JSON.stringify(input.targetSeedDate)} is not a date (YYYY-MM-DD).`);
  if (input.readyBy != null && !isLocalDate(input.readyBy)) issues.push(`Ready-by date ${JSON.stringify(input.readyBy)} is not a date (YYYY-MM-DD).`);
  for (const [name, value] of [
    ['average last spring frost', input.avgLastSpringFrost],
    ['average first fall frost', input.avgFirstFallFrost],
    ['average first hard freeze', input.avgFirstHardFreeze],
  ] as const) {
    if (value != null && !isMonthDay(value)) issues.push(`The ${name} ${JSON.stringify(value)} is not a month and day (MM-DD).`);
  }
  try {
    blendProfile(input.blend);
  } catch (error) {
    issues.push(messageOf(error));
  }
  if (input.killWaitDays !== undefined && (!Number.isInteger(input.killWaitDays) || input.killWaitDays < 0 || input.killWaitDays > 90)) {
    issues.push('The kill wait must be a whole number of days from 0 to 90.');
  }
  if (input.seedBagLb !== undefined && (!isNum(input.seedBagLb) || input.seedBagLb <= 0)) issues.push('Seed bag size must be more than 0 lb.');
  if (input.seedBag != null) {
    try {
      seedBagRatePerAcreLb(input.seedBag);
    } catch (error) {
      issues.push(messageOf(error));
    }
  }
  const acres = isNum(input.acres) && input.acres > 0 ? input.acres : 1;
  if (input.herbicide) {
    if (!input.herbicide.productName?.trim()) issues.push('Name the herbicide product, as on its label.');
    const h = input.herbicide;
    for (const [name, v] of [
      ['rainfast period', h.rainfastHours],
      ['label wind limit', h.maxWindMph],
    ] as const) {
      if (v != null && (!isNum(v) || v <= 0)) issues.push(`The ${name} must be more than 0.`);
    }
    if (h.minTempF != null && h.maxTempF != null && h.minTempF >= h.maxTempF) issues.push("The herbicide's lowest temperature must be under its highest.");
    issues.push(...activeIngredientIssues(input));
  }
  if (input.sprayer) {
    try {
      sprayMix({
        acres,
        carrierGalPerAcre: input.sprayer.carrierGalPerAcre,
        tankGal: input.sprayer.tankGal,
        product: input.herbicide?.rate ?? { percentSolution: 1 },
      });
    } catch (error) {
      issues.push(messageOf(error));
    }
  }
  if (input.fertilizer) {
    try {
      fertilizerAmount({ grade: input.fertilizer.grade, target: input.fertilizer.target, acres, bagLb: input.fertilizer.bagLb });
    } catch (error) {
      issues.push(messageOf(error));
    }
  }
  if (input.lime) {
    try {
      limeAmount({ tonsPerAcre: input.lime.tonsPerAcre, acres, bagLb: input.lime.bagLb });
    } catch (error) {
      issues.push(messageOf(error));
    }
  }
  return issues;
}

/** Herbicide actives: known ids, each once, and none that would kill the existing stand the blend keeps. */
function activeIngredientIssues(input: PlantingInput): string[] {
  const ids: unknown = input.herbicide?.activeIngredients;
  if (ids === undefined) return [];
  if (!Array.isArray(ids) || ids.some((id) => typeof id !== 'string')) return ['Herbicide actives must be a list of active ingredient ids.'];
  const unknown = ids.filter((id: string) => !isHerbicideActive(id));
  if (unknown.length) {
    return [`Herbicide actives: unknown ${unknown.map((id) => JSON.stringify(id)).join(', ')}; use ${HERBICIDE_ACTIVE_IDS.join(', ')}.`];
  }
  if (new Set(ids).size !== ids.length) return ['Herbicide actives: list each active once.'];
  try {
    return standSafetyIssues(input);
  } catch {
    return []; // the blend's own problem is reported above
  }
}

export function assertPlantingInput(input: PlantingInput): void {
  const issues = plantingInputIssues(input);
  if (issues.length) throw new PlanInputError(issues);
}

const STATUSES = ['planned', 'done', 'skipped'];

/** A stored plan handed back to replan: every step needs a key, a real date and a known status. */
export function planIssues(plan: { steps?: unknown } | null | undefined): string[] {
  if (!plan || !Array.isArray(plan.steps)) return ['The current plan has no list of steps.'];
  const issues: string[] = [];
  const seen = new Set<string>();
  for (const raw of plan.steps as Record<string, unknown>[]) {
    const key = typeof raw?.key === 'string' ? raw.key : null;
    if (!key) {
      issues.push('A step of the current plan has no key.');
      continue;
    }
    if (seen.has(key)) issues.push(`The current plan lists step "${key}" twice.`);
    seen.add(key);
    if (!isLocalDate(raw.date)) issues.push(`Step "${key}" has no valid date (${JSON.stringify(raw.date)}).`);
    if (!STATUSES.includes(raw.status as string)) issues.push(`Step "${key}" has an unknown status ${JSON.stringify(raw.status)}.`);
    if (raw.doneOn != null && !isLocalDate(raw.doneOn)) issues.push(`Step "${key}" has an invalid done date ${JSON.stringify(raw.doneOn)}.`);
  }
  return issues;
}
