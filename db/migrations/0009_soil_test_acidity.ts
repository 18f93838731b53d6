import { Kysely, sql } from 'kysely';

// What a lime rate is worked out from: which buffer the lab's buffer pH was read with (SMP, as Midwest labs
// use it, or Mehlich, as the North Carolina lab does), and the exchangeable acidity (Ac, meq/100 cm³) that the
// North Carolina lab reports. Both optional: older reports and many labs give neither.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('soil_tests')
    .addColumn('buffer_method', 'text', (c) => c.check(sql`buffer_method in ('smp', 'mehlich')`))
    .addColumn('acidity_meq', 'double precision', (c) => c.check(sql`acidity_meq >= 0`))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('soil_tests').dropColumn('acidity_meq').dropColumn('buffer_method').execute();
}
