// The planning engine's entry points. planPlanting lays out a planting's steps from its target seeding date
// and, where the forecast reaches, lets the rules place the weather-bound steps (spraying, burning, seeding,
// fertilizing, frost seeding). replan does the same against a new forecast while keeping what people did
// and decided: done, skipped and pinned steps stay; following steps count from the real dates; steps past
// the forecast keep their dates; each move is reported with its old and new date and why.
import { coverPurpose } from '@/lib/agronomy/seed-cover';
import { legumeNitrogenWarning, legumeOnly } from '@/lib/agronomy/nitrogen';
import { blendProfile, type BlendProfile } from '@/lib/agronomy/species';
import { cautionsFor } from './cautions';
import { indexForecast, inHorizon, daysOfHorizon, type ForecastIndex } from './forecast-days';
import {
  addDays,
  clampDate,
  dayPair,
  dayWithMonth,
  daysBetween,
  localDateOf,
  maxDate,
  monthDayInYear,
  shortDay,
} from './local-dates';
import { inchesPrecise } from './format';
import { burns, clearingBy, methodSteps, type StepTemplate } from './methods';
import { resolveParameters, type ScheduleParameters } from './parameters';
import { burnDay, burnPermitDecision } from './rules/burn-window';
import { fertilizeBeforeRain } from './rules/fertilize-before-rain';
import { frostBounds, frostDeadlineOn, type FrostBounds } from './rules/frost-deadline';
import { frozenGroundOn } from './rules/frozen-ground';
import { germinationCheck } from './rules/germination-check';
import { killWaitDecision, killWaitEnd, killWaitRespected } from './rules/kill-wait';
import { limeSplit, limeTiming, surfaceSecondHalfDate } from './rules/lime-timing';
import { killWaitFromActives, plantBackDecision, plantBackEnd, plantBackFor, plantBackWords, sprayAndSeedConflict, type PlantBack } from './rules/plant-back';
import { seedBeforeRain } from './rules/seed-before-rain';
import { soilTemperatureOn } from './rules/soil-temperature';
import { sprayDay, type SprayContext, type SprayDay } from './rules/spray-window';
import { upkeepSpecs } from './rules/upkeep';
import { seedStepNotes } from './seeding-notes';
import { STEP_KINDS } from './step-kinds';
import { fertilizerQuantities, limeQuantities, seedQuantities, sprayQuantities, DEFAULT_SEED_BAG_LB } from './step-quantities';
import type { Forecast, Plan, PlanStep, PlantingInput, Quantity, RuleDecision, StepChange, StepKind } from './types';
import { assertPlantingInput, planIssues, PlanInputError } from './validate';

interface Ctx {
  input: PlantingInput;
  /** Hours before this instant are past (null when only a date is being checked). */
  nowMs: number | null;
  params: ScheduleParameters;
  profile: BlendProfile;
  today: string;
  fc: ForecastIndex | null;
  prior: Map<string, PlanStep>;
  templates: Map<string, StepTemplate>;
  order: string[];
  placed: Map<string, PlanStep>;
  frost: FrostBounds;
  spray: SprayContext | null;
  planWarnings: string[];
  /** The mix's longest plant-back for the blend, and the kill wait the actives set (when nothing else does). */
  plantBack: PlantBack | null;
  killWaitNote: string | null;
}

/** Where a step goes and why. Its rules are read on the final date by explain(), once every step is placed. */
interface Placement {
  date: string;
  window?: { earliest: string; latest: string } | null;
  hours?: { start: string; end: string } | null;
  reason: string;
  rules?: RuleDecision[];
  warnings?: string[];
  recurrence?: string | null;
  quantities?: Quantity[];
}

// ——— context ————————————————————————————————————————————————————————————————

function buildContext(input: PlantingInput, forecast: Forecast | null, today: string, nowMs: number | null, prior: PlanStep[] | null): Ctx {
  assertPlantingInput(input);
  const killWait = killWaitFromActives(input);
  const params = resolveParameters(input.parameters, input.killWaitDays ?? killWait?.days);
  const profile = blendProfile(input.blend);
  const planWarnings: string[] = [];
  let fc: ForecastIndex | null = null;
  if (forecast) {
    const seed = params.seedBeforeRain;
    fc = indexForecast(forecast, input.timeZone, {
      measurableRainMm: seed.measurableRainMm,
      eventGapHours: seed.eventGapHours,
      soakingRainMm: seed.soakingRainMm,
      soakingWindowHours: seed.soakingWindowHours,
    });
    if (forecast.timeZone && forecast.timeZone !== input.timeZone) {
      planWarnings.push(`The forecast was fetched for ${forecast.timeZone}; Sowcast reads it in the property's zone, ${input.timeZone}.`);
    }
  }
  const { steps, notes } = methodSteps(input, params.limeTiming.splitAboveTonsPerAcre);
  planWarnings.push(...notes);
  const n = input.fertilizer?.target.n ?? 0;
  if (n > 0 && legumeOnly(input.blend)) planWarnings.push(legumeNitrogenWarning(n));
  const templates = new Map(steps.map((s) => [s.key, s]));
  return {
    input,
    nowMs,
    params,
    profile,
    today,
    fc,
    prior: new Map((prior ?? []).map((s) => [s.key, s])),
    templates,
    order: steps.map((s) => s.key),
    placed: new Map(),
    frost: frostBounds(input, profile, params.frostDeadline),
    spray: fc
      ? { fc, latitudeDeg: input.latitudeDeg, longitudeDeg: input.longitudeDeg, product: input.herbicide, params: params.sprayWindow, notBeforeMs: nowMs, cache: new Map<string, SprayDay>() }
      : null,
    planWarnings,
    plantBack: plantBackFor(input),
    killWaitNote: killWait?.note ?? null,
  };
}

/** spray-and-seed cannot sow into the dying cover when the mix's plant-back is longer than its spray-to-seed gap. */
function plantBackOutlasts(ctx: Ctx): boolean {
  return ctx.input.method === 'spray-and-seed' && !!ctx.plantBack && ctx.plantBack.days > ctx.params.sequence.maxSprayToSeedDays;
}

const has = (ctx: Ctx, key: string) => ctx.templates.has(key);

function fixedPrior(ctx: Ctx, key: string): PlanStep | null {
  const p = ctx.prior.get(key);
  return p && (p.status !== 'planned' || p.pinned) ? p : null;
}

/** The date later steps count from: the real date of a done step, none for a skipped one. */
function effective(ctx: Ctx, key: string): string | null {
  const s = ctx.placed.get(key);
  if (!s || s.status === 'skipped') return null;
  return s.status === 'done' ? (s.doneOn ?? s.date) : s.date;
}

/** A tied step's own fixed date, before it is placed (a pinned or done till holds the seeding back). */
function fixedEffective(ctx: Ctx, key: string): string | null {
  const p = has(ctx, key) ? fixedPrior(ctx, key) : null;
  if (!p || p.status === 'skipped') return null;
  return p.status === 'done' ? (p.doneOn ?? p.date) : p.date;
}

function predecessorsLatest(ctx: Ctx, key: string, after = ctx.templates.get(key)?.after ?? []): string | null {
  let latest: string | null = null;
  for (const k of after) {
    const d = effective(ctx, k);
    if (d && (!latest || d > latest)) latest = d;
  }
  return latest;
}

