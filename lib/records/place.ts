// What a new record (or a correction) needs from the property before it is written: the plot it names must
// be one of the property's plots, its step one of that plot's steps, and the local date and time are read
// in the property's zone. Refusals name the field and write nothing.
import { getStepWithPlace } from '@/lib/data/plantings';
import { getPlot } from '@/lib/data/plots';
import { getProperty } from '@/lib/data/properties';
import { HttpError, notFound } from '@/lib/http';
import { instantOf } from '@/lib/schedule/local-dates';
import { RECORD_KIND_OF_STEP } from './draft';

const refuse = (field: string, message: string) => new HttpError(400, `${message} (${field})`, { [field]: message });

// A record is of work done: a time more than an hour ahead of the clock is a typing slip (common practice,
// no source; the hour allows for a phone whose clock runs a little fast).
const FUTURE_SLACK_MS = 3_600_000;

export async function placeRecord(
  propertyId: string,
  input: { plotId: string; stepId?: string; kind: string; appliedOn: string; appliedTime: string },
  now: Date,
  options: { checkStep: boolean } = { checkStep: true },
) {
  const property = await getProperty(propertyId);
  if (!property) throw notFound();
  const plot = await getPlot(input.plotId);
  if (!plot || plot.property_id !== propertyId) throw refuse('plotId', 'Plot must be one of this property’s plots');
  if (options.checkStep && input.stepId) {
    const step = await getStepWithPlace(input.stepId);
    if (!step || step.property_id !== propertyId || step.plot_id !== plot.id) {
      throw refuse('stepId', 'Step must be a step of this plot');
    }
    if (RECORD_KIND_OF_STEP[step.kind] !== input.kind) {
      throw refuse('kind', `A ${step.kind} step records a ${RECORD_KIND_OF_STEP[step.kind] ?? 'different'} application, not ${input.kind}`);
    }
  }
  const appliedAt = instantOf(input.appliedOn, input.appliedTime, property.time_zone);
  if (appliedAt.getTime() > now.getTime() + FUTURE_SLACK_MS) {
    throw refuse('appliedOn', 'Date applied must not be in the future: record work that was done');
  }
  return { property, plot, appliedAt, timeZone: property.time_zone };
}
