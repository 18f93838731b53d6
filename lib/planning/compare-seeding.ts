// What-if for the planner: the same planting seeded on two or three dates, side by side. Every number comes
// from the engine's own rules — the seeding is pinned to each date and the plan re-placed around it — so
// the comparison says what the plan would say.
import type { Plot, Property } from '@/db/database';
import { blendProfile } from '@/lib/agronomy/species';
import { indexForecast, inHorizon } from '@/lib/schedule/forecast-days';
import { addDays, daysBetween, monthDayInYear } from '@/lib/schedule/local-dates';
import { resolveParameters } from '@/lib/schedule/parameters';
import { planPlanting, replan } from '@/lib/schedule/plan';
import { frostBounds } from '@/lib/schedule/rules/frost-deadline';
import { germinationCheck } from '@/lib/schedule/rules/germination-check';
import { seedZoneOutlook } from '@/lib/schedule/seed-zone';
import type { Forecast, RuleDecision } from '@/lib/schedule/types';
import type { PlantingFormInput } from '@/lib/validations/planting';
import { buildPlantingInput } from './input';

export interface SeedingOption {
  seedDate: string;
  /** True when every rule passes for seeding that day. */
  ok: boolean;
  /** The engine's verdicts for seeding that day (sequence, soil temperature, rain, frost deadline…). */
  decisions: RuleDecision[];
  germination: {
    /** The day the seed zone is expected to be wet enough to start the seed: the first soaking rain, or the seeding day. */
    moistDate: string;
    /** Expected emergence: the blend's slowest species is up by the daily rate summation (germination-check rule). */
    emergenceDate: string;
    /** Days from seeding to expected emergence. */
    daysToEmergence: number;
    /** The germination-check step's date in the plan re-placed around this seeding. */
    checkDate: string | null;
    /** The blend's slowest species to come up (lib/agronomy/emergence.ts), which sets the date. */
    emergenceSpeciesId: string;
    reason: string;
    warnings: string[];
  };
  /**
   * Seed-zone moisture (FAO-56 surface-layer balance, lib/agronomy/water-balance.ts) from the seeding day to
   * the end of the forecast or to emergence, whichever is first; null when the forecast does not reach the day.
   * The layer starts dry, so only forecast rain makes it moist: the same balance the plan's germination check reads
   * (lib/schedule/seed-zone.ts). moistDays counts every moist day; firstDryDate is the first dry day after it was wet.
   */
  moisture: { fromDate: string; throughDate: string; days: number; moistDays: number; firstDryDate: string | null } | null;
  /**
   * Frost margin in days, whichever binds. Fall: days from seeding to the blend's latest date (each species' killing
   * freeze less the growing days it needs, lib/schedule/rules/frost-deadline.ts) — negative when past it; checked for
   * every season. Spring, frost-tender blend: days after the earliest safe date (the average last frost plus the
   * margin). null when it does not apply or no frost date is recorded. weeksNeeded is growingDaysNeeded in whole weeks.
   */
  frost: {
    marginDays: number | null;
    limitDate: string | null;
    frostDate: string | null;
    weeksNeeded: number;
    growingDaysNeeded: number;
    note: string;
  };
  planWarnings: string[];
}

