// Lime timing: agricultural lime dissolves and neutralizes acidity slowly, so it goes on months before the
// seed, not with it; a large rate goes on in two halves. When there is no time left, it still goes on now,
// and the plan says the stand will get the full effect only the next season.
import { addDays, dayWithMonth, daysBetween } from '../local-dates';
import { formatNumber } from '../format';
import type { RuleDecision } from '../types';

export interface LimeTimingParams {
  /** Lime this many days before the planned seeding when the calendar allows (about six months). */
  idealLeadDays: number;
  /** Fewer days than this, and the lime will not have reacted by seeding (about three months). */
  minLeadDays: number;
  /** Days from taking the soil sample to having the lab's numbers. */
  labTurnaroundDays: number;
  /** Rates above this go on in two halves. */
  splitAboveTonsPerAcre: number;
  /** On the surface (no tillage to mix it in), the second half this many days after the first. */
  surfaceSplitGapDays: number;
}

export const LIME_TIMING_DEFAULTS: LimeTimingParams = {
  idealLeadDays: 180,
  minLeadDays: 90,
  labTurnaroundDays: 14,
  splitAboveTonsPerAcre: 2,
  surfaceSplitGapDays: 180,
};

export const LIME_TIMING_SOURCES: Record<keyof LimeTimingParams, string> = {
  idealLeadDays:
    'Mississippi State University Extension, cool-season food plot guidance (secondary, as reproduced online): lime moves and reacts slowly, so apply it three to six months before planting and disk it in whenever possible',
  minLeadDays:
    'Mississippi State University Extension (secondary): three to six months before planting; NCDA&CS "Tips about soil pH and liming" (2005): it takes several months for lime to fully react, so apply it as soon as the need is recognized',
  labTurnaroundDays: 'common practice, no source: a state soil-test lab returns results in one to two weeks',
  splitAboveTonsPerAcre:
    'Virginia Cooperative Extension 452-703, Soil Test Note 3 (new stands where incorporation is possible): where more than 2 tons per acre are recommended, apply one-half, disk it in and plow it under, then apply the second half and disk it in',
  surfaceSplitGapDays:
    'Penn State Agricultural Analytical Services Lab, home garden report notes: larger limestone rates are divided and applied six months apart (for rates from about 2.2 t/acre, 11 lb per 100 ft²)',
};

export interface LimeTimingVerdict {
  leadDays: number;
  enough: boolean;
  decision: RuleDecision;
  /** For the step's reason: where it sits and why. */
  summary: string;
  warning: string | null;
}

const monthsOf = (days: number) => formatNumber(days / 30.4, 0);

/** The lime step on `date` for a seeding planned on `seedDate`. */
export function limeTiming(date: string, seedDate: string, params: LimeTimingParams): LimeTimingVerdict {
  const leadDays = daysBetween(date, seedDate);
  const window = `${monthsOf(params.minLeadDays)}–${monthsOf(params.idealLeadDays)} months`;
  if (leadDays >= params.minLeadDays) {
    const summary = `about ${monthsOf(leadDays)} months before the planned seeding (${dayWithMonth(seedDate)}): lime needs ${window} to react, so it goes on early`;
    return { leadDays, enough: true, summary, warning: null, decision: { rule: 'lime-timing', ok: true, reason: summary } };
  }
  const summary = 'lime now; it needs months to react — expect the full effect next season';
  const when = leadDays > 0 ? `only ${leadDays} day${leadDays === 1 ? '' : 's'} before seeding` : leadDays === 0 ? 'on the seeding day' : `${-leadDays} days after the planned seeding`;
  return {
    leadDays,
    enough: false,
    summary,
    warning: `Lime ${when}: it needs ${window} to react, so this stand gets only part of its effect; expect the full effect next season.`,
    decision: { rule: 'lime-timing', ok: true, marginal: true, reason: `${when}; ${summary}` },
  };
}

/** Whether a rate goes on in two halves, and the words for it. */
export function limeSplit(tonsPerAcre: number, params: LimeTimingParams): { split: boolean; halfTonsPerAcre: number; why: string } {
  const split = tonsPerAcre > params.splitAboveTonsPerAcre;
  return {
    split,
    halfTonsPerAcre: split ? tonsPerAcre / 2 : tonsPerAcre,
    why: `${formatNumber(tonsPerAcre, 2)} t/acre is more than ${formatNumber(params.splitAboveTonsPerAcre)} t/acre, so it goes on in two halves`,
  };
}

/** The second half on the surface, six months after the first. */
export function surfaceSecondHalfDate(firstDate: string, params: LimeTimingParams): string {
  return addDays(firstDate, params.surfaceSplitGapDays);
}
