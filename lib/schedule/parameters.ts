// Every default the rules use, in one place, each with its source. A planting may override any of them
// (PlantingInput.parameters); the label and local rules still govern what the numbers cannot know.
import { BURN_WINDOW_DEFAULTS, BURN_WINDOW_SOURCES, type BurnWindowParams } from './rules/burn-window';
import {
  FERTILIZE_BEFORE_RAIN_DEFAULTS,
  FERTILIZE_BEFORE_RAIN_SOURCES,
  type FertilizeBeforeRainParams,
} from './rules/fertilize-before-rain';
import { FROST_DEADLINE_DEFAULTS, FROST_DEADLINE_SOURCES, type FrostDeadlineParams } from './rules/frost-deadline';
import { FROZEN_GROUND_DEFAULTS, FROZEN_GROUND_SOURCES, type FrozenGroundParams } from './rules/frozen-ground';
import { GERMINATION_CHECK_DEFAULTS, GERMINATION_CHECK_SOURCES, type GerminationCheckParams } from './rules/germination-check';
import { KILL_WAIT_DEFAULTS, KILL_WAIT_SOURCES, type KillWaitParams } from './rules/kill-wait';
import { LIME_TIMING_DEFAULTS, LIME_TIMING_SOURCES, type LimeTimingParams } from './rules/lime-timing';
import { SEED_BEFORE_RAIN_DEFAULTS, SEED_BEFORE_RAIN_SOURCES, type SeedBeforeRainParams } from './rules/seed-before-rain';
import { SOIL_TEMPERATURE_DEFAULTS, SOIL_TEMPERATURE_SOURCES, type SoilTemperatureParams } from './rules/soil-temperature';
import { SPRAY_WINDOW_DEFAULTS, SPRAY_WINDOW_SOURCES, type SprayWindowParams } from './rules/spray-window';
import { UPKEEP_DEFAULTS, UPKEEP_SOURCES, type UpkeepParams } from './rules/upkeep';
import { SEQUENCE_DEFAULTS, SEQUENCE_SOURCES, type SequenceParams } from './methods';

export interface ScheduleParameters {
  sequence: SequenceParams;
  sprayWindow: SprayWindowParams;
  killWait: KillWaitParams;
  seedBeforeRain: SeedBeforeRainParams;
  soilTemperature: SoilTemperatureParams;
  frostDeadline: FrostDeadlineParams;
  fertilizeBeforeRain: FertilizeBeforeRainParams;
  germinationCheck: GerminationCheckParams;
  burnWindow: BurnWindowParams;
  frozenGround: FrozenGroundParams;
  upkeep: UpkeepParams;
  limeTiming: LimeTimingParams;
}

export type ScheduleParameterOverrides = { [K in keyof ScheduleParameters]?: Partial<ScheduleParameters[K]> };

export const DEFAULT_SCHEDULE_PARAMETERS: ScheduleParameters = {
  sequence: SEQUENCE_DEFAULTS,
  sprayWindow: SPRAY_WINDOW_DEFAULTS,
  killWait: KILL_WAIT_DEFAULTS,
  seedBeforeRain: SEED_BEFORE_RAIN_DEFAULTS,
  soilTemperature: SOIL_TEMPERATURE_DEFAULTS,
  frostDeadline: FROST_DEADLINE_DEFAULTS,
  fertilizeBeforeRain: FERTILIZE_BEFORE_RAIN_DEFAULTS,
  germinationCheck: GERMINATION_CHECK_DEFAULTS,
  burnWindow: BURN_WINDOW_DEFAULTS,
  frozenGround: FROZEN_GROUND_DEFAULTS,
  upkeep: UPKEEP_DEFAULTS,
  limeTiming: LIME_TIMING_DEFAULTS,
};

export const SCHEDULE_PARAMETER_SOURCES = {
  sequence: SEQUENCE_SOURCES,
  sprayWindow: SPRAY_WINDOW_SOURCES,
  killWait: KILL_WAIT_SOURCES,
  seedBeforeRain: SEED_BEFORE_RAIN_SOURCES,
  soilTemperature: SOIL_TEMPERATURE_SOURCES,
  frostDeadline: FROST_DEADLINE_SOURCES,
  fertilizeBeforeRain: FERTILIZE_BEFORE_RAIN_SOURCES,
  germinationCheck: GERMINATION_CHECK_SOURCES,
  burnWindow: BURN_WINDOW_SOURCES,
  frozenGround: FROZEN_GROUND_SOURCES,
  upkeep: UPKEEP_SOURCES,
  limeTiming: LIME_TIMING_SOURCES,
} as const;

/** Defaults, then the planting's overrides; `killWaitDays` on the planting itself wins for the kill wait. */
export function resolveParameters(overrides: ScheduleParameterOverrides | null | undefined, killWaitDays?: number): ScheduleParameters {
  const out = {} as Record<keyof ScheduleParameters, unknown>;
  for (const key of Object.keys(DEFAULT_SCHEDULE_PARAMETERS) as (keyof ScheduleParameters)[]) {
    out[key] = { ...DEFAULT_SCHEDULE_PARAMETERS[key], ...(overrides?.[key] ?? {}) };
  }
  const params = out as unknown as ScheduleParameters;
  if (killWaitDays !== undefined) params.killWait = { ...params.killWait, killWaitDays };
  return params;
}
