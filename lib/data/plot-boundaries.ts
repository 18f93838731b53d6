import { getDb } from '@/db';
import type { BoundaryFeature } from '@/lib/geo/boundary';

export interface PlotBoundaryDto {
  plotId: string;
  feature: BoundaryFeature;
  /** Geodesic area on WGS84, international acres. */
  acres: number;
  /** The acres the plot is planned with now, so the page can offer the boundary's figure instead. */
  plotAcres: number;
  upload: { id: string; filename: string; uploadedAt: string } | null;
}

export interface StoredFile {
  filename: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  storageKey: string;
}

export async function getPlotBoundary(plotId: string): Promise<PlotBoundaryDto | null> {
  const row = await getDb()
    .selectFrom('plots')
    .leftJoin('uploads', 'uploads.id', 'plots.boundary_upload_id')
    .select(['plots.id', 'plots.acres', 'plots.boundary', 'plots.boundary_acres', 'uploads.id as upload_id', 'uploads.filename', 'uploads.created_at as uploaded_at'])
    .where('plots.id', '=', plotId)
    .executeTakeFirst();
  if (!row || !row.boundary || row.boundary_acres === null) return null;
  return {
    plotId: row.id,
    feature: row.boundary as BoundaryFeature,
    acres: row.boundary_acres,
    plotAcres: row.acres,
    upload: row.upload_id ? { id: row.upload_id, filename: row.filename!, uploadedAt: new Date(row.uploaded_at!).toISOString() } : null,
  };
}

/**
 * Keeps the uploaded file's row and the plot's new outline in one transaction. The plot keeps one boundary:
 * the file it replaces is removed with its row, and its storage key is returned for the caller to delete.
 */
export async function savePlotBoundary(o: {
  plotId: string;
  propertyId: string;
  userId: string;
  feature: BoundaryFeature;
  acres: number;
  file: StoredFile;
}): Promise<{ boundary: PlotBoundaryDto; replacedKey: string | null }> {
  const replacedKey = await getDb()
    .transaction()
    .execute(async (trx) => {
      const previous = await trx
        .selectFrom('plots')
        .leftJoin('uploads', 'uploads.id', 'plots.boundary_upload_id')
        .select(['uploads.id', 'uploads.storage_key'])
        .where('plots.id', '=', o.plotId)
        .forUpdate('plots')
        .executeTakeFirst();
      const upload = await trx
        .insertInto('uploads')
        .values({
          property_id: o.propertyId,
          plot_id: o.plotId,
          kind: 'boundary',
          filename: o.file.filename,
          content_type: o.file.contentType,
          size_bytes: o.file.sizeBytes,
          sha256: o.file.sha256,
          storage_key: o.file.storageKey,
          uploaded_by: o.userId,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      await trx
        .updateTable('plots')
        .set({ boundary: JSON.stringify(o.feature), boundary_acres: o.acres, boundary_upload_id: upload.id, updated_at: new Date() })
        .where('id', '=', o.plotId)
        .execute();
      if (previous?.id) await trx.deleteFrom('uploads').where('id', '=', previous.id).where('kind', '=', 'boundary').execute();
      return previous?.storage_key ?? null;
    });
  const boundary = await getPlotBoundary(o.plotId);
  if (!boundary) throw new Error('the boundary just saved could not be read back');
  return { boundary, replacedKey };
}

/** Clears the plot's outline and removes its file's row; the storage key is returned for the caller to delete. */
export async function clearPlotBoundary(plotId: string): Promise<{ removedKey: string | null }> {
  return getDb()
    .transaction()
    .execute(async (trx) => {
      const previous = await trx
        .selectFrom('plots')
        .leftJoin('uploads', 'uploads.id', 'plots.boundary_upload_id')
        .select(['uploads.id', 'uploads.storage_key'])
        .where('plots.id', '=', plotId)
        .forUpdate('plots')
        .executeTakeFirst();
      await trx
        .updateTable('plots')
        .set({ boundary: null, boundary_acres: null, boundary_upload_id: null, updated_at: new Date() })
        .where('id', '=', plotId)
        .execute();
      if (previous?.id) await trx.deleteFrom('uploads').where('id', '=', previous.id).where('kind', '=', 'boundary').execute();
      return { removedKey: previous?.storage_key ?? null };
    });
}
