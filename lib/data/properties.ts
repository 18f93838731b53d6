import type { Insertable, Kysely } from 'kysely';
import { getDb } from '@/db';
import type { Database, PropertiesTable, Property, PropertyRole } from '@/db/database';
import type { PropertyInput } from '@/lib/validations/property';

export interface PropertyDto {
  id: string;
  name: string;
  latitude: number;
  longitude: number;
  timeZone: string;
  elevationM: number;
  avgLastSpringFrost: string | null;
  avgFirstFallFrost: string | null;
  avgFirstHardFreeze: string | null;
  seasonOpensOn: string | null;
  tenure: Property['tenure'];
  landownerName: string | null;
  landownerContact: string | null;
  permissionGrantedOn: string | null;
  createdAt: string;
  updatedAt: string;
}

export function toPropertyDto(row: Property): PropertyDto {
  return {
    id: row.id,
    name: row.name,
    latitude: row.latitude,
    longitude: row.longitude,
    timeZone: row.time_zone,
    elevationM: row.elevation_m,
    avgLastSpringFrost: row.avg_last_spring_frost,
    avgFirstFallFrost: row.avg_first_fall_frost,
    avgFirstHardFreeze: row.avg_first_hard_freeze,
    seasonOpensOn: row.season_opens_on,
    tenure: row.tenure,
    landownerName: row.landowner_name,
    landownerContact: row.landowner_contact,
    permissionGrantedOn: row.permission_granted_on,
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

const COLUMN_OF = {
  name: 'name',
  latitude: 'latitude',
  longitude: 'longitude',
  timeZone: 'time_zone',
  elevationM: 'elevation_m',
  avgLastSpringFrost: 'avg_last_spring_frost',
  avgFirstFallFrost: 'avg_first_fall_frost',
  avgFirstHardFreeze: 'avg_first_hard_freeze',
  seasonOpensOn: 'season_opens_on',
  tenure: 'tenure',
  landownerName: 'landowner_name',
  landownerContact: 'landowner_contact',
  permissionGrantedOn: 'permission_granted_on',
} as const satisfies Record<keyof PropertyInput, string>;

/** Columns for the fields named in `keys`; an optional field sent empty is cleared (null). */
function toColumns(input: Partial<PropertyInput>, keys: readonly string[] = Object.keys(COLUMN_OF)) {
  const out: Record<string, unknown> = {};
  for (const key of keys) {
    if (key in COLUMN_OF) {
      const field = key as keyof PropertyInput;
      out[COLUMN_OF[field]] = input[field] ?? null;
    }
  }
  return out;
}

export interface PropertySummary extends PropertyDto {
  role: PropertyRole;
  plotCount: number;
  plotAcres: number;
}

export async function listPropertiesForUser(userId: string): Promise<PropertySummary[]> {
  const rows = await getDb()
    .selectFrom('properties')
    .innerJoin('memberships', 'memberships.property_id', 'properties.id')
    .selectAll('properties')
    .select('memberships.role')
    .select((eb) => [
      eb.selectFrom('plots').whereRef('plots.property_id', '=', 'properties.id').select((sub) => sub.fn.countAll<number>().as('n')).as('plot_count'),
      eb.selectFrom('plots').whereRef('plots.property_id', '=', 'properties.id').select((sub) => sub.fn.coalesce(sub.fn.sum<number>('plots.acres'), sub.lit(0)).as('a')).as('plot_acres'),
    ])
    .where('memberships.user_id', '=', userId)
    .orderBy('properties.name')
    .execute();
  return rows.map((row) => ({
    ...toPropertyDto(row as unknown as Property),
    role: row.role,
    plotCount: Number(row.plot_count ?? 0),
    plotAcres: Number(row.plot_acres ?? 0),
  }));
}

export async function getProperty(id: string, db: Kysely<Database> = getDb()) {
  return db.selectFrom('properties').selectAll().where('id', '=', id).executeTakeFirst();
}

/** How many properties the user owns. */
export async function countOwnedProperties(userId: string): Promise<number> {
  const row = await getDb()
    .selectFrom('memberships')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('user_id', '=', userId)
    .where('role', '=', 'owner')
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

/** Creates the property and makes its creator the owner, in one transaction. */
export async function createProperty(ownerId: string, input: PropertyInput): Promise<PropertyDto> {
  return getDb().transaction().execute(async (trx) => {
    const row = await trx
      .insertInto('properties')
      .values(toColumns(input) as Insertable<PropertiesTable>)
      .returningAll()
      .executeTakeFirstOrThrow();
    await trx.insertInto('memberships').values({ property_id: row.id, user_id: ownerId, role: 'owner' }).execute();
    return toPropertyDto(row);
  });
}

export async function updateProperty(id: string, input: Partial<PropertyInput>, keys: string[]) {
  const values = toColumns(input, keys);
  const row = await getDb()
    .updateTable('properties')
    .set({ ...values, updated_at: new Date() })
    .where('id', '=', id)
    .returningAll()
    .executeTakeFirst();
  return row ? toPropertyDto(row) : null;
}

export async function deleteProperty(id: string) {
  await getDb().deleteFrom('properties').where('id', '=', id).execute();
}
