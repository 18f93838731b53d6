// Frozen ground: frost seeding broadcasts onto ground frozen overnight that thaws by day; the freeze-thaw
// heave opens small cracks that work the seed in without any soil work.
import type { ForecastIndex } from '../forecast-days';
import { degreesF } from '../format';
import { shortDay } from '../local-dates';
import type { RuleDecision } from '../types';

export interface FrozenGroundParams {
  /** Air at or below this before `morningEndClock` freezes the surface. */
  freezeAirC: number;
  /** Air above this later in the day thaws it. */
  thawAirC: number;
  morningEndClock: string;
}

export const FROZEN_GROUND_DEFAULTS: FrozenGroundParams = { freezeAirC: 0, thawAirC: 2, morningEndClock: '09:00' };

export const FROZEN_GROUND_SOURCES: Record<keyof FrozenGroundParams, string> = {
  freezeAirC: 'common practice, no source: a night at or below freezing leaves the surface frozen at dawn',
  thawAirC: 'common practice, no source: a day a little above freezing thaws the surface, completing the freeze-thaw cycle',
  morningEndClock: 'common practice (frost seeding is broadcast early, while the ground is still hard enough to walk and drive on)',
};

export interface FrozenGroundDay {
  freezeThaw: boolean;
  decision: RuleDecision;
}

export function frozenGroundOn(fc: ForecastIndex, date: string, params: FrozenGroundParams): FrozenGroundDay {
  const day = fc.byDate.get(date);
  if (!day) {
    return { freezeThaw: false, decision: { rule: 'frozen-ground', ok: true, reason: `${shortDay(date)} is beyond the forecast; broadcast on a frozen morning` } };
  }
  let morningMin = Infinity;
  let dayMax = -Infinity;
  for (let i = day.firstHour; i <= day.lastHour; i++) {
    const h = fc.hours[i];
    if (h.clock < params.morningEndClock) morningMin = Math.min(morningMin, h.airTempC);
    dayMax = Math.max(dayMax, h.airTempC);
  }
  const frozen = morningMin <= params.freezeAirC;
  const thaw = dayMax > params.thawAirC;
  if (frozen && thaw) {
    return {
      freezeThaw: true,
      decision: { rule: 'frozen-ground', ok: true, reason: `frozen morning (${degreesF(morningMin)}), thawing to ${degreesF(dayMax)}: a freeze-thaw day` },
    };
  }
  return {
    freezeThaw: false,
    decision: {
      rule: 'frozen-ground',
      ok: false,
      reason: !Number.isFinite(morningMin)
        ? `the morning of ${shortDay(date)} is not in the forecast`
        : !frozen
          ? `no overnight freeze (morning low ${degreesF(morningMin)})`
          : `no thaw (high ${degreesF(dayMax)})`,
    },
  };
}
