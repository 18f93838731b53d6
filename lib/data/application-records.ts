import type { Selectable } from 'kysely';
import { getDb } from '@/db';
import type { ApplicationRecordsTable } from '@/db/database';
import { localClock } from '@/lib/schedule/local-dates';
import type { ApplicationCorrectionInput, ApplicationRecordInput, RecordFilters } from '@/lib/validations/application-record';

type Row = Selectable<ApplicationRecordsTable>;

export interface ApplicationRecordDto {
  id: string;
  propertyId: string;
  plotId: string | null;
  plotName: string;
  stepId: string | null;
  supersedesId: string | null;
  correctionReason: string | null;
  /** The correction that replaced this record, when there is one (the record itself never changes). */
  supersededBy: { id: string; recordedAt: string } | null;
  kind: Row['kind'];
  appliedAt: string; // ISO instant (UTC)
  appliedOn: string; // local date in timeZone
  appliedTime: string; // local 'HH:mm' in timeZone
  timeZone: string;
  areaAcres: number;
  location: string | null;
  site: string | null;
  productName: string;
  epaRegNo: string | null;
  restrictedUse: boolean;
  activeIngredientPct: number | null;
  rateValue: number;
  rateUnit: string;
  totalProductValue: number;
  totalProductUnit: string;
  waterGal: number | null;
  sprayer: string | null;
  applicatorName: string;
  applicatorLicense: string | null;
  windMph: number | null;
  windDirection: string | null;
  airTempF: number | null;
  humidityPct: number | null;
  weatherSource: Row['weather_source'];
  notes: string | null;
  recordedBy: { id: string; name: string } | null;
  recordedAt: string;
}

type JoinedRow = Row & { superseded_by_id: string | null; superseded_by_at: Date | string | null; recorded_by_name: string | null };

export function toRecordDto(row: JoinedRow): ApplicationRecordDto {
  const appliedAt = new Date(row.applied_at);
  return {
    id: row.id,
    propertyId: row.property_id,
    plotId: row.plot_id,
    plotName: row.plot_name,
    stepId: row.step_id,
    supersedesId: row.supersedes_id,
    correctionReason: row.correction_reason,
    supersededBy: row.superseded_by_id ? { id: row.superseded_by_id, recordedAt: new Date(row.superseded_by_at!).toISOString() } : null,
    kind: row.kind,
    appliedAt: appliedAt.toISOString(),
    appliedOn: row.applied_on,
    appliedTime: localClock(appliedAt.getTime(), row.time_zone),
    timeZone: row.time_zone,
    areaAcres: row.area_acres,
    location: row.location,
    site: row.site,
    productName: row.product_name,
    epaRegNo: row.epa_reg_no,
    restrictedUse: row.restricted_use,
    activeIngredientPct: row.active_ingredient_pct,
    rateValue: row.rate_value,
    rateUnit: row.rate_unit,
    totalProductValue: row.total_product_value,
    totalProductUnit: row.total_product_unit,
    waterGal: row.water_gal,
    sprayer: row.sprayer,
    applicatorName: row.applicator_name,
    applicatorLicense: row.applicator_license,
    windMph: row.wind_mph,
    windDirection: row.wind_direction,
    airTempF: row.air_temp_f,
    humidityPct: row.humidity_pct,
    weatherSource: row.weather_source,
    notes: row.notes,
    recordedBy: row.recorded_by ? { id: row.recorded_by, name: row.recorded_by_name ?? '' } : null,
    recordedAt: new Date(row.recorded_at).toISOString(),
  };
}

function selectRecords() {
  return getDb()
    .selectFrom('application_records as r')
    .leftJoin('application_records as c', 'c.supersedes_id', 'r.id')
    .leftJoin('users as u', 'u.id', 'r.recorded_by')
    .selectAll('r')
    .select(['c.id as superseded_by_id', 'c.recorded_at as superseded_by_at', 'u.name as recorded_by_name']);
}

