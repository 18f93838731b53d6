import { z } from 'zod';
import { requireStepRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { latestForecast } from '@/lib/data/forecasts';
import { getPlanting } from '@/lib/data/plantings';
import { getPlot } from '@/lib/data/plots';
import { getProperty } from '@/lib/data/properties';
import { HttpError, json, notFound, route } from '@/lib/http';
import { recordCautions } from '@/lib/records/cautions';
import { buildRecordDraft, weatherAt } from '@/lib/records/draft';
import type { Quantity } from '@/lib/schedule/types';
import type { PlantingFormInput } from '@/lib/validations/planting';
import { gridCellKey } from '@/lib/weather/grid';

type Context = { params: Promise<{ stepId: string }> };

const query = z
  .object({ at: z.iso.datetime({ offset: true, error: 'at must be an ISO 8601 instant such as 2027-09-01T13:30:00Z' }).optional() })
  .strict();

/**
 * The application record a spray, fertilize or lime step suggests, for the form to start from: the plan's
 * product, rate and quantities, the plot's acres, and the stored forecast's weather for the hour of the work
 * (the step's completion time, or now, or `?at=`). Members and up: the people who log records.
 */
export const GET = route(async (request, { params }: Context) => {
  const { stepId } = await params;
  const { step, user } = await requireStepRole(stepId, 'member');
  const { at: atParam } = query.parse(Object.fromEntries(new URL(request.url).searchParams));
  const [planting, plot, property] = await Promise.all([getPlanting(step.planting_id), getPlot(step.plot_id), getProperty(step.property_id)]);
  if (!planting || !plot || !property) throw notFound();
  const at = atParam ? new Date(atParam) : step.status === 'done' && step.done_at ? new Date(step.done_at) : now();
  const forecast = await latestForecast(gridCellKey(property.latitude, property.longitude));
  const weather = forecast ? weatherAt(forecast.hours, forecast.fetchedAt, at) : null;
  const draft = buildRecordDraft({
    step: { id: step.id, kind: step.kind, quantities: step.quantities as Quantity[] },
    form: planting.input as PlantingFormInput,
    plot: { id: plot.id, name: plot.name, acres: plot.acres },
    applicatorName: user.name,
    at,
    timeZone: property.time_zone,
    weather,
  });
  if (!draft) {
    const message = 'Only spray, fertilize and lime steps have application records';
    throw new HttpError(400, `${message} (stepId)`, { stepId: message });
  }
  return json({
    draft,
    weather,
    step: { id: step.id, kind: step.kind, title: step.title, status: step.status, doneOn: step.done_on },
    cautions: recordCautions(draft.kind),
    timeZone: property.time_zone,
  });
});
