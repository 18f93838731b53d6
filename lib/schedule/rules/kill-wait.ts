// Kill wait: the days after spraying before the ground is worked, so a systemic burndown has time to move
// down into roots before tillage cuts them off. Its end is a dated event of its own: reminders hang on it.
import { addDays, dayWithMonth } from '../local-dates';
import type { RuleDecision } from '../types';

export interface KillWaitParams {
  killWaitDays: number;
}

export const KILL_WAIT_DEFAULTS: KillWaitParams = { killWaitDays: 14 };

export const KILL_WAIT_SOURCES: Record<keyof KillWaitParams, string> = {
  killWaitDays:
    'common practice, no source: about two weeks for a systemic burndown to kill perennial grasses and weeds before the ground is worked; ' +
    "the product label's interval before tillage or planting governs",
};

export function killWaitEnd(sprayDate: string, days: number): string {
  return addDays(sprayDate, days);
}

export function killWaitDecision(sprayDate: string, days: number, sprayDone: boolean): RuleDecision {
  const end = killWaitEnd(sprayDate, days);
  return {
    rule: 'kill-wait',
    ok: true,
    reason: `kill wait of ${days} days after ${sprayDone ? 'spraying' : 'the planned spraying'} on ${dayWithMonth(sprayDate)} ends ${dayWithMonth(end)}`,
  };
}

/** Whether a later step on `date` respects the wait. */
export function killWaitRespected(sprayDate: string, days: number, date: string): RuleDecision {
  const end = killWaitEnd(sprayDate, days);
  return date >= end
    ? { rule: 'kill-wait', ok: true, reason: `after the kill wait, which ends ${dayWithMonth(end)}` }
    : { rule: 'kill-wait', ok: false, reason: `before the kill wait ends on ${dayWithMonth(end)} (${days} days after spraying on ${dayWithMonth(sprayDate)})` };
}
