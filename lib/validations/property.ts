import { z } from 'zod';
import {
  optionalLocalDate, optionalMonthDay, optionalText, requiredNumber, requiredText,
} from './common';

const zones = new Set(Intl.supportedValuesOf('timeZone'));
// Intl lists canonical zones only; UTC and Etc/UTC are valid IANA names too.
zones.add('UTC');
zones.add('Etc/UTC');

/** True when the runtime's IANA time zone database knows the name. */
export function isKnownTimeZone(name: string): boolean {
  return zones.has(name);
}

export const timeZoneNames = (): string[] => [...zones].sort();

export const TENURES = ['owned', 'leased', 'permission'] as const;
export const TENURE_LABELS: Record<(typeof TENURES)[number], string> = {
  owned: 'Owned',
  leased: 'Leased',
  permission: 'Used with permission',
};

export const propertySchema = z.object({
  name: requiredText('Name'),
  latitude: requiredNumber('Latitude', -90, 90, '°'),
  longitude: requiredNumber('Longitude', -180, 180, '°'),
  timeZone: z
    .string({ error: 'Time zone is required' })
    .trim()
    .min(1, 'Time zone is required')
    .refine(isKnownTimeZone, 'Time zone must be an IANA name such as America/Chicago'),
  elevationM: requiredNumber('Elevation', -500, 9000, ' m'),
  avgLastSpringFrost: optionalMonthDay('Average last spring frost'),
  avgFirstFallFrost: optionalMonthDay('Average first fall frost'),
  seasonOpensOn: optionalLocalDate('Season opening date'),
  tenure: z.enum(TENURES, { error: 'Tenure must be owned, leased or permission' }),
  landownerName: optionalText('Landowner name', 120),
  landownerContact: optionalText('Landowner contact', 200),
  permissionGrantedOn: optionalLocalDate('Permission date'),
});

export const propertyUpdateSchema = propertySchema.partial();

export type PropertyInput = z.infer<typeof propertySchema>;
export type PropertyFormValues = z.input<typeof propertySchema>;
