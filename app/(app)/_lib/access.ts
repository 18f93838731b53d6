import { notFound, redirect } from 'next/navigation';
import { cache } from 'react';
import { requirePlotRole, requireRole, type Access } from '@/lib/auth/roles';
import { HttpError } from '@/lib/http';
import { signInPath } from '@/lib/client/navigation';
import type { Role } from '@/lib/validations/membership';

export type PageAccess<T> = { ok: true; access: T } | { ok: false; message: string };

/**
 * The page-side face of requireRole: a non-member sees "not found" (the property's existence is not
 * revealed), a signed-out visitor goes to sign-in and back, and a member with too low a role gets the
 * reason to show instead of the page.
 */
function settle(error: unknown, path: string): { ok: false; message: string } {
  if (error instanceof HttpError) {
    if (error.status === 404) notFound();
    if (error.status === 401) redirect(signInPath(path));
    if (error.status === 403) return { ok: false, message: error.message };
  }
  throw error;
}

// Cached per request: a page and its generateMetadata ask the same question once.
export const propertyAccess = cache(async (propertyId: string, needed: Role, path: string): Promise<PageAccess<Access>> => {
  try {
    return { ok: true, access: await requireRole(propertyId, needed) };
  } catch (error) {
    return settle(error, path);
  }
});

export async function plotAccess(plotId: string, needed: Role, path: string) {
  try {
    return { ok: true as const, access: await requirePlotRole(plotId, needed) };
  } catch (error) {
    return settle(error, path);
  }
}
