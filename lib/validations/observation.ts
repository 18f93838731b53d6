import { z } from 'zod';
import { optionalLocalDate, optionalText, uuid } from './common';

export const WEED_PRESSURES = ['none', 'light', 'moderate', 'heavy'] as const;
export const WEED_PRESSURE_LABELS: Record<(typeof WEED_PRESSURES)[number], string> = {
  none: 'None',
  light: 'Light',
  moderate: 'Moderate',
  heavy: 'Heavy',
};

/** The most spots a check records; more than this is a typo, not a survey. */
export const MAX_SPOTS = 30;
export const MAX_PHOTOS_PER_CHECK = 12;

const spotCount = z
  .number({ error: 'Each spot needs a count of plants' })
  .int('A count is a whole number of plants')
  .min(0, 'A count cannot be below 0')
  .max(10_000, 'A count must be at most 10,000 plants');

/** A germination check as the check form sends it. */
export const observationSchema = z
  .object({
    stepId: uuid.optional(),
    observedOn: optionalLocalDate('Date of the check'),
    standRating: z
      .number({ error: 'Stand rating must be 1 to 5' })
      .int('Stand rating must be 1 to 5')
      .min(1, 'Stand rating must be 1 to 5')
      .max(5, 'Stand rating must be 1 to 5'),
    frameCounts: z
      .array(spotCount, { error: 'Plants counted must be a list of counts' })
      .min(1, 'Count plants in the frame at one spot at least')
      .max(MAX_SPOTS, `At most ${MAX_SPOTS} spots`),
    frameSqFt: z
      .number({ error: 'Frame size must be a number of square feet' })
      .gt(0, 'Frame size must be more than 0 sq ft')
      .max(100, 'Frame size must be at most 100 sq ft'),
    weedPressure: z.enum(WEED_PRESSURES, { error: 'Weed pressure must be none, light, moderate or heavy' }),
    notes: optionalText('Notes', 2000),
    photoIds: z.array(uuid, { error: 'Photos must be a list of uploaded photo ids' }).max(MAX_PHOTOS_PER_CHECK, `At most ${MAX_PHOTOS_PER_CHECK} photos`).optional(),
  })
  .strict();

export type ObservationInput = z.infer<typeof observationSchema>;

/** Accepting a reseeding: which check it answers (the proposal is worked out again on the server). */
export const reseedSchema = z
  .object({
    observationId: uuid,
  })
  .strict();

export type ReseedInput = z.infer<typeof reseedSchema>;

/** The optional text fields sent with a photo upload (multipart). */
export const photoFieldsSchema = z
  .object({
    caption: optionalText('Caption', 300),
    observationId: z.preprocess((v) => (v === '' ? undefined : v), uuid.optional()),
  })
  .strict();
