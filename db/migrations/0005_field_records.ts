import { Kysely, sql } from 'kysely';

// Work in the field and its records: uploaded files (photos, soil-test reports, boundary tracks), plot
// boundaries, germination checks, application records (append-only; a correction is a new row that names
// the one it replaces), soil tests, expenses with their split, and each person's iCalendar feed tokens.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('uploads')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('property_id', 'uuid', (c) => c.notNull().references('properties.id').onDelete('cascade'))
    .addColumn('plot_id', 'uuid', (c) => c.references('plots.id').onDelete('set null'))
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('photo', 'soil-test', 'boundary')`))
    .addColumn('filename', 'text', (c) => c.notNull())
    .addColumn('content_type', 'text', (c) => c.notNull())
    .addColumn('size_bytes', 'integer', (c) => c.notNull().check(sql`size_bytes > 0`))
    .addColumn('sha256', 'text', (c) => c.notNull())
    // Where the storage module keeps the bytes (local disk under .data/ or an S3-compatible bucket).
    .addColumn('storage_key', 'text', (c) => c.notNull().unique())
    .addColumn('thumb_key', 'text')
    .addColumn('width', 'integer')
    .addColumn('height', 'integer')
    .addColumn('caption', 'text')
    .addColumn('uploaded_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('uploads_property').on('uploads').columns(['property_id', 'created_at']).execute();

  await db.schema
    .alterTable('plots')
    // A GeoJSON Feature (Polygon or MultiPolygon, WGS84) and its geodesic area, from an uploaded track.
    .addColumn('boundary', 'jsonb')
    .addColumn('boundary_acres', 'double precision')
    .addColumn('boundary_upload_id', 'uuid', (c) => c.references('uploads.id').onDelete('set null'))
    .execute();

  await db.schema
    .alterTable('steps')
    // What was really done (seed broadcast, product used…), as the person completing the step recorded it.
    .addColumn('done_record', 'jsonb')
    .execute();

  await db.schema
    .createTable('observations')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('planting_id', 'uuid', (c) => c.notNull().references('plantings.id').onDelete('cascade'))
    .addColumn('plot_id', 'uuid', (c) => c.notNull().references('plots.id').onDelete('cascade'))
    .addColumn('step_id', 'uuid', (c) => c.references('steps.id').onDelete('set null'))
    .addColumn('observed_on', 'date', (c) => c.notNull())
    .addColumn('observed_at', 'timestamptz', (c) => c.notNull())
    .addColumn('observer_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('stand_rating', 'smallint', (c) => c.notNull().check(sql`stand_rating between 1 and 5`))
    // Plants counted in a frame at each spot, and the frame's size (a one-square-foot frame by default).
    .addColumn('frame_counts', 'jsonb', (c) => c.notNull())
    .addColumn('frame_sq_ft', 'double precision', (c) => c.notNull().defaultTo(1))
    .addColumn('plants_per_sq_ft', 'double precision', (c) => c.notNull())
    .addColumn('expected_per_sq_ft', 'double precision')
    .addColumn('expected_source', 'text')
    .addColumn('weed_pressure', 'text', (c) => c.notNull().check(sql`weed_pressure in ('none', 'light', 'moderate', 'heavy')`))
    .addColumn('verdict', 'text', (c) => c.notNull().check(sql`verdict in ('good', 'fair', 'poor')`))
    .addColumn('notes', 'text')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('observations_planting').on('observations').columns(['planting_id', 'observed_at']).execute();
  await db.schema
    .alterTable('uploads')
    .addColumn('observation_id', 'uuid', (c) => c.references('observations.id').onDelete('set null'))
    .execute();

  await db.schema
    .createTable('application_records')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('property_id', 'uuid', (c) => c.notNull().references('properties.id').onDelete('cascade'))
    // The plot may be deleted later; the record keeps its name and area (records outlive plots).
    .addColumn('plot_id', 'uuid', (c) => c.references('plots.id').onDelete('set null'))
    .addColumn('plot_name', 'text', (c) => c.notNull())
    .addColumn('step_id', 'uuid', (c) => c.references('steps.id').onDelete('set null'))
    // A correction is a new record naming the one it replaces; each record is replaced at most once.
    .addColumn('supersedes_id', 'uuid', (c) => c.references('application_records.id').onDelete('restrict').unique())
    .addColumn('correction_reason', 'text')
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('herbicide', 'fertilizer', 'lime')`))
    .addColumn('applied_at', 'timestamptz', (c) => c.notNull())
    .addColumn('applied_on', 'date', (c) => c.notNull())
    .addColumn('time_zone', 'text', (c) => c.notNull())
    .addColumn('area_acres', 'double precision', (c) => c.notNull().check(sql`area_acres > 0`))
    .addColumn('location', 'text')
    .addColumn('site', 'text')
    .addColumn('product_name', 'text', (c) => c.notNull())
    .addColumn('epa_reg_no', 'text')
    .addColumn('restricted_use', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('active_ingredient_pct', 'double precision')
    .addColumn('rate_value', 'double precision', (c) => c.notNull())
    .addColumn('rate_unit', 'text', (c) => c.notNull())
    .addColumn('total_product_value', 'double precision', (c) => c.notNull())
    .addColumn('total_product_unit', 'text', (c) => c.notNull())
    .addColumn('water_gal', 'double precision')
    .addColumn('sprayer', 'text')
    .addColumn('applicator_name', 'text', (c) => c.notNull())
    .addColumn('applicator_license', 'text')
    .addColumn('wind_mph', 'double precision')
    .addColumn('wind_direction', 'text')
    .addColumn('air_temp_f', 'double precision')
    .addColumn('humidity_pct', 'double precision')
    .addColumn('weather_source', 'text', (c) => c.check(sql`weather_source in ('forecast', 'observation', 'entered')`))
    .addColumn('notes', 'text')
    .addColumn('recorded_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('recorded_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('application_records_property').on('application_records').columns(['property_id', 'applied_at']).execute();
  // Append-only: the database itself refuses an UPDATE, so no code path can change a record silently.
  // (Deleting a property still removes its records with it.)
  await sql`
    create function application_records_append_only() returns trigger language plpgsql as $$
    begin
      raise exception 'application records cannot be changed; record a correction instead'
        using errcode = 'P0001';
    end $$`.execute(db);
  await sql`
    create trigger application_records_no_update before update on application_records
    for each row execute function application_records_append_only()`.execute(db);

  await db.schema
    .createTable('soil_tests')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('property_id', 'uuid', (c) => c.notNull().references('properties.id').onDelete('cascade'))
    .addColumn('plot_id', 'uuid', (c) => c.notNull().references('plots.id').onDelete('cascade'))
    .addColumn('sampled_on', 'date')
    .addColumn('lab_name', 'text')
    .addColumn('ph', 'double precision')
    .addColumn('buffer_ph', 'double precision')
    .addColumn('p_ppm', 'double precision')
    .addColumn('k_ppm', 'double precision')
    .addColumn('organic_matter_pct', 'double precision')
    .addColumn('lime_tons_per_acre', 'double precision')
    .addColumn('n_lb_per_acre', 'double precision')
    .addColumn('p2o5_lb_per_acre', 'double precision')
    .addColumn('k2o_lb_per_acre', 'double precision')
    .addColumn('recommendation', 'text')
    .addColumn('upload_id', 'uuid', (c) => c.references('uploads.id').onDelete('set null'))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('soil_tests_plot').on('soil_tests').columns(['plot_id', 'created_at']).execute();

  await db.schema
    .createTable('expenses')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('property_id', 'uuid', (c) => c.notNull().references('properties.id').onDelete('cascade'))
    .addColumn('plot_id', 'uuid', (c) => c.references('plots.id').onDelete('set null'))
    .addColumn('season', 'text', (c) => c.notNull().check(sql`season in ('spring', 'fall')`))
    .addColumn('year', 'integer', (c) => c.notNull().check(sql`year between 2000 and 2200`))
    .addColumn('spent_on', 'date', (c) => c.notNull())
    .addColumn('category', 'text', (c) =>
      c.notNull().check(sql`category in ('seed', 'herbicide', 'fertilizer', 'lime', 'fuel', 'equipment', 'labour', 'other')`),
    )
    .addColumn('description', 'text', (c) => c.notNull())
    // Money in cents, never floating dollars.
    .addColumn('amount_cents', 'integer', (c) => c.notNull().check(sql`amount_cents >= 0`))
    .addColumn('labour_hours', 'double precision', (c) => c.check(sql`labour_hours is null or labour_hours >= 0`))
    .addColumn('paid_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    // The people who share this cost (user ids); empty means every member who shares the club's costs.
    .addColumn('split_among', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('expenses_property').on('expenses').columns(['property_id', 'spent_on']).execute();

  await db.schema
    .createTable('calendar_feeds')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    // Only the SHA-256 of the secret token is kept; the URL is shown once when it is made.
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('label', 'text')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('last_used_at', 'timestamptz')
    .addColumn('revoked_at', 'timestamptz')
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('calendar_feeds').execute();
  await db.schema.dropTable('expenses').execute();
  await db.schema.dropTable('soil_tests').execute();
  await db.schema.dropTable('application_records').execute();
  await sql`drop function application_records_append_only()`.execute(db);
  await db.schema.alterTable('uploads').dropColumn('observation_id').execute();
  await db.schema.dropTable('observations').execute();
  await db.schema.alterTable('steps').dropColumn('done_record').execute();
  await db.schema.alterTable('plots').dropColumn('boundary_upload_id').dropColumn('boundary_acres').dropColumn('boundary').execute();
  await db.schema.dropTable('uploads').execute();
}
