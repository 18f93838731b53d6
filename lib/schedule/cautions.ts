// Cautions for the steps that can hurt someone. Plain words, always shown with the step; Sowcast defers to
// the product label, local codes and licensed practice, and says so on each one.
import type { Caution, StepKind } from './types';

export const DEFER =
  'Sowcast plans dates and amounts only; it defers to the product label, local codes and licensed practice.';

export const HERBICIDE_CAUTIONS: readonly Caution[] = [
  {
    topic: 'herbicide',
    text:
      'The herbicide label is the law: follow its rates, protective equipment, re-entry interval, rainfast period, ' +
      'and its water and drift restrictions. Where this plan and the label differ, the label wins.',
  },
  {
    topic: 'herbicide',
    text: 'Wear the protective equipment the label lists — at least gloves, long sleeves, long pants, shoes and eye protection — while mixing and spraying.',
  },
  {
    topic: 'herbicide',
    text: 'Keep spray off ponds, streams, wells and neighbours’ crops; do not spray in gusty wind or in dead-calm, humid air where drift can hang and travel.',
  },
  { topic: 'herbicide', text: DEFER },
];

export const FIRE_CAUTIONS: readonly Caution[] = [
  {
    topic: 'fire',
    text: 'Burning needs the local permit or approval, and burning may be banned on the day: check local burn rules before you light.',
  },
  {
    topic: 'fire',
    text: 'Prepare a fire break down to bare soil around the plot beforehand; have water, tools and enough people on hand, and stay until it is out cold.',
  },
  { topic: 'fire', text: 'Prescribed burning is licensed or certified work in many places; use a certified burner where the law asks for one.' },
  { topic: 'fire', text: DEFER },
];

export const CHAINSAW_CAUTIONS: readonly Caution[] = [
  {
    topic: 'chainsaw',
    text: 'Chainsaw and brush-cutter work: wear chaps, a helmet with face screen, eye and ear protection, gloves and sturdy boots.',
  },
  { topic: 'chainsaw', text: 'Never cut alone; plan each tree’s fall and escape path, and keep others two tree-lengths away.' },
  { topic: 'chainsaw', text: DEFER },
];

export const FERTILIZER_CAUTIONS: readonly Caution[] = [
  {
    topic: 'fertilizer',
    text: 'Keep fertilizer and lime out of streams and ponds, sweep spills off hard ground, and do not spread ahead of a downpour.',
  },
  { topic: 'fertilizer', text: DEFER },
];

export function cautionsFor(kind: StepKind): Caution[] {
  switch (kind) {
    case 'spray':
    case 'spot-spray-grass':
      return [...HERBICIDE_CAUTIONS];
    case 'burn':
      return [...FIRE_CAUTIONS];
    case 'clear-brush':
      return [...CHAINSAW_CAUTIONS];
    case 'fertilize':
    case 'lime':
      return [...FERTILIZER_CAUTIONS];
    default:
      return [];
  }
}
