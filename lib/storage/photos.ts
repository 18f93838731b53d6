// Turns an uploaded photo into what Sowcast keeps: the type read from the bytes (never the name or the
// browser's word), the picture turned upright from its EXIF orientation, a 1280 px and a 320 px WebP with
// every metadata block left out — a phone photo's EXIF carries the GPS position of the plot and the camera.
import { createHash } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';

export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;
export const PHOTO_MAX_LABEL = '15 MB';
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export const DISPLAY_PX = 1280;
export const THUMB_PX = 320;
// About 50 megapixels: more than any phone camera, and a cap on what a crafted "decompression bomb" can cost.
const MAX_INPUT_PIXELS = 50_000_000;

/** A refused upload, with the status and the field to show it under. Nothing has been written. */
export class UploadRefused extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly field = 'file',
  ) {
    super(message);
  }
}

export interface PreparedPhoto {
  /** The detected type of what was sent. */
  sentType: (typeof PHOTO_TYPES)[number];
  display: { bytes: Uint8Array; width: number; height: number };
  thumb: { bytes: Uint8Array; width: number; height: number };
  contentType: 'image/webp';
}

export const sha256Hex = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/** Refuses anything but a readable JPEG, PNG or WebP within the size limit; returns the two stored versions. */
export async function preparePhoto(bytes: Uint8Array): Promise<PreparedPhoto> {
  if (bytes.byteLength === 0) throw new UploadRefused(400, 'The file is empty (0 bytes). Pick the photo again.');
  if (bytes.byteLength > PHOTO_MAX_BYTES) {
    throw new UploadRefused(413, `The photo is ${(bytes.byteLength / 1024 / 1024).toFixed(1)} MB; photos may be at most ${PHOTO_MAX_LABEL}.`);
  }
  const detected = await fileTypeFromBuffer(bytes);
  if (!detected || !(PHOTO_TYPES as readonly string[]).includes(detected.mime)) {
    const what = detected ? `a ${detected.ext.toUpperCase()} file (${detected.mime})` : 'not an image Sowcast can read';
    throw new UploadRefused(415, `This file is ${what}. Photos must be JPEG, PNG or WebP, whatever the file is named.`);
  }
  try {
    const image = () => sharp(bytes, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' }).autoOrient();
    const render = async (px: number) => {
      const { data, info } = await image()
        .resize({ width: px, height: px, fit: 'inside', withoutEnlargement: true })
        .webp({ quality: px <= THUMB_PX ? 70 : 82 })
        .toBuffer({ resolveWithObject: true });
      return { bytes: new Uint8Array(data), width: info.width, height: info.height };
    };
    const [display, thumb] = await Promise.all([render(DISPLAY_PX), render(THUMB_PX)]);
    return { sentType: detected.mime as PreparedPhoto['sentType'], display, thumb, contentType: 'image/webp' };
  } catch (error) {
    throw unreadablePicture(error, detected.ext);
  }
}

function unreadablePicture(error: unknown, ext: string): UploadRefused {
  const message = String((error as Error)?.message ?? error);
  if (/pixel limit/i.test(message)) return new UploadRefused(413, 'The picture has too many pixels (over 50 megapixels). Send a smaller one.');
  return new UploadRefused(400, `The ${ext.toUpperCase()} file could not be read as a picture (it may be cut short or damaged).`);
}

/**
 * A picture kept at its full size (a photographed lab report must stay legible), turned upright and
 * re-encoded in its own format. sharp writes no EXIF, XMP, IPTC or ICC block unless asked to (its
 * `keepMetadata`/`withMetadata`), so the GPS position a phone records in the EXIF is gone.
 */
export async function pictureWithoutMetadata(bytes: Uint8Array, type: 'image/jpeg' | 'image/png'): Promise<Uint8Array> {
  try {
    const image = sharp(bytes, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' }).autoOrient();
    const encoded = type === 'image/jpeg' ? image.jpeg({ quality: 90 }) : image.png();
    return new Uint8Array(await encoded.toBuffer());
  } catch (error) {
    throw unreadablePicture(error, type === 'image/jpeg' ? 'jpeg' : 'png');
  }
}

/** The name shown when the photo is saved: the sender's name without folders or odd characters, ending .webp. */
export function storedPhotoName(sentName: string | undefined): string {
  const base = (sentName ?? '').split(/[\\/]/).pop() ?? '';
  const stem = base.replace(/\.[A-Za-z0-9]{1,5}$/, '').replace(/[^\p{L}\p{N} ._-]+/gu, '_').trim().slice(0, 80);
  return `${stem || 'photo'}.webp`;
}
