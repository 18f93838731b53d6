// The iCalendar feed over real HTTP, read with ical.js (an independent RFC 5545 parser: ICAL.parse,
// ICAL.Component, ICAL.Event and its recurrence iterator). Checked against:
// - GET /api/calendar for the same person: the same steps on the same local dates, recurring upkeep included;
// - US daylight saving time by statute (15 U.S.C. §260a: from 2:00 a.m. on the second Sunday of March to the
//   first Sunday of November), so Central time is UTC−6 before that Sunday and UTC−5 from it;
// - FIPS 180-4 SHA-256 (node:crypto) for the stored token hash; RFC 4648 §5 base64url for the token.
import { createHash, randomBytes } from 'node:crypto';
import ICAL from 'ical.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testDb } from '../support/db';
import { addMember, Client, createPlot, createProperty, signedInUser, type TestUser } from '../support/http';

type Person = { user: TestUser; client: Client };
const db = testDb();
const ZONE = 'America/Chicago';
let owner: Person, member: Person, stranger: Person;
let plot: { id: string; name: string };
let otherPlot: { id: string; name: string };
let plantingId: string;

const YEAR = new Date().getUTCFullYear() + 1;
/** The second Sunday of March of YEAR, worked from the weekday of 1 March (15 U.S.C. §260a). */
const DST_START = (() => {
  const firstWeekday = new Date(Date.UTC(YEAR, 2, 1)).getUTCDay(); // 0 = Sunday
  const firstSunday = 1 + ((7 - firstWeekday) % 7);
  return `${YEAR}-03-${String(firstSunday + 7).padStart(2, '0')}`;
})();
const dayBefore = (date: string) => new Date(Date.parse(`${date}T12:00:00Z`) - 86_400_000).toISOString().slice(0, 10);
const FROM = `${YEAR}-01-01`;
const TO = `${YEAR}-12-31`;

