import { requirePlotRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { latestForecast } from '@/lib/data/forecasts';
import { createPlanting, getStepRows, toStepDto } from '@/lib/data/plantings';
import { getProperty } from '@/lib/data/properties';
import { listPlantingsWithSteps, toPlantingDto } from '@/lib/data/steps';
import { HttpError, json, notFound, parseBody, route } from '@/lib/http';
import { buildPlantingInput } from '@/lib/planning/input';
import { planPlanting } from '@/lib/schedule/plan';
import type { Forecast } from '@/lib/schedule/types';
import { plantingSchema } from '@/lib/validations/planting';
import { gridCellKey } from '@/lib/weather/grid';

type Context = { params: Promise<{ plotId: string }> };

/** The plot's plantings, each with its steps. Everyone who may see the plot. */
export const GET = route(async (_request, { params }: Context) => {
  const { plotId } = await params;
  await requirePlotRole(plotId, 'viewer');
  return json({ plantings: await listPlantingsWithSteps(plotId) });
});

/**
 * Plans a planting through the engine — against the property's latest stored forecast when there is one —
 * and saves it with its steps. Managers and owners.
 */
export const POST = route(async (request, { params }: Context) => {
  const { plotId } = await params;
  const { plot, user } = await requirePlotRole(plotId, 'manager');
  const form = await parseBody(request, plantingSchema);
  const property = await getProperty(plot.property_id);
  if (!property) throw notFound();
  const stored = await latestForecast(gridCellKey(property.latitude, property.longitude));
  const forecast: Forecast | null = stored ? { timeZone: property.time_zone, fetchedAt: stored.fetchedAt, hours: stored.hours } : null;
  let plan;
  try {
    plan = planPlanting(buildPlantingInput(property, plot, form), forecast, now());
  } catch (error) {
    // The engine refuses impossible requests (a grade that cannot supply a nutrient) with a RangeError.
    if (error instanceof RangeError) throw new HttpError(400, error.message);
    throw error;
  }
  const planting = await createPlanting({ plotId, form, plan, createdBy: user.id });
  const steps = (await getStepRows(planting.id)).map(toStepDto);
  return json({ planting: toPlantingDto(planting), steps, warnings: plan.warnings, forecastThrough: plan.forecastThrough }, 201);
});