/** Where a step sat before: its current date in replan, the plan's default in planPlanting. */
function anchorOf(ctx: Ctx, key: string, fallback: string): string {
  const p = ctx.prior.get(key);
  return p && p.status === 'planned' && !p.pinned ? p.date : fallback;
}


function quantitiesFor(ctx: Ctx, kind: StepKind): Quantity[] {
  const { input } = ctx;
  const bagLb = input.seedBagLb ?? input.seedBag?.lb ?? DEFAULT_SEED_BAG_LB;
  switch (kind) {
    case 'seed':
      return seedQuantities(input.blend, input.acres, input.method, bagLb, input.seedBag);
    case 'frost-seed':
      return seedQuantities(input.blend, input.acres, 'frost-seeding', bagLb, input.seedBag);
    case 'spray':
      return sprayQuantities(input);
    case 'fertilize':
      return fertilizerQuantities(input);
    case 'lime':
      return limeQuantities(input);
    default:
      return [];
  }
}

function sequenceDecision(ctx: Ctx, key: string, date: string, after = ctx.templates.get(key)?.after ?? []): RuleDecision | null {
  const parts: string[] = [];
  let ok = true;
  for (const k of after) {
    const d = effective(ctx, k);
    const s = ctx.placed.get(k);
    if (!d || !s) continue;
    const noun = STEP_KINDS[s.kind].noun;
    if (date < d) {
      ok = false;
      parts.push(`before ${noun} (${shortDay(d)}), which it must follow`);
    } else parts.push(`after ${noun} (${shortDay(d)})`);
  }
  return parts.length ? { rule: 'sequence', ok, reason: parts.join('; ') } : null;
}

function commit(ctx: Ctx, key: string, kind: StepKind, p: Placement, after?: string[]): PlanStep {
  const prior = ctx.prior.get(key);
  const step: PlanStep = {
    key,
    kind,
    title: STEP_KINDS[kind].title,
    date: p.date,
    window: p.window ?? null,
    hours: p.hours ?? null,
    status: prior?.status ?? 'planned',
    pinned: prior?.pinned ?? false,
    doneOn: prior?.doneOn ?? null,
    after: after ?? ctx.templates.get(key)?.after ?? [],
    quantities: p.quantities ?? quantitiesFor(ctx, kind),
    cautions: cautionsFor(kind),
    reason: p.reason,
    rules: p.rules ?? [],
    warnings: [...(p.warnings ?? []), ...seedStepNotes(ctx.input, key)],
    recurrence: p.recurrence ?? null,
  };
  ctx.placed.set(key, step);
  return step;
}

/** Done, skipped and pinned steps keep their date; a pinned one is re-explained on it. */
function keepFixed(ctx: Ctx, key: string, prior: PlanStep, after?: string[]): PlanStep {
  if (prior.status !== 'planned') {
    const kept = { ...prior, after: after ?? ctx.templates.get(key)?.after ?? prior.after };
    ctx.placed.set(key, kept);
    return kept;
  }
  return commit(
    ctx,
    key,
    prior.kind,
    {
      date: prior.date,
      window: prior.window,
      hours: prior.hours ?? null,
      reason: `pinned to ${dayWithMonth(prior.date)}`,
      recurrence: prior.recurrence ?? null,
    },
    after,
  );
}

function place(ctx: Ctx, key: string, compute: () => Placement): void {
  const template = ctx.templates.get(key);
  if (!template) return;
  const fixed = fixedPrior(ctx, key);
  if (fixed) keepFixed(ctx, key, fixed);
  else commit(ctx, key, template.kind, compute());
}

// ——— choosing a day ——————————————————————————————————————————————————————————

interface Evaluated<E> {
  tier: number; // lower is better
  secondary: number;
  extra: E;
}

interface Choice<E> {
  date: string;
  outcome: 'outside' | 'chosen' | 'beyond';
  extra: E | null;
}

/**
 * The rules only re-place a step whose date is inside the forecast: among the window's forecast days that
 * pass, the best tier wins, then the day nearest the step's date, then the secondary preference, then the
 * earlier day. When no forecast day passes, the step goes to the first day past the forecast.
 */
function chooseDay<E>(ctx: Ctx, earliest: string, latest: string, base: string, evaluate: (date: string) => Evaluated<E> | null): Choice<E> {
  const fc = ctx.fc;
  if (!fc || !inHorizon(fc, base)) return { date: base, outcome: 'outside', extra: null };
  let best: { date: string; e: Evaluated<E> } | null = null;
  for (const date of daysOfHorizon(fc, earliest, latest)) {
    const e = evaluate(date);
    if (!e) continue;
    if (!best) {
      best = { date, e };
      continue;
    }
    const a = [e.tier, Math.abs(daysBetween(base, date)), e.secondary];
    const b = [best.e.tier, Math.abs(daysBetween(base, best.date)), best.e.secondary];
    const better = a[0] !== b[0] ? a[0] < b[0] : a[1] !== b[1] ? a[1] < b[1] : a[2] < b[2];
    if (better) best = { date, e };
  }
  if (best) return { date: best.date, outcome: 'chosen', extra: best.e.extra };
  return { date: maxDate(addDays(fc.lastDate as string, 1), earliest), outcome: 'beyond', extra: null };
}

const through = (ctx: Ctx) => (ctx.fc?.lastDate ? shortDay(ctx.fc.lastDate) : '');

function outsideWords(ctx: Ctx, date: string): string {
  if (!ctx.fc || !ctx.fc.lastDate || !ctx.fc.firstDate) return 'no forecast yet';
  if (date < ctx.fc.firstDate) return `the forecast starts only on ${dayWithMonth(ctx.fc.firstDate)}`;
  return `the forecast reaches only to ${dayWithMonth(ctx.fc.lastDate)}`;
}

// ——— evaluating a step on a day (also used to explain a dragged date) ——————————————

function noForecast(rule: RuleDecision['rule'], what: string): RuleDecision {
  return { rule, ok: true, reason: `no forecast for that day yet; ${what}` };
}

