import { requireRoleFor } from '@/lib/auth/roles';
import { requireUser } from '@/lib/auth/session';
import { recordPropertyId } from '@/lib/data/application-records';
import { notFound } from '@/lib/http';
import { uuid } from '@/lib/validations/common';
import type { Role } from '@/lib/validations/membership';

/** Access through a record id: 404 for a record that does not exist or whose property the user cannot see. */
export async function requireRecordRole(recordId: string, needed: Role) {
  const user = await requireUser();
  if (!uuid.safeParse(recordId).success) throw notFound();
  const propertyId = await recordPropertyId(recordId);
  if (!propertyId) throw notFound();
  return requireRoleFor(user, propertyId, needed);
}
