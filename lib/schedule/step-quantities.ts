// What to carry to the plot for each step, worked out by lib/agronomy/quantities.ts and written as a person
// reads a list: "17 lb of seed — 2 bags", "2 sprayer fills of 4 gal, 10.2 fl oz of product in each".
import { fertilizerAmount, limeAmount, seedAmount, sprayMix, type PlantingMethod } from '@/lib/agronomy/quantities';
import { cultipackAdvice, inoculantReminders } from '@/lib/agronomy/seed-cover';
import { seedingRate, type SeedBagLabel } from '@/lib/agronomy/seeding-rate';
import type { BlendPart } from '@/lib/agronomy/species';
import { formatAmount } from './format';
import type { PlantingInput, Quantity } from './types';

export const DEFAULT_SEED_BAG_LB = 50;

const bags = (n: number) => `${n} bag${n === 1 ? '' : 's'}`;

/** The seed to carry: the blend's pounds and bags with how the rate was chosen, each species' pounds, inoculant and, for small
 *  seed on a prepared seedbed, the cultipacker. */
export function seedQuantities(
  parts: BlendPart[],
  acres: number,
  method: PlantingMethod,
  bagLb = DEFAULT_SEED_BAG_LB,
  seedBag?: SeedBagLabel | null,
): Quantity[] {
  const rate = seedingRate(parts, method, seedBag);
  const total = seedAmount({ ratePerAcreLb: rate.ratePerAcreLb, acres, bagLb });
  const out: Quantity[] = [
    {
      item: 'seed',
      amount: total.pounds,
      unit: 'lb',
      detail: `${formatAmount(total.pounds)} lb of seed — ${bags(total.bags ?? 0)} (${rate.how})`,
    },
  ];
  const pounds = new Map(rate.parts.map((part) => [part.speciesId, part.ratePerAcreLb * acres]));
  if (parts.length > 1) {
    for (const part of rate.parts) {
      const lb = part.ratePerAcreLb * acres;
      out.push({ item: part.name, amount: lb, unit: 'lb', detail: `${formatAmount(lb)} lb of ${part.name.toLowerCase()}` });
    }
  }
  for (const reminder of inoculantReminders(parts, pounds)) {
    out.push({ item: 'inoculant', amount: reminder.lb, unit: 'lb of seed', detail: reminder.detail });
  }
  const cultipack = method === 'prepared-seedbed' ? cultipackAdvice(parts) : null;
  if (cultipack) out.push({ item: 'cultipacker', amount: 1, unit: 'cultipacker', detail: `A cultipacker or roller. ${cultipack}` });
  return out;
}

export function sprayQuantities(input: Pick<PlantingInput, 'acres' | 'herbicide' | 'sprayer'>): Quantity[] {
  if (!input.herbicide || !input.sprayer) return [];
  const mix = sprayMix({
    acres: input.acres,
    carrierGalPerAcre: input.sprayer.carrierGalPerAcre,
    tankGal: input.sprayer.tankGal,
    product: input.herbicide.rate,
  });
  const tank = input.sprayer.tankGal;
  const product = input.herbicide.productName;
  const fills =
    mix.tankLoads === 1 && mix.totalSprayGal < tank
      ? `1 sprayer fill of ${formatAmount(mix.totalSprayGal)} gal, ${formatAmount(mix.productFlOz)} fl oz of product in it`
      : `${mix.tankLoads} sprayer fill${mix.tankLoads === 1 ? '' : 's'} of ${formatAmount(tank)} gal, ${formatAmount(mix.productFlOzPerFullTank)} fl oz of product in each`;
  const lastFillGal = mix.totalSprayGal - (mix.tankLoads - 1) * tank;
  const partial = mix.tankLoads > 1 && lastFillGal < tank - 1e-9;
  return [
    {
      item: 'sprayer fills',
      amount: mix.tankLoads,
      unit: 'fills',
      detail: partial ? `${fills} (the last fill ${formatAmount(lastFillGal)} gal, with proportionally less product)` : fills,
    },
    {
      item: product,
      amount: mix.productFlOz,
      unit: 'fl oz',
      detail: `${formatAmount(mix.productFlOz)} fl oz of ${product} for ${formatAmount(input.acres)} acre${input.acres === 1 ? '' : 's'} (${formatAmount(mix.totalSprayGal)} gal of spray)`,
    },
    { item: 'water', amount: mix.waterGal, unit: 'gal', detail: `${formatAmount(mix.waterGal)} gal of clean water` },
  ];
}

export function fertilizerQuantities(input: Pick<PlantingInput, 'acres' | 'fertilizer'>): Quantity[] {
  if (!input.fertilizer) return [];
  const f = fertilizerAmount({ grade: input.fertilizer.grade, target: input.fertilizer.target, acres: input.acres, bagLb: input.fertilizer.bagLb });
  const grade = input.fertilizer.grade.join('-');
  const s = f.supplied;
  return [
    {
      item: `fertilizer ${grade}`,
      amount: f.totalLb,
      unit: 'lb',
      detail: `${formatAmount(f.totalLb)} lb of ${grade} — ${bags(f.bags)} (${formatAmount(f.lbPerAcre)} lb/acre: ${formatAmount(s.n)} N, ${formatAmount(s.p2o5)} P₂O₅, ${formatAmount(s.k2o)} K₂O lb/acre)`,
    },
  ];
}

export function limeQuantities(input: Pick<PlantingInput, 'acres' | 'lime'>): Quantity[] {
  if (!input.lime) return [];
  const l = limeAmount({ tonsPerAcre: input.lime.tonsPerAcre, acres: input.acres, bagLb: input.lime.bagLb });
  return [{ item: 'lime', amount: l.totalLb, unit: 'lb', detail: `${formatAmount(l.totalLb)} lb of lime — ${bags(l.bags)}` }];
}
