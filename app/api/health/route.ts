import { sql } from 'kysely';
import { getDb } from '@/db';
import { json, route } from '@/lib/http';

export const dynamic = 'force-dynamic';

export const GET = route(async () => {
  try {
    await sql`select 1`.execute(getDb());
    return json({ ok: true, database: 'up' });
  } catch {
    return json({ ok: false, database: 'down' }, 503);
  }
});
