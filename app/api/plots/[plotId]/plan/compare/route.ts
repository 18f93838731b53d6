import { requirePlotRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { latestForecast } from '@/lib/data/forecasts';
import { getProperty } from '@/lib/data/properties';
import { HttpError, json, notFound, parseBody, route } from '@/lib/http';
import { compareSeedingDates } from '@/lib/planning/compare-seeding';
import type { Forecast } from '@/lib/schedule/types';
import { planCompareSchema } from '@/lib/validations/step-edit';
import { gridCellKey } from '@/lib/weather/grid';

type Context = { params: Promise<{ plotId: string }> };

/**
 * What-if: two or three seeding dates for one planting, each judged by the engine against the stored
 * forecast — rules, expected emergence, seed-zone moisture and frost margin. Saves nothing. Members and up.
 */
export const POST = route(async (request, { params }: Context) => {
  const { plotId } = await params;
  const { plot } = await requirePlotRole(plotId, 'member');
  const body = await parseBody(request, planCompareSchema);
  const property = await getProperty(plot.property_id);
  if (!property) throw notFound();
  const stored = await latestForecast(gridCellKey(property.latitude, property.longitude));
  const forecast: Forecast | null = stored ? { timeZone: property.time_zone, fetchedAt: stored.fetchedAt, hours: stored.hours } : null;
  try {
    const options = compareSeedingDates({ property, plot, form: body.planting, seedDates: body.seedDates, forecast, now: now() });
    return json({ options, forecastFetchedAt: stored?.fetchedAt ?? null });
  } catch (error) {
    if (error instanceof RangeError) throw new HttpError(400, error.message);
    throw error;
  }
});
