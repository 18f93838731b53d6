// How much seed, spray mix, fertilizer and lime a plot needs. Pure arithmetic over the label and bag numbers
// the user gives; every rule of thumb says where it comes from.
import { flOzToGal, galToFlOz, SHORT_TON_LB } from './units';

export type PlantingMethod = 'spray-and-seed' | 'prepared-seedbed' | 'frost-seeding';

// The seeding rate itself (lb per acre, by how the seed goes in) comes from lib/agronomy/seeding-rate.ts.

// Virginia Tech SPES-201 (Soil Test Note / nutrient conversions): fertilizer grades state P as P₂O₅ and K as K₂O.
export const P2O5_TO_P = 0.4365;
export const P_TO_P2O5 = 2.291;
export const K2O_TO_K = 0.8301;
export const K_TO_K2O = 1.2051;
export const p2o5ToP = (p2o5Lb: number) => p2o5Lb * P2O5_TO_P;
export const pToP2o5 = (pLb: number) => pLb * P_TO_P2O5;
export const k2oToK = (k2oLb: number) => k2oLb * K2O_TO_K;
export const kToK2o = (kLb: number) => kLb * K_TO_K2O;

/** Whole bags, loads or fills: round up, but not past float noise (8.5 × 0.5 × 2 / 8.5 is one bag). */
function roundUpCount(x: number): number {
  return Math.ceil(x - 1e-9 * Math.max(1, Math.abs(x)));
}

function requirePositive(value: number, what: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new RangeError(`${what} must be a number greater than 0 (got ${value}).`);
  }
}

/** Pounds of seed for a plot at a rate, and whole bags when the bag size is known. */
export function seedAmount(o: { ratePerAcreLb: number; acres: number; bagLb?: number }): { pounds: number; bags?: number } {
  requirePositive(o.ratePerAcreLb, 'Seeding rate (lb per acre)');
  requirePositive(o.acres, 'Plot size (acres)');
  const pounds = o.ratePerAcreLb * o.acres;
  if (o.bagLb === undefined) return { pounds };
  requirePositive(o.bagLb, 'Seed bag size (lb)');
  return { pounds, bags: roundUpCount(pounds / o.bagLb) };
}

export type SprayProductRate = { percentSolution: number } | { flOzPerAcre: number };

export function sprayMix(o: { acres: number; carrierGalPerAcre: number; tankGal: number; product: SprayProductRate }): {
  waterGal: number;
  productFlOz: number;
  tankLoads: number;
  productFlOzPerFullTank: number;
  totalSprayGal: number;
  acresPerFullTank: number;
} {
  requirePositive(o.acres, 'Plot size (acres)');
  requirePositive(o.carrierGalPerAcre, 'Spray volume (gallons per acre)');
  requirePositive(o.tankGal, 'Sprayer tank size (gallons)');
  const totalSprayGal = o.acres * o.carrierGalPerAcre;
  const acresPerFullTank = o.tankGal / o.carrierGalPerAcre;

  let productFlOz: number;
  let productFlOzPerFullTank: number;
  if (o.product && 'percentSolution' in o.product) {
    const pct = o.product.percentSolution;
    requirePositive(pct, 'Percent solution');
    if (pct > 100) throw new RangeError(`Percent solution cannot be more than 100 % (got ${pct}).`);
    // % v/v of the finished spray: a 2 % solution is 2 parts product in 100 parts of mix.
    productFlOz = (pct / 100) * galToFlOz(totalSprayGal);
    productFlOzPerFullTank = (pct / 100) * galToFlOz(o.tankGal);
  } else if (o.product && 'flOzPerAcre' in o.product) {
    requirePositive(o.product.flOzPerAcre, 'Product rate (fl oz per acre)');
    productFlOz = o.product.flOzPerAcre * o.acres;
    productFlOzPerFullTank = o.product.flOzPerAcre * acresPerFullTank;
    if (flOzToGal(o.product.flOzPerAcre) > o.carrierGalPerAcre) {
      throw new RangeError(
        `${o.product.flOzPerAcre} fl oz per acre is more than the ${o.carrierGalPerAcre} gallons of spray per acre; ` +
          'raise the spray volume or check the product rate.',
      );
    }
  } else {
    throw new RangeError('Give the product rate as a percent solution or as fl oz per acre.');
  }

  return {
    waterGal: totalSprayGal - flOzToGal(productFlOz),
    productFlOz,
    tankLoads: roundUpCount(totalSprayGal / o.tankGal),
    productFlOzPerFullTank,
    totalSprayGal,
    acresPerFullTank,
  };
}

