import { cache } from 'react';
import { getProperty, toPropertyDto } from '@/lib/data/properties';

/** One read per request, shared by the page and its metadata. */
export const loadProperty = cache(async (propertyId: string) => {
  const row = await getProperty(propertyId);
  return row ? toPropertyDto(row) : null;
});
