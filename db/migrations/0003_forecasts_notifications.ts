import { Kysely, sql } from 'kysely';

// Forecasts (one fetch per grid cell, every fetch kept), the refresh state per cell, notification rows
// (one per message per channel, unique by dedupe key), push subscriptions per device, and each person's
// notification settings.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createType('notification_channel').asEnum(['email', 'push']).execute();

  await db.schema
    .createTable('forecasts')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    .addColumn('grid_key', 'text', (c) => c.notNull())
    .addColumn('latitude', 'double precision', (c) => c.notNull())
    .addColumn('longitude', 'double precision', (c) => c.notNull())
    .addColumn('provider', 'text', (c) => c.notNull())
    .addColumn('fetched_at', 'timestamptz', (c) => c.notNull())
    .addColumn('first_hour', 'timestamptz', (c) => c.notNull())
    .addColumn('last_hour', 'timestamptz', (c) => c.notNull())
    // The engine's hourly Forecast hours, validated before they are stored: never a partial answer.
    .addColumn('hours', 'jsonb', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('forecasts_grid_time').on('forecasts').columns(['grid_key', 'fetched_at']).execute();

  await db.schema
    .createTable('forecast_status')
    .addColumn('grid_key', 'text', (c) => c.primaryKey())
    .addColumn('last_attempt_at', 'timestamptz')
    .addColumn('last_success_at', 'timestamptz')
    .addColumn('failing_since', 'timestamptz')
    .addColumn('last_error', 'text')
    .addColumn('consecutive_failures', 'integer', (c) => c.notNull().defaultTo(0))
    .execute();

  await db.schema
    .createTable('notification_settings')
    .addColumn('user_id', 'uuid', (c) => c.primaryKey().references('users.id').onDelete('cascade'))
    .addColumn('email_enabled', 'boolean', (c) => c.notNull().defaultTo(true))
    .addColumn('push_enabled', 'boolean', (c) => c.notNull().defaultTo(true))
    .addColumn('reminder_hour', 'smallint', (c) => c.notNull().defaultTo(7).check(sql`reminder_hour between 0 and 23`))
    .addColumn('quiet_start_hour', 'smallint', (c) => c.check(sql`quiet_start_hour between 0 and 23`))
    .addColumn('quiet_end_hour', 'smallint', (c) => c.check(sql`quiet_end_hour between 0 and 23`))
    .addColumn('due_reminders', 'boolean', (c) => c.notNull().defaultTo(true))
    .addColumn('digest', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('push_subscriptions')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('endpoint', 'text', (c) => c.notNull().unique())
    .addColumn('p256dh', 'text', (c) => c.notNull())
    .addColumn('auth', 'text', (c) => c.notNull())
    .addColumn('label', 'text')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('last_sent_at', 'timestamptz')
    .execute();
  await db.schema.createIndex('push_subscriptions_user').on('push_subscriptions').column('user_id').execute();

  await db.schema
    .createTable('notifications')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    // step, kind, user, channel, local date (or the forecast for moves): a message is made once.
    .addColumn('dedupe_key', 'text', (c) => c.notNull().unique())
    // A person with an account, or (invitations) only an e-mail address.
    .addColumn('user_id', 'uuid', (c) => c.references('users.id').onDelete('cascade'))
    .addColumn('email_to', 'text')
    .addColumn('property_id', 'uuid', (c) => c.references('properties.id').onDelete('cascade'))
    .addColumn('step_id', 'uuid', (c) => c.references('steps.id').onDelete('set null'))
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('channel', sql`notification_channel`, (c) => c.notNull())
    .addColumn('message', 'jsonb', (c) => c.notNull())
    .addColumn('send_after', 'timestamptz', (c) => c.notNull())
    .addColumn('claimed_at', 'timestamptz')
    .addColumn('claimed_by', 'text')
    .addColumn('sent_at', 'timestamptz')
    .addColumn('failed_at', 'timestamptz')
    .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('last_error', 'text')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint('notifications_recipient', sql`user_id is not null or (email_to is not null and channel = 'email')`)
    .execute();
  await db.schema
    .createIndex('notifications_due')
    .on('notifications')
    .columns(['send_after'])
    .where(sql.ref('sent_at'), 'is', null)
    .execute();
  await db.schema.createIndex('notifications_user').on('notifications').columns(['user_id', 'created_at']).execute();

  // "Steps moved since my last visit" needs to know when that was.
  await db.schema.alterTable('users').addColumn('last_seen_at', 'timestamptz').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('users').dropColumn('last_seen_at').execute();
  for (const table of ['notifications', 'push_subscriptions', 'notification_settings', 'forecast_status', 'forecasts']) {
    await db.schema.dropTable(table).ifExists().execute();
  }
  await db.schema.dropType('notification_channel').ifExists().execute();
}
