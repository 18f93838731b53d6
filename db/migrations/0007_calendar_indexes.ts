import { Kysely, sql } from 'kysely';

// Indexes for the dashboard of a large club, each measured with EXPLAIN (ANALYZE) on a 1,000-plot club
// (5,850 steps, 117,000 moves): "moved since your last visit" read every move newer than the visit and
// sorted them for the newest 50 (80–160 ms; newest first along this index, 6–15 ms); the germination checks
// due looked through every step of every planting (10–15 ms; this partial index holds only the planned
// checks, 2–7 ms).
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createIndex('step_moves_created').on('step_moves').column('created_at').execute();
  await db.schema
    .createIndex('steps_germination_due')
    .on('steps')
    .column('local_date')
    .where(sql<boolean>`kind = 'check-germination' and status = 'planned'`)
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('steps_germination_due').ifExists().execute();
  await db.schema.dropIndex('step_moves_created').ifExists().execute();
}
