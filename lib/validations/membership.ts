import './zod-config';
import { z } from 'zod';

export const ROLES = ['owner', 'manager', 'member', 'viewer'] as const;
export type Role = (typeof ROLES)[number];
export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  manager: 'Manager',
  member: 'Member',
  viewer: 'Viewer',
};
export const ROLE_HINTS: Record<Role, string> = {
  owner: 'Everything, including people, roles and deleting the property',
  manager: 'Plans plots and schedules; edits everything but people',
  member: 'Sees everything, completes steps, logs records',
  viewer: 'Read-only, for a landowner or a guest',
};

const email = z
  .string({ error: 'E-mail is required' })
  .trim()
  .toLowerCase()
  .max(254, 'E-mail must be at most 254 characters')
  .pipe(z.email({ error: 'E-mail must be a valid address' }));

export const emailSchema = email;

export const invitationSchema = z.object({
  email,
  role: z.enum(ROLES, { error: 'Role must be owner, manager, member or viewer' }),
});
export type InvitationInput = z.infer<typeof invitationSchema>;

export const roleChangeSchema = z.object({
  role: z.enum(ROLES, { error: 'Role must be owner, manager, member or viewer' }),
});

/** Higher number = more rights. A role includes every right of the roles below it. */
export const ROLE_RANK: Record<Role, number> = { viewer: 0, member: 1, manager: 2, owner: 3 };
export const roleAtLeast = (role: Role, needed: Role) => ROLE_RANK[role] >= ROLE_RANK[needed];
