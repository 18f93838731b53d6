import type { Selectable, Transaction } from 'kysely';
import { getDb } from '@/db';
import type { Database, ObservationsTable, StandVerdict, WeedPressure } from '@/db/database';
import { listObservationPhotos, toUploadDto, type UploadDto } from './uploads';

type ObservationRow = Selectable<ObservationsTable>;

export interface ObservationDto {
  id: string;
  plantingId: string;
  plotId: string;
  stepId: string | null;
  observedOn: string;
  observedAt: string;
  observer: { id: string; name: string } | null;
  standRating: number;
  frameCounts: number[];
  frameSqFt: number;
  plantsPerSqFt: number;
  expectedPerSqFt: number | null;
  expectedSource: string | null;
  weedPressure: WeedPressure;
  verdict: StandVerdict;
  notes: string | null;
  reseedPlantingId: string | null;
  photos: UploadDto[];
}

function toDto(row: ObservationRow & { observer_name?: string | null }, photos: UploadDto[]): ObservationDto {
  return {
    id: row.id,
    plantingId: row.planting_id,
    plotId: row.plot_id,
    stepId: row.step_id,
    observedOn: row.observed_on,
    observedAt: new Date(row.observed_at).toISOString(),
    observer: row.observer_id ? { id: row.observer_id, name: row.observer_name ?? '' } : null,
    standRating: row.stand_rating,
    frameCounts: row.frame_counts as number[],
    frameSqFt: row.frame_sq_ft,
    plantsPerSqFt: row.plants_per_sq_ft,
    expectedPerSqFt: row.expected_per_sq_ft,
    expectedSource: row.expected_source,
    weedPressure: row.weed_pressure,
    verdict: row.verdict,
    notes: row.notes,
    reseedPlantingId: row.reseed_planting_id,
    photos,
  };
}

/** Photo ids that cannot be linked to a check of this plot (unknown, not a photo, another plot, another check). */
export class PhotoLinkError extends Error {}

/**
 * Saves a check and links its photos in one transaction. Only photos of the same plot that belong to no
 * other check may be linked; otherwise nothing is saved.
 */
export async function createObservation(o: {
  plantingId: string;
  plotId: string;
  stepId: string | null;
  observedOn: string;
  observedAt: Date;
  observerId: string;
  standRating: number;
  frameCounts: number[];
  frameSqFt: number;
  plantsPerSqFt: number;
  expectedPerSqFt: number | null;
  expectedSource: string | null;
  weedPressure: WeedPressure;
  verdict: StandVerdict;
  notes: string | null;
  photoIds: string[];
}): Promise<string> {
  return getDb()
    .transaction()
    .execute(async (trx) => {
      const row = await trx
        .insertInto('observations')
        .values({
          planting_id: o.plantingId,
          plot_id: o.plotId,
          step_id: o.stepId,
          observed_on: o.observedOn,
          observed_at: o.observedAt,
          observer_id: o.observerId,
          stand_rating: o.standRating,
          frame_counts: JSON.stringify(o.frameCounts),
          frame_sq_ft: o.frameSqFt,
          plants_per_sq_ft: o.plantsPerSqFt,
          expected_per_sq_ft: o.expectedPerSqFt,
          expected_source: o.expectedSource,
          weed_pressure: o.weedPressure,
          verdict: o.verdict,
          notes: o.notes,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      const ids = [...new Set(o.photoIds)];
      if (ids.length) {
        const linked = await trx
          .updateTable('uploads')
          .set({ observation_id: row.id })
          .where('id', 'in', ids)
          .where('kind', '=', 'photo')
          .where('plot_id', '=', o.plotId)
          .where('observation_id', 'is', null)
          .returning('id')
          .execute();
        if (linked.length !== ids.length) {
          throw new PhotoLinkError('A photo is not one uploaded for this plot, or belongs to another check; upload it again');
        }
      }
      return row.id;
    });
}

export async function deleteObservation(id: string): Promise<void> {
  await getDb().deleteFrom('observations').where('id', '=', id).execute();
}

const withObserver = () =>
  getDb()
    .selectFrom('observations')
    .leftJoin('users', 'users.id', 'observations.observer_id')
    .selectAll('observations')
    .select('users.name as observer_name');

export async function getObservation(id: string): Promise<ObservationDto | null> {
  const row = await withObserver().where('observations.id', '=', id).executeTakeFirst();
  if (!row) return null;
  const photos = await listObservationPhotos([row.id]);
  return toDto(row, photos.map(toUploadDto));
}

/** A planting's checks, newest first, each with its photos. */
export async function listObservations(plantingId: string): Promise<ObservationDto[]> {
  const rows = await withObserver()
    .where('observations.planting_id', '=', plantingId)
    .orderBy('observations.observed_at', 'desc')
    .execute();
  const photos = await listObservationPhotos(rows.map((r) => r.id));
  return rows.map((r) => toDto(r, photos.filter((p) => p.observation_id === r.id).map(toUploadDto)));
}

/** Locks the check's row; the reseeding it already led to, if any (null when the check is gone). */
export async function lockObservation(trx: Transaction<Database>, id: string) {
  return trx.selectFrom('observations').selectAll().where('id', '=', id).forUpdate().executeTakeFirst();
}

export async function setReseedPlanting(trx: Transaction<Database>, observationId: string, plantingId: string): Promise<void> {
  await trx.updateTable('observations').set({ reseed_planting_id: plantingId }).where('id', '=', observationId).execute();
}
