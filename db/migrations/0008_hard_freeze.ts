import { Kysely, sql } from 'kysely';

// The average first hard freeze (28 °F, National Weather Service) of a property, beside its first fall frost:
// hardy species survive a light freeze, so the frost-deadline rule counts their growing days to this date
// (lib/schedule/rules/frost-deadline.ts). Optional; without it the rule estimates it from the first frost.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('properties')
    .addColumn('avg_first_hard_freeze', 'text', (c) => c.check(sql`avg_first_hard_freeze ~ '^(0[1-9]|1[0-2])-(0[1-9]|[12][0-9]|3[01])$'`))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('properties').dropColumn('avg_first_hard_freeze').execute();
}
