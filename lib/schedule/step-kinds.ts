// The kinds of step a planting is made of, in the trade's words. Colours and icons belong to the UI.
import type { StepKind } from './types';

export interface StepKindInfo {
  kind: StepKind;
  title: string;
  /** How a move is told: "moved seeding from Tue 14 to Sun 12". */
  noun: string;
  description: string;
}

export const STEP_KINDS: Record<StepKind, StepKindInfo> = {
  'clear-brush': {
    kind: 'clear-brush',
    title: 'Clear brush',
    noun: 'brush clearing',
    description: 'Cut and remove brush and saplings so the plot can be sprayed and seeded.',
  },
  spray: {
    kind: 'spray',
    title: 'Spray the burndown',
    noun: 'spraying',
    description: 'Kill the standing vegetation with a burndown herbicide in a calm, rain-free window.',
  },
  'kill-wait': {
    kind: 'kill-wait',
    title: 'Kill wait',
    noun: 'the end of the kill wait',
    description: 'Let the herbicide work down into the roots before the ground is burned or worked.',
  },
  burn: {
    kind: 'burn',
    title: 'Burn (optional)',
    noun: 'burning',
    description: 'Burn off the dead cover, with a permit in hand and a prepared fire break.',
  },
  'rake-till': {
    kind: 'rake-till',
    title: 'Rake or till',
    noun: 'raking or tilling',
    description: 'Rake off thatch or till to bare soil so seed reaches the ground.',
  },
  seed: {
    kind: 'seed',
    title: 'Broadcast seed',
    noun: 'seeding',
    description: 'Spread the blend, ahead of a soaking rain while the soil is warm enough.',
  },
  'cover-seed': {
    kind: 'cover-seed',
    title: 'Cover the seed (drag or cultipack)',
    noun: 'covering the seed',
    description: 'Press or drag the seed into the surface for soil contact.',
  },
  fertilize: {
    kind: 'fertilize',
    title: 'Fertilize',
    noun: 'fertilizing',
    description: 'Spread the fertilizer the soil test calls for, ahead of rain.',
  },
  lime: {
    kind: 'lime',
    title: 'Lime',
    noun: 'liming',
    description: 'Spread lime to raise the soil pH; it works slowly, so the earlier the better.',
  },
  'check-germination': {
    kind: 'check-germination',
    title: 'Check germination',
    noun: 'the germination check',
    description: 'Walk the plot and look for seedlings; record what you see.',
  },
  mow: {
    kind: 'mow',
    title: 'Mow',
    noun: 'mowing',
    description: 'Mow the stand high to hold back weeds and keep growth tender.',
  },
  'spot-spray-grass': {
    kind: 'spot-spray-grass',
    title: 'Spot-spray grass',
    noun: 'spot-spraying grass',
    description: 'Spot-spray invading grass with a grass-selective herbicide.',
  },
  'frost-seed': {
    kind: 'frost-seed',
    title: 'Frost seed',
    noun: 'frost seeding',
    description: 'Broadcast seed onto frozen ground in late winter; freeze and thaw work it in.',
  },
  'soil-test': {
    kind: 'soil-test',
    title: 'Soil test',
    noun: 'the soil test',
    description: 'Send a soil sample for pH, lime and fertilizer recommendations.',
  },
};

export function stepTitle(kind: StepKind): string {
  return STEP_KINDS[kind].title;
}
