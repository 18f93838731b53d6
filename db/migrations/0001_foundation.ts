import { Kysely, sql } from 'kysely';

// Foundation: people, properties (the ground a club hunts or a landowner manages), who may do what there,
// invitations, plots, and the sign-in attempt log used to slow password guessing.
export async function up(db: Kysely<any>): Promise<void> {
  await sql`create extension if not exists pgcrypto`.execute(db);

  await db.schema.createType('property_role').asEnum(['owner', 'manager', 'member', 'viewer']).execute();
  await db.schema.createType('land_tenure').asEnum(['owned', 'leased', 'permission']).execute();
  await db.schema
    .createType('plot_cover')
    .asEnum(['grass-weeds', 'brush', 'bare-soil', 'tilled', 'existing-stand'])
    .execute();
  await db.schema.createType('plot_sun').asEnum(['full', 'partial', 'shade']).execute();

  await db.schema
    .createTable('users')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('password_hash', 'text', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint('users_email_lower', sql`email = lower(email)`)
    .execute();
  await db.schema.createIndex('users_email_key').unique().on('users').column('email').execute();

  await db.schema
    .createTable('sign_in_attempts')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('ip', 'text')
    .addColumn('succeeded', 'boolean', (c) => c.notNull())
    .addColumn('attempted_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema
    .createIndex('sign_in_attempts_email_time')
    .on('sign_in_attempts')
    .columns(['email', 'attempted_at'])
    .execute();

  await db.schema
    .createTable('properties')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('latitude', 'double precision', (c) => c.notNull().check(sql`latitude between -90 and 90`))
    .addColumn('longitude', 'double precision', (c) => c.notNull().check(sql`longitude between -180 and 180`))
    .addColumn('time_zone', 'text', (c) => c.notNull())
    .addColumn('elevation_m', 'double precision', (c) =>
      c.notNull().defaultTo(0).check(sql`elevation_m between -500 and 9000`),
    )
    // Average frost dates are a month and day that recur every year, so they are stored as 'MM-DD'.
    .addColumn('avg_last_spring_frost', 'text', (c) =>
      c.check(sql`avg_last_spring_frost ~ '^(0[1-9]|1[0-2])-(0[1-9]|[12][0-9]|3[01])$'`),
    )
    .addColumn('avg_first_fall_frost', 'text', (c) =>
      c.check(sql`avg_first_fall_frost ~ '^(0[1-9]|1[0-2])-(0[1-9]|[12][0-9]|3[01])$'`),
    )
    .addColumn('season_opens_on', 'date')
    .addColumn('tenure', sql`land_tenure`, (c) => c.notNull().defaultTo('owned'))
    .addColumn('landowner_name', 'text')
    .addColumn('landowner_contact', 'text')
    .addColumn('permission_granted_on', 'date')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('memberships')
    .addColumn('property_id', 'uuid', (c) => c.notNull().references('properties.id').onDelete('cascade'))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('role', sql`property_role`, (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('memberships_pkey', ['property_id', 'user_id'])
    .execute();
  await db.schema.createIndex('memberships_user').on('memberships').column('user_id').execute();

  await db.schema
    .createTable('invitations')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('property_id', 'uuid', (c) => c.notNull().references('properties.id').onDelete('cascade'))
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('role', sql`property_role`, (c) => c.notNull())
    // Only a SHA-256 of the token is kept: a stolen database copy cannot accept invitations.
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('invited_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addColumn('accepted_at', 'timestamptz')
    .addColumn('accepted_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('revoked_at', 'timestamptz')
    .addCheckConstraint('invitations_email_lower', sql`email = lower(email)`)
    .execute();
  await db.schema.createIndex('invitations_property').on('invitations').column('property_id').execute();

  await db.schema
    .createTable('plots')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('property_id', 'uuid', (c) => c.notNull().references('properties.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('acres', 'double precision', (c) => c.notNull().check(sql`acres > 0 and acres <= 10000`))
    .addColumn('cover', sql`plot_cover`, (c) => c.notNull())
    .addColumn('sun', sql`plot_sun`, (c) => c.notNull())
    .addColumn('soil_ph', 'double precision', (c) => c.check(sql`soil_ph between 3 and 10`))
    .addColumn('notes', 'text')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('plots_property_name_key', ['property_id', 'name'])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['plots', 'invitations', 'memberships', 'properties', 'sign_in_attempts', 'users']) {
    await db.schema.dropTable(table).ifExists().execute();
  }
  for (const type of ['plot_sun', 'plot_cover', 'land_tenure', 'property_role']) {
    await db.schema.dropType(type).ifExists().execute();
  }
}
