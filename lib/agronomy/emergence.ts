// Days from sowing to seedling emergence at a constant soil temperature at seeding depth, per species, calibrated
// to published days-to-emergence tables and degree-day requirements. The germination check sums the daily fraction
// 1 / daysToEmergence(T) over the days' soil temperatures until it reaches 1 — the development-rate (thermal-time)
// summation of crop models: emergence rate rises about linearly with temperature between a base and an optimum
// (Angus, Cunningham, Moncur & Mackenzie 1981, Field Crops Research 3:365–378; Bierhuizen & Wagenvoort 1974,
// Scientia Horticulturae 2:213–219 — both from memory).
import { growingDegreeDays } from './gdd';

/** One row of a days-to-emergence table: days at each tested soil temperature; null = no germination (NG). */
type TableRow = ReadonlyArray<readonly [soilTempF: number, days: number | null]>;

export type EmergenceCalibration =
  | { speciesId: string; model: 'table'; row: TableRow; source: string }
  | { speciesId: string; model: 'degree-days'; baseF: number; upperCapF: number | null; degreeDaysF: number; source: string };

const HARRINGTON_MINGES =
  'Harrington & Minges (1954), Vegetable Seed Germination, California Agricultural Extension mimeo leaflet: days to ' +
  'emergence from seed planted ½ in deep at soil temperatures 32–104 °F, as reproduced in Knott’s Handbook for ' +
  'Vegetable Growers (1997) and in Teaching Organic Farming and Gardening (UC Santa Cruz), Unit 1.3 Appendix 4 (whole days)';

// Harrington & Minges rows, as Appendix 4 prints them (32, 41, 50, 59, 68, 77, 86, 95, 104 °F; "—" = not tested,
// left out; "NG" = no germination, null).
const TURNIP: TableRow = [[32, null], [41, null], [50, 5], [59, 3], [68, 2], [77, 1], [86, 1], [95, 1], [104, 3]];
const RADISH: TableRow = [[32, null], [41, 29], [50, 11], [59, 6], [68, 4], [77, 4], [86, 3]];
const PEA: TableRow = [[41, 36], [50, 14], [59, 9], [68, 8], [77, 6], [86, 6]];
const LETTUCE: TableRow = [[32, 49], [41, 15], [50, 7], [59, 4], [68, 3], [77, 2], [86, 3], [95, null], [104, null]];
const SNAP_BEAN: TableRow = [[32, null], [41, null], [50, null], [59, 16], [68, 11], [77, 8], [86, 6], [95, 6], [104, null]];

const CORN_GDD =
  'R. L. Nielsen, Purdue University Agronomy, The Emergence Process in Corn: 100–120 GDD (86/50 °F method) from planting ' +
  'to emergence, best counted from soil temperature; also UNL CropWatch, Growing Degree Units and Corn Emergence (2015) ' +
  'and Iowa State University ICM (2021). Sowcast takes the midpoint, 110';
// Nori, Black & Moot: field emergence of annual clovers (Lincoln University thesis, Nori 2013), base 0 °C.
const ANNUAL_CLOVER_FIELD =
  'Nori (2013), The development and growth of annual clovers for use in dryland pasture (Lincoln University, NZ), ' +
  'abstract: arrowleaf clover emerged after 90 °C·d and gland clover after 96 °C·d, base temperature 0 °C; ' +
  'optimum germination temperature 16–20 °C. Sowcast: 90 °C·d = 162 °F·d above 32 °F, rate held at its 68 °F (20 °C) value above that';
const PERENNIAL_FROM_ANNUAL =
  `no published days-to-emergence table found for this species; ${ANNUAL_CLOVER_FIELD}. ` +
  'Moot, Scott, Roy & Nicholls (2000, NZ J. Agric. Res. 43:15–25) found base temperatures ≤ 4 °C for temperate pasture ' +
  'legumes, which fits the 0 °C base; that the perennial species need the same thermal time is Sowcast’s assumption';