const NUTRIENT_LABEL = { n: 'N', p2o5: 'P₂O₅', k2o: 'K₂O' } as const;

export function fertilizerAmount(o: {
  grade: [number, number, number];
  target: { n?: number; p2o5?: number; k2o?: number };
  acres: number;
  bagLb?: number;
}): { lbPerAcre: number; totalLb: number; bags: number; supplied: { n: number; p2o5: number; k2o: number } } {
  requirePositive(o.acres, 'Plot size (acres)');
  const bagLb = o.bagLb ?? 50;
  requirePositive(bagLb, 'Fertilizer bag size (lb)');
  if (!Array.isArray(o.grade) || o.grade.length !== 3) {
    throw new RangeError('A fertilizer grade has three numbers: N-P₂O₅-K₂O, e.g. 13-13-13.');
  }
  const [nPct, pPct, kPct] = o.grade;
  const gradeText = o.grade.join('-');
  for (const pct of o.grade) {
    if (typeof pct !== 'number' || !Number.isFinite(pct) || pct < 0 || pct > 100) {
      throw new RangeError(`Each number of the grade ${gradeText} must be a percentage from 0 to 100.`);
    }
  }
  if (nPct + pPct + kPct > 100) {
    throw new RangeError(`The grade ${gradeText} adds up to more than 100 %.`);
  }
  const fraction = { n: nPct / 100, p2o5: pPct / 100, k2o: kPct / 100 };

  let lbPerAcre = 0;
  let anyTarget = false;
  for (const key of ['n', 'p2o5', 'k2o'] as const) {
    const wanted = o.target?.[key];
    if (wanted === undefined || wanted === 0) continue;
    if (typeof wanted !== 'number' || !Number.isFinite(wanted) || wanted < 0) {
      throw new RangeError(`The ${NUTRIENT_LABEL[key]} target must be 0 or more lb per acre (got ${wanted}).`);
    }
    if (fraction[key] === 0) {
      throw new RangeError(`${gradeText} cannot supply ${NUTRIENT_LABEL[key]}.`);
    }
    anyTarget = true;
    // SPES-201 method: product needed = nutrient wanted ÷ the grade's fraction of it; the largest need decides.
    lbPerAcre = Math.max(lbPerAcre, wanted / fraction[key]);
  }
  if (!anyTarget) {
    throw new RangeError('Give at least one nutrient target (lb per acre of N, P₂O₅ or K₂O) from the soil test.');
  }
  const totalLb = lbPerAcre * o.acres;
  return {
    lbPerAcre,
    totalLb,
    bags: roundUpCount(totalLb / bagLb),
    supplied: { n: lbPerAcre * fraction.n, p2o5: lbPerAcre * fraction.p2o5, k2o: lbPerAcre * fraction.k2o },
  };
}

/** tonsPerAcre: US short tons (2,000 lb), as soil-test lime recommendations give them. */
export function limeAmount(o: { tonsPerAcre: number; acres: number; bagLb?: number }): { totalLb: number; bags: number } {
  requirePositive(o.tonsPerAcre, 'Lime rate (tons per acre)');
  requirePositive(o.acres, 'Plot size (acres)');
  const bagLb = o.bagLb ?? 50;
  requirePositive(bagLb, 'Lime bag size (lb)');
  const totalLb = o.tonsPerAcre * SHORT_TON_LB * o.acres;
  return { totalLb, bags: roundUpCount(totalLb / bagLb) };
}
