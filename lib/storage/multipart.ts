// Reads a multipart/form-data upload without ever holding more than the limit: the declared Content-Length
// is checked before reading, and the bytes are counted as they arrive (a chunked body has no length).
import { HttpError, readBodyWithin } from '@/lib/http';
import { UploadRefused } from './photos';

/** Headroom over the file limit for the multipart boundaries and the small text fields. */
const FORM_OVERHEAD_BYTES = 64 * 1024;
/** A 15 MB photo over a weak field connection (about 1 Mbit/s) takes two minutes; past five, it is cut. */
const UPLOAD_TIMEOUT_MS = 5 * 60_000;

export async function readMultipart(request: Request, maxFileBytes: number, limitLabel: string): Promise<FormData> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^multipart\/form-data/i.test(type)) {
    throw new UploadRefused(415, 'Send the file as multipart/form-data (a form with a "file" field).');
  }
  const max = maxFileBytes + FORM_OVERHEAD_BYTES;
  let body: Uint8Array<ArrayBuffer>;
  try {
    body = await readBodyWithin(request, max, UPLOAD_TIMEOUT_MS);
  } catch (error) {
    if (error instanceof HttpError && error.status === 413) {
      throw new UploadRefused(413, `The upload is larger than ${limitLabel}; nothing was saved.`);
    }
    if (error instanceof HttpError) throw new UploadRefused(error.status, `${error.message}; nothing was saved.`);
    throw error;
  }
  if (body.byteLength === 0) throw new UploadRefused(400, 'The upload is empty: no file was sent.');
  try {
    return await new Response(body, { headers: { 'content-type': type } }).formData();
  } catch {
    throw new UploadRefused(400, 'The upload could not be read as a form; send the file again.');
  }
}