const SMALL_GRAIN =
  'NDSU / North Dakota Agricultural Weather Network small-grain degree-day model (Bauer et al.), base 32 °F: wheat about ' +
  '180 GDD from planting to emergence, barley about 176 (NDSU Extension, Williams County, 2012); University of Minnesota ' +
  'Extension (Wiersma): oats and barley take a few less than wheat';

const CATALOG: EmergenceCalibration[] = [
  { speciesId: 'turnip', model: 'table', row: TURNIP, source: `${HARRINGTON_MINGES}, row "Turnip"` },
  {
    speciesId: 'forage-rape',
    model: 'table',
    row: TURNIP,
    source: `${HARRINGTON_MINGES}, row "Turnip" — the closest row for rape (same genus, Brassica); no rape row in the table`,
  },
  { speciesId: 'forage-radish', model: 'table', row: RADISH, source: `${HARRINGTON_MINGES}, row "Radish"` },
  { speciesId: 'austrian-winter-peas', model: 'table', row: PEA, source: `${HARRINGTON_MINGES}, row "Pea"` },
  {
    speciesId: 'chicory',
    model: 'table',
    row: LETTUCE,
    source: `${HARRINGTON_MINGES}, row "Lettuce" — the closest row for chicory (both in the chicory tribe, Cichorieae); no chicory row in the table`,
  },
  {
    speciesId: 'cowpeas',
    model: 'table',
    row: SNAP_BEAN,
    source: `${HARRINGTON_MINGES}, row "Bean, snap" — the closest row for cowpeas (a warm-season bean); no cowpea row in the table`,
  },
  { speciesId: 'corn', model: 'degree-days', baseF: 50, upperCapF: 86, degreeDaysF: 110, source: CORN_GDD },
  {
    speciesId: 'soybeans',
    model: 'degree-days',
    baseF: 50,
    upperCapF: 86,
    degreeDaysF: 110,
    source:
      'Iowa State University ICM (Anderson & Vittetoe 2021), citing Conley & Gaska (2010) and Casteel (2010): 90–130 GDD ' +
      '(base 50 °F) from planting to soybean emergence; Sowcast takes the midpoint, 110, with the corn method’s 86 °F cap',
  },
  {
    speciesId: 'grain-sorghum',
    model: 'degree-days',
    baseF: 50,
    upperCapF: 86,
    degreeDaysF: 110,
    source: `from memory: no sorghum figure found; taken equal to corn (${CORN_GDD})`,
  },
  { speciesId: 'winter-wheat', model: 'degree-days', baseF: 32, upperCapF: null, degreeDaysF: 180, source: `${SMALL_GRAIN}: wheat 180` },
  {
    speciesId: 'oats',
    model: 'degree-days',
    baseF: 32,
    upperCapF: null,
    degreeDaysF: 176,
    source: `${SMALL_GRAIN}: oats taken at barley’s 176`,
  },
  {
    speciesId: 'cereal-rye',
    model: 'degree-days',
    baseF: 32,
    upperCapF: null,
    degreeDaysF: 180,
    source: `${SMALL_GRAIN}: no rye figure found, taken at wheat’s 180`,
  },
  { speciesId: 'crimson-clover', model: 'degree-days', baseF: 32, upperCapF: 68, degreeDaysF: 162, source: ANNUAL_CLOVER_FIELD },
  { speciesId: 'arrowleaf-clover', model: 'degree-days', baseF: 32, upperCapF: 68, degreeDaysF: 162, source: ANNUAL_CLOVER_FIELD },
  { speciesId: 'berseem-clover', model: 'degree-days', baseF: 32, upperCapF: 68, degreeDaysF: 162, source: ANNUAL_CLOVER_FIELD },
  { speciesId: 'white-clover', model: 'degree-days', baseF: 32, upperCapF: 68, degreeDaysF: 162, source: PERENNIAL_FROM_ANNUAL },
  { speciesId: 'red-clover', model: 'degree-days', baseF: 32, upperCapF: 68, degreeDaysF: 162, source: PERENNIAL_FROM_ANNUAL },
  { speciesId: 'alfalfa', model: 'degree-days', baseF: 32, upperCapF: 68, degreeDaysF: 162, source: PERENNIAL_FROM_ANNUAL },
  {
    speciesId: 'buckwheat',
    model: 'degree-days',
    baseF: 41,
    upperCapF: 86,
    degreeDaysF: 180,
    source: 'from memory, no source found: about 100 °C·d above 5 °C (180 °F·d above 41 °F), about 5 days in 77 °F soil',
  },
];