/** A property's records, newest application first; corrected originals are listed too, marked. */
export async function listRecords(propertyId: string, filters: RecordFilters = {}): Promise<ApplicationRecordDto[]> {
  let query = selectRecords().where('r.property_id', '=', propertyId);
  if (filters.plot) query = query.where('r.plot_id', '=', filters.plot);
  if (filters.kind) query = query.where('r.kind', '=', filters.kind);
  if (filters.from) query = query.where('r.applied_on', '>=', filters.from);
  if (filters.to) query = query.where('r.applied_on', '<=', filters.to);
  if (filters.product) {
    // A plain substring, whatever the letter case: % and _ typed by a person are not wildcards.
    const escaped = filters.product.replace(/[\\%_]/g, (c) => `\\${c}`);
    query = query.where('r.product_name', 'ilike', `%${escaped}%`);
  }
  const rows = await query.orderBy('r.applied_at', 'desc').orderBy('r.recorded_at', 'desc').orderBy('r.id').execute();
  return rows.map(toRecordDto);
}

export async function getRecord(recordId: string): Promise<ApplicationRecordDto | null> {
  const row = await selectRecords().where('r.id', '=', recordId).executeTakeFirst();
  return row ? toRecordDto(row) : null;
}

/** Where a record belongs, for the access check. */
export async function recordPropertyId(recordId: string): Promise<string | null> {
  const row = await getDb().selectFrom('application_records').select('property_id').where('id', '=', recordId).executeTakeFirst();
  return row?.property_id ?? null;
}

/** Thrown when a record already has a correction: each record is replaced at most once (the unique index decides). */
export class AlreadyCorrected extends Error {
  constructor(public readonly correctionId: string | null) {
    super('This record has already been corrected; correct the newer record instead');
  }
}

interface Placed {
  propertyId: string;
  plotName: string;
  appliedAt: Date;
  timeZone: string;
  recordedBy: string;
}

function columns(input: ApplicationRecordInput | ApplicationCorrectionInput, o: Placed) {
  return {
    property_id: o.propertyId,
    plot_id: input.plotId,
    plot_name: o.plotName,
    step_id: input.stepId ?? null,
    kind: input.kind,
    applied_at: o.appliedAt,
    applied_on: input.appliedOn,
    time_zone: o.timeZone,
    area_acres: input.areaAcres,
    location: input.location ?? null,
    site: input.site ?? null,
    product_name: input.productName,
    epa_reg_no: input.epaRegNo ?? null,
    restricted_use: input.restrictedUse,
    active_ingredient_pct: input.activeIngredientPct ?? null,
    rate_value: input.rateValue,
    rate_unit: input.rateUnit,
    total_product_value: input.totalProductValue,
    total_product_unit: input.totalProductUnit,
    water_gal: input.waterGal ?? null,
    sprayer: input.sprayer ?? null,
    applicator_name: input.applicatorName,
    applicator_license: input.applicatorLicense ?? null,
    wind_mph: input.windMph ?? null,
    wind_direction: input.windDirection ?? null,
    air_temp_f: input.airTempF ?? null,
    humidity_pct: input.humidityPct ?? null,
    weather_source: input.weatherSource ?? null,
    notes: input.notes ?? null,
    recorded_by: o.recordedBy,
  };
}

export async function createRecord(input: ApplicationRecordInput, o: Placed): Promise<ApplicationRecordDto> {
  const row = await getDb().insertInto('application_records').values(columns(input, o)).returning('id').executeTakeFirstOrThrow();
  return (await getRecord(row.id))!;
}

/**
 * A correction: a new record naming the one it replaces. The original row is never touched (a trigger
 * refuses UPDATE); a second correction of the same record is refused by the unique index on supersedes_id.
 * The correction keeps the original's step.
 */
export async function createCorrection(originalId: string, input: ApplicationCorrectionInput, o: Placed): Promise<ApplicationRecordDto> {
  const id = await getDb()
    .transaction()
    .execute(async (trx) => {
      const original = await trx.selectFrom('application_records').select(['id', 'step_id']).where('id', '=', originalId).executeTakeFirstOrThrow();
      const existing = await trx.selectFrom('application_records').select('id').where('supersedes_id', '=', originalId).executeTakeFirst();
      if (existing) throw new AlreadyCorrected(existing.id);
      try {
        const row = await trx
          .insertInto('application_records')
          .values({
            ...columns({ ...input, stepId: original.step_id ?? undefined }, o),
            supersedes_id: originalId,
            correction_reason: input.correctionReason,
          })
          .returning('id')
          .executeTakeFirstOrThrow();
        return row.id;
      } catch (error) {
        // Two corrections racing: the unique index lets one through.
        if ((error as { code?: string }).code === '23505') throw new AlreadyCorrected(null);
        throw error;
      }
    });
  return (await getRecord(id))!;
}
