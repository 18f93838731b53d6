// A soil lab's results as CSV: one sample, either as a header row over one row of values or as two columns
// of name and value. Headers are matched in the spellings labs commonly use, with the unit read from the
// header ("P (lb/A)", "Lime, lb/1000 sq ft"); every value is converted to the units Sowcast stores.
import Papa from 'papaparse';
import { SHORT_TON_LB, SQ_FT_PER_ACRE } from '@/lib/agronomy/units';
import { isRealDate } from '@/lib/validations/common';
import type { SoilTestValues } from '@/lib/validations/soil-test';

export class SoilTestCsvError extends Error {
  override name = 'SoilTestCsvError';
}

type Field = keyof SoilTestValues;
type Unit = 'none' | 'ppm' | 'lbPerAcre' | 'pct' | 'tonsPerAcre' | 'lbPer1000SqFt';

interface Column {
  field: Field;
  label: string;
  /** Header spellings, lower-cased with everything but letters and digits removed, units taken off. */
  names: string[];
  units: Unit[];
  /** The unit a header without one is read in. */
  defaultUnit: Unit;
  required?: boolean;
}

// Soil-test P and K are reported either in ppm (mg/kg) or in lb per acre; the lb/acre figure is the ppm
// figure times 2, from the 2,000,000 lb "acre furrow slice" (6⅔ in deep) that US soil-test reports assume
// (common practice, no single source).
const PPM_PER_LB_PER_ACRE = 0.5;

const COLUMNS: Column[] = [
  { field: 'ph', label: 'soil pH', names: ['ph', 'soilph', 'phwater', 'waterph', 'phh2o', 'ph11', 'ph1to1', 'ph11water', 'phwater11', 'soilph11', 'soilwaterph'], units: ['none'], defaultUnit: 'none', required: true },
  {
    field: 'bufferPh', label: 'buffer pH',
    names: ['bufferph', 'bph', 'buffer', 'smpbuffer', 'smpbufferph', 'sikorabuffer', 'sikorabufferph', 'mehlichbuffer', 'mehlichbufferph', 'adamsevansbuffer', 'adamsevansbufferph', 'bufferphsmp', 'bufferphsikora', 'bufferphmehlich', 'bufferphadamsevans'],
    units: ['none'], defaultUnit: 'none',
  },
  {
    field: 'pPpm', label: 'phosphorus (P)',
    names: ['p', 'phosphorus', 'mehlich3p', 'm3p', 'mehlichp', 'brayp', 'brayp1', 'p1', 'olsenp', 'pmehlich3', 'pbray1', 'polsen', 'soilp'],
    units: ['ppm', 'lbPerAcre'], defaultUnit: 'ppm', required: true,
  },
  {
    field: 'kPpm', label: 'potassium (K)',
    names: ['k', 'potassium', 'mehlich3k', 'm3k', 'mehlichk', 'kmehlich3', 'exchk', 'exchangeablek', 'soilk'],
    units: ['ppm', 'lbPerAcre'], defaultUnit: 'ppm', required: true,
  },
  // The North Carolina lab's exchangeable acidity, meq/100 cm³ (NCDA&CS: Ac = (6.6 − Mehlich buffer pH) × 4).
  { field: 'acidityMeq', label: 'exchangeable acidity (Ac)', names: ['ac', 'acidity', 'exchangeableacidity', 'exchacidity', 'acmeq', 'acmeq100cm3'], units: ['none'], defaultUnit: 'none' },
  { field: 'organicMatterPct', label: 'organic matter', names: ['om', 'organicmatter', 'omloi', 'organicmatterloi', 'som', 'soilorganicmatter'], units: ['pct'], defaultUnit: 'pct' },
  {
    field: 'limeTonsPerAcre', label: 'lime recommendation',
    names: ['lime', 'limerec', 'limerecommendation', 'limerecommended', 'limerequirement', 'aglime', 'aglimerec', 'recommendedlime'],
    units: ['tonsPerAcre', 'lbPerAcre', 'lbPer1000SqFt'], defaultUnit: 'tonsPerAcre',
  },
  { field: 'nLbPerAcre', label: 'nitrogen (N) recommendation', names: ['n', 'nrec', 'nitrogen', 'nitrogenrec', 'nrecommendation', 'nitrogenrecommendation', 'recommendedn'], units: ['lbPerAcre', 'lbPer1000SqFt'], defaultUnit: 'lbPerAcre' },
  { field: 'p2o5LbPerAcre', label: 'phosphate (P₂O₅) recommendation', names: ['p2o5', 'p2o5rec', 'phosphate', 'phosphaterec', 'p2o5recommendation', 'recommendedp2o5'], units: ['lbPerAcre', 'lbPer1000SqFt'], defaultUnit: 'lbPerAcre' },
  { field: 'k2oLbPerAcre', label: 'potash (K₂O) recommendation', names: ['k2o', 'k2orec', 'potash', 'potashrec', 'k2orecommendation', 'recommendedk2o'], units: ['lbPerAcre', 'lbPer1000SqFt'], defaultUnit: 'lbPerAcre' },
  { field: 'recommendation', label: 'recommendation', names: ['recommendation', 'recommendations', 'comments', 'comment', 'notes', 'remarks', 'labcomments'], units: ['none'], defaultUnit: 'none' },
  { field: 'sampledOn', label: 'sample date', names: ['datesampled', 'sampledate', 'sampled', 'sampledon', 'samplingdate', 'date'], units: ['none'], defaultUnit: 'none' },
  { field: 'labName', label: 'lab', names: ['lab', 'laboratory', 'labname'], units: ['none'], defaultUnit: 'none' },
];

