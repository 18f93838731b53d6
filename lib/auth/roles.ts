import { getStepWithPlace } from '@/lib/data/plantings';
import { getPlot } from '@/lib/data/plots';
import { getMembershipRole } from '@/lib/data/memberships';
import { HttpError, notFound } from '@/lib/http';
import { uuid } from '@/lib/validations/common';
import { ROLE_LABELS, roleAtLeast, type Role } from '@/lib/validations/membership';
import { requireUser, type CurrentUser } from './session';

export interface Access {
  user: CurrentUser;
  propertyId: string;
  role: Role;
}

const NEEDS: Record<Role, string> = {
  owner: 'Only an owner of this property can do that',
  manager: 'Only a manager or owner of this property can do that',
  member: 'Viewers can look but not change anything here',
  viewer: 'You cannot see this property',
};

/**
 * The one access check. A user who is not a member gets 404 — the property's existence is not revealed;
 * a member whose role is too low gets 403.
 */
export async function requireRole(propertyId: string, needed: Role): Promise<Access> {
  const user = await requireUser();
  return requireRoleFor(user, propertyId, needed);
}

export async function requireRoleFor(user: CurrentUser, propertyId: string, needed: Role): Promise<Access> {
  if (!uuid.safeParse(propertyId).success) throw notFound();
  const role = await getMembershipRole(propertyId, user.id);
  if (!role) throw notFound();
  if (!roleAtLeast(role, needed)) throw new HttpError(403, `${NEEDS[needed]} (your role: ${ROLE_LABELS[role]})`);
  return { user, propertyId, role };
}

/** Access through a plot id: 404 for a plot that does not exist or whose property the user cannot see. */
export async function requirePlotRole(plotId: string, needed: Role) {
  const user = await requireUser();
  if (!uuid.safeParse(plotId).success) throw notFound();
  const plot = await getPlot(plotId);
  if (!plot) throw notFound();
  const access = await requireRoleFor(user, plot.property_id, needed);
  return { ...access, plot };
}

/** Access through a step id: 404 for a step that does not exist or whose property the user cannot see. */
export async function requireStepRole(stepId: string, needed: Role) {
  const user = await requireUser();
  if (!uuid.safeParse(stepId).success) throw notFound();
  const step = await getStepWithPlace(stepId);
  if (!step) throw notFound();
  const access = await requireRoleFor(user, step.property_id, needed);
  return { ...access, step };
}
