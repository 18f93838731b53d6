import { notFound, route } from '@/lib/http';
import { requireUploadRole, serveStored } from '../serve';

type Context = { params: Promise<{ uploadId: string }> };

/** The 320 px thumbnail of a photo; 404 for uploads that have none (documents). */
export const GET = route(async (_request, { params }: Context) => {
  const { uploadId } = await params;
  const { upload } = await requireUploadRole(uploadId, 'viewer');
  if (!upload.thumb_key) throw notFound();
  return serveStored(upload.thumb_key, 'image/webp', upload.filename.replace(/(\.[^.]*)?$/, '-thumb.webp'));
});
