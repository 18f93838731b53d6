import { z } from 'zod';
import { optionalLocalDate, optionalNumber, optionalText } from './common';

// Plausible ranges, wide on purpose: they catch a value typed in the wrong column or unit, not an unusual soil.
// pH 3–10 and buffer pH 4–8 span the scales soil labs report on (common practice, no source); the rest are
// upper bounds no lab report reaches (from memory).
export const soilTestValuesSchema = z
  .object({
    sampledOn: optionalLocalDate('Sample date'),
    labName: optionalText('Lab', 120),
    ph: optionalNumber('Soil pH', 3, 10),
    bufferPh: optionalNumber('Buffer pH', 4, 8),
    bufferMethod: z.enum(['smp', 'mehlich'], { error: 'Buffer method: choose SMP or Mehlich.' }).optional(),
    // NCDA&CS reports Ac from 0 up; above 30 meq/100 cm³ is a value in the wrong column (from memory).
    acidityMeq: optionalNumber('Exchangeable acidity (Ac)', 0, 30, ' meq/100 cm³'),
    pPpm: optionalNumber('Phosphorus (P)', 0, 2000, ' ppm'),
    kPpm: optionalNumber('Potassium (K)', 0, 5000, ' ppm'),
    organicMatterPct: optionalNumber('Organic matter', 0, 100, '%'),
    limeTonsPerAcre: optionalNumber('Lime', 0, 20, ' tons per acre'),
    nLbPerAcre: optionalNumber('Nitrogen (N)', 0, 1000, ' lb per acre'),
    p2o5LbPerAcre: optionalNumber('Phosphate (P₂O₅)', 0, 1000, ' lb per acre'),
    k2oLbPerAcre: optionalNumber('Potash (K₂O)', 0, 1000, ' lb per acre'),
    recommendation: optionalText('Recommendation', 4000),
  })
  .strict();

export type SoilTestValues = z.infer<typeof soilTestValuesSchema>;

export const SOIL_TEST_NUMBER_FIELDS = [
  'ph', 'bufferPh', 'acidityMeq', 'pPpm', 'kPpm', 'organicMatterPct', 'limeTonsPerAcre', 'nLbPerAcre', 'p2o5LbPerAcre', 'k2oLbPerAcre',
] as const;
export const SOIL_TEST_TEXT_FIELDS = ['sampledOn', 'labName', 'bufferMethod', 'recommendation'] as const;

/** A multipart form's text fields as the schema's input: numbers from their text, blanks left out. */
export function soilTestFormValues(form: FormData): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const key of SOIL_TEST_TEXT_FIELDS) {
    const value = form.get(key);
    if (typeof value === 'string' && value.trim()) out[key] = value;
  }
  for (const key of SOIL_TEST_NUMBER_FIELDS) {
    const value = form.get(key);
    if (typeof value === 'string' && value.trim()) out[key] = /^[-+]?\d*\.?\d+(e[-+]?\d+)?$/i.test(value.trim()) ? Number(value) : value;
  }
  return out;
}
