// Lime from a soil test: how many tons per acre of agricultural lime raise the soil to a target pH, by the
// two methods labs report most (Mehlich buffer acidity, SMP buffer pH), the target pH each species needs,
// and how a lime of another quality changes the tons. Each number names its source; the lab's own
// recommendation, when the report gives one, is the better number.
import { getSpecies, type BlendPart, type Sourced } from './species';

const NCDA_LIME =
  'NCDA&CS Agronomic Division, lime factor table (ncagr.gov/agronomi/bufftab1.htm): LR (US tons/acre) = Ac × [(target pH − current pH) ÷ (6.6 − current pH)] − residual credit; Ac = (6.6 − Mehlich buffer pH) × 4 meq/100 cm³';
const NCDA_STANDARD_LIME =
  'NCDA&CS news release "Tips about soil pH and liming" (2005): soil test recommendations are for standard agricultural grade lime; by state law a lime label lists the amount equal to 1 ton of standard lime';
const TRI_STATE_FRAME =
  'Tri-State Fertilizer Recommendations for Corn, Soybeans, Wheat and Alfalfa, Extension Bulletin E-2567 (1995), "Soil pH and Lime Recommendations", as reprinted by MSU Extension (06039707): rates by SMP lime test index for an 8-inch depth, agricultural ground limestone with a neutralizing value of 90 %; one-half for no-till and established forages (0–4 in)';
const TRI_STATE_TABLE_VALUES =
  'from memory: the SMP lime table values as recalled (the 1.4 / 1.2 / 1.0 t at buffer pH 6.8 series); the printed E-2567 table was not re-read here — check against the bulletin';
const TRI_STATE_PH =
  'Tri-State E-2567 (1995), Table 1 as reprinted: alfalfa 6.5 (subsoil pH > 6) / 6.8 (subsoil pH < 6); other forage legumes 6.0 / 6.8; corn, soybeans, small grains, other crops 6.0 / 6.5';
const FOOD_PLOT_PH =
  'wildlife food plot guides (Mississippi State University Extension / Deer Lab, as the issue cites them; secondary): clovers and alfalfa 6.5–7.0, brassicas 6.0–6.5, grains 6.0–6.5';
const PENN_STATE_ALFALFA = 'Penn State Agronomy Guide, Part 1 §2 "Limestone recommendation": optimum pH 6.5 for most agronomic crops, 7.0 for alfalfa';
const MEMORY = 'from memory (general extension guidance, not checked against a publication)';

/** Tons per acre of the method's reference lime (see LIME_REFERENCE). */
export type LimeTestInput =
  | { method: 'mehlich-acidity'; soilPh: number; targetPh: number; acidityMeq: number }
  | { method: 'smp-buffer'; soilPh: number; bufferPh: number; targetPh: number; depth?: 'tilled' | 'no-till' };

export type LimeMethod = LimeTestInput['method'];

/** What one "ton" of each method's answer is. */
export const LIME_REFERENCE: Record<LimeMethod, { neutralizingPct: number | null; words: string; source: string }> = {
  'mehlich-acidity': {
    neutralizingPct: null,
    words: 'tons of standard agricultural lime per acre',
    source: NCDA_STANDARD_LIME,
  },
  'smp-buffer': {
    neutralizingPct: 90,
    words: 'tons of agricultural ground limestone (neutralizing value 90 %) per acre',
    source: TRI_STATE_FRAME,
  },
};

export class LimeInputError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'LimeInputError';
  }
}

function check(field: string, value: number, lo: number, hi: number, what: string): void {
  if (!Number.isFinite(value) || value < lo || value > hi) {
    throw new LimeInputError(field, `${field}: ${what} must be a number from ${lo} to ${hi}, not ${value}.`);
  }
}

