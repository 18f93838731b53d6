import './zod-config';
import { z } from 'zod';

/** Empty form fields ('' or NaN from a number input) mean "not given". */
const blankToUndefined = (value: unknown) =>
  value === '' || value === null || (typeof value === 'number' && Number.isNaN(value)) ? undefined : value;

/**
 * C0 control characters and DEL, except tab, line feed and carriage return (which multi-line notes use).
 * PostgreSQL refuses U+0000 in text outright ("invalid byte sequence"), and none of the others is typed by
 * a person; they come from pasted binary or a crafted request.
 */
const CONTROL_CHARACTER = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;

export const hasControlCharacter = (value: string) => CONTROL_CHARACTER.test(value);

/** Text as people type it: no control characters (above). Every free-text field is built on this. */
export const plainText = (label: string, error = `${label} must be text`) =>
  z.string({ error }).refine((v) => !hasControlCharacter(v), `${label} must not contain control characters`);

export const requiredText = (label: string, max = 120) =>
  plainText(label, `${label} is required`)
    .trim()
    .min(1, `${label} is required`)
    .max(max, `${label} must be at most ${max} characters`);

export const optionalText = (label: string, max = 2000) =>
  z.preprocess(
    (v) => (typeof v === 'string' && v.trim() === '' ? undefined : blankToUndefined(v)),
    plainText(label).trim().max(max, `${label} must be at most ${max} characters`).optional(),
  );

export const requiredNumber = (label: string, min: number, max: number, unit = '') =>
  z.preprocess(
    blankToUndefined,
    z
      .number({ error: `${label} must be a number` })
      .refine(Number.isFinite, `${label} must be a number`)
      .min(min, `${label} must be at least ${min}${unit}`)
      .max(max, `${label} must be at most ${max}${unit}`),
  );

export const optionalNumber = (label: string, min: number, max: number, unit = '') =>
  z.preprocess(
    blankToUndefined,
    z
      .number({ error: `${label} must be a number` })
      .min(min, `${label} must be at least ${min}${unit}`)
      .max(max, `${label} must be at most ${max}${unit}`)
      .optional(),
  );

const MONTH_DAYS = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** A day of the year that recurs annually, as 'MM-DD' (average frost dates). */
export const optionalMonthDay = (label: string) =>
  z.preprocess(
    blankToUndefined,
    z
      .string({ error: `${label} must be a month and day` })
      .regex(/^\d{2}-\d{2}$/, `${label} must be a month and day like 04-15`)
      .refine((v) => {
        const [m, d] = v.split('-').map(Number);
        return m >= 1 && m <= 12 && d >= 1 && d <= MONTH_DAYS[m - 1];
      }, `${label} is not a real day of the year`)
      .optional(),
  );

export function isRealDate(value: string): boolean {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(value)) return false;
  const [y, m, d] = value.split('-').map(Number);
  const date = new Date(Date.UTC(y, m - 1, d));
  return date.getUTCFullYear() === y && date.getUTCMonth() === m - 1 && date.getUTCDate() === d && y >= 1900 && y <= 2200;
}

/** A local calendar date 'YYYY-MM-DD'. */
export const localDate = (label: string) =>
  z
    .string({ error: `${label} must be a date` })
    .refine(isRealDate, `${label} must be a real date (YYYY-MM-DD)`);

export const optionalLocalDate = (label: string) => z.preprocess(blankToUndefined, localDate(label).optional());

export const uuid = z.uuid();

/** Field errors keyed by field path, as the forms show them. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || '_';
    if (!out[key]) out[key] = issue.message;
  }
  return out;
}