function decisionsOn(ctx: Ctx, key: string, kind: StepKind, date: string, after?: string[]): RuleDecision[] {
  const out: RuleDecision[] = [];
  const seq = sequenceDecision(ctx, key, date, after);
  if (seq) out.push(seq);
  const { fc, params } = ctx;
  const sprayEff = has(ctx, 'spray') ? effective(ctx, 'spray') : null;
  const covered = inHorizon(fc, date);
  switch (kind) {
    case 'spray':
    case 'spot-spray-grass':
      out.push(ctx.spray && covered ? sprayDay(ctx.spray, date).decision : noForecast('spray-window', 'check wind, rain and temperature against the label on the day'));
      if (kind === 'spray') {
        const mowed = clearingBy(ctx.input) === 'mowing' ? effective(ctx, 'clear-brush') : null;
        const regrowth = params.sequence.mowRegrowthDays;
        if (mowed && date >= mowed && daysBetween(mowed, date) < regrowth) {
          out.push({ rule: 'sequence', ok: false, reason: `only ${daysBetween(mowed, date)} days after mowing; mowed weeds need about ${regrowth} days to regrow to the label's stage` });
        }
      }
      break;
    case 'kill-wait':
      if (sprayEff) {
        const end = killWaitEnd(sprayEff, params.killWait.killWaitDays);
        out.push(
          date === end
            ? killWaitDecision(sprayEff, params.killWait.killWaitDays, ctx.placed.get('spray')?.status === 'done')
            : { rule: 'kill-wait', ok: date > end, reason: `the kill wait ends ${dayWithMonth(end)}, ${params.killWait.killWaitDays} days after spraying on ${dayWithMonth(sprayEff)}` },
        );
      }
      break;
    case 'burn':
      out.push(burnPermitDecision(ctx.input.burn));
      if (sprayEff) out.push(killWaitRespected(sprayEff, params.killWait.killWaitDays, date));
      if (fc && covered) out.push(burnDay(fc, date, ctx.input, params.burnWindow, ctx.nowMs).decision);
      break;
    case 'rake-till':
      if (sprayEff && ctx.input.method === 'prepared-seedbed') out.push(killWaitRespected(sprayEff, params.killWait.killWaitDays, date));
      break;
    case 'lime':
      if (key === 'lime') out.push(limeTiming(date, ctx.input.targetSeedDate, params.limeTiming).decision);
      break;
    case 'seed': {
      if (sprayEff && ctx.input.method === 'prepared-seedbed') out.push(killWaitRespected(sprayEff, params.killWait.killWaitDays, date));
      if (sprayEff && ctx.input.method === 'spray-and-seed') {
        const gap = daysBetween(sprayEff, date);
        const max = params.sequence.maxSprayToSeedDays;
        const waits = plantBackOutlasts(ctx);
        out.push({
          rule: 'sequence',
          ok: gap >= 0 && (waits || gap <= max),
          reason:
            gap < 0
              ? `before spraying (${shortDay(sprayEff)})`
              : `${gap === 0 ? 'the day of spraying' : `${gap} day${gap === 1 ? '' : 's'} after spraying`}; ${waits ? 'the plant-back sets the gap' : `spray-and-seed seeds within ${max} days`}`,
        });
      }
      if (sprayEff && ctx.plantBack) out.push(plantBackDecision(sprayEff, ctx.plantBack, date));
      out.push(soilTemperatureOn(fc, date, ctx.profile, params.soilTemperature).decision);
      out.push(fc && covered ? seedBeforeRain(fc, date, params.seedBeforeRain).decision : noForecast('seed-before-rain', 'Sowcast places seeding ahead of rain once the forecast reaches it'));
      out.push(frostDeadlineOn(date, ctx.frost, params.frostDeadline).decision);
      break;
    }
    case 'frost-seed':
      out.push(fc && covered ? frozenGroundOn(fc, date, params.frozenGround).decision : noForecast('frozen-ground', 'broadcast on a frozen morning'));
      break;
    case 'fertilize':
      if (workedIn(ctx, date)) {
        const washout = fc && covered ? fertilizeBeforeRain(fc, date, params.fertilizeBeforeRain).washout : false;
        out.push({ rule: 'fertilize-before-rain', ok: !washout, reason: 'worked into the seedbed by the final pass, so it does not wait on rain' });
      } else {
        out.push(
          fc && covered
            ? fertilizeBeforeRain(fc, date, params.fertilizeBeforeRain, carriesNitrogen(ctx)).decision
            : noForecast('fertilize-before-rain', carriesNitrogen(ctx) ? 'spread just before a good rain (0.5 in or more)' : 'spread ahead of a soaking rain'),
        );
      }
      break;
    case 'check-germination': {
      const seedKey = has(ctx, 'frost-seed') ? 'frost-seed' : 'seed';
      const seedEff = effective(ctx, seedKey);
      if (seedEff) {
        const g = germination(ctx, seedEff);
        out.push(
          date >= g.date
            ? g.decision
            : { rule: 'germination-check', ok: false, reason: `too early: seedlings are expected about ${dayWithMonth(g.date)} (${g.decision.reason})` },
        );
      }
      break;
    }
    default:
      break;
  }
  return out;
}

/** The average last spring frost on or after a date (frost seeding in late winter looks to the coming spring). */
function nextLastSpringFrost(monthDay: string | null, from: string): string | null {
  if (!monthDay) return null;
  const year = Number(from.slice(0, 4));
  const thisYear = monthDayInYear(monthDay, year);
  return thisYear >= from ? thisYear : monthDayInYear(monthDay, year + 1);
}

function germination(ctx: Ctx, seedDate: string) {
  const { input } = ctx;
  return germinationCheck({
    seedDate,
    fc: ctx.fc,
    profile: ctx.profile,
    params: ctx.params.germinationCheck,
    soak: ctx.params.seedBeforeRain,
    frostSeeding: input.method === 'frost-seeding',
    lastSpringFrost: nextLastSpringFrost(input.avgLastSpringFrost, seedDate),
    texture: input.soilTexture ?? 'loam',
    latitudeDeg: input.latitudeDeg,
  });
}

const carriesNitrogen = (ctx: Ctx) => (ctx.input.fertilizer?.grade[0] ?? 0) > 0;

/** Prepared seedbed: fertilizer spread on or before the planned ground work is mixed in by it. */
function workedIn(ctx: Ctx, date: string): boolean {
  const till = ctx.placed.get('rake-till');
  return ctx.input.method === 'prepared-seedbed' && !!till && till.status !== 'skipped' && date <= (effective(ctx, 'rake-till') ?? till.date);
}

// ——— the steps ————————————————————————————————————————————————————————————————

function defaults(ctx: Ctx) {
  const { input, params } = ctx;
  const seq = params.sequence;
  const target = input.targetSeedDate;
  let spray: string;
  if (input.method === 'prepared-seedbed') {
    const groundReady = burns(input) ? addDays(target, -seq.burnBeforeSeedDays) : target;
    spray = addDays(groundReady, -params.killWait.killWaitDays);
  } else spray = addDays(target, -seq.sprayToSeedDays);
  return {
    target,
    spray,
    burn: addDays(target, -seq.burnBeforeSeedDays),
    clear: addDays(has(ctx, 'spray') ? spray : target, -clearLeadDays(ctx)),
    soilTest: addDays(target, -soilTestLeadDays(ctx)),
  };
}

/** With lime planned, the soil test goes early enough for the lab's numbers and six months of lime. */
function soilTestLeadDays(ctx: Ctx): number {
  const lime = ctx.params.limeTiming;
  return ctx.input.lime ? Math.max(ctx.params.sequence.soilTestLeadDays, lime.idealLeadDays + lime.labTurnaroundDays) : ctx.params.sequence.soilTestLeadDays;
}

function placeSoilTest(ctx: Ctx, d: ReturnType<typeof defaults>): void {
  place(ctx, 'soil-test', () => {
    const date = maxDate(ctx.today, anchorOf(ctx, 'soil-test', d.soilTest));
    const lead = daysBetween(date, d.target);
    const lime = ctx.params.limeTiming;
    const warnings =
      ctx.input.lime && lead < lime.minLeadDays + lime.labTurnaroundDays
        ? [`Only ${Math.max(0, lead)} days before seeding: lime works slowly, so it may not reach its full effect by then.`]
        : [];
    return {
      date,
      reason: `test ahead of seeding so lime and fertilizer follow the soil's numbers; lime works over months, so the earlier the better`,
      warnings,
    };
  });
}