// Headers that name the sample, not a result; a two-column file may carry them as rows.
const IGNORED = new Set(['sample', 'sampleid', 'sampleno', 'samplenumber', 'id', 'field', 'fieldid', 'plot', 'plotname', 'labno', 'labnumber', 'name', 'client', 'grower', 'depth', 'crop']);

const UNIT_PATTERNS: [RegExp, Unit][] = [
  [/\b(lbs?|pounds?)\s*(\/|per)\s*1,?000\s*(sq\.?\s*ft|ft2|ft²|square\s*feet)/i, 'lbPer1000SqFt'],
  [/\b(tons?|t)\s*(\/|per)\s*(a|ac|acre)\b/i, 'tonsPerAcre'],
  [/\b(lbs?|pounds?)\s*(\/|per)\s*(a|ac|acre)\b/i, 'lbPerAcre'],
  [/\b(ppm|mg\s*\/\s*kg)\b/i, 'ppm'],
  [/%|\bpercent\b|\bpct\b/i, 'pct'],
];

/** Splits a header into its name and the unit stated in it (in brackets, after a comma, or trailing). */
function readHeader(header: string): { key: string; unit: Unit | null; unitText: string | null } {
  let unit: Unit | null = null;
  let unitText: string | null = null;
  for (const [pattern, u] of UNIT_PATTERNS) {
    const m = pattern.exec(header);
    if (m) {
      unit = u;
      unitText = m[0];
      break;
    }
  }
  // A bracketed unit we do not know ("P (kg/ha)") is reported, not ignored.
  const bracket = /[([]\s*([^)\]]+?)\s*[)\]]/.exec(header)?.[1] ?? null;
  if (!unit && bracket && /\/|per\b/i.test(bracket)) unitText = bracket;
  let name = header;
  if (unitText) name = name.replace(unitText, ' ');
  // What is left in brackets after the unit is gone (an extraction method, a ratio) stays part of the name.
  name = name.replace(/[()[\]]/g, ' ').replace(/,\s*$/, '');
  const key = name
    .toLowerCase()
    .replace(/₂/g, '2')
    .replace(/₅/g, '5')
    .replace(/[^a-z0-9]/g, '');
  return { key, unit, unitText };
}

/** The buffer a buffer-pH header names: Sikora's buffer is calibrated to read as SMP (Sikora 2006). */
function bufferMethodOf(key: string): 'smp' | 'mehlich' | undefined {
  if (/smp|sikora/.test(key)) return 'smp';
  if (/mehlich/.test(key)) return 'mehlich';
  return undefined;
}

function findColumn(key: string): Column | undefined {
  return COLUMNS.find((c) => c.names.includes(key));
}

function convert(value: number, from: Unit, column: Column): number {
  switch (column.field) {
    case 'pPpm':
    case 'kPpm':
      return from === 'lbPerAcre' ? value * PPM_PER_LB_PER_ACRE : value;
    case 'limeTonsPerAcre':
      if (from === 'lbPerAcre') return value / SHORT_TON_LB;
      if (from === 'lbPer1000SqFt') return (value * (SQ_FT_PER_ACRE / 1000)) / SHORT_TON_LB;
      return value;
    case 'nLbPerAcre':
    case 'p2o5LbPerAcre':
    case 'k2oLbPerAcre':
      return from === 'lbPer1000SqFt' ? value * (SQ_FT_PER_ACRE / 1000) : value;
    default:
      return value;
  }
}

const UNIT_WORDS: Record<Unit, string> = {
  none: 'no unit',
  ppm: 'ppm (mg/kg)',
  lbPerAcre: 'lb/acre',
  pct: '%',
  tonsPerAcre: 'tons/acre',
  lbPer1000SqFt: 'lb/1000 sq ft',
};

