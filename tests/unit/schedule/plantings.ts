// Invented plantings for the schedule tests (no real place: a mid-latitude site on Central time).
import type { Plan, PlanStep, PlantingInput } from '@/lib/schedule/types';

export const ZONE = 'America/Chicago';

export function planting(overrides: Partial<PlantingInput> = {}): PlantingInput {
  return {
    timeZone: ZONE,
    latitudeDeg: 38.6,
    longitudeDeg: -90.2,
    elevationM: 150,
    avgLastSpringFrost: '04-10',
    avgFirstFallFrost: '11-20',
    acres: 1,
    cover: 'tilled',
    season: 'fall',
    method: 'prepared-seedbed',
    blend: [{ speciesId: 'white-clover', share: 1 }],
    targetSeedDate: '2027-09-14',
    coverSeed: false,
    ...overrides,
  };
}

export function step(plan: Plan, key: string): PlanStep {
  const found = plan.steps.find((s) => s.key === key);
  if (!found) throw new Error(`no step ${key} in plan: ${plan.steps.map((s) => s.key).join(', ')}`);
  return found;
}

/** The same plan with one step changed, as the database would hand it back to replan. */
export function withStep(plan: Plan, key: string, change: Partial<PlanStep>): Plan {
  return { ...plan, steps: plan.steps.map((s) => (s.key === key ? { ...s, ...change } : s)) };
}

/** Weekday and day as Intl (ECMA-402) spells them, independent of the engine's own formatting. */
export function intlDay(date: string, withMonth = false): string {
  const d = new Date(`${date}T12:00:00Z`);
  const weekday = new Intl.DateTimeFormat('en-US', { weekday: 'short', timeZone: 'UTC' }).format(d);
  const month = new Intl.DateTimeFormat('en-US', { month: 'short', timeZone: 'UTC' }).format(d);
  return withMonth ? `${weekday} ${d.getUTCDate()} ${month}` : `${weekday} ${d.getUTCDate()}`;
}