/** Days from clearing to spraying: a saw on woody brush holds nothing back; mowing waits for regrowth. */
function clearLeadDays(ctx: Ctx): number {
  const seq = ctx.params.sequence;
  return clearingBy(ctx.input) === 'mowing' && has(ctx, 'spray') ? seq.mowRegrowthDays : seq.clearBeforeSprayDays;
}

function placeClear(ctx: Ctx, d: ReturnType<typeof defaults>): void {
  const days = clearLeadDays(ctx);
  const ahead = `${days} day${days === 1 ? '' : 's'} ahead of the planned ${has(ctx, 'spray') ? 'spraying' : 'seeding'}`;
  place(ctx, 'clear-brush', () => ({
    date: maxDate(ctx.today, anchorOf(ctx, 'clear-brush', d.clear)),
    reason:
      clearingBy(ctx.input) === 'chainsaw'
        ? `cut the woody brush ${ahead}; cutting stems takes none of the leaves the spray must wet, so it does not hold the spraying back`
        : has(ctx, 'spray')
          ? `mow ${ahead}: mowed weeds must regrow to the label's stage before a systemic burndown moves down to the roots`
          : `mow ${ahead}`,
  }));
}

function sprayEarliest(ctx: Ctx): string {
  const clear = effective(ctx, 'clear-brush');
  return maxDate(ctx.today, clear ? addDays(clear, clearLeadDays(ctx)) : null);
}

function sprayTier(ctx: Ctx, date: string): { tier: number; day: SprayDay | null } | null {
  if (!ctx.spray || !inHorizon(ctx.fc, date)) return { tier: 0, day: null };
  const day = sprayDay(ctx.spray, date);
  if (day.level === 'none') return null;
  return { tier: day.level === 'good' ? 0 : 1, day };
}

function sprayPlacement(ctx: Ctx, date: string, outcome: Choice<unknown>['outcome'], window: { earliest: string; latest: string }): Placement {
  const warnings: string[] = [];
  let hours: Placement['hours'] = null;
  let reason: string;
  if (ctx.spray && inHorizon(ctx.fc, date)) {
    const day = sprayDay(ctx.spray, date);
    hours = day.hours;
    reason = day.decision.reason;
    if (day.level === 'none') warnings.push(`No spray window on ${shortDay(date)}: ${day.decision.reason}.`);
  } else if (outcome === 'beyond') {
    reason = `no spray window in the forecast through ${through(ctx)}; placed on the first day past it, to be checked as the forecast extends`;
  } else {
    reason = `planned date; ${outsideWords(ctx, date)} — the spray window is checked once it does`;
  }
  if (!ctx.input.herbicide) warnings.push('No herbicide chosen yet: add the product and its label rate to get the mix.');
  else if (!ctx.input.sprayer) warnings.push('No sprayer recorded: add the tank size and spray volume to get the fills.');
  return { date, window, hours, reason, warnings };
}

/** Prepared seedbed: the burndown goes on the best spray day near its planned date. */
function placeSprayAlone(ctx: Ctx, d: ReturnType<typeof defaults>): void {
  place(ctx, 'spray', () => {
    const seq = ctx.params.sequence;
    const hardEarliest = sprayEarliest(ctx);
    const center = maxDate(hardEarliest, d.spray);
    const earliest = maxDate(hardEarliest, addDays(center, -seq.sprayMoveEarlierDays));
    const latest = addDays(center, seq.sprayMoveLaterDays);
    const base = clampDate(anchorOf(ctx, 'spray', center), earliest, latest);
    const choice = chooseDay(ctx, earliest, latest, base, (date) => {
      const t = sprayTier(ctx, date);
      return t ? { tier: t.tier, secondary: 0, extra: null } : null;
    });
    return sprayPlacement(ctx, choice.date, choice.outcome, { earliest, latest });
  });
}

function placeKillWait(ctx: Ctx): void {
  place(ctx, 'kill-wait', () => {
    const spray = effective(ctx, 'spray');
    const days = ctx.params.killWait.killWaitDays;
    if (!spray) {
      return { date: maxDate(ctx.today, anchorOf(ctx, 'kill-wait', ctx.today)), reason: 'spraying was skipped, so there is no kill wait to count' };
    }
    const end = killWaitEnd(spray, days);
    const decision = killWaitDecision(spray, days, ctx.placed.get('spray')?.status === 'done');
    const date = maxDate(ctx.today, end);
    return {
      date,
      window: { earliest: spray, latest: end },
      reason: `${end < ctx.today ? `${decision.reason}; it is over — work the ground when ready` : decision.reason}${ctx.killWaitNote ? ` (${ctx.killWaitNote})` : ''}`,
    };
  });
}

function placeBurn(ctx: Ctx, d: ReturnType<typeof defaults>): void {
  place(ctx, 'burn', () => {
    const hardEarliest = maxDate(ctx.today, predecessorsLatest(ctx, 'burn'));
    const center = maxDate(hardEarliest, d.burn);
    const latest = addDays(center, ctx.params.sequence.burnMoveLaterDays);
    const base = clampDate(anchorOf(ctx, 'burn', center), hardEarliest, latest);
    const fc = ctx.fc;
    const choice = chooseDay(ctx, hardEarliest, latest, base, (date) => (fc && burnDay(fc, date, ctx.input, ctx.params.burnWindow, ctx.nowMs).ok ? { tier: 0, secondary: 0, extra: null } : null));
    let hours: Placement['hours'] = null;
    let reason: string;
    const warnings: string[] = [];
    if (fc && inHorizon(fc, choice.date)) {
      const day = burnDay(fc, choice.date, ctx.input, ctx.params.burnWindow, ctx.nowMs);
      hours = day.hours;
      reason = day.decision.reason;
      if (!day.ok) warnings.push(`No burn window on ${shortDay(choice.date)}.`);
    } else if (choice.outcome === 'beyond') {
      reason = `no burn window in the forecast through ${through(ctx)}; placed on the first day past it; check local burn rules`;
    } else reason = `after the kill wait; ${outsideWords(ctx, choice.date)} — check humidity, wind and local burn rules on the day`;
    return { date: choice.date, window: { earliest: hardEarliest, latest }, hours, reason, warnings };
  });
}

/** spray-and-seed: the best spray day in the days before (or on) a seeding day. */
function sprayOptionsFor(ctx: Ctx, seedDate: string): { date: string; tier: number }[] | null {
  const seq = ctx.params.sequence;
  const first = maxDate(sprayEarliest(ctx), addDays(seedDate, -seq.maxSprayToSeedDays));
  const preferred = clampDate(addDays(seedDate, -seq.sprayToSeedDays), first, seedDate);
  const options: { date: string; tier: number; distance: number }[] = [];
  for (let date = first; date <= seedDate; date = addDays(date, 1)) {
    const t = sprayTier(ctx, date);
    if (t) options.push({ date, tier: t.tier, distance: Math.abs(daysBetween(preferred, date)) });
  }
  if (!options.length) return null;
  // Best window, then nearest the usual gap, then closer to the seeding (the cover is fresher).
  options.sort((a, b) => a.tier - b.tier || a.distance - b.distance || (a.date < b.date ? 1 : -1));
  return options;
}

