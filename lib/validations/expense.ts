import { z } from 'zod';
import { localDate, optionalNumber, requiredText } from './common';

export const EXPENSE_CATEGORIES = ['seed', 'herbicide', 'fertilizer', 'lime', 'fuel', 'equipment', 'labour', 'other'] as const;
export type ExpenseCategory = (typeof EXPENSE_CATEGORIES)[number];

export const EXPENSE_CATEGORY_LABELS: Record<ExpenseCategory, string> = {
  seed: 'Seed',
  herbicide: 'Herbicide',
  fertilizer: 'Fertilizer',
  lime: 'Lime',
  fuel: 'Fuel',
  equipment: 'Equipment',
  labour: 'Labour',
  other: 'Other',
};

export const EXPENSE_SEASONS = ['spring', 'fall'] as const;

const MAX_CENTS = 100_000_000; // $1,000,000.00: far above any food plot bill, well inside an integer column

/**
 * Dollars as typed ("120", "120.5", "$1,204.50") → integer cents, read from the text so no binary
 * floating-point rounding ever touches money. A JSON number is read through its shortest decimal text.
 */
export function dollarsToCents(value: unknown): number | null {
  const text = typeof value === 'number' ? (Number.isFinite(value) ? String(value) : '') : typeof value === 'string' ? value.trim() : '';
  const m = /^\$?\s*(\d{1,3}(?:,\d{3})+|\d+)(?:\.(\d{1,2}))?$/.exec(text);
  if (!m) return null;
  const whole = Number(m[1].replaceAll(',', ''));
  const fraction = m[2] ? Number(m[2].padEnd(2, '0')) : 0;
  return whole * 100 + fraction;
}

const amountCents = z
  .unknown()
  .transform((value, ctx) => {
    if (value === undefined || value === null || value === '') {
      ctx.addIssue({ code: 'custom', message: 'Amount is required' });
      return z.NEVER;
    }
    const cents = dollarsToCents(value);
    if (cents === null) {
      ctx.addIssue({ code: 'custom', message: 'Amount must be dollars and cents, like 120 or 120.50' });
      return z.NEVER;
    }
    if (cents > MAX_CENTS) {
      ctx.addIssue({ code: 'custom', message: 'Amount must be at most $1,000,000.00' });
      return z.NEVER;
    }
    return cents;
  });

/** An expense as the costs form and POST /api/properties/[id]/expenses take it. Blank plot = the whole property. */
export const expenseSchema = z
  .object({
    plotId: z.preprocess((v) => (v === '' || v === undefined ? null : v), z.uuid({ error: 'Plot must be one of the property’s plots' }).nullable()),
    season: z.enum(EXPENSE_SEASONS, { error: 'Season must be spring or fall' }),
    year: z.preprocess(
      (v) => (typeof v === 'string' && v.trim() !== '' ? Number(v) : v),
      z.number({ error: 'Year must be a number' }).int('Year must be a whole number').min(2000, 'Year must be 2000 or later').max(2200, 'Year must be 2200 or earlier'),
    ),
    spentOn: localDate('Date'),
    category: z.enum(EXPENSE_CATEGORIES, { error: 'Category must be one of seed, herbicide, fertilizer, lime, fuel, equipment, labour, other' }),
    description: requiredText('Description', 200),
    amount: amountCents,
    labourHours: optionalNumber('Labour hours', 0, 10_000, ' h'),
    paidBy: z.preprocess((v) => (v === '' ? undefined : v), z.uuid({ error: 'Say who paid' })),
    splitAmong: z
      .array(z.uuid({ error: 'Split among must name people on this property' }), { error: 'Split among must be a list of people' })
      .max(100, 'Split among at most 100 people')
      .refine((ids) => new Set(ids).size === ids.length, 'Each person may be named once')
      .default([]),
  })
  .strict()
  .superRefine((value, ctx) => {
    if (value.category === 'labour' && value.labourHours === undefined) {
      ctx.addIssue({ code: 'custom', path: ['labourHours'], message: 'Labour hours are required for labour' });
    }
  });

export type ExpenseInput = z.infer<typeof expenseSchema>;

/** The optional season filter of GET /api/properties/[id]/expenses and its CSV export. */
export const expenseQuerySchema = z
  .object({
    season: z.enum(EXPENSE_SEASONS, { error: 'Season must be spring or fall' }).optional(),
    year: z.preprocess((v) => (v === undefined ? undefined : Number(v)), z.number({ error: 'Year must be a number' }).int().min(2000).max(2200).optional()),
  })
  .strict();

/** The season filter from a request URL's query. */
export function parseExpenseFilter(url: string) {
  const params = new URL(url).searchParams;
  return expenseQuerySchema.parse({ season: params.get('season') ?? undefined, year: params.get('year') ?? undefined });
}
