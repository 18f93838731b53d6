import { Kysely, sql } from 'kysely';

// Plantings (one season's plan for a plot) and their steps, with every move kept.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createType('planting_method').asEnum(['spray-and-seed', 'prepared-seedbed', 'frost-seeding']).execute();
  await db.schema.createType('planting_status').asEnum(['active', 'finished', 'abandoned']).execute();
  await db.schema
    .createType('step_kind')
    .asEnum([
      'clear-brush', 'spray', 'kill-wait', 'burn', 'rake-till', 'seed', 'cover-seed', 'fertilize', 'lime',
      'check-germination', 'mow', 'spot-spray-grass', 'frost-seed', 'soil-test',
    ])
    .execute();
  await db.schema.createType('step_status').asEnum(['planned', 'done', 'skipped']).execute();

  await db.schema
    .createTable('plantings')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('plot_id', 'uuid', (c) => c.notNull().references('plots.id').onDelete('cascade'))
    .addColumn('season', 'text', (c) => c.notNull().check(sql`season in ('spring', 'fall')`))
    .addColumn('year', 'integer', (c) => c.notNull().check(sql`year between 2000 and 2200`))
    .addColumn('method', sql`planting_method`, (c) => c.notNull())
    .addColumn('status', sql`planting_status`, (c) => c.notNull().defaultTo('active'))
    .addColumn('target_seed_date', 'date', (c) => c.notNull())
    .addColumn('ready_by', 'date')
    // The engine's whole input (blend, products, sprayer, options) as the planner saved it.
    .addColumn('input', 'jsonb', (c) => c.notNull())
    .addColumn('warnings', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('plantings_plot').on('plantings').column('plot_id').execute();

  await db.schema
    .createTable('steps')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('planting_id', 'uuid', (c) => c.notNull().references('plantings.id').onDelete('cascade'))
    .addColumn('key', 'text', (c) => c.notNull())
    .addColumn('kind', sql`step_kind`, (c) => c.notNull())
    .addColumn('title', 'text', (c) => c.notNull())
    .addColumn('position', 'integer', (c) => c.notNull())
    .addColumn('local_date', 'date', (c) => c.notNull())
    .addColumn('window_start', 'date')
    .addColumn('window_end', 'date')
    .addColumn('hours', 'jsonb')
    .addColumn('pinned', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('status', sql`step_status`, (c) => c.notNull().defaultTo('planned'))
    .addColumn('done_on', 'date')
    .addColumn('done_at', 'timestamptz')
    .addColumn('done_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('assignee_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('after', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('quantities', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('cautions', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('rules', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('warnings', 'jsonb', (c) => c.notNull().defaultTo(sql`'[]'::jsonb`))
    .addColumn('reason', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('recurrence', 'text')
    .addColumn('notes', 'text')
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('steps_planting_key', ['planting_id', 'key'])
    .addCheckConstraint('steps_window_order', sql`window_start is null or window_end is null or window_start <= window_end`)
    .execute();
  await db.schema.createIndex('steps_date').on('steps').columns(['local_date']).execute();
  await db.schema.createIndex('steps_assignee').on('steps').columns(['assignee_id']).execute();

  await db.schema
    .createTable('step_moves')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    .addColumn('step_id', 'uuid', (c) => c.notNull().references('steps.id').onDelete('cascade'))
    .addColumn('from_date', 'date', (c) => c.notNull())
    .addColumn('to_date', 'date', (c) => c.notNull())
    .addColumn('reason', 'text', (c) => c.notNull())
    // null = the engine moved it; otherwise the person who did.
    .addColumn('moved_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('forecast_fetched_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('step_moves_step').on('step_moves').columns(['step_id', 'created_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['step_moves', 'steps', 'plantings']) await db.schema.dropTable(table).ifExists().execute();
  for (const type of ['step_status', 'step_kind', 'planting_status', 'planting_method']) {
    await db.schema.dropType(type).ifExists().execute();
  }
}