function seedingWindow(ctx: Ctx, key: 'seed' | 'frost-seed', hardEarliest: string, hardLatest: string | null) {
  const seq = ctx.params.sequence;
  const target = ctx.input.targetSeedDate;
  const early = key === 'seed' ? seq.seedMoveEarlierDays : seq.frostSeedMoveDays;
  const late = key === 'seed' ? seq.seedMoveLaterDays : seq.frostSeedMoveDays;
  let center = maxDate(hardEarliest, target);
  if (hardLatest && center > hardLatest) center = maxDate(hardEarliest, hardLatest);
  const earliest = maxDate(hardEarliest, addDays(center, -early));
  let softLatest = addDays(center, late);
  if (hardLatest && softLatest > hardLatest) softLatest = maxDate(earliest, hardLatest);
  const fallLatest = key === 'seed' ? ctx.frost.fallLatest : null;
  // The fall deadline caps how far the weather may push seeding; it never pulls a planned date in by itself.
  const latest = fallLatest && fallLatest >= earliest && fallLatest < softLatest ? fallLatest : softLatest;
  const base = clampDate(anchorOf(ctx, key, center), earliest, softLatest);
  return { earliest, latest: latest < base ? base : latest, base, center };
}

function placeSeeding(ctx: Ctx, key: 'seed' | 'frost-seed', hardEarliest: string, hardLatest: string | null, coupled: boolean): void {
  place(ctx, key, () => {
    const { fc, params, profile } = ctx;
    const springEarliest = key === 'seed' ? ctx.frost.springEarliest : null;
    const earliestHard = maxDate(hardEarliest, springEarliest);
    const w = seedingWindow(ctx, key, earliestHard, hardLatest);
    const choice = chooseDay(ctx, w.earliest, w.latest, w.base, (date) => {
      if (key === 'frost-seed') {
        const f = frozenGroundOn(fc as ForecastIndex, date, params.frozenGround);
        return { tier: f.freezeThaw ? 0 : 2, secondary: 0, extra: null };
      }
      const soil = soilTemperatureOn(fc, date, profile, params.soilTemperature);
      if (soil.level === 'cold') return null;
      const rain = seedBeforeRain(fc as ForecastIndex, date, params.seedBeforeRain);
      if (rain.washout) return null;
      // spray-and-seed: a seeding day counts only with a spray window in the days before it.
      let sprayTierValue = 0;
      if (coupled) {
        const options = sprayOptionsFor(ctx, date);
        if (!options) return null;
        sprayTierValue = options[0].tier;
      }
      return { tier: (rain.qualifies ? 0 : 2) + sprayTierValue, secondary: soil.level === 'optimum' ? 0 : 1, extra: null };
    });
    const whyNotOn = (day: string): string => {
      const soil = soilTemperatureOn(fc, day, profile, params.soilTemperature);
      if (soil.level === 'cold') return soil.summary;
      const rain = fc && inHorizon(fc, day) ? seedBeforeRain(fc, day, params.seedBeforeRain) : null;
      if (rain?.washout) return rain.summary;
      if (coupled && !sprayOptionsFor(ctx, day)) return `no spray window in the ${params.sequence.maxSprayToSeedDays} days before`;
      return 'outside the window';
    };
    const date = choice.date;
    const warnings: string[] = [];
    let reason: string;
    if (key === 'frost-seed') {
      const f = fc && inHorizon(fc, date) ? frozenGroundOn(fc, date, params.frozenGround) : null;
      reason = f
        ? f.freezeThaw
          ? `broadcast on the frozen morning: ${f.decision.reason}`
          : `no freeze-thaw day in the forecast near the planned date (${f.decision.reason}); broadcast early while the ground is firm`
        : `late-winter frost seeding; ${outsideWords(ctx, date)} — broadcast on a morning when the ground is frozen`;
    } else {
      const soil = soilTemperatureOn(fc, date, profile, params.soilTemperature);
      const rain = fc && inHorizon(fc, date) ? seedBeforeRain(fc, date, params.seedBeforeRain) : null;
      const frost = frostDeadlineOn(date, ctx.frost, params.frostDeadline);
      if (frost.warning) {
        warnings.push(frost.warning);
        if (!frost.decision.ok) ctx.planWarnings.push(frost.warning);
      }
      if (springEarliest && ctx.input.targetSeedDate < springEarliest && date >= springEarliest) {
        warnings.push(`The target date ${dayWithMonth(ctx.input.targetSeedDate)} is before ${dayWithMonth(springEarliest)}, the earliest safe date for frost-tender seed.`);
      }
      if (choice.outcome === 'outside') {
        reason = `planned date; ${outsideWords(ctx, date)} — Sowcast moves seeding ahead of rain once it does`;
      } else if (choice.outcome === 'beyond') {
        reason = `no day in the forecast through ${through(ctx)} has the soil warm enough and no washout; placed on the first day past it, to be checked as the forecast extends`;
        warnings.push(`No seeding day fits in the forecast through ${through(ctx)}; Sowcast re-checks as the forecast extends.`);
      } else if (rain?.qualifies) {
        reason = `${rain.summary}; ${soil.summary}`;
      } else if (date === w.base) {
        reason = `no soaking rain (${inchesPrecise(ctx.params.seedBeforeRain.soakingRainMm)} or more) in the forecast through ${through(ctx)}, so the planned date stays; ${soil.summary}`;
      } else {
        reason = `the nearest day that fits (${whyNotOn(w.base)} on ${shortDay(w.base)}); no soaking rain in the forecast through ${through(ctx)}; ${soil.summary}`;
      }
    }
    return { date, window: { earliest: w.earliest, latest: w.latest }, reason, warnings };
  });
}

function placeSprayForSeed(ctx: Ctx): void {
  place(ctx, 'spray', () => {
    const seed = effective(ctx, 'seed') ?? ctx.placed.get('seed')?.date ?? ctx.input.targetSeedDate;
    const seq = ctx.params.sequence;
    const earliest = maxDate(sprayEarliest(ctx), addDays(seed, -seq.maxSprayToSeedDays));
    const window = { earliest, latest: maxDate(earliest, seed) };
    const options = sprayOptionsFor(ctx, seed);
    if (options) {
      const p = sprayPlacement(ctx, options[0].date, 'chosen', window);
      const gap = daysBetween(options[0].date, seed);
      const when = gap === 0 ? 'the morning of seeding' : `${gap} day${gap === 1 ? '' : 's'} before seeding`;
      return { ...p, reason: inHorizon(ctx.fc, options[0].date) ? `${when}: ${p.reason}` : `${when}; ${outsideWords(ctx, options[0].date)} — the spray window is checked once it does` };
    }
    const fallback = clampDate(addDays(seed, -seq.sprayToSeedDays), window.earliest, window.latest);
    const p = sprayPlacement(ctx, fallback, 'chosen', window);
    return { ...p, warnings: [...(p.warnings ?? []), `No spray window in the ${seq.maxSprayToSeedDays} days before seeding; spray when wind and rain allow.`] };
  });
}

