// Gives every demo person a virtual phone at the local fake push service, so the demo's reminders have somewhere
// to ring, and puts the demo's rain into the fake forecast. Run by `npm start` once the fakes are up (they keep
// their state in memory, so this runs on every start). Idempotent: a person whose virtual phone the fake still
// knows keeps it; one the fake forgot (it restarted) is replaced.
//   FAKE_PUSH_URL      the fake push service (https, self-signed: trusted through NODE_EXTRA_CA_CERTS)
//   FAKE_WEATHER_URL   the fake weather service; when set, the rain the demo's waiting planting is timed against is put in
import type { Kysely } from 'kysely';
import { deleteSubscription, listSubscriptions, saveSubscription } from '@/lib/data/push-subscriptions';
import { vapidKeys } from '@/lib/notify/push';
import { pushSubscriptionSchema } from '@/lib/validations/notification-settings';
import { createDb, createPool, getDb } from './index';
import type { Database } from './database';
import { demoWeatherEvents } from './demo';
import demoUsers from './demo-users.json';

const TIMEOUT_MS = 10_000;

async function call<T>(url: string, init: { method: string; body?: unknown }): Promise<T> {
  const response = await fetch(url, {
    method: init.method,
    headers: init.body === undefined ? {} : { 'content-type': 'application/json' },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
    signal: AbortSignal.timeout(TIMEOUT_MS),
  });
  const text = await response.text();
  if (!response.ok) throw new Error(`${init.method} ${url} answered ${response.status}: ${text.slice(0, 300)}`);
  return (text ? JSON.parse(text) : null) as T;
}

export const demoPhoneLabel = (name: string) => `Demo phone — ${name}`;

/**
 * One virtual phone per demo person without a working subscription. Returns how many were made. `db` reads the
 * demo people; subscriptions are stored through lib/data (DATABASE_URL's database).
 */
export async function registerDemoPhones(db: Kysely<Database>, pushUrl: string, publicKey: string): Promise<number> {
  const origin = new URL(pushUrl).origin;
  const known = new Set((await call<{ endpoint: string; gone?: boolean }[]>(`${origin}/_control/subscriptions`, { method: 'GET' }))
    .filter((d) => !d.gone)
    .map((d) => d.endpoint));
  let made = 0;
  for (const person of demoUsers.users) {
    const user = await db.selectFrom('users').select(['id', 'name']).where('email', '=', person.email).executeTakeFirst();
    if (!user) continue;
    const subscriptions = await listSubscriptions(user.id);
    // A phone of this fake that the fake no longer knows (it keeps devices in memory) would only ever answer 404.
    for (const s of subscriptions) {
      if (new URL(s.endpoint).origin === origin && !known.has(s.endpoint)) await deleteSubscription(user.id, s.endpoint);
    }
    const alive = subscriptions.filter((s) => new URL(s.endpoint).origin !== origin || known.has(s.endpoint));
    if (alive.length > 0) continue;
    const device = await call<unknown>(`${origin}/_control/subscriptions`, {
      method: 'POST',
      // Bound to Sowcast's VAPID key (RFC 8292 §3.2), as a browser subscription is.
      body: { label: demoPhoneLabel(user.name), applicationServerKey: publicKey },
    });
    const parsed = pushSubscriptionSchema.parse({ ...(device as object), label: demoPhoneLabel(user.name) });
    await saveSubscription(user.id, parsed);
    made += 1;
  }
  return made;
}

/** The rain two days out (and the dry week after it) at the property of the demo's waiting planting. */
export async function putDemoWeather(weatherUrl: string, at?: Date) {
  const events = demoWeatherEvents(at);
  for (const event of events) await call(`${new URL(weatherUrl).origin}/_control/events`, { method: 'POST', body: event });
  return events;
}

async function main() {
  const pool = createPool();
  const db = createDb(pool);
  try {
    const pushUrl = process.env.FAKE_PUSH_URL;
    if (pushUrl) {
      const { publicKey } = vapidKeys(process.env, process.env.SOWCAST_DATA_DIR ?? '.data');
      const made = await registerDemoPhones(db, pushUrl, publicKey);
      console.log(`demo phones: ${made} virtual phone${made === 1 ? '' : 's'} registered at ${pushUrl} (see ${pushUrl}/ for what they receive)`);
    } else {
      console.log('demo phones: FAKE_PUSH_URL is not set, no virtual phones made');
    }
    const weatherUrl = process.env.FAKE_WEATHER_URL;
    if (weatherUrl) {
      const [rain] = await putDemoWeather(weatherUrl);
      console.log(`demo weather: ${rain.totalMm} mm of rain on ${rain.date} at Foxglove Hollow Lease, then a dry week, put into the fake forecast`);
    }
  } finally {
    await db.destroy();
    await getDb().destroy();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  main().catch((error) => {
    console.error('demo phones failed:', error);
    process.exit(1);
  });
}
