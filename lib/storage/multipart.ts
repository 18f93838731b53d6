// Reads a multipart/form-data upload without ever holding more than the limit: the declared Content-Length
// is checked before reading, and the bytes are counted as they arrive (a chunked body has no length).
import { UploadRefused } from './photos';

/** Headroom over the file limit for the multipart boundaries and the small text fields. */
const FORM_OVERHEAD_BYTES = 64 * 1024;

export async function readMultipart(request: Request, maxFileBytes: number, limitLabel: string): Promise<FormData> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^multipart\/form-data/i.test(type)) {
    throw new UploadRefused(415, 'Send the file as multipart/form-data (a form with a "file" field).');
  }
  const max = maxFileBytes + FORM_OVERHEAD_BYTES;
  const tooBig = () => new UploadRefused(413, `The upload is larger than ${limitLabel}; nothing was saved.`);
  const declared = Number(request.headers.get('content-length') ?? NaN);
  if (Number.isFinite(declared) && declared > max) throw tooBig();
  if (!request.body) throw new UploadRefused(400, 'The upload is empty: no file was sent.');

  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > max) {
      await reader.cancel().catch(() => undefined);
      throw tooBig();
    }
    chunks.push(value);
  }
  const body = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    body.set(c, at);
    at += c.byteLength;
  }
  try {
    return await new Response(body, { headers: { 'content-type': type } }).formData();
  } catch {
    throw new UploadRefused(400, 'The upload could not be read as a form; send the file again.');
  }
}
