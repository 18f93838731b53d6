import { requireStepRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { completeStep, StepDateError, StepRecordError } from '@/lib/planning/complete-step';
import { stepOutcomeSchema } from '@/lib/validations/step';

type Context = { params: Promise<{ stepId: string }> };

/**
 * Marks a step done (with the real date, default today in the property's zone, and the moment it was done,
 * default now) or skipped, with what was really done (the seed broadcast); the engine then re-places the
 * steps that follow from that date. The same outcome sent twice — a phone's offline queue retrying — is
 * answered as done again (`repeated: true`) and changes nothing. Members and up; others learn nothing.
 */
export const POST = route(async (request, { params }: Context) => {
  const { stepId } = await params;
  const { user, step } = await requireStepRole(stepId, 'member');
  const body = await parseBody(request, stepOutcomeSchema);
  try {
    const result = await completeStep({
      stepId,
      plantingId: step.planting_id,
      status: body.status,
      date: body.date,
      doneAt: body.doneAt,
      notes: body.notes,
      record: body.record,
      userId: user.id,
      now: now(),
    });
    return json({
      step: result.steps.find((s) => s.id === stepId),
      steps: result.steps,
      moved: result.changes,
      repeated: result.repeated,
      record: result.record,
    });
  } catch (error) {
    if (error instanceof StepDateError || error instanceof StepRecordError) throw new HttpError(400, error.message, { [error.field]: error.message });
    // The engine refuses a stored plan or input it cannot work with (a RangeError with a readable message).
    if (error instanceof RangeError) throw new HttpError(400, error.message);
    throw error;
  }
});
