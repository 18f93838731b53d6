import { deleteUploadRow } from '@/lib/data/uploads';
import { HttpError, notFound, route } from '@/lib/http';
import { storage } from '@/lib/storage';
import { roleAtLeast } from '@/lib/validations/membership';
import { requireUploadRole, serveStored } from './serve';

type Context = { params: Promise<{ uploadId: string }> };

/** The uploaded file (a photo, a soil-test report…), to the people of its property only. */
export const GET = route(async (_request, { params }: Context) => {
  const { uploadId } = await params;
  const { upload } = await requireUploadRole(uploadId, 'viewer');
  return serveStored(upload.storage_key, upload.content_type, upload.filename);
});

/** Removes the upload and its bytes: managers and owners, or the member who uploaded it. */
export const DELETE = route(async (_request, { params }: Context) => {
  const { uploadId } = await params;
  const { upload, user, role } = await requireUploadRole(uploadId, 'viewer');
  const mine = upload.uploaded_by === user.id && roleAtLeast(role, 'member');
  if (!roleAtLeast(role, 'manager') && !mine) {
    throw new HttpError(403, 'Only a manager, an owner or the person who uploaded it can remove this file');
  }
  const row = await deleteUploadRow(uploadId);
  if (!row) throw notFound();
  const store = storage();
  await Promise.all([row.storage_key, row.thumb_key].filter((k): k is string => !!k).map((key) => store.delete(key)));
  return new Response(null, { status: 204 });
});
