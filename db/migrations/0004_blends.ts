import { Kysely, sql } from 'kysely';

// Saved blends: a property's own mixes (species and shares), so a club plants the same blend each season
// without retyping it. The parts are the planting form's blend rows, validated by the same schema.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('blends')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('property_id', 'uuid', (c) => c.notNull().references('properties.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('parts', 'jsonb', (c) => c.notNull())
    .addColumn('notes', 'text')
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  // One name per property, whatever the letter case ("Fall clover" and "fall clover" are the same blend).
  await sql`create unique index blends_property_name on blends (property_id, lower(name))`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('blends').execute();
}
