import { Kysely, sql } from 'kysely';

// Account hardening: e-mail verification, a per-user session version (bumped to end every session at once),
// sessions signed out one by one, the shared counters of the sign-in/sign-up/invitation limits, and the link
// from an invitation's e-mail to the invitation (so the sender can see it was revoked before sending).
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable('users')
    .addColumn('email_verified_at', 'timestamptz')
    .addColumn('session_version', 'integer', (c) => c.notNull().defaultTo(0))
    .execute();
  // Accounts made before verification existed proved nothing, but they were the only way in: treat them as
  // verified rather than lock their owners out of inviting and new properties.
  await sql`update users set email_verified_at = created_at`.execute(db);

  await db.schema
    .createTable('email_verifications')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addColumn('used_at', 'timestamptz')
    .execute();
  await db.schema.createIndex('email_verifications_user').on('email_verifications').column('user_id').execute();

  // A session signed out on its own device: its id is refused until the token would have expired anyway.
  await db.schema
    .createTable('signed_out_sessions')
    .addColumn('session_id', 'uuid', (c) => c.primaryKey())
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .execute();

  // rate-limiter-flexible's PostgreSQL store (its own CREATE TABLE, here so the web needs no DDL rights):
  // key, points used in the window, window end in epoch milliseconds.
  await db.schema
    .createTable('rate_limits')
    .addColumn('key', 'varchar(255)', (c) => c.primaryKey())
    .addColumn('points', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('expire', 'bigint')
    .execute();
  await db.schema.createIndex('rate_limits_expire').on('rate_limits').column('expire').execute();

  await db.schema
    .alterTable('notifications')
    .addColumn('invitation_id', 'uuid', (c) => c.references('invitations.id').onDelete('cascade'))
    .execute();
  await sql`update notifications n set invitation_id = i.id from invitations i
            where n.kind = 'invitation' and n.dedupe_key = 'invitation:' || i.id::text`.execute(db);
  await db.schema.createIndex('invitations_property_created').on('invitations').columns(['property_id', 'created_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('invitations_property_created').ifExists().execute();
  await db.schema.alterTable('notifications').dropColumn('invitation_id').execute();
  await db.schema.dropTable('rate_limits').ifExists().execute();
  await db.schema.dropTable('signed_out_sessions').ifExists().execute();
  await db.schema.dropTable('email_verifications').ifExists().execute();
  await db.schema.alterTable('users').dropColumn('session_version').dropColumn('email_verified_at').execute();
}
