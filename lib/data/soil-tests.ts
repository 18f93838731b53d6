import { sql } from 'kysely';
import { getDb } from '@/db';
import type { SoilTestValues } from '@/lib/validations/soil-test';
import type { StoredFile } from './plot-boundaries';

export interface SoilTestDto {
  id: string;
  plotId: string;
  sampledOn: string | null;
  labName: string | null;
  ph: number | null;
  bufferPh: number | null;
  bufferMethod: 'smp' | 'mehlich' | null;
  acidityMeq: number | null;
  pPpm: number | null;
  kPpm: number | null;
  organicMatterPct: number | null;
  limeTonsPerAcre: number | null;
  nLbPerAcre: number | null;
  p2o5LbPerAcre: number | null;
  k2oLbPerAcre: number | null;
  recommendation: string | null;
  createdAt: string;
  /** The report as uploaded; its bytes are served to members of the property only. */
  file: { uploadId: string; filename: string; contentType: string; url: string } | null;
}

const columns = [
  'soil_tests.id', 'soil_tests.plot_id', 'soil_tests.sampled_on', 'soil_tests.lab_name', 'soil_tests.ph', 'soil_tests.buffer_ph',
  'soil_tests.buffer_method', 'soil_tests.acidity_meq', 'soil_tests.p_ppm', 'soil_tests.k_ppm', 'soil_tests.organic_matter_pct', 'soil_tests.lime_tons_per_acre', 'soil_tests.n_lb_per_acre',
  'soil_tests.p2o5_lb_per_acre', 'soil_tests.k2o_lb_per_acre', 'soil_tests.recommendation', 'soil_tests.created_at',
  'uploads.id as upload_id', 'uploads.filename', 'uploads.content_type',
] as const;

function query() {
  return getDb().selectFrom('soil_tests').leftJoin('uploads', 'uploads.id', 'soil_tests.upload_id').select(columns);
}
type Row = Awaited<ReturnType<ReturnType<typeof query>['executeTakeFirstOrThrow']>>;

const toDto = (r: Row): SoilTestDto => ({
  id: r.id,
  plotId: r.plot_id,
  sampledOn: r.sampled_on,
  labName: r.lab_name,
  ph: r.ph,
  bufferPh: r.buffer_ph,
  bufferMethod: r.buffer_method,
  acidityMeq: r.acidity_meq,
  pPpm: r.p_ppm,
  kPpm: r.k_ppm,
  organicMatterPct: r.organic_matter_pct,
  limeTonsPerAcre: r.lime_tons_per_acre,
  nLbPerAcre: r.n_lb_per_acre,
  p2o5LbPerAcre: r.p2o5_lb_per_acre,
  k2oLbPerAcre: r.k2o_lb_per_acre,
  recommendation: r.recommendation,
  createdAt: new Date(r.created_at).toISOString(),
  file: r.upload_id ? { uploadId: r.upload_id, filename: r.filename!, contentType: r.content_type!, url: `/api/uploads/${r.upload_id}` } : null,
});

/** Newest sample first: by the date sampled where the report gives one, else by when it was uploaded. */
export async function listSoilTests(plotId: string): Promise<SoilTestDto[]> {
  const rows = await query()
    .where('soil_tests.plot_id', '=', plotId)
    .orderBy(sql`coalesce(soil_tests.sampled_on, (soil_tests.created_at at time zone 'UTC')::date)`, 'desc')
    .orderBy('soil_tests.created_at', 'desc')
    .execute();
  return rows.map(toDto);
}

/** The soil test's row and its file's row in one transaction. */
export async function createSoilTest(o: {
  plotId: string;
  propertyId: string;
  userId: string;
  values: SoilTestValues;
  file: StoredFile;
}): Promise<SoilTestDto> {
  const v = o.values;
  const id = await getDb()
    .transaction()
    .execute(async (trx) => {
      const upload = await trx
        .insertInto('uploads')
        .values({
          property_id: o.propertyId,
          plot_id: o.plotId,
          kind: 'soil-test',
          filename: o.file.filename,
          content_type: o.file.contentType,
          size_bytes: o.file.sizeBytes,
          sha256: o.file.sha256,
          storage_key: o.file.storageKey,
          uploaded_by: o.userId,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      const row = await trx
        .insertInto('soil_tests')
        .values({
          property_id: o.propertyId,
          plot_id: o.plotId,
          sampled_on: v.sampledOn ?? null,
          lab_name: v.labName ?? null,
          ph: v.ph ?? null,
          buffer_ph: v.bufferPh ?? null,
          buffer_method: v.bufferMethod ?? null,
          acidity_meq: v.acidityMeq ?? null,
          p_ppm: v.pPpm ?? null,
          k_ppm: v.kPpm ?? null,
          organic_matter_pct: v.organicMatterPct ?? null,
          lime_tons_per_acre: v.limeTonsPerAcre ?? null,
          n_lb_per_acre: v.nLbPerAcre ?? null,
          p2o5_lb_per_acre: v.p2o5LbPerAcre ?? null,
          k2o_lb_per_acre: v.k2oLbPerAcre ?? null,
          recommendation: v.recommendation ?? null,
          upload_id: upload.id,
          created_by: o.userId,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      return row.id;
    });
  return toDto(await query().where('soil_tests.id', '=', id).executeTakeFirstOrThrow());
}
