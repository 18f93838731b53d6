import { requireRole } from '@/lib/auth/roles';
import { requireUser } from '@/lib/auth/session';
import { getUpload } from '@/lib/data/uploads';
import { notFound } from '@/lib/http';
import { storage } from '@/lib/storage';
import { uuid } from '@/lib/validations/common';
import type { Role } from '@/lib/validations/membership';

/** The upload, for people of its property with at least `needed`; 404 for anyone else and for no such upload. */
export async function requireUploadRole(uploadId: string, needed: Role) {
  await requireUser();
  if (!uuid.safeParse(uploadId).success) throw notFound();
  const upload = await getUpload(uploadId);
  if (!upload) throw notFound();
  const access = await requireRole(upload.property_id, needed);
  return { ...access, upload };
}

const INLINE = new Set(['image/jpeg', 'image/png', 'image/webp']);

/** RFC 6266 with the RFC 8187 form for names outside ASCII. */
function disposition(kind: 'inline' | 'attachment', filename: string): string {
  const ascii = filename.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(filename)}`;
}

/** The stored bytes with headers that keep them private and stop a browser guessing another type. */
export async function serveStored(key: string, contentType: string, filename: string): Promise<Response> {
  const bytes = await storage().get(key);
  if (!bytes) throw notFound();
  return new Response(bytes as Uint8Array<ArrayBuffer>, {
    status: 200,
    headers: {
      'Content-Type': contentType,
      'Content-Length': String(bytes.byteLength),
      'Content-Disposition': disposition(INLINE.has(contentType) ? 'inline' : 'attachment', filename),
      'Cache-Control': 'private, max-age=3600',
      'X-Content-Type-Options': 'nosniff',
      // Even an inline image is never a page that could run script.
      'Content-Security-Policy': "default-src 'none'; sandbox",
    },
  });
}