/** NCDA&CS: exchangeable acidity from the Mehlich buffer pH reading. */
export function mehlichAcidityFromBufferPh(mehlichBufferPh: number): number {
  check('bufferPh', mehlichBufferPh, 3, 7.5, 'the Mehlich buffer pH');
  return Math.max(0, (6.6 - mehlichBufferPh) * 4);
}

/**
 * Tri-State SMP table: tons (8-inch depth, NV 90 %) by SMP buffer pH for target pH 6.8, 6.5 and 6.0.
 * Values: see TRI_STATE_TABLE_VALUES — from memory, not re-read against the bulletin.
 */
export const SMP_LIME_TABLE: Sourced<{ bufferPh: number; tons: { 6.8: number; 6.5: number; 6: number } }[]> = {
  source: `${TRI_STATE_FRAME}; ${TRI_STATE_TABLE_VALUES}`,
  value: [
    { bufferPh: 6.8, tons: { 6.8: 1.4, 6.5: 1.2, 6: 1.0 } },
    { bufferPh: 6.7, tons: { 6.8: 2.4, 6.5: 2.1, 6: 1.7 } },
    { bufferPh: 6.6, tons: { 6.8: 3.4, 6.5: 2.9, 6: 2.4 } },
    { bufferPh: 6.5, tons: { 6.8: 4.5, 6.5: 3.8, 6: 3.1 } },
    { bufferPh: 6.4, tons: { 6.8: 5.5, 6.5: 4.7, 6: 3.9 } },
    { bufferPh: 6.3, tons: { 6.8: 6.5, 6.5: 5.5, 6: 4.6 } },
    { bufferPh: 6.2, tons: { 6.8: 7.5, 6.5: 6.4, 6: 5.3 } },
    { bufferPh: 6.1, tons: { 6.8: 8.6, 6.5: 7.3, 6: 6.0 } },
    { bufferPh: 6.0, tons: { 6.8: 9.6, 6.5: 8.1, 6: 6.7 } },
    { bufferPh: 5.9, tons: { 6.8: 10.6, 6.5: 8.9, 6: 7.4 } },
    { bufferPh: 5.8, tons: { 6.8: 11.7, 6.5: 9.8, 6: 8.1 } },
    { bufferPh: 5.7, tons: { 6.8: 12.7, 6.5: 10.7, 6: 8.9 } },
  ],
};

/** MSU Extension ("what does lime index mean"): no lime is recommended above a lime index of 70 (SMP 7.0). */
const SMP_NO_LIME_BUFFER_PH = 7.0;

function between(x: number, x0: number, x1: number, y0: number, y1: number): number {
  return x1 === x0 ? y0 : y0 + ((x - x0) * (y1 - y0)) / (x1 - x0);
}

/** The SMP table read at a buffer pH for one of its target columns; linear between rows, and from the first
 *  row to nothing at buffer pH 7.0 (Sowcast's reading of "no lime above a lime index of 70"). */
function smpColumn(bufferPh: number, target: 6 | 6.5 | 6.8): number {
  const rows = SMP_LIME_TABLE.value;
  const top = rows[0];
  if (bufferPh >= SMP_NO_LIME_BUFFER_PH) return 0;
  if (bufferPh >= top.bufferPh) return between(bufferPh, SMP_NO_LIME_BUFFER_PH, top.bufferPh, 0, top.tons[target]);
  for (let i = 1; i < rows.length; i++) {
    const [hi, lo] = [rows[i - 1], rows[i]];
    if (bufferPh >= lo.bufferPh) return between(bufferPh, hi.bufferPh, lo.bufferPh, hi.tons[target], lo.tons[target]);
  }
  throw new LimeInputError(
    'bufferPh',
    `bufferPh: an SMP buffer pH of ${bufferPh} is below the Tri-State table (lowest ${rows[rows.length - 1].bufferPh}); a soil that acid needs the lab's own recommendation.`,
  );
}