/**
 * Lime goes on months before the planned seeding (not the weather-moved one: it does not follow the seeding
 * around), as soon as the soil test allows; on a prepared seedbed no later than the planned seeding, so the
 * seedbed work mixes it in. A split rate puts half here and half later (placeLimeSecond).
 */
function placeLime(ctx: Ctx): void {
  place(ctx, 'lime', () => {
    const { input, params } = ctx;
    const timing = params.limeTiming;
    const target = input.targetSeedDate;
    const soilTest = effective(ctx, 'soil-test');
    const hardEarliest = maxDate(ctx.today, predecessorsLatest(ctx, 'lime'));
    let desired = maxDate(addDays(target, -timing.idealLeadDays), soilTest ? addDays(soilTest, timing.labTurnaroundDays) : null);
    if (input.method === 'prepared-seedbed' && desired > target) desired = target;
    const date = maxDate(hardEarliest, desired);
    const verdict = limeTiming(date, target, timing);
    const tons = (input.lime as { tonsPerAcre: number }).tonsPerAcre;
    const split = limeSplit(tons, timing);
    const how =
      input.method === 'prepared-seedbed'
        ? 'spread it and disk it in if you can; the seedbed work mixes it in further'
        : 'spread it on the surface, where it works down slowly';
    const reason = split.split ? `${verdict.summary}; ${how} — the first half: ${split.why}` : `${verdict.summary}; ${how}`;
    return {
      date,
      reason,
      warnings: verdict.warning ? [verdict.warning] : [],
      quantities: limeQuantities({ acres: input.acres, lime: { ...(input.lime as NonNullable<PlantingInput['lime']>), tonsPerAcre: split.halfTonsPerAcre } }),
    };
  });
}

/** The second half of a split rate: with the seedbed work on a prepared seedbed, six months on elsewhere. */
function placeLimeSecond(ctx: Ctx, groundWork: string | null): void {
  place(ctx, 'lime-second', () => {
    const { input, params } = ctx;
    const split = limeSplit((input.lime as { tonsPerAcre: number }).tonsPerAcre, params.limeTiming);
    const first = effective(ctx, 'lime') ?? (ctx.placed.get('lime') as PlanStep).date;
    const quantities = limeQuantities({ acres: input.acres, lime: { ...(input.lime as NonNullable<PlantingInput['lime']>), tonsPerAcre: split.halfTonsPerAcre } });
    if (groundWork) {
      const date = maxDate(ctx.today, predecessorsLatest(ctx, 'lime-second'), groundWork);
      return {
        date,
        quantities,
        reason: `the second half (${split.why}): spread it before the final seedbed pass (${shortDay(date)}) and disk it in`,
      };
    }
    const date = maxDate(ctx.today, predecessorsLatest(ctx, 'lime-second'), surfaceSecondHalfDate(first, params.limeTiming));
    return {
      date,
      quantities,
      reason: `the second half (${split.why}): about six months after the first (${dayWithMonth(first)}), on the surface`,
    };
  });
}

/** Steps tied to the seeding day: worked ground, seed covered, fertilizer spread with it. */
function placeTied(ctx: Ctx, key: string, desired: string, reason: string, warnings: string[] = []): void {
  place(ctx, key, () => ({ date: maxDate(ctx.today, predecessorsLatest(ctx, key), desired), reason, warnings }));
}

function placeFertilizeAhead(ctx: Ctx, context: string): void {
  place(ctx, 'fertilize', () => {
    const p = ctx.params.fertilizeBeforeRain;
    const hardEarliest = maxDate(ctx.today, predecessorsLatest(ctx, 'fertilize'));
    const latest = addDays(hardEarliest, p.searchDays);
    const base = clampDate(anchorOf(ctx, 'fertilize', hardEarliest), hardEarliest, latest);
    const fc = ctx.fc;
    const nitrogen = carriesNitrogen(ctx);
    const choice = chooseDay(ctx, hardEarliest, latest, base, (date) => {
      const v = fertilizeBeforeRain(fc as ForecastIndex, date, p, nitrogen);
      return v.washout ? null : { tier: v.qualifies ? 0 : 2, secondary: 0, extra: v };
    });
    const v = fc && inHorizon(fc, choice.date) ? fertilizeBeforeRain(fc, choice.date, p, nitrogen) : null;
    const reason =
      choice.outcome === 'outside'
        ? `${context}; ${outsideWords(ctx, choice.date)} — spread ${nitrogen ? 'just before a good rain (0.5 in or more in one rain carries urea nitrogen in)' : 'ahead of a soaking rain'}`
        : choice.outcome === 'beyond'
          ? `${context}; heavy rain through ${through(ctx)}, so placed on the first day past the forecast`
          : v?.qualifies
            ? `${context}; ${v.summary}`
            : `${context}; ${v ? v.summary : 'no rain forecast'}, so it stays on the first suitable day`;
    return { date: choice.date, window: { earliest: hardEarliest, latest }, reason, warnings: fertilizerWarnings(ctx) };
  });
}

function fertilizerWarnings(ctx: Ctx): string[] {
  const n = ctx.input.fertilizer?.target.n ?? 0;
  return n > 0 && legumeOnly(ctx.input.blend) ? [legumeNitrogenWarning(n)] : [];
}

function placeCheck(ctx: Ctx): void {
  place(ctx, 'check-germination', () => {
    const seedKey = has(ctx, 'frost-seed') ? 'frost-seed' : 'seed';
    const seed = effective(ctx, seedKey) ?? ctx.placed.get(seedKey)?.date ?? ctx.input.targetSeedDate;
    const g = germination(ctx, seed);
    const date = maxDate(ctx.today, predecessorsLatest(ctx, 'check-germination'), g.date);
    return { date, window: null, reason: g.decision.reason, warnings: g.warnings };
  });
}

function placeUpkeep(ctx: Ctx): void {
  if (!ctx.input.upkeep) return;
  const standFrom = effective(ctx, 'check-germination') ?? ctx.placed.get('check-germination')?.date;
  if (!standFrom) return;
  const specs = upkeepSpecs({
    standFrom,
    soilTestDate: effective(ctx, 'soil-test'),
    blend: ctx.input.blend,
    avgLastSpringFrost: ctx.input.avgLastSpringFrost,
    timeZone: ctx.input.timeZone,
    params: ctx.params.upkeep,
    today: ctx.today,
  });
  for (const spec of specs) {
    const after = ['check-germination'];
    ctx.templates.set(spec.key, { key: spec.key, kind: spec.kind, after });
    ctx.order.push(spec.key);
    const fixed = fixedPrior(ctx, spec.key);
    if (fixed) {
      keepFixed(ctx, spec.key, fixed, after);
      continue;
    }
    commit(
      ctx,
      spec.key,
      spec.kind,
      {
        date: spec.date,
        reason: spec.reason,
        rules: [spec.decision],
        recurrence: spec.recurrence,
        quantities: spec.parts ? seedQuantities(spec.parts, ctx.input.acres, 'frost-seeding', ctx.input.seedBagLb ?? DEFAULT_SEED_BAG_LB) : [],
      },
      after,
    );
  }
}

