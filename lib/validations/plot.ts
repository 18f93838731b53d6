import { z } from 'zod';
import { optionalNumber, optionalText, requiredText } from './common';

export const PLOT_COVERS = ['grass-weeds', 'brush', 'bare-soil', 'tilled', 'existing-stand'] as const;
export const PLOT_COVER_LABELS: Record<(typeof PLOT_COVERS)[number], string> = {
  'grass-weeds': 'Standing grass and weeds',
  brush: 'Brush',
  'bare-soil': 'Bare soil',
  tilled: 'Tilled',
  'existing-stand': 'An existing stand',
};
export const PLOT_SUNS = ['full', 'partial', 'shade'] as const;
export const PLOT_SUN_LABELS: Record<(typeof PLOT_SUNS)[number], string> = {
  full: 'Full sun',
  partial: 'Partial sun',
  shade: 'Mostly shade',
};

export const plotSchema = z.object({
  name: requiredText('Name', 80),
  acres: z.preprocess(
    (v) => (v === '' || (typeof v === 'number' && Number.isNaN(v)) ? undefined : v),
    z
      .number({ error: 'Acres must be a number' })
      .gt(0, 'Acres must be more than 0')
      .max(10000, 'Acres must be at most 10000'),
  ),
  cover: z.enum(PLOT_COVERS, { error: 'Cover must be one of the listed kinds' }),
  sun: z.enum(PLOT_SUNS, { error: 'Sun must be full, partial or shade' }),
  soilPh: optionalNumber('Soil pH', 3, 10),
  notes: optionalText('Notes', 4000),
});

// An unknown key is refused rather than ignored, so a misspelt field never looks saved.
export const plotUpdateSchema = plotSchema.partial().strict();

export type PlotInput = z.infer<typeof plotSchema>;
export type PlotFormValues = z.input<typeof plotSchema>;
