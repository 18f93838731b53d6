import { requirePlotRole } from '@/lib/auth/roles';
import { getObservation } from '@/lib/data/observations';
import { insertUpload, toUploadDto } from '@/lib/data/uploads';
import { HttpError, json, route } from '@/lib/http';
import { storage } from '@/lib/storage';
import { readMultipart } from '@/lib/storage/multipart';
import { PHOTO_MAX_BYTES, PHOTO_MAX_LABEL, preparePhoto, sha256Hex, storedPhotoName, UploadRefused } from '@/lib/storage/photos';
import { photoFieldsSchema } from '@/lib/validations/observation';

type Context = { params: Promise<{ plotId: string }> };

const refuse = (error: UploadRefused) => new HttpError(error.status, error.message, { [error.field]: error.message });

/**
 * A photo of the plot (a germination check, before and after): JPEG, PNG or WebP by its bytes, at most
 * 15 MB. Kept as an upright 1280 px WebP and a 320 px thumbnail without metadata. Members and up. A refused
 * upload writes nothing: no row, no file.
 */
export const POST = route(async (request, { params }: Context) => {
  const { plotId } = await params;
  const { plot, user } = await requirePlotRole(plotId, 'member');
  let form: FormData;
  try {
    form = await readMultipart(request, PHOTO_MAX_BYTES, PHOTO_MAX_LABEL);
  } catch (error) {
    if (error instanceof UploadRefused) throw refuse(error);
    throw error;
  }
  const file = form.get('file');
  if (!(file instanceof File)) throw new HttpError(400, 'Attach the photo as the "file" field', { file: 'Attach the photo as the "file" field' });
  const fields = photoFieldsSchema.parse({
    caption: form.get('caption') ?? undefined,
    observationId: form.get('observationId') ?? undefined,
  });
  if (fields.observationId) {
    const observation = await getObservation(fields.observationId);
    if (!observation || observation.plotId !== plot.id) {
      throw new HttpError(400, 'The check is not one of this plot', { observationId: 'The check is not one of this plot' });
    }
  }
  let photo;
  try {
    photo = await preparePhoto(new Uint8Array(await file.arrayBuffer()));
  } catch (error) {
    if (error instanceof UploadRefused) throw refuse(error);
    throw error;
  }

  const store = storage();
  const keys: string[] = [];
  try {
    const storageKey = await store.put('photos', photo.display.bytes, photo.contentType);
    keys.push(storageKey);
    const thumbKey = await store.put('thumbs', photo.thumb.bytes, photo.contentType);
    keys.push(thumbKey);
    const row = await insertUpload({
      propertyId: plot.property_id,
      plotId: plot.id,
      observationId: fields.observationId ?? null,
      kind: 'photo',
      filename: storedPhotoName(file.name),
      contentType: photo.contentType,
      sizeBytes: photo.display.bytes.byteLength,
      sha256: sha256Hex(photo.display.bytes),
      storageKey,
      thumbKey,
      width: photo.display.width,
      height: photo.display.height,
      caption: fields.caption ?? null,
      uploadedBy: user.id,
    });
    return json({ upload: toUploadDto(row) }, 201);
  } catch (error) {
    // The row did not make it: the bytes must not stay behind without it.
    await Promise.all(keys.map((key) => store.delete(key).catch(() => undefined)));
    throw error;
  }
});
