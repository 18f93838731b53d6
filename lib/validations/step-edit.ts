import { z } from 'zod';
import { STEP_KINDS } from '@/lib/schedule/step-kinds';
import type { StepKind } from '@/lib/schedule/types';
import { daysBetween } from '@/lib/schedule/local-dates';
import { isRealDate, localDate } from './common';
import { plantingSchema } from './planting';

const STEP_KIND_VALUES = Object.keys(STEP_KINDS) as [StepKind, ...StepKind[]];

/** The longest calendar range one request may ask for: a season and its upkeep, with room either side. */
export const CALENDAR_MAX_DAYS = 400;

/** Assigning a step to a person (or to nobody) and pinning or unpinning its date. */
export const stepPatchSchema = z
  .object({
    assigneeId: z.uuid({ error: 'Assignee must be a person of this property (a user id) or null' }).nullable().optional(),
    pinned: z.boolean({ error: 'Pinned must be true or false' }).optional(),
  })
  .strict();

export type StepPatchInput = z.infer<typeof stepPatchSchema>;

/** Moving a step to another local day; `confirm` keeps the day even when the rules advise against it. */
export const stepMoveSchema = z
  .object({
    date: localDate('Date'),
    confirm: z.boolean({ error: 'Confirm must be true or false' }).optional(),
  })
  .strict();

export type StepMoveInput = z.infer<typeof stepMoveSchema>;

const blankToUndefined = (v: unknown) => (v === '' || v === null ? undefined : v);
const realRange = (q: { from: string; to: string }) => isRealDate(q.from) && isRealDate(q.to);

/** The calendar's query string: a local date range and optional filters. */
export const calendarQuerySchema = z
  .object({
    from: localDate('From'),
    to: localDate('To'),
    property: z.preprocess(blankToUndefined, z.uuid({ error: 'Property must be a property id' }).optional()),
    plot: z.preprocess(blankToUndefined, z.uuid({ error: 'Plot must be a plot id' }).optional()),
    kind: z.preprocess(blankToUndefined, z.enum(STEP_KIND_VALUES, { error: 'Kind must be one of the step kinds' }).optional()),
    assignee: z.preprocess(blankToUndefined, z.uuid({ error: 'Assignee must be a user id' }).optional()),
  })
  // The range checks only compare real dates: a bad one is already reported under its own field.
  .refine((q) => !realRange(q) || q.to >= q.from, { message: 'To must not be before From', path: ['to'] })
  .refine((q) => !realRange(q) || q.to < q.from || daysBetween(q.from, q.to) <= CALENDAR_MAX_DAYS, {
    message: `The range may span at most ${CALENDAR_MAX_DAYS} days`,
    path: ['to'],
  });

export type CalendarQuery = z.infer<typeof calendarQuerySchema>;

/** What-if: the planting as the planner form has it, and two or three seeding dates to compare. */
export const planCompareSchema = z.object({
  planting: plantingSchema,
  seedDates: z
    .array(localDate('Seeding date'), { error: 'Seeding dates must be a list of dates' })
    .min(2, 'Give two or three seeding dates to compare')
    .max(3, 'Compare at most three seeding dates')
    .refine((dates) => new Set(dates).size === dates.length, 'Each seeding date may appear once'),
});

export type PlanCompareInput = z.infer<typeof planCompareSchema>;