function schedule(ctx: Ctx): void {
  const d = defaults(ctx);
  const { input } = ctx;
  placeSoilTest(ctx, d);
  placeClear(ctx, d);
  placeLime(ctx);
  if (input.method === 'frost-seeding') {
    placeSeeding(ctx, 'frost-seed', ctx.today, null, false);
    placeLimeSecond(ctx, null);
    placeCheck(ctx);
    placeFertilizeAhead(ctx, 'once the stand is up');
  } else if (input.method === 'spray-and-seed' && plantBackOutlasts(ctx)) {
    if (has(ctx, 'spray')) placeSprayAlone(ctx, d);
    const sprayEff = effective(ctx, 'spray');
    const hardEarliest = maxDate(
      ctx.today,
      sprayEff ? plantBackEnd(sprayEff, ctx.plantBack as PlantBack) : null,
      has(ctx, 'spray') ? null : effective(ctx, 'clear-brush'),
    );
    placeSeeding(ctx, 'seed', hardEarliest, null, false);
    notePlantBack(ctx);
    placeSprayAndSeedRest(ctx);
  } else if (input.method === 'spray-and-seed') {
    const sprayFixed = has(ctx, 'spray') ? fixedPrior(ctx, 'spray') : null;
    if (sprayFixed) keepFixed(ctx, 'spray', sprayFixed);
    const sprayEff = effective(ctx, 'spray');
    const hardEarliest = sprayEff ? maxDate(ctx.today, sprayEff) : has(ctx, 'spray') ? sprayEarliest(ctx) : maxDate(ctx.today, predecessorsLatest(ctx, 'seed', ['clear-brush']));
    const hardLatest = sprayEff ? maxDate(hardEarliest, addDays(sprayEff, ctx.params.sequence.maxSprayToSeedDays)) : null;
    placeSeeding(ctx, 'seed', hardEarliest, hardLatest, has(ctx, 'spray') && !sprayFixed);
    if (has(ctx, 'spray') && !sprayFixed) placeSprayForSeed(ctx);
    placeSprayAndSeedRest(ctx);
  } else {
    if (has(ctx, 'spray')) placeSprayAlone(ctx, d);
    placeKillWait(ctx);
    placeBurn(ctx, d);
    const burnt = effective(ctx, 'burn');
    const hardEarliest = maxDate(
      ctx.today,
      burnt ? addDays(burnt, ctx.params.sequence.burnBeforeSeedDays) : null,
      effective(ctx, 'kill-wait'),
      has(ctx, 'spray') ? null : effective(ctx, 'clear-brush'),
      effective(ctx, 'lime'),
      fixedEffective(ctx, 'lime-second'),
      fixedEffective(ctx, 'fertilize'),
      fixedEffective(ctx, 'rake-till'),
      effective(ctx, 'spray') && ctx.plantBack ? plantBackEnd(effective(ctx, 'spray') as string, ctx.plantBack) : null,
    );
    placeSeeding(ctx, 'seed', hardEarliest, null, false);
    notePlantBack(ctx);
    const seedStep = ctx.placed.get('seed') as PlanStep;
    const seed = effective(ctx, 'seed') ?? seedStep.date;
    placeTied(ctx, 'rake-till', seed, `work the ground the day of seeding (${shortDay(seed)}) so the seed meets fresh soil; the pass mixes in the lime and fertilizer spread before it`);
    const groundWork = effective(ctx, 'rake-till') ?? ctx.placed.get('rake-till')?.date ?? seed;
    if (has(ctx, 'lime-second')) placeLimeSecond(ctx, groundWork);
    if (has(ctx, 'fertilize')) {
      if (seedStep.status === 'planned') {
        const worked = has(ctx, 'rake-till') ? 'so the final seedbed pass works it in (phosphorus and potassium barely move from where they land)' : 'and cover it with the seed';
        placeTied(ctx, 'fertilize', groundWork, `spread before the seedbed work (${shortDay(groundWork)}) ${worked}`, fertilizerWarnings(ctx));
      } else placeFertilizeAhead(ctx, 'after the seeding');
    }
    placeTied(ctx, 'cover-seed', seed, `right after broadcasting (${shortDay(seed)}), ${coverPurpose(ctx.input.blend)}`);
    placeCheck(ctx);
  }
  placeUpkeep(ctx);
}

/** spray-and-seed after the seeding is placed: lime with the spraying, the seed covered, the stand checked and fed. */
function placeSprayAndSeedRest(ctx: Ctx): void {
  placeLimeSecond(ctx, null);
  const seed = effective(ctx, 'seed') ?? (ctx.placed.get('seed') as PlanStep).date;
  placeTied(ctx, 'cover-seed', seed, `right after broadcasting (${shortDay(seed)}), ${coverPurpose(ctx.input.blend)}`);
  placeCheck(ctx);
  placeFertilizeAhead(ctx, 'once the stand is up (after the germination check)');
}

/** When the plant-back holds the seeding past its target date, the seeding says so, naming the active and the days. */
function notePlantBack(ctx: Ctx): void {
  const pb = ctx.plantBack;
  const seed = ctx.placed.get('seed');
  const spray = effective(ctx, 'spray');
  if (!pb || !seed || !spray || seed.status !== 'planned' || seed.pinned) return;
  const end = plantBackEnd(spray, pb);
  const target = ctx.input.targetSeedDate;
  if (target >= end) return;
  seed.reason = `held until the plant-back ends ${dayWithMonth(end)}: ${plantBackWords(pb)}; ${seed.reason}`;
  const moved = seed.date !== target ? `Seeding moved from ${dayWithMonth(target)} to ${dayWithMonth(seed.date)}: ` : '';
  const warning = plantBackOutlasts(ctx)
    ? `${moved}${sprayAndSeedConflict(pb, ctx.params.sequence.maxSprayToSeedDays)}`
    : `${moved}${plantBackWords(pb)}, and spraying is on ${dayWithMonth(spray)}. To keep the seeding date, spray at least ${pb.days} days before it.`;
  seed.warnings = [...seed.warnings, warning];
  ctx.planWarnings.push(warning);
}

/** Belt and braces: no planned step before today or before a step it follows. */
function enforceOrder(ctx: Ctx): void {
  for (const key of ctx.order) {
    const step = ctx.placed.get(key);
    if (!step || step.status !== 'planned' || step.pinned) continue;
    const lower = maxDate(ctx.today, predecessorsLatest(ctx, key));
    if (step.date < lower) {
      step.date = lower;
      step.warnings = [...step.warnings, `Moved to ${dayWithMonth(lower)} to follow the steps before it.`];
    }
  }
}

/** Once every step has its date, each planned step's rules are read again on that date, so a step placed
 *  before its predecessors (a seeding before its till) still lists them. */
function explain(ctx: Ctx): void {
  for (const step of ctx.placed.values()) {
    if (step.status !== 'planned' || step.recurrence) continue;
    step.rules = decisionsOn(ctx, step.key, step.kind, step.date, step.after);
    if (step.pinned) step.warnings = step.rules.filter((r) => !r.ok).map((r) => `Pinned on ${shortDay(step.date)}: ${r.reason}.`);
  }
}