async function insertStep(o: { key: string; kind: string; title: string; date: string; hours?: { start: string; end: string }; recurrence?: string; status?: 'planned' | 'done' | 'skipped' }) {
  const row = await db
    .insertInto('steps')
    .values({
      planting_id: plantingId,
      key: o.key,
      kind: o.kind as 'spray',
      title: o.title,
      position: 90,
      local_date: o.date,
      hours: o.hours ? JSON.stringify(o.hours) : null,
      status: o.status ?? 'planned',
      after: '[]',
      quantities: JSON.stringify(o.kind === 'spray' ? [{ item: 'mix', amount: 2, unit: 'gal', detail: '2 gal of spray mix' }] : []),
      cautions: '[]',
      rules: '[]',
      warnings: '[]',
      reason: 'set by the feed test',
      recurrence: o.recurrence ?? null,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

async function makeFeed(p: Person, label?: string) {
  const res = await p.client.post('/api/settings/calendar-feeds', label ? { label } : {});
  expect(res.status, res.text).toBe(201);
  return { id: res.body.feed.id as string, url: res.body.url as string, token: new URL(res.body.url).pathname.split('/').at(-1)! };
}

/** The feed parsed by ical.js, with its VTIMEZONEs registered so TZID times resolve through them. */
function parseFeed(text: string) {
  const calendar = new ICAL.Component(ICAL.parse(text));
  for (const tz of calendar.getAllSubcomponents('vtimezone')) ICAL.TimezoneService.register(tz);
  return { calendar, events: calendar.getAllSubcomponents('vevent').map((v) => new ICAL.Event(v)) };
}

/** Each (step, local date) the feed puts in [from, to], expanding recurrences with ical.js. */
type FeedEvent = InstanceType<typeof ICAL.Event>;
type FeedTime = InstanceType<typeof ICAL.Time>;

function feedOccurrences(events: FeedEvent[], from: string, to: string) {
  const out: { stepId: string; date: string; clock: string | null; utc: string | null }[] = [];
  for (const event of events) {
    const stepId = event.uid.replace(/@sowcast$/, '');
    const take = (t: FeedTime) => {
      const date = t.toString().slice(0, 10);
      if (date >= from && date <= to) out.push({ stepId, date, clock: t.isDate ? null : t.toString().slice(11, 16), utc: t.isDate ? null : t.toJSDate().toISOString() });
    };
    if (!event.isRecurring()) {
      take(event.startDate);
      continue;
    }
    const it = event.iterator();
    for (let next = it.next(); next; next = it.next()) {
      if (next.toString().slice(0, 10) > to) break;
      take(next);
    }
  }
  return out;
}

beforeAll(async () => {
  [owner, member, stranger] = await Promise.all(['feed-owner', 'feed-member', 'feed-stranger'].map((p) => signedInUser(p)));
  const property = await createProperty(owner.client, { timeZone: ZONE, name: `Feed ${Date.now()}` });
  plot = await createPlot(owner.client, property.id, { name: 'Creek bottom' });
  await addMember(owner.client, property.id, member, 'member');
  const planting = await owner.client.post(`/api/plots/${plot.id}/plantings`, {
    season: 'fall',
    method: 'spray-and-seed',
    blend: [{ speciesId: 'white-clover', share: 1 }],
    targetSeedDate: `${YEAR}-09-10`,
    herbicide: { productName: 'Generic glyphosate 41%', rateKind: 'percent-solution', rate: 2 },
    sprayer: { tankGal: 4, carrierGalPerAcre: 20 },
    upkeep: true,
  });
  expect(planting.status, planting.text).toBe(201);
  plantingId = planting.body.planting.id;
  const other = await createProperty(stranger.client);
  otherPlot = await createPlot(stranger.client, other.id, { name: 'Not yours' });
});

afterAll(async () => {
  await db.destroy();
});

describe('the calendar feed', () => {
  it('makes a 256-bit base64url token, shows it once, and stores only its SHA-256', async () => {
    const feed = await makeFeed(owner, 'My phone');
    // RFC 4648 §5: 43 base64url characters without padding carry 32 bytes = 256 bits.
    expect(feed.token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(Buffer.from(feed.token, 'base64url')).toHaveLength(32);
    const row = await db.selectFrom('calendar_feeds').selectAll().where('id', '=', feed.id).executeTakeFirstOrThrow();
    expect(row.token_hash).toBe(createHash('sha256').update(feed.token).digest('hex'));
    expect(JSON.stringify(row)).not.toContain(feed.token);
    const list = await owner.client.get('/api/settings/calendar-feeds');
    expect(list.body.feeds.find((f: { id: string }) => f.id === feed.id)).toEqual({ id: feed.id, label: 'My phone', createdAt: expect.any(String), lastUsedAt: null });
    expect(list.text).not.toContain(feed.token);
    expect(list.text).not.toContain(row.token_hash);
    // Two feeds never share a token.
    expect((await makeFeed(owner)).token).not.toBe(feed.token);
  });

  it('serves text/calendar without a session, notes the use, and matches GET /api/calendar step for step and date for date', async () => {
    const dst = await insertStep({ key: 'feed-spray-dst', kind: 'spray', title: 'Spray the burndown', date: DST_START, hours: { start: '09:00', end: '13:00' } });
    const before = await insertStep({ key: 'feed-spray-before', kind: 'spray', title: 'Spray the edge', date: dayBefore(DST_START), hours: { start: '09:00', end: '13:00' } });
    // Monthly on the 1st at 08:00 local, February to May: two occurrences before the change, two after.
    const mow = await insertStep({
      key: 'feed-mow', kind: 'mow', title: 'Mow', date: `${YEAR}-02-01`,
      recurrence: `DTSTART;TZID=${ZONE}:${YEAR}0201T080000\nRRULE:FREQ=MONTHLY;BYMONTHDAY=1;COUNT=4`,
    });
    const done = await insertStep({ key: 'feed-soil', kind: 'soil-test', title: 'Take the soil test', date: `${YEAR}-02-10`, status: 'done' });
    const skipped = await insertStep({ key: 'feed-lime', kind: 'lime', title: 'Spread lime', date: `${YEAR}-02-11`, status: 'skipped' });

    const feed = await makeFeed(owner);
    const res = await new Client('phone calendar').get(new URL(feed.url).pathname);
    expect(res.status, res.text).toBe(200);
    expect(res.headers.get('content-type')).toBe('text/calendar; charset=utf-8');
    const used = await db.selectFrom('calendar_feeds').select('last_used_at').where('id', '=', feed.id).executeTakeFirstOrThrow();
    expect(used.last_used_at).toBeInstanceOf(Date);

    const { calendar, events } = parseFeed(res.text);
    expect(calendar.getFirstPropertyValue('version')).toBe('2.0');
    const calendarRoute = await owner.client.get(`/api/calendar?from=${FROM}&to=${TO}`);
    expect(calendarRoute.status).toBe(200);
    const expected = (calendarRoute.body.events as { stepId: string; start: string; clock?: string }[]).map((e) => `${e.stepId} ${e.start}`).sort();
    const got = feedOccurrences(events, FROM, TO);
    expect(got.map((o) => `${o.stepId} ${o.date}`).sort()).toEqual(expected);
    expect(expected.length).toBeGreaterThan(8);
    // Recurring occurrences keep the calendar's local start time too.
    for (const e of calendarRoute.body.events as { stepId: string; start: string; clock?: string; recurring?: boolean }[]) {
      if (e.recurring) expect(got.find((o) => o.stepId === e.stepId && o.date === e.start)?.clock).toBe(e.clock);
    }

    const byId = new Map(events.map((e) => [e.uid, e]));
    // Timed steps: TZID of the property's zone, resolved through the feed's own VTIMEZONE.
    const dstEvent = byId.get(`${dst}@sowcast`)!;
    expect(dstEvent.component.getFirstProperty('dtstart')!.getParameter('tzid')).toBe(ZONE);
    expect(dstEvent.startDate.zone.tzid).toBe(ZONE);
    // 09:00 CDT (UTC−5) on the Sunday daylight time starts = 14:00 UTC; the day before, 09:00 CST (UTC−6) = 15:00 UTC.
    expect(dstEvent.startDate.toJSDate().toISOString()).toBe(`${DST_START}T14:00:00.000Z`);
    expect(dstEvent.endDate.toJSDate().toISOString()).toBe(`${DST_START}T18:00:00.000Z`);
    expect(byId.get(`${before}@sowcast`)!.startDate.toJSDate().toISOString()).toBe(`${dayBefore(DST_START)}T15:00:00.000Z`);
    // The recurrence keeps 08:00 on the ground across the change: 14:00 UTC in Feb and Mar, 13:00 UTC in Apr and May.
    expect(got.filter((o) => o.stepId === mow).map((o) => o.utc)).toEqual([
      `${YEAR}-02-01T14:00:00.000Z`, `${YEAR}-03-01T14:00:00.000Z`, `${YEAR}-04-01T13:00:00.000Z`, `${YEAR}-05-01T13:00:00.000Z`,
    ]);
    const rule = byId.get(`${mow}@sowcast`)!.component.getFirstPropertyValue('rrule') as InstanceType<typeof ICAL.Recur>;
    expect([rule.freq, rule.count, rule.parts.BYMONTHDAY]).toEqual(['MONTHLY', 4, [1]]);

    // All-day steps are DATE values on the local date.
    const doneEvent = byId.get(`${done}@sowcast`)!;
    expect(doneEvent.startDate.isDate).toBe(true);
    expect(doneEvent.startDate.toString()).toBe(`${YEAR}-02-10`);
    expect(doneEvent.summary).toBe(`✓ Done: ${plot.name} — Take the soil test`);
    expect(byId.get(`${skipped}@sowcast`)!.component.getFirstPropertyValue('status')).toBe('CANCELLED');
    expect(dstEvent.summary).toBe(`${plot.name} — Spray the burndown`);
    // What to carry, the herbicide cautions, and the link to the step.
    expect(dstEvent.description).toContain('2 gal of spray mix');
    expect(dstEvent.description).toMatch(/label is the law/);
    expect(dstEvent.component.getFirstPropertyValue('url')).toMatch(new RegExp(`/steps/${dst}$`));
    // SEQUENCE and LAST-MODIFIED follow the step's last change.
    const stored = await db.selectFrom('steps').select('updated_at').where('id', '=', dst).executeTakeFirstOrThrow();
    expect((dstEvent.component.getFirstPropertyValue('last-modified') as FeedTime).toJSDate().getTime()).toBe(Math.floor(new Date(stored.updated_at).getTime() / 1000) * 1000);
    expect(typeof dstEvent.sequence).toBe('number');
    // Nothing of a property the person does not belong to.
    expect(res.text).not.toContain(otherPlot.name);
  });

  it('gives the same steps to every member of the property, each through their own feed', async () => {
    const feed = await makeFeed(member);
    const res = await new Client().get(new URL(feed.url).pathname);
    const route = await member.client.get(`/api/calendar?from=${FROM}&to=${TO}`);
    const got = feedOccurrences(parseFeed(res.text).events, FROM, TO).map((o) => `${o.stepId} ${o.date}`).sort();
    expect(got).toEqual((route.body.events as { stepId: string; start: string }[]).map((e) => `${e.stepId} ${e.start}`).sort());
  });

  it('a revoked token, an unknown token and a malformed one all get the same bare 404', async () => {
    const feed = await makeFeed(owner);
    const path = new URL(feed.url).pathname;
    expect((await new Client().get(path)).status).toBe(200);
    // Another person cannot revoke it.
    expect((await stranger.client.delete(`/api/settings/calendar-feeds/${feed.id}`)).status).toBe(404);
    expect((await new Client().get(path)).status).toBe(200);
    expect((await owner.client.delete(`/api/settings/calendar-feeds/${feed.id}`)).status).toBe(204);
    expect((await owner.client.delete(`/api/settings/calendar-feeds/${feed.id}`)).status).toBe(404);
    const answers = await Promise.all(
      [path, `/api/calendar-feed/${randomBytes(32).toString('base64url')}`, '/api/calendar-feed/short', `/api/calendar-feed/${'%00'.repeat(15)}`].map((p) => new Client().get(p)),
    );
    for (const a of answers) {
      expect(a.status).toBe(404);
      expect(a.body).toEqual({ error: 'Not found' });
    }
    const list = await owner.client.get('/api/settings/calendar-feeds');
    expect(list.body.feeds.map((f: { id: string }) => f.id)).not.toContain(feed.id);
  });
});
