import { z } from 'zod';
import { optionalLocalDate, optionalText } from './common';

export const STEP_OUTCOMES = ['done', 'skipped'] as const;

/** Marking a step done or skipped: the real date (local, the property's zone; default today) and notes. */
export const stepOutcomeSchema = z
  .object({
    status: z.enum(STEP_OUTCOMES, { error: 'Status must be done or skipped' }),
    date: optionalLocalDate('Date'),
    notes: optionalText('Notes', 2000),
  })
  .strict();

export type StepOutcomeInput = z.infer<typeof stepOutcomeSchema>;
