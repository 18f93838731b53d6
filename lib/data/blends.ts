import { getDb } from '@/db';
import type { SavedBlendInput } from '@/lib/validations/blend';

export interface SavedBlendDto {
  id: string;
  propertyId: string;
  name: string;
  parts: { speciesId: string; share: number }[];
  notes: string | null;
  createdAt: string;
}

type Row = { id: string; property_id: string; name: string; parts: SavedBlendDto['parts']; notes: string | null; created_at: Date | string };

const toDto = (row: Row): SavedBlendDto => ({
  id: row.id,
  propertyId: row.property_id,
  name: row.name,
  parts: row.parts,
  notes: row.notes,
  createdAt: new Date(row.created_at).toISOString(),
});

/** Thrown when the property already has a blend of that name (the unique index decides, case-insensitively). */
export class DuplicateBlendName extends Error {}

export async function listBlends(propertyId: string): Promise<SavedBlendDto[]> {
  const rows = await getDb().selectFrom('blends').selectAll().where('property_id', '=', propertyId).orderBy('name').execute();
  return rows.map(toDto);
}

export async function getBlend(propertyId: string, blendId: string): Promise<SavedBlendDto | null> {
  const row = await getDb().selectFrom('blends').selectAll().where('property_id', '=', propertyId).where('id', '=', blendId).executeTakeFirst();
  return row ? toDto(row) : null;
}

export async function createBlend(propertyId: string, input: SavedBlendInput, userId: string): Promise<SavedBlendDto> {
  try {
    const row = await getDb()
      .insertInto('blends')
      .values({ property_id: propertyId, name: input.name, parts: JSON.stringify(input.parts), notes: input.notes ?? null, created_by: userId })
      .returningAll()
      .executeTakeFirstOrThrow();
    return toDto(row);
  } catch (error) {
    if ((error as { code?: string }).code === '23505') throw new DuplicateBlendName('This property already has a blend with that name');
    throw error;
  }
}

/** Deletes the blend when it belongs to the property; false when there was none. Plantings keep their own copy. */
export async function deleteBlend(propertyId: string, blendId: string): Promise<boolean> {
  const result = await getDb().deleteFrom('blends').where('property_id', '=', propertyId).where('id', '=', blendId).executeTakeFirst();
  return Number(result.numDeletedRows) > 0;
}