/** Month/day/year as US labs print it, or ISO; anything else is reported. */
function readDate(text: string, header: string): string {
  const iso = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(text);
  const us = /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/.exec(text);
  const parts = iso ? [iso[1], iso[2], iso[3]] : us ? [us[3], us[1], us[2]] : null;
  const value = parts ? `${parts[0]}-${parts[1].padStart(2, '0')}-${parts[2].padStart(2, '0')}` : '';
  if (!isRealDate(value)) throw new SoilTestCsvError(`The “${header}” value “${text}” is not a date (use YYYY-MM-DD or MM/DD/YYYY).`);
  return value;
}

/** The sample's values in Sowcast's units, or a SoilTestCsvError naming the column that is missing or bad. */
export function parseSoilTestCsv(text: string): SoilTestValues {
  const body = text.replace(/^\uFEFF/, '');
  if (!body.trim()) throw new SoilTestCsvError('The CSV file is empty.');
  const parsed = Papa.parse<string[]>(body.trim(), { skipEmptyLines: 'greedy' });
  const fatal = parsed.errors.find((e) => e.type === 'Quotes');
  if (fatal) throw new SoilTestCsvError(`The CSV could not be read: ${fatal.message} (row ${(fatal.row ?? 0) + 1}).`);
  const rows = parsed.data.map((r) => r.map((cell) => (cell ?? '').trim()));
  if (rows.length < 2) throw new SoilTestCsvError('The CSV needs a header row and a row of results under it.');

  const pairs = namedValues(rows);
  const values: Record<string, unknown> = {};
  const seen = new Map<Field, string>();
  for (const { header, value } of pairs) {
    const { key, unit, unitText } = readHeader(header);
    if (!key || IGNORED.has(key)) continue;
    const column = findColumn(key);
    if (!column) continue;
    if (seen.has(column.field)) {
      throw new SoilTestCsvError(`The CSV has two ${column.label} columns (“${seen.get(column.field)}” and “${header}”); keep one.`);
    }
    seen.set(column.field, header);
    if (!unit && unitText) {
      throw new SoilTestCsvError(`The “${header}” column is in ${unitText}, which Sowcast does not read; use ${column.units.map((u) => UNIT_WORDS[u]).join(' or ')}.`);
    }
    const from = unit ?? column.defaultUnit;
    if (!column.units.includes(from)) {
      throw new SoilTestCsvError(`The “${header}” column is in ${UNIT_WORDS[from]}; ${column.label} must be in ${column.units.map((u) => UNIT_WORDS[u]).join(' or ')}.`);
    }
    if (value === '') continue;
    if (column.field === 'recommendation' || column.field === 'labName') values[column.field] = value;
    else if (column.field === 'sampledOn') values.sampledOn = readDate(value, header);
    else {
      const number = Number(value.replace(/,/g, ''));
      if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(value.replace(/,/g, '')) || !Number.isFinite(number)) {
        throw new SoilTestCsvError(`The “${header}” value “${value}” is not a number.`);
      }
      values[column.field] = roundConverted(convert(number, from, column));
      if (column.field === 'bufferPh' && bufferMethodOf(key)) values.bufferMethod = bufferMethodOf(key);
    }
  }
  for (const column of COLUMNS.filter((c) => c.required)) {
    if (!seen.has(column.field)) {
      throw new SoilTestCsvError(
        `The CSV has no ${column.label} column (a header such as ${column.names.slice(0, 3).map((n) => `“${displayName(n)}”`).join(', ')}).`,
      );
    }
    if (values[column.field] === undefined) throw new SoilTestCsvError(`The “${seen.get(column.field)}” column has no value.`);
  }
  return values as SoilTestValues;
}

const displayName = (key: string) => ({ ph: 'pH', soilph: 'Soil pH', phwater: 'pH (water)', p: 'P', phosphorus: 'Phosphorus', mehlich3p: 'Mehlich 3 P', k: 'K', potassium: 'Potassium', mehlich3k: 'Mehlich 3 K' })[key] ?? key;

// Unit conversions such as lb/1000 sq ft → lb/acre leave binary fractions; six decimals is far finer than any lab.
const roundConverted = (value: number) => Math.round(value * 1e6) / 1e6;

/** Header-over-values (one sample) or two columns of name and value. */
function namedValues(rows: string[][]): { header: string; value: string }[] {
  const [head, ...rest] = rows;
  const twoColumn = rows.every((r) => r.length <= 2) && rows.filter((r) => findColumn(readHeader(r[0] ?? '').key)).length >= 2;
  if (twoColumn) {
    const first = readHeader(head[0] ?? '').key;
    const body = findColumn(first) ? rows : rest;
    return body.map((r) => ({ header: r[0] ?? '', value: r[1] ?? '' }));
  }
  if (rest.length > 1) {
    throw new SoilTestCsvError(`The CSV holds ${rest.length} samples; upload the one for this plot (a header row and one row of results).`);
  }
  return head.map((header, i) => ({ header, value: rest[0][i] ?? '' }));
}
