import { createHash, randomBytes } from 'node:crypto';
import { getDb } from '@/db';
import type { PropertyRole } from '@/db/database';
import { ROLE_RANK } from '@/lib/validations/membership';

const INVITATION_DAYS = 14;

export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

export interface InvitationDto {
  id: string;
  email: string;
  role: PropertyRole;
  createdAt: string;
  expiresAt: string;
  acceptedAt: string | null;
  revokedAt: string | null;
  invitedBy: string | null;
}

/** Creates an invitation; the token is returned once (only its hash is stored). 256 random bits. */
export async function createInvitation(propertyId: string, email: string, role: PropertyRole, invitedBy: string) {
  const token = randomBytes(32).toString('base64url');
  const expires = new Date(Date.now() + INVITATION_DAYS * 86_400_000);
  const row = await getDb()
    .insertInto('invitations')
    .values({ property_id: propertyId, email, role, token_hash: hashToken(token), invited_by: invitedBy, expires_at: expires })
    .returning(['id', 'email', 'role', 'created_at', 'expires_at'])
    .executeTakeFirstOrThrow();
  return { token, invitation: { id: row.id, email: row.email, role: row.role, expiresAt: new Date(row.expires_at).toISOString() } };
}

export async function listInvitations(propertyId: string): Promise<InvitationDto[]> {
  const rows = await getDb()
    .selectFrom('invitations')
    .leftJoin('users', 'users.id', 'invitations.invited_by')
    .select([
      'invitations.id', 'invitations.email', 'invitations.role', 'invitations.created_at', 'invitations.expires_at',
      'invitations.accepted_at', 'invitations.revoked_at', 'users.name as inviter',
    ])
    .where('invitations.property_id', '=', propertyId)
    .orderBy('invitations.created_at', 'desc')
    .execute();
  return rows.map((r) => ({
    id: r.id,
    email: r.email,
    role: r.role,
    createdAt: new Date(r.created_at).toISOString(),
    expiresAt: new Date(r.expires_at).toISOString(),
    acceptedAt: r.accepted_at ? new Date(r.accepted_at).toISOString() : null,
    revokedAt: r.revoked_at ? new Date(r.revoked_at).toISOString() : null,
    invitedBy: r.inviter,
  }));
}

export async function revokeInvitation(propertyId: string, invitationId: string) {
  const result = await getDb()
    .updateTable('invitations')
    .set({ revoked_at: new Date() })
    .where('id', '=', invitationId)
    .where('property_id', '=', propertyId)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) > 0;
}

export type InvitationState = 'open' | 'accepted' | 'revoked' | 'expired';

export async function findInvitationByToken(token: string) {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
  const row = await getDb()
    .selectFrom('invitations')
    .innerJoin('properties', 'properties.id', 'invitations.property_id')
    .leftJoin('users', 'users.id', 'invitations.invited_by')
    .select([
      'invitations.id', 'invitations.property_id', 'invitations.email', 'invitations.role', 'invitations.expires_at',
      'invitations.accepted_at', 'invitations.revoked_at', 'properties.name as property_name', 'users.name as inviter',
    ])
    .where('invitations.token_hash', '=', hashToken(token))
    .executeTakeFirst();
  if (!row) return null;
  const state: InvitationState = row.revoked_at
    ? 'revoked'
    : row.accepted_at
      ? 'accepted'
      : new Date(row.expires_at) < new Date()
        ? 'expired'
        : 'open';
  return {
    id: row.id,
    propertyId: row.property_id,
    propertyName: row.property_name,
    email: row.email,
    role: row.role,
    inviter: row.inviter,
    expiresAt: new Date(row.expires_at).toISOString(),
    state,
  };
}

/**
 * Accepts an open invitation for the signed-in user. An existing membership keeps the higher role.
 * The update's WHERE makes acceptance happen once even when two requests race.
 */
export async function acceptInvitation(invitationId: string, propertyId: string, userId: string, role: PropertyRole) {
  return getDb().transaction().execute(async (trx) => {
    const claimed = await trx
      .updateTable('invitations')
      .set({ accepted_at: new Date(), accepted_by: userId })
      .where('id', '=', invitationId)
      .where('accepted_at', 'is', null)
      .where('revoked_at', 'is', null)
      .where('expires_at', '>', new Date())
      .executeTakeFirst();
    if (Number(claimed.numUpdatedRows) === 0) return false;
    const existing = await trx
      .selectFrom('memberships')
      .select('role')
      .where('property_id', '=', propertyId)
      .where('user_id', '=', userId)
      .executeTakeFirst();
    if (!existing) {
      await trx.insertInto('memberships').values({ property_id: propertyId, user_id: userId, role }).execute();
    } else if (ROLE_RANK[role] > ROLE_RANK[existing.role]) {
      await trx.updateTable('memberships').set({ role }).where('property_id', '=', propertyId).where('user_id', '=', userId).execute();
    }
    return true;
  });
}
