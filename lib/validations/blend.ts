import { z } from 'zod';
import { optionalText, requiredText } from './common';
import { blendParts } from './planting';

/** A saved blend of a property: a name and the same rows the planting form's blend takes. */
export const savedBlendSchema = z
  .object({
    name: requiredText('Blend name', 80),
    parts: blendParts,
    notes: optionalText('Notes', 1000),
  })
  .strict();

export type SavedBlendInput = z.infer<typeof savedBlendSchema>;
