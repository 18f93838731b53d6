import { getDb } from '@/db';
import type { PropertyRole } from '@/db/database';
import { ROLE_RANK } from '@/lib/validations/membership';
import { bumpSessionVersion } from './users';

export async function getMembershipRole(propertyId: string, userId: string): Promise<PropertyRole | null> {
  const row = await getDb()
    .selectFrom('memberships')
    .select('role')
    .where('property_id', '=', propertyId)
    .where('user_id', '=', userId)
    .executeTakeFirst();
  return row?.role ?? null;
}

export interface MemberDto {
  userId: string;
  name: string;
  /** Shown to owners only; null for everyone else. */
  email: string | null;
  role: PropertyRole;
  since: string;
}

export async function listMembers(propertyId: string): Promise<MemberDto[]> {
  const rows = await getDb()
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id', 'users.name', 'users.email', 'memberships.role', 'memberships.created_at'])
    .where('memberships.property_id', '=', propertyId)
    .orderBy('users.name')
    .execute();
  return rows.map((r) => ({
    userId: r.id,
    name: r.name,
    email: r.email,
    role: r.role,
    since: new Date(r.created_at).toISOString(),
  }));
}

export class LastOwnerError extends Error {
  constructor() {
    super('A property needs at least one owner: make someone else an owner first');
  }
}

/**
 * Changes a role; refuses to leave the property without an owner. Locks the property's rows meanwhile.
 * `endSessions` when someone else lowers the person's role (not when they step down themself).
 */
export async function changeRole(propertyId: string, userId: string, role: PropertyRole, endSessions = false) {
  return getDb().transaction().execute(async (trx) => {
    const rows = await trx
      .selectFrom('memberships')
      .select(['user_id', 'role'])
      .where('property_id', '=', propertyId)
      .forUpdate()
      .execute();
    const target = rows.find((r) => r.user_id === userId);
    if (!target) return null;
    const owners = rows.filter((r) => r.role === 'owner').length;
    if (target.role === 'owner' && role !== 'owner' && owners <= 1) throw new LastOwnerError();
    await trx
      .updateTable('memberships')
      .set({ role })
      .where('property_id', '=', propertyId)
      .where('user_id', '=', userId)
      .execute();
    // A role taken away ends the person's sessions: a copied token carries nothing of the old role.
    if (endSessions && ROLE_RANK[role] < ROLE_RANK[target.role]) await bumpSessionVersion(userId, trx);
    return { userId, role };
  });
}

/** Removes a membership; `endSessions` when someone else removed the person (not when they left themself). */
export async function removeMember(propertyId: string, userId: string, endSessions = false) {
  return getDb().transaction().execute(async (trx) => {
    const rows = await trx
      .selectFrom('memberships')
      .select(['user_id', 'role'])
      .where('property_id', '=', propertyId)
      .forUpdate()
      .execute();
    const target = rows.find((r) => r.user_id === userId);
    if (!target) return false;
    if (target.role === 'owner' && rows.filter((r) => r.role === 'owner').length <= 1) throw new LastOwnerError();
    await trx.deleteFrom('memberships').where('property_id', '=', propertyId).where('user_id', '=', userId).execute();
    if (endSessions) await bumpSessionVersion(userId, trx);
    return true;
  });
}