function smpTons(bufferPh: number, targetPh: number): number {
  if (targetPh > 6.8) throw new LimeInputError('targetPh', `targetPh: the Tri-State SMP table goes up to pH 6.8, not ${targetPh}.`);
  const col = (target: 6 | 6.5 | 6.8) => smpColumn(bufferPh, target);
  if (targetPh <= 6.0) return col(6);
  if (targetPh <= 6.5) return between(targetPh, 6.0, 6.5, col(6), col(6.5));
  return between(targetPh, 6.5, 6.8, col(6.5), col(6.8));
}

/**
 * Tons per acre of the method's reference lime (LIME_REFERENCE) to bring the soil to `targetPh`; 0 when the
 * soil pH is already at or above it. Mehlich: the NCDA&CS formula, without a residual credit for lime put on
 * in the last months. SMP: the Tri-State table, interpolated; `depth: 'no-till'` halves it (0–4 in).
 */
export function limeTonsPerAcre(o: LimeTestInput): number {
  check('soilPh', o.soilPh, 3, 9, 'the soil pH');
  check('targetPh', o.targetPh, 4.5, 7.5, 'the target pH');
  if (o.soilPh >= o.targetPh) return 0;
  if (o.method === 'mehlich-acidity') {
    check('acidityMeq', o.acidityMeq, 0, 30, 'the exchangeable acidity (meq/100 cm³)');
    if (o.soilPh >= 6.6) return 0;
    return (o.acidityMeq * (o.targetPh - o.soilPh)) / (6.6 - o.soilPh);
  }
  if (o.method === 'smp-buffer') {
    check('bufferPh', o.bufferPh, 4, 7.5, 'the SMP buffer pH');
    if (o.targetPh < 5.5) throw new LimeInputError('targetPh', `targetPh: the Tri-State SMP table starts at pH 6.0 (Sowcast scales it down to 5.5), not ${o.targetPh}.`);
    // Below 6.0 the table has no column: the 6.0 column scaled by the share of the pH gain is Sowcast's own.
    const tons = o.targetPh < 6.0 ? smpTons(o.bufferPh, 6.0) * ((o.targetPh - o.soilPh) / (6.0 - o.soilPh)) : smpTons(o.bufferPh, o.targetPh);
    return o.depth === 'no-till' ? tons / 2 : tons;
  }
  throw new LimeInputError('method', `method: unknown soil-test lime method "${(o as { method: string }).method}".`);
}

// ——— lime quality ————————————————————————————————————————————————————————————

export const LIME_QUALITY_SOURCES = {
  neutralizingValue:
    'Tri-State E-2567 (1995) as reprinted by MSU Extension: to adjust for a liming material with another neutralizing value, multiply the recommendation by 0.90 and divide by the new neutralizing value (e.g. × 0.90 ÷ 0.80 at NV 80 %)',
  cce: 'Penn State Agricultural Analytical Services Lab, home garden report notes: actual liming material = recommendation × 100 ÷ CCE of the material (recommendations assume CCE 100)',
  enp:
    'Ohio State University Extension (Tri-State 2020, Ohio liming rates; "Understanding value in lime"): Ohio rates are pounds of effective neutralizing power (ENP) per acre; tons of product = ENP recommended ÷ the ENP per ton on the label',
} as const;

/**
 * Tons of a lime product that do the work of `tonsPerAcre` of the reference lime: both strengths as percent
 * neutralizing value (CCE, NV or ECCE — the same scale as the reference).
 */
export function limeProductTons(tonsPerAcre: number, o: { referencePct: number; productPct: number }): number {
  check('productPct', o.productPct, 1, 200, "the lime's neutralizing value (%)");
  check('referencePct', o.referencePct, 1, 200, "the recommendation's neutralizing value (%)");
  return (tonsPerAcre * o.referencePct) / o.productPct;
}

