import { z } from 'zod';
import { localDate, optionalLocalDate, optionalNumber, optionalText, requiredNumber, requiredText } from './common';

// An application record: what was put on which ground, when, by whom and in what weather. The fields cover
// what 7 CFR 110.3 asks a certified applicator to keep for a restricted-use pesticide (brand or product name,
// EPA registration number, total amount, location, crop or site, size of the area, date, the applicator's name
// and certification number), so one record serves where a state asks for the same or more.

export const APPLICATION_KINDS = ['herbicide', 'fertilizer', 'lime'] as const;
export type ApplicationKind = (typeof APPLICATION_KINDS)[number];
export const APPLICATION_KIND_LABELS: Record<ApplicationKind, string> = {
  herbicide: 'Herbicide',
  fertilizer: 'Fertilizer',
  lime: 'Lime',
};

/** Rates as labels and soil-test reports give them. '% v/v' is percent of the spray volume. */
export const RATE_UNITS = ['fl oz/acre', 'pt/acre', 'qt/acre', 'gal/acre', 'oz/acre', 'lb/acre', 'tons/acre', '% v/v'] as const;
export const AMOUNT_UNITS = ['fl oz', 'pt', 'qt', 'gal', 'oz', 'lb', 'tons'] as const;

/** Sixteen compass points (the direction the wind blows from), or no steady direction. */
export const WIND_DIRECTIONS = [
  'N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSW', 'SW', 'WSW', 'W', 'WNW', 'NW', 'NNW', 'calm', 'variable',
] as const;

export const WEATHER_SOURCES = ['forecast', 'observation', 'entered'] as const;
export const WEATHER_SOURCE_LABELS: Record<(typeof WEATHER_SOURCES)[number], string> = {
  forecast: 'From the stored forecast for that hour',
  observation: 'Observed',
  entered: 'Entered by hand',
};

/**
 * An EPA registration number: company number, product number, and for a distributor's relabel a third
 * part (e.g. 524-445 or 524-445-12345). From memory of 40 CFR 152.132 and the label format; the lengths
 * allowed here are generous on purpose.
 */
export const EPA_REG_NO_PATTERN = /^\d{1,7}-\d{1,6}(-\d{1,7})?$/;

const blankToUndefined = (v: unknown) => (v === '' || v === null ? undefined : v);

const localTime = z
  .string({ error: 'Time must be a time of day' })
  .regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Time must be a time of day like 08:30 (24-hour)');

const shape = {
  kind: z.enum(APPLICATION_KINDS, { error: 'Kind must be herbicide, fertilizer or lime' }),
  plotId: z.uuid({ error: 'Plot must be one of the property’s plots' }),
  stepId: z.preprocess(blankToUndefined, z.uuid({ error: 'Step must be a step id' }).optional()),
  appliedOn: localDate('Date applied'),
  appliedTime: localTime,
  areaAcres: requiredNumber('Area treated', 0.001, 10_000, ' acres'),
  location: optionalText('Location in the plot', 200),
  site: optionalText('Crop or site', 120),
  productName: requiredText('Product name', 120),
  epaRegNo: z.preprocess(
    (v) => (typeof v === 'string' ? (v.trim() === '' ? undefined : v.trim()) : blankToUndefined(v)),
    z
      .string({ error: 'EPA registration number must be text' })
      .regex(EPA_REG_NO_PATTERN, 'EPA registration number must look like 524-445 or 524-445-12345 (as on the label)')
      .optional(),
  ),
  restrictedUse: z.boolean({ error: 'Restricted use must be yes or no' }).default(false),
  activeIngredientPct: optionalNumber('Active ingredient', 0, 100, ' %'),
  rateValue: requiredNumber('Rate', 0, 100_000).refine((v) => v > 0, 'Rate must be more than 0'),
  rateUnit: z.enum(RATE_UNITS, { error: `Rate unit must be one of ${RATE_UNITS.join(', ')}` }),
  totalProductValue: requiredNumber('Total product used', 0, 1_000_000).refine((v) => v > 0, 'Total product used must be more than 0'),
  totalProductUnit: z.enum(AMOUNT_UNITS, { error: `Total product unit must be one of ${AMOUNT_UNITS.join(', ')}` }),
  waterGal: optionalNumber('Water used', 0, 100_000, ' gal'),
  sprayer: optionalText('Sprayer', 120),
  applicatorName: requiredText('Applicator', 120),
  applicatorLicense: optionalText('Applicator certification number', 60),
  windMph: optionalNumber('Wind speed', 0, 100, ' mph'),
  windDirection: z.preprocess(blankToUndefined, z.enum(WIND_DIRECTIONS, { error: 'Wind direction must be a compass point such as NW, or calm' }).optional()),
  airTempF: optionalNumber('Air temperature', -40, 130, ' °F'),
  humidityPct: optionalNumber('Humidity', 0, 100, ' %'),
  weatherSource: z.preprocess(blankToUndefined, z.enum(WEATHER_SOURCES, { error: 'Weather source must be forecast, observation or entered' }).optional()),
  notes: optionalText('Notes', 2000),
};

