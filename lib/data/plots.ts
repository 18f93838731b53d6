import type { Insertable } from 'kysely';
import { getDb } from '@/db';
import type { Plot, PlotsTable } from '@/db/database';
import type { PlotInput } from '@/lib/validations/plot';

export interface PlotDto {
  id: string;
  propertyId: string;
  name: string;
  acres: number;
  cover: Plot['cover'];
  sun: Plot['sun'];
  soilPh: number | null;
  notes: string | null;
  createdAt: string;
  updatedAt: string;
}

export function toPlotDto(row: Plot): PlotDto {
  return {
    id: row.id,
    propertyId: row.property_id,
    name: row.name,
    acres: row.acres,
    cover: row.cover,
    sun: row.sun,
    soilPh: row.soil_ph,
    notes: row.notes,
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

const COLUMN_OF = {
  name: 'name',
  acres: 'acres',
  cover: 'cover',
  sun: 'sun',
  soilPh: 'soil_ph',
  notes: 'notes',
} as const satisfies Record<keyof PlotInput, string>;

function toColumns(input: Partial<PlotInput>, keys: readonly string[] = Object.keys(COLUMN_OF)) {
  const out: Record<string, unknown> = {};
  for (const key of keys) {
    if (key in COLUMN_OF) {
      const field = key as keyof PlotInput;
      out[COLUMN_OF[field]] = input[field] ?? null;
    }
  }
  return out;
}

/** Thrown when a plot name is already used on the property (the unique constraint decides). */
export class DuplicatePlotName extends Error {}

function rethrowDuplicate(error: unknown): never {
  if ((error as { code?: string }).code === '23505') throw new DuplicatePlotName('A plot with that name already exists on this property');
  throw error;
}

export async function listPlots(propertyId: string): Promise<PlotDto[]> {
  const rows = await getDb().selectFrom('plots').selectAll().where('property_id', '=', propertyId).orderBy('name').execute();
  return rows.map(toPlotDto);
}

export async function getPlot(id: string) {
  return getDb().selectFrom('plots').selectAll().where('id', '=', id).executeTakeFirst();
}

export async function createPlot(propertyId: string, input: PlotInput): Promise<PlotDto> {
  try {
    const row = await getDb()
      .insertInto('plots')
      .values({ ...(toColumns(input) as Omit<Insertable<PlotsTable>, 'property_id'>), property_id: propertyId })
      .returningAll()
      .executeTakeFirstOrThrow();
    return toPlotDto(row);
  } catch (error) {
    rethrowDuplicate(error);
  }
}

export async function updatePlot(id: string, input: Partial<PlotInput>, keys: string[]) {
  try {
    const row = await getDb()
      .updateTable('plots')
      .set({ ...toColumns(input, keys), updated_at: new Date() })
      .where('id', '=', id)
      .returningAll()
      .executeTakeFirst();
    return row ? toPlotDto(row) : null;
  } catch (error) {
    rethrowDuplicate(error);
  }
}

export async function deletePlot(id: string) {
  await getDb().deleteFrom('plots').where('id', '=', id).execute();
}