/** Ohio: tons of product per acre from a recommendation in pounds of ENP and the label's ENP per ton. */
export function limeTonsFromEnp(enpLbPerAcre: number, productEnpLbPerTon: number): number {
  check('enpLbPerTon', productEnpLbPerTon, 100, 2000, 'the ENP per ton on the lime label');
  if (!Number.isFinite(enpLbPerAcre) || enpLbPerAcre < 0) throw new LimeInputError('enpLbPerAcre', 'enpLbPerAcre: the ENP recommendation must be 0 or more.');
  return enpLbPerAcre / productEnpLbPerTon;
}

// ——— target pH by species ——————————————————————————————————————————————————————

export interface TargetPh {
  /** The published optimum range. */
  rangePh: [number, number];
  /** What Sowcast limes to: the low end of the range, where lime stops paying (Tri-State lime to the level). */
  targetPh: number;
  source: string;
}

const t = (lo: number, hi: number, source: string, target = lo): TargetPh => ({ rangePh: [lo, hi], targetPh: target, source });

export const TARGET_PH_BY_SPECIES: Readonly<Record<string, TargetPh>> = Object.freeze({
  'white-clover': t(6.5, 7.0, `${FOOD_PLOT_PH}; ${TRI_STATE_PH}`),
  'red-clover': t(6.5, 7.0, `${FOOD_PLOT_PH}; ${TRI_STATE_PH}`),
  'crimson-clover': t(6.5, 7.0, `${FOOD_PLOT_PH}; ${TRI_STATE_PH}`),
  'arrowleaf-clover': t(6.5, 7.0, `${FOOD_PLOT_PH}; ${TRI_STATE_PH}`),
  'berseem-clover': t(6.5, 7.0, `${FOOD_PLOT_PH}; ${TRI_STATE_PH}`),
  // Tri-State limes alfalfa to 6.8 where the subsoil is acid, as it is across most of the humid East.
  alfalfa: t(6.5, 7.0, `${FOOD_PLOT_PH}; ${TRI_STATE_PH}; ${PENN_STATE_ALFALFA}`, 6.8),
  chicory: t(6.0, 7.0, MEMORY),
  'forage-rape': t(6.0, 6.5, FOOD_PLOT_PH),
  turnip: t(6.0, 6.5, FOOD_PLOT_PH),
  'forage-radish': t(6.0, 6.5, FOOD_PLOT_PH),
  'cereal-rye': t(6.0, 6.5, `${FOOD_PLOT_PH}; ${TRI_STATE_PH}`),
  'winter-wheat': t(6.0, 6.5, `${FOOD_PLOT_PH}; ${TRI_STATE_PH}`),
  oats: t(6.0, 6.5, `${FOOD_PLOT_PH}; ${TRI_STATE_PH}`),
  'austrian-winter-peas': t(6.0, 7.0, MEMORY),
  soybeans: t(6.0, 6.5, TRI_STATE_PH),
  cowpeas: t(5.5, 6.5, MEMORY),
  corn: t(6.0, 6.5, TRI_STATE_PH),
  'grain-sorghum': t(6.0, 6.5, `${TRI_STATE_PH} ("other crops")`),
  buckwheat: t(5.5, 7.0, `${MEMORY}; buckwheat is known for doing well on acid, low-fertility ground`),
});

export function targetPhFor(speciesId: string): TargetPh {
  const found = TARGET_PH_BY_SPECIES[speciesId];
  if (!found) throw new LimeInputError('speciesId', `speciesId: no target pH is recorded for "${speciesId}".`);
  return found;
}

/** A blend is limed for its most demanding member: the highest target pH among its species. */
export function blendTargetPh(parts: readonly BlendPart[]): { targetPh: number; speciesId: string; name: string } {
  if (!parts.length) throw new LimeInputError('blend', 'blend: choose at least one species to find its target pH.');
  let best: { targetPh: number; speciesId: string } | null = null;
  for (const part of parts) {
    const { targetPh } = targetPhFor(part.speciesId);
    if (!best || targetPh > best.targetPh) best = { targetPh, speciesId: part.speciesId };
  }
  const chosen = best as { targetPh: number; speciesId: string };
  return { ...chosen, name: getSpecies(chosen.speciesId).name };
}

