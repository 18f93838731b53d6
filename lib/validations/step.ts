import { z } from 'zod';
import { SPECIES } from '@/lib/agronomy/species';
import { optionalLocalDate, optionalText } from './common';

export const STEP_OUTCOMES = ['done', 'skipped'] as const;

/** Steps whose record says how much seed actually went out. */
export const SEED_RECORD_KINDS = ['seed', 'frost-seed'] as const;

/** Sowcast's own bound, to catch a slipped digit: about 20 acres at a heavy 500 lb/acre rate (common practice, no source). */
export const MAX_SEED_LB = 10_000;

const KNOWN_SPECIES = new Set(SPECIES.map((s) => s.id));

const blank = (value: unknown) => (value === '' || value === null || (typeof value === 'number' && Number.isNaN(value)) ? undefined : value);

const pounds = (label: string) =>
  z
    .number({ error: `${label} must be a number of pounds` })
    .refine(Number.isFinite, `${label} must be a number of pounds`)
    .positive(`${label} must be more than 0 lb`)
    .max(MAX_SEED_LB, `${label} must be at most ${MAX_SEED_LB} lb`);

/**
 * What was really done, beyond the date: for a seeding, the pounds actually broadcast (and, when the person
 * weighed them out separately, per species — the parts must add up to the total).
 */
export const stepRecordSchema = z
  .object({
    seedLb: pounds('Seed broadcast'),
    species: z
      .array(
        z
          .object({
            speciesId: z.string({ error: 'Species must be named' }).refine((id) => KNOWN_SPECIES.has(id), 'Species is not in the catalog'),
            lb: pounds('Seed of a species'),
          })
          .strict(),
      )
      .max(20, 'At most 20 species')
      .optional(),
  })
  .strict()
  .superRefine((record, ctx) => {
    if (!record.species?.length) return;
    const ids = record.species.map((s) => s.speciesId);
    if (new Set(ids).size !== ids.length) ctx.addIssue({ code: 'custom', path: ['species'], message: 'Each species may be listed once' });
    const sum = record.species.reduce((total, s) => total + s.lb, 0);
    // Entries are typed to a tenth of a pound; the parts may differ from the total by their rounding only.
    if (Math.abs(sum - record.seedLb) > Math.max(0.05 * record.species.length, record.seedLb * 0.005)) {
      ctx.addIssue({ code: 'custom', path: ['species'], message: `The species add up to ${Math.round(sum * 10) / 10} lb, not the ${record.seedLb} lb broadcast` });
    }
  });

/**
 * Marking a step done or skipped: the real date (local, the property's zone; default today), the moment it
 * was done (an RFC 3339 instant with its offset; default now), notes and, for a seeding, what went out.
 */
export const stepOutcomeSchema = z
  .object({
    status: z.enum(STEP_OUTCOMES, { error: 'Status must be done or skipped' }),
    date: optionalLocalDate('Date'),
    doneAt: z.preprocess(
      blank,
      z.iso.datetime({ offset: true, error: 'Done at must be a date and time with its offset, like 2027-09-14T08:30:00-05:00' }).optional(),
    ),
    notes: optionalText('Notes', 2000),
    record: z.preprocess(blank, stepRecordSchema.optional()),
  })
  .strict();

export type StepOutcomeInput = z.infer<typeof stepOutcomeSchema>;
export type StepRecord = z.infer<typeof stepRecordSchema>;
