// The file of a multipart upload for the plot's boundary and soil-test routes: read within a size limit,
// refused with a message (and field "file") that the upload form shows as it is.
import { createHash } from 'node:crypto';
import { HttpError } from '@/lib/http';
import { readMultipart } from '@/lib/storage/multipart';
import { UploadRefused } from '@/lib/storage/photos';

export interface UploadedFile {
  form: FormData;
  /** The sender's file name without folders or odd characters. */
  filename: string;
  bytes: Uint8Array;
  sha256: string;
}

export const refuseFile = (status: number, message: string) => new HttpError(status, message, { file: message });

export async function readUploadedFile(request: Request, maxBytes: number, limitLabel: string): Promise<UploadedFile> {
  let form: FormData;
  try {
    form = await readMultipart(request, maxBytes, limitLabel);
  } catch (error) {
    if (error instanceof UploadRefused) throw refuseFile(error.status, error.message);
    throw error;
  }
  const file = form.get('file');
  if (!(file instanceof Blob)) throw refuseFile(400, 'Choose a file to upload (the form has no "file").');
  if (file.size === 0) throw refuseFile(400, 'The file is empty.');
  if (file.size > maxBytes) throw refuseFile(413, `The file is larger than ${limitLabel}; nothing was saved.`);
  const bytes = new Uint8Array(await file.arrayBuffer());
  const sent = 'name' in file && typeof file.name === 'string' ? file.name : '';
  const filename = (sent.split(/[\\/]/).pop() ?? '').replace(/[^\w .()-]+/g, '_').trim().slice(-120) || 'upload';
  return { form, filename, bytes, sha256: createHash('sha256').update(bytes).digest('hex') };
}

/** UTF-8 text of the file, or a refusal for a file that is not text. */
export function fileText(file: UploadedFile, what: string): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(file.bytes);
  } catch {
    throw refuseFile(400, `The file is not a text file; ${what}.`);
  }
}