const BY_ID = new Map(CATALOG.map((c) => [c.speciesId, c]));

export const EMERGENCE_SOURCES = {
  model:
    'development-rate summation: each day adds 1 / (days to emergence at that day’s soil temperature), and seedlings are up ' +
    'when the sum reaches 1 (Angus et al. 1981; Bierhuizen & Wagenvoort 1974 — from memory)',
  interpolation:
    'between the table’s tested temperatures the rate (1 / days) is interpolated linearly, as development rate is about linear ' +
    'in temperature; "no germination" is a rate of 0; below the lowest tested temperature there is no emergence (Infinity), ' +
    'above the highest the last tested value holds (Sowcast’s choice)',
  degreeDays: 'degree-day species: days = degree days needed ÷ (soil °F clamped to the upper cap − base); Infinity at or below the base',
} as const;

export function emergenceCalibration(speciesId: string): EmergenceCalibration {
  const found = BY_ID.get(speciesId);
  if (!found) {
    throw new RangeError(`No emergence calibration for species "${speciesId}"; known: ${CATALOG.map((c) => c.speciesId).join(', ')}.`);
  }
  return found;
}

function tableDays(row: TableRow, soilTempF: number): number {
  const rate = (days: number | null) => (days === null ? 0 : 1 / days);
  const [lowestF] = row[0];
  if (soilTempF < lowestF) return Infinity;
  const last = row[row.length - 1];
  if (soilTempF >= last[0]) return last[1] === null ? Infinity : last[1];
  for (let i = 1; i < row.length; i++) {
    const [t1, d1] = row[i];
    if (soilTempF > t1) continue;
    const [t0, d0] = row[i - 1];
    const r = rate(d0) + ((rate(d1) - rate(d0)) * (soilTempF - t0)) / (t1 - t0);
    return r > 0 ? 1 / r : Infinity;
  }
  return Infinity;
}

/**
 * Median days from sowing to emergence with the seed zone held at `soilTempF` (moist soil assumed). Infinity where
 * the species does not come up at that temperature (below its base or its lowest tested temperature, or "NG").
 */
export function daysToEmergence(speciesId: string, soilTempF: number): number {
  if (typeof soilTempF !== 'number' || !Number.isFinite(soilTempF)) {
    throw new RangeError(`soilTempF must be a number of °F (got ${soilTempF}).`);
  }
  const c = emergenceCalibration(speciesId);
  if (c.model === 'table') return tableDays(c.row, soilTempF);
  if (soilTempF <= c.baseF) return Infinity;
  const perDay = growingDegreeDays(soilTempF, soilTempF, c.upperCapF === null ? { base: c.baseF } : { base: c.baseF, upperCap: c.upperCapF });
  return c.degreeDaysF / perDay;
}

/**
 * Rate summation over a run of daily soil temperatures (°F, the first day first): the 1-based day on which
 * Σ 1 / daysToEmergence(T) reaches 1, or null if it does not within the days given.
 */
export function emergenceDay(speciesId: string, dailySoilTempF: readonly number[]): number | null {
  let sum = 0;
  for (let i = 0; i < dailySoilTempF.length; i++) {
    sum += 1 / daysToEmergence(speciesId, dailySoilTempF[i]);
    // Float noise (1/3 + 1/3 + 1/3) must not cost a day.
    if (sum >= 1 - 1e-9) return i + 1;
  }
  return null;
}
