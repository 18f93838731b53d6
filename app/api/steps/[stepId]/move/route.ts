import { requireStepRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { errorResponse, HttpError, json, parseBody, route } from '@/lib/http';
import { mayMoveStep } from '@/lib/planning/calendar-events';
import { moveStep, StepMoveDateError, StepMoveRefused } from '@/lib/planning/move-step';
import { roleAtLeast } from '@/lib/validations/membership';
import { stepMoveSchema } from '@/lib/validations/step-edit';

type Context = { params: Promise<{ stepId: string }> };

/**
 * Moves a step to another local day (a drag on the calendar). Managers and owners may move any step,
 * members only the steps given to them, viewers none. A day the rules advise against answers 409 with the
 * reasons, and a manager may send it again with `confirm: true`.
 */
export const POST = route(async (request, { params }: Context) => {
  const { stepId } = await params;
  const { user, step, role } = await requireStepRole(stepId, 'member');
  if (!mayMoveStep(role, step.assignee_id, user.id)) {
    throw new HttpError(403, 'Members can move only the steps assigned to them');
  }
  const body = await parseBody(request, stepMoveSchema);
  try {
    const result = await moveStep({
      stepId,
      plantingId: step.planting_id,
      date: body.date,
      confirm: body.confirm === true,
      canConfirm: roleAtLeast(role, 'manager'),
      user,
      now: now(),
    });
    return json({ step: result.steps.find((s) => s.id === stepId), steps: result.steps, confirmedDespite: result.confirmedDespite });
  } catch (error) {
    if (error instanceof StepMoveRefused) {
      const response = errorResponse(new HttpError(409, error.message));
      const payload = (await response.json()) as Record<string, unknown>;
      return json({ ...payload, reasons: error.reasons, canConfirm: error.canConfirm }, 409);
    }
    if (error instanceof StepMoveDateError) throw new HttpError(400, `${error.message} (date)`, { date: error.message });
    if (error instanceof RangeError) throw new HttpError(400, error.message);
    throw error;
  }
});