type RecordFields = z.infer<z.ZodObject<typeof shape>>;

function recordRules(r: RecordFields, ctx: z.RefinementCtx) {
  if (r.restrictedUse) {
    if (r.kind !== 'herbicide') {
      ctx.addIssue({ code: 'custom', path: ['restrictedUse'], message: 'Only a pesticide can be restricted use; fertilizer and lime are not' });
    }
    // 7 CFR 110.3(a)(2) and (a)(8): the registration number and the certified applicator's number.
    if (!r.epaRegNo) ctx.addIssue({ code: 'custom', path: ['epaRegNo'], message: 'A restricted-use record needs the EPA registration number from the label' });
    if (!r.applicatorLicense) {
      ctx.addIssue({ code: 'custom', path: ['applicatorLicense'], message: 'A restricted-use product needs a certified applicator: give the certification number' });
    }
    if (!r.site) ctx.addIssue({ code: 'custom', path: ['site'], message: 'A restricted-use record needs the crop or site treated' });
  }
  if (r.kind !== 'herbicide' && r.rateUnit === '% v/v') {
    ctx.addIssue({ code: 'custom', path: ['rateUnit'], message: 'A percent-of-spray rate is for sprayed products; give fertilizer or lime per acre' });
  }
  if (r.rateUnit === '% v/v' && r.rateValue > 100) {
    ctx.addIssue({ code: 'custom', path: ['rateValue'], message: 'A percent solution must be at most 100 %' });
  }
  const weatherGiven = [r.windMph, r.windDirection, r.airTempF, r.humidityPct].some((v) => v !== undefined);
  if (r.weatherSource && !weatherGiven) {
    ctx.addIssue({ code: 'custom', path: ['weatherSource'], message: 'A weather source needs at least one weather reading' });
  }
}

/** A new record, as the form and POST /api/properties/[propertyId]/records take it. */
export const applicationRecordSchema = z.object(shape).strict().superRefine(recordRules);
export type ApplicationRecordInput = z.infer<typeof applicationRecordSchema>;

/** A correction: the whole record as it should have been, and why (the original stays as it was). */
export const applicationCorrectionSchema = z
  .object({ ...shape, correctionReason: requiredText('Reason for the correction', 500) })
  .strict()
  .superRefine(recordRules);
export type ApplicationCorrectionInput = z.infer<typeof applicationCorrectionSchema>;

/** The list's filters, from the query string. */
export const recordFiltersSchema = z
  .object({
    plot: z.preprocess(blankToUndefined, z.uuid({ error: 'Plot filter must be a plot id' }).optional()),
    product: optionalText('Product filter', 120),
    from: optionalLocalDate('From date'),
    to: optionalLocalDate('To date'),
    kind: z.preprocess(blankToUndefined, z.enum(APPLICATION_KINDS, { error: 'Kind filter must be herbicide, fertilizer or lime' }).optional()),
  })
  .strict()
  .refine((f) => !f.from || !f.to || f.from <= f.to, { message: 'The from date must not be after the to date', path: ['from'] });
export type RecordFilters = z.infer<typeof recordFiltersSchema>;

/** Every field name of a record, in form order (forms place server errors by these). */
export const RECORD_FIELD_NAMES = [...Object.keys(shape), 'correctionReason'] as const;