// ——— a soil test's numbers → a lime rate for a blend ————————————————————————————————————

export interface SoilTestLimeInput {
  soilPh: number | null;
  bufferPh?: number | null;
  bufferMethod?: 'smp' | 'mehlich' | null;
  acidityMeq?: number | null;
}

export type SoilTestLime =
  | { ok: true; tonsPerAcre: number; targetPh: number; speciesName: string; method: LimeMethod; reference: string; basis: string }
  | { ok: false; reason: string };

/**
 * The lime rate a soil test's numbers give for a blend: to the blend's strictest target pH, by the Mehlich
 * acidity when the report has Ac (or a Mehlich buffer pH), else by the SMP table; on ground that is not worked
 * (`noTill`) the Tri-State half rate for the top 4 in. `ok: false` says what is missing.
 */
export function limeForSoilTest(test: SoilTestLimeInput, blend: readonly BlendPart[], o: { noTill?: boolean } = {}): SoilTestLime {
  if (test.soilPh === null || test.soilPh === undefined) return { ok: false, reason: 'the soil test has no soil pH' };
  let target: ReturnType<typeof blendTargetPh>;
  try {
    target = blendTargetPh(blend.filter((p) => p.speciesId));
  } catch (error) {
    if (error instanceof LimeInputError) return { ok: false, reason: 'choose the blend first, so the lime can aim at its target pH' };
    throw error;
  }
  const common = { targetPh: target.targetPh, speciesName: target.name };
  const acidity = test.acidityMeq ?? (test.bufferMethod === 'mehlich' && test.bufferPh != null ? mehlichAcidityFromBufferPh(test.bufferPh) : null);
  try {
    if (acidity !== null && acidity !== undefined) {
      const tonsPerAcre = limeTonsPerAcre({ method: 'mehlich-acidity', soilPh: test.soilPh, targetPh: target.targetPh, acidityMeq: acidity });
      const basis = test.acidityMeq != null ? `acidity Ac ${test.acidityMeq}` : `Mehlich buffer pH ${test.bufferPh}`;
      return { ok: true, tonsPerAcre, method: 'mehlich-acidity', reference: LIME_REFERENCE['mehlich-acidity'].words, basis: `soil pH ${test.soilPh}, ${basis} (NCDA&CS method)`, ...common };
    }
    if (test.bufferPh != null && test.bufferMethod !== 'mehlich') {
      const smpTarget = Math.min(target.targetPh, 6.8);
      const tonsPerAcre = limeTonsPerAcre({ method: 'smp-buffer', soilPh: test.soilPh, bufferPh: test.bufferPh, targetPh: smpTarget, depth: o.noTill ? 'no-till' : 'tilled' });
      const assumed = test.bufferMethod === 'smp' ? '' : ' — read as SMP, the buffer most labs use; check your report';
      const depth = o.noTill ? ', halved for ground that is not worked (top 4 in)' : '';
      return { ok: true, tonsPerAcre, method: 'smp-buffer', reference: LIME_REFERENCE['smp-buffer'].words, basis: `soil pH ${test.soilPh}, buffer pH ${test.bufferPh} (Tri-State SMP table${depth})${assumed}`, ...common };
    }
  } catch (error) {
    if (error instanceof LimeInputError) return { ok: false, reason: error.message };
    throw error;
  }
  if (test.soilPh >= target.targetPh) return { ok: true, tonsPerAcre: 0, method: 'smp-buffer', reference: LIME_REFERENCE['smp-buffer'].words, basis: `soil pH ${test.soilPh} is at or above the target`, ...common };
  return { ok: false, reason: 'the soil test has a pH below the target but no buffer pH or acidity (Ac) to size the lime from' };
}
