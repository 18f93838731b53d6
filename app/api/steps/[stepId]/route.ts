import { requireStepRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { toStepDto } from '@/lib/data/plantings';
import { getStepDetail, hasRoleAtLeast, listStepMovesWithPeople } from '@/lib/data/steps';
import { HttpError, json, notFound, parsePatch, route } from '@/lib/http';
import { mayMoveStep } from '@/lib/planning/calendar-events';
import { editStep, StepMoveRefused } from '@/lib/planning/move-step';
import { stepPatchSchema } from '@/lib/validations/step-edit';

type Context = { params: Promise<{ stepId: string }> };

/** One step with its planting, plot and property, the property's zone, its assignee and its moves. */
export const GET = route(async (_request, { params }: Context) => {
  const { stepId } = await params;
  const { role, user } = await requireStepRole(stepId, 'viewer');
  const step = await getStepDetail(stepId);
  if (!step) throw notFound();
  const moves = await listStepMovesWithPeople(stepId);
  return json({
    step: toStepDto(step),
    planting: { id: step.planting_id, season: step.planting_season, year: step.planting_year, method: step.planting_method, status: step.planting_status },
    plot: { id: step.plot_id, name: step.plot_name },
    property: { id: step.property_id, name: step.property_name, timeZone: step.time_zone },
    assignee: step.assignee_id ? { id: step.assignee_id, name: step.assignee_name ?? '' } : null,
    moves,
    role,
    canMove: step.status === 'planned' && !step.recurrence && mayMoveStep(role, step.assignee_id, user.id),
  });
});

/**
 * Assigns the step to a member (or to nobody) and pins or unpins its date. Managers and owners. The
 * assignee must be a member, manager or owner of the property: viewers are not given work.
 */
export const PATCH = route(async (request, { params }: Context) => {
  const { stepId } = await params;
  const { step, user } = await requireStepRole(stepId, 'manager');
  const { data } = await parsePatch(request, stepPatchSchema);
  if (data.assigneeId && !(await hasRoleAtLeast(step.property_id, data.assigneeId, 'member'))) {
    const message = 'The assignee must be a member, manager or owner of this property';
    throw new HttpError(400, `${message} (assigneeId)`, { assigneeId: message });
  }
  try {
    const result = await editStep({ stepId, plantingId: step.planting_id, assigneeId: data.assigneeId, pinned: data.pinned, userId: user.id, now: now() });
    return json({ step: result.steps.find((s) => s.id === stepId), steps: result.steps });
  } catch (error) {
    if (error instanceof StepMoveRefused) throw new HttpError(409, error.message);
    throw error;
  }
});