function finish(ctx: Ctx): Plan {
  enforceOrder(ctx);
  explain(ctx);
  const index = new Map(ctx.order.map((k, i) => [k, i]));
  const steps = [...ctx.placed.values()].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : (index.get(a.key) ?? 0) - (index.get(b.key) ?? 0)));
  const warnings = [...new Set(ctx.planWarnings)];
  const readyBy = ctx.input.readyBy;
  const check = ctx.placed.get('check-germination');
  if (readyBy && check && check.date > readyBy) {
    warnings.push(`The stand may not be up by ${dayWithMonth(readyBy)}: seedlings are expected about ${dayWithMonth(check.date)}.`);
  }
  return { steps, warnings, forecastThrough: ctx.fc?.lastDate ?? null };
}

// ——— entry points ————————————————————————————————————————————————————————————

export function planPlanting(input: PlantingInput, forecast: Forecast | null, now: Date): Plan {
  assertPlantingInput(input);
  const ctx = buildContext(input, forecast, localDateOf(now, input.timeZone), now.getTime(), null);
  schedule(ctx);
  return finish(ctx);
}

const WEATHER_KINDS: StepKind[] = ['spray', 'burn', 'seed', 'fertilize', 'frost-seed'];

function moveReason(ctx: Ctx, old: PlanStep, step: PlanStep): string {
  const [from, to] = dayPair(old.date, step.date);
  let reason = `moved ${STEP_KINDS[step.kind].noun} from ${from} to ${to}: ${step.reason}`;
  if (WEATHER_KINDS.includes(step.kind) && inHorizon(ctx.fc, old.date)) {
    const failing = decisionsOn(ctx, step.key, step.kind, old.date).filter((r) => !r.ok && r.rule !== 'sequence');
    if (failing.length) reason += ` — on ${from}: ${failing.map((r) => r.reason).join('; ')}`;
  }
  return reason;
}

export function replan(input: PlantingInput, current: Plan, forecast: Forecast, now: Date): { plan: Plan; changes: StepChange[] } {
  assertPlantingInput(input);
  const issues = planIssues(current);
  if (issues.length) throw new PlanInputError(issues);
  const ctx = buildContext(input, forecast, localDateOf(now, input.timeZone), now.getTime(), current.steps);
  schedule(ctx);
  const plan = finish(ctx);
  const changes: StepChange[] = [];
  for (const step of plan.steps) {
    const old = ctx.prior.get(step.key);
    if (old && old.date !== step.date) {
      changes.push({ key: step.key, kind: step.kind, from: old.date, to: step.date, reason: moveReason(ctx, old, step) });
    }
  }
  return { plan, changes };
}

/**
 * The rules' verdicts on putting one step of a plan on a given day — what the calendar shows when a
 * person drags a step ("no rain in sight; soil 44 °F, below the 45 °F minimum for white clover").
 * `now` bounds what may be carried along (nothing goes before today); without it, nothing carried goes
 * before the dragged day or the carried step's current date, whichever is earlier.
 */
export function checkStepDate(input: PlantingInput, plan: Plan, stepKey: string, date: string, forecast: Forecast | null, now?: Date): RuleDecision[] {
  const step = plan.steps.find((s) => s.key === stepKey);
  if (!step) throw new Error(`The plan has no step "${stepKey}".`);
  const spray = plan.steps.find((s) => s.key === 'spray');
  const floor = spray && spray.date < date ? spray.date : date;
  const today = now ? localDateOf(now, input.timeZone) : floor;
  const ctx = buildContext(input, forecast, today, now ? now.getTime() : null, plan.steps);
  for (const s of plan.steps) {
    ctx.placed.set(s.key, s);
    if (!ctx.templates.has(s.key)) ctx.templates.set(s.key, { key: s.key, kind: s.kind, after: s.after });
  }
  const carried = carrySprayWithSeeding(ctx, step, date);
  const decisions = decisionsOn(ctx, stepKey, step.kind, date, untiedPredecessors(plan, step));
  return carried ? [...decisions, carried] : decisions;
}

/**
 * The spray a dragged spray-and-seed seeding takes along. The burndown goes on right before the seed, into
 * cover that is still standing (methods.ts), so a planned spray nobody pinned follows the seeding to the
 * new day, placed the way placeSprayForSeed places it — the replan after the move puts it there. A done or
 * pinned spray stays, and the seeding is judged against it. Returns the verdict on the carried spray (and
 * places it in `ctx`, so the seeding's own sequence reads against the new spray date), or null when
 * nothing is carried.
 */
function carrySprayWithSeeding(ctx: Ctx, step: PlanStep, date: string): RuleDecision | null {
  if (ctx.input.method !== 'spray-and-seed' || step.kind !== 'seed' || plantBackOutlasts(ctx)) return null;
  const spray = ctx.placed.get('spray');
  if (!spray || spray.status !== 'planned' || spray.pinned) return null;
  const seq = ctx.params.sequence;
  const earliest = maxDate(sprayEarliest(ctx), addDays(date, -seq.maxSprayToSeedDays));
  // No room before the seeding (today, or the brush clearing, is in the way): the spray stays and binds.
  if (earliest > date) return null;
  const options = sprayOptionsFor(ctx, date);
  const to = options ? options[0].date : clampDate(addDays(date, -seq.sprayToSeedDays), earliest, date);
  ctx.placed.set('spray', { ...spray, date: to });
  const gap = daysBetween(to, date);
  const when = gap === 0 ? 'the morning of seeding' : `${gap} day${gap === 1 ? '' : 's'} before seeding`;
  const [from, onto] = dayPair(spray.date, to);
  const moves = spray.date === to ? `spraying stays on ${from}, ${when}` : `spraying moves with it from ${from} to ${onto}, ${when}`;
  if (options) {
    const window = ctx.spray && inHorizon(ctx.fc, to) ? sprayDay(ctx.spray, to).decision : null;
    const decision: RuleDecision = { rule: 'spray-window', ok: true, reason: window ? `${moves}: ${window.reason}` : moves };
    return window?.marginal ? { ...decision, marginal: true } : decision;
  }
  // Only a forecast can rule every day out (sprayTier passes days it does not cover), so ctx.spray is set here.
  const none = sprayDay(ctx.spray as SprayContext, to).decision.reason;
  return { rule: 'spray-window', ok: false, reason: `no spray window in the ${seq.maxSprayToSeedDays} days before seeding — ${none}` };
}

/** Steps that go with the seeding (its ground work and what that pass works in: the fertilizer and a split
 *  lime's second half) move with it when it is dragged; what binds the new day is what they themselves
 *  follow. Lime itself does not: it goes on months ahead, on its own date. Done and pinned ones stay put and
 *  still bind. */
const MOVES_WITH_SEEDING = new Set(['rake-till', 'fertilize', 'lime-second']);

function untiedPredecessors(plan: Plan, step: PlanStep): string[] {
  if (step.kind !== 'seed') return step.after;
  const byKey = new Map(plan.steps.map((s) => [s.key, s]));
  const out = new Set<string>();
  const visit = (key: string) => {
    const s = byKey.get(key);
    if (s && MOVES_WITH_SEEDING.has(key) && s.status === 'planned' && !s.pinned) s.after.forEach(visit);
    else out.add(key);
  };
  step.after.forEach(visit);
  return [...out];
}
