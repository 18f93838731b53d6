// The seed zone's water balance over the forecast: rain per local day and Hargreaves ET₀ from the day's air
// temperatures into the FAO-56 surface layer (lib/agronomy/water-balance.ts). One helper, so the germination check,
// the seeding comparison and the plot's weather chart read the seed zone the same way.
import { et0Hargreaves } from '@/lib/agronomy/et0';
import { seedZoneMoisture, type SeedZoneMoisture, type SoilTexture } from '@/lib/agronomy/water-balance';
import type { ForecastIndex } from './forecast-days';
import { addDays, dayOfYear } from './local-dates';

/**
 * The seed zone from `from` through `through` (or the last forecast day); null when the forecast lacks `from`. The
 * balance runs from the forecast's first day, taken as air-dry, so rain in the forecast before `from` (the day before
 * seeding) has already wetted the soil the seed goes into.
 */
export function seedZoneOutlook(
  fc: ForecastIndex,
  from: string,
  through: string,
  latitudeDeg: number,
  texture: SoilTexture,
  soakingRainMm?: number,
): SeedZoneMoisture | null {
  if (!fc.firstDate || !fc.byDate.has(from)) return null;
  const waterDays = [];
  for (let d = fc.firstDate < from ? fc.firstDate : from; d <= through; d = addDays(d, 1)) {
    const day = fc.byDate.get(d);
    if (!day) break;
    waterDays.push({
      date: d,
      rainMm: fc.rainByDate.get(d) ?? 0,
      et0Mm: et0Hargreaves({ tMaxC: day.airMaxC, tMinC: day.airMinC, latitudeDeg, dayOfYear: dayOfYear(d) }),
    });
  }
  return waterDays.length ? seedZoneMoisture(waterDays, { texture, soakingRainMm, reportFrom: from }) : null;
}
