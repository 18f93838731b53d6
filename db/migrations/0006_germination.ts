import { Kysely } from 'kysely';

// A germination check remembers the reseeding it led to, so accepting the proposal twice (a double tap on a
// phone, two managers at once) makes one planting, and the check can link to it.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('observations')
    .addColumn('reseed_planting_id', 'uuid', (c) => c.references('plantings.id').onDelete('set null'))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('observations').dropColumn('reseed_planting_id').execute();
}
