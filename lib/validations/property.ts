import { z } from 'zod';
import {
  optionalLocalDate, optionalMonthDay, optionalText, requiredNumber, requiredText,
} from './common';

const zones = new Set(Intl.supportedValuesOf('timeZone'));
// Intl lists canonical zones only; UTC and Etc/UTC are valid IANA names too.
zones.add('UTC');
zones.add('Etc/UTC');

/**
 * The runtime's own name for a zone, or null when it does not know the zone. ICU lists some zones under
 * their older names (America/Indianapolis, Asia/Calcutta) and leaves out links (US/Central), yet resolves
 * the current IANA names and links to those: a browser in Indiana reports America/Indiana/Indianapolis.
 */
export function canonicalTimeZone(name: string): string | null {
  if (zones.has(name)) return name;
  try {
    const resolved = new Intl.DateTimeFormat('en-US', { timeZone: name }).resolvedOptions().timeZone;
    // Bare offsets such as +05:00 are not places; only names that land on a listed zone count.
    return zones.has(resolved) ? resolved : null;
  } catch {
    return null;
  }
}

/** True when the runtime's IANA time zone database knows the name. */
export function isKnownTimeZone(name: string): boolean {
  return canonicalTimeZone(name) !== null;
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
    .refine(isKnownTimeZone, 'Time zone must be an IANA name such as America/Chicago')
    // One spelling per zone in the database, the one the time zone list offers.
    .transform((name) => canonicalTimeZone(name) ?? name),
  elevationM: requiredNumber('Elevation', -500, 9000, ' m'),
  avgLastSpringFrost: optionalMonthDay('Average last spring frost'),
  avgFirstFallFrost: optionalMonthDay('Average first fall frost'),
  avgFirstHardFreeze: optionalMonthDay('Average first hard freeze'),
  seasonOpensOn: optionalLocalDate('Season opening date'),
  tenure: z.enum(TENURES, { error: 'Tenure must be owned, leased or permission' }),
  landownerName: optionalText('Landowner name', 120),
  landownerContact: optionalText('Landowner contact', 200),
  permissionGrantedOn: optionalLocalDate('Permission date'),
});

// An unknown key is refused rather than ignored, so a misspelt field never looks saved.
export const propertyUpdateSchema = propertySchema.partial().strict();

export type PropertyInput = z.infer<typeof propertySchema>;
export type PropertyFormValues = z.input<typeof propertySchema>;