export function compareSeedingDates(o: {
  property: Property;
  plot: Pick<Plot, 'acres' | 'cover'>;
  form: PlantingFormInput;
  seedDates: string[];
  forecast: Forecast | null;
  now: Date;
}): SeedingOption[] {
  return o.seedDates.map((seedDate) => {
    const input = buildPlantingInput(o.property, o.plot, { ...o.form, targetSeedDate: seedDate });
    const seedKey = input.method === 'frost-seeding' ? 'frost-seed' : 'seed';
    const first = planPlanting(input, o.forecast, o.now);
    const pinned = { ...first, steps: first.steps.map((s) => (s.key === seedKey ? { ...s, date: seedDate, pinned: true } : s)) };
    const forecast: Forecast = o.forecast ?? { timeZone: input.timeZone, fetchedAt: o.now.toISOString(), hours: [] };
    const { plan } = replan(input, pinned, forecast, o.now);
    const seed = plan.steps.find((s) => s.key === seedKey);
    const decisions = seed?.rules ?? [];

    const params = resolveParameters(input.parameters, input.killWaitDays);
    const profile = blendProfile(input.blend);
    const soak = params.seedBeforeRain;
    const fc = o.forecast
      ? indexForecast(o.forecast, input.timeZone, {
          measurableRainMm: soak.measurableRainMm,
          eventGapHours: soak.eventGapHours,
          soakingRainMm: soak.soakingRainMm,
          soakingWindowHours: soak.soakingWindowHours,
        })
      : null;
    const year = Number(seedDate.slice(0, 4));
    const lastFrostThisYear = input.avgLastSpringFrost ? monthDayInYear(input.avgLastSpringFrost, year) : null;
    const lastSpringFrost =
      lastFrostThisYear && input.avgLastSpringFrost ? (lastFrostThisYear >= seedDate ? lastFrostThisYear : monthDayInYear(input.avgLastSpringFrost, year + 1)) : null;
    const texture = input.soilTexture ?? 'loam';
    const g = germinationCheck({
      seedDate,
      fc,
      profile,
      params: params.germinationCheck,
      soak,
      frostSeeding: input.method === 'frost-seeding',
      lastSpringFrost,
      texture,
      latitudeDeg: input.latitudeDeg,
    });
    const emergenceDate = addDays(g.date, -params.germinationCheck.checkDelayDays);

    let moisture: SeedingOption['moisture'] = null;
    if (fc && fc.lastDate && inHorizon(fc, seedDate)) {
      const through = emergenceDate < fc.lastDate ? emergenceDate : fc.lastDate;
      const water = seedZoneOutlook(fc, seedDate, through, input.latitudeDeg, texture, soak.soakingRainMm);
      if (water) {
        moisture = { fromDate: seedDate, throughDate: water.days.at(-1)!.date, days: water.days.length, moistDays: water.moistDays, firstDryDate: water.firstDryDate };
      }
    }

    const bounds = frostBounds(input, profile, params.frostDeadline);
    const growingDaysNeeded = bounds.growingDaysNeeded;
    const weeksNeeded = Math.ceil(growingDaysNeeded / 7);
    const fallMargin = bounds.fallLatest ? daysBetween(seedDate, bounds.fallLatest) : null;
    const springMargin = bounds.springEarliest ? daysBetween(bounds.springEarliest, seedDate) : null;
    let frost: SeedingOption['frost'];
    // The margin that binds: a tender spring blend can be too early for the last frost or too late for the first.
    if (fallMargin !== null && (springMargin === null || fallMargin <= springMargin)) {
      const s = bounds.limiting;
      frost = {
        marginDays: fallMargin,
        limitDate: bounds.fallLatest,
        frostDate: bounds.firstFallFrost,
        weeksNeeded,
        growingDaysNeeded,
        note: `days to spare before ${bounds.fallLatest}, the latest date: ${s.name} ${s.needs} about ${growingDaysNeeded} days of growth before ${
          s.killedBy === 'freeze' ? 'the average first fall frost' : `a hard freeze (${bounds.firstHardFreeze})`
        }`,
      };
    } else if (springMargin !== null) {
      frost = {
        marginDays: springMargin,
        limitDate: bounds.springEarliest,
        frostDate: bounds.lastSpringFrost,
        weeksNeeded,
        growingDaysNeeded,
        note: `days after ${bounds.springEarliest}, the earliest safe date for frost-tender seed`,
      };
    } else {
      frost = {
        marginDays: null,
        limitDate: null,
        frostDate: bounds.season === 'fall' ? bounds.firstFallFrost : bounds.lastSpringFrost,
        weeksNeeded,
        growingDaysNeeded,
        note: !bounds.applies
          ? 'frost seeding goes on in late winter; no frost deadline'
          : bounds.season === 'fall'
            ? 'no average first fall frost recorded for the property'
            : bounds.frostTender
              ? 'no average last spring frost recorded for the property'
              : 'no average first fall frost recorded for the property',
      };
    }

    return {
      seedDate,
      ok: decisions.every((d) => d.ok),
      decisions,
      germination: {
        moistDate: g.moistDate,
        emergenceDate,
        daysToEmergence: daysBetween(seedDate, emergenceDate),
        checkDate: plan.steps.find((s) => s.key === 'check-germination')?.date ?? null,
        emergenceSpeciesId: g.emergenceSpeciesId,
        reason: g.decision.reason,
        warnings: g.warnings,
      },
      moisture,
      frost,
      planWarnings: plan.warnings,
    };
  });
}
