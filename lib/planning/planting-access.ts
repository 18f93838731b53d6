import { requireRoleFor } from '@/lib/auth/roles';
import { requireUser } from '@/lib/auth/session';
import { getPlantingWithPlace } from '@/lib/data/steps';
import { notFound } from '@/lib/http';
import { uuid } from '@/lib/validations/common';
import type { Role } from '@/lib/validations/membership';

/** Access through a planting id: 404 for one that does not exist or whose property the user cannot see. */
export async function requirePlantingRole(plantingId: string, needed: Role) {
  const user = await requireUser();
  if (!uuid.safeParse(plantingId).success) throw notFound();
  const planting = await getPlantingWithPlace(plantingId);
  if (!planting) throw notFound();
  const access = await requireRoleFor(user, planting.property_id, needed);
  return { ...access, planting };
}
