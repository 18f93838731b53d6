import type { Selectable } from 'kysely';
import { getDb } from '@/db';
import type { UploadKind, UploadsTable } from '@/db/database';

type UploadRow = Selectable<UploadsTable>;

export interface UploadDto {
  id: string;
  kind: UploadKind;
  plotId: string | null;
  observationId: string | null;
  filename: string;
  contentType: string;
  sizeBytes: number;
  width: number | null;
  height: number | null;
  caption: string | null;
  uploadedBy: string | null;
  createdAt: string;
  /** Where the browser fetches the bytes (members of the property only). */
  url: string;
  thumbUrl: string | null;
}

export function toUploadDto(row: UploadRow): UploadDto {
  return {
    id: row.id,
    kind: row.kind,
    plotId: row.plot_id,
    observationId: row.observation_id,
    filename: row.filename,
    contentType: row.content_type,
    sizeBytes: row.size_bytes,
    width: row.width,
    height: row.height,
    caption: row.caption,
    uploadedBy: row.uploaded_by,
    createdAt: new Date(row.created_at).toISOString(),
    url: `/api/uploads/${row.id}`,
    thumbUrl: row.thumb_key ? `/api/uploads/${row.id}/thumb` : null,
  };
}

export async function insertUpload(values: {
  propertyId: string;
  plotId: string | null;
  observationId?: string | null;
  kind: UploadKind;
  filename: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  storageKey: string;
  thumbKey?: string | null;
  width?: number | null;
  height?: number | null;
  caption?: string | null;
  uploadedBy: string;
}): Promise<UploadRow> {
  return getDb()
    .insertInto('uploads')
    .values({
      property_id: values.propertyId,
      plot_id: values.plotId,
      observation_id: values.observationId ?? null,
      kind: values.kind,
      filename: values.filename,
      content_type: values.contentType,
      size_bytes: values.sizeBytes,
      sha256: values.sha256,
      storage_key: values.storageKey,
      thumb_key: values.thumbKey ?? null,
      width: values.width ?? null,
      height: values.height ?? null,
      caption: values.caption ?? null,
      uploaded_by: values.uploadedBy,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

export async function getUpload(id: string): Promise<UploadRow | undefined> {
  return getDb().selectFrom('uploads').selectAll().where('id', '=', id).executeTakeFirst();
}

/** Removes the row and returns it (its storage keys, for the caller to delete the bytes); null when gone. */
export async function deleteUploadRow(id: string): Promise<UploadRow | null> {
  const row = await getDb().deleteFrom('uploads').where('id', '=', id).returningAll().executeTakeFirst();
  return row ?? null;
}

export async function listObservationPhotos(observationIds: string[]): Promise<UploadRow[]> {
  if (!observationIds.length) return [];
  return getDb()
    .selectFrom('uploads')
    .selectAll()
    .where('observation_id', 'in', observationIds)
    .where('kind', '=', 'photo')
    .orderBy('created_at')
    .execute();
}
