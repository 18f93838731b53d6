// Which reminders are due, for whom and when (lib/notify/reminders.ts).
// Sources for the clock checks:
// - America/Chicago is UTC−6 (CST) in winter and UTC−5 (CDT) in summer; daylight saving time begins the second
//   Sunday of March and ends the first Sunday of November (15 U.S.C. §260a, Energy Policy Act of 2005 §110):
//   in 2027 that is Sun 14 March and Sun 7 November. The zone rules come from the IANA time zone database,
//   which Node's Intl carries; each instant is read back with Intl.DateTimeFormat, independent of date-fns-tz.
// - Quiet hours that "defer, never drop" and the 07:00 default hour are Sowcast's own rules (no outside source).
import { describe, expect, it } from 'vitest';
import { DEFAULT_SETTINGS, type NotificationSettings } from '@/lib/data/notification-settings';
import { messageIdFor } from '@/lib/notify/email';
import {
  atLocalHour, channelsFor, dedupeKey, deferPastQuietHours, dueReminders, inQuietHours, movedNotifications, recipientsOf,
  reminderTime, type Membership, type Person, type ReminderStep,
} from '@/lib/notify/reminders';

const ZONE = 'America/Chicago';
const BASE = 'https://sowcast.example.test';

/** The wall clock an instant shows in a zone, read with Intl (IANA tz database), not with the code under test. */
function wallClock(instant: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-CA', {
    timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit',
  }).formatToParts(instant);
  const f = Object.fromEntries(parts.map((p) => [p.type, p.value]));
  return `${f.year}-${f.month}-${f.day} ${f.hour}:${f.minute}`;
}

const settings = (over: Partial<NotificationSettings> = {}): NotificationSettings => ({ ...DEFAULT_SETTINGS, ...over });

const person = (userId: string, over: Partial<Person> = {}): Person => ({
  userId,
  email: `${userId}@example.test`,
  settings: settings(),
  hasPushDevices: true,
  homeTimeZone: ZONE,
  ...over,
});

const OWNER = '00000000-0000-4000-8000-00000000000a';
const MANAGER = '00000000-0000-4000-8000-00000000000b';
const MEMBER = '00000000-0000-4000-8000-00000000000c';
const VIEWER = '00000000-0000-4000-8000-00000000000d';
const PROPERTY = '10000000-0000-4000-8000-000000000001';
const PLANTING = '20000000-0000-4000-8000-000000000001';

const memberships: Membership[] = [
  { propertyId: PROPERTY, userId: OWNER, role: 'owner' },
  { propertyId: PROPERTY, userId: MANAGER, role: 'manager' },
  { propertyId: PROPERTY, userId: MEMBER, role: 'member' },
  { propertyId: PROPERTY, userId: VIEWER, role: 'viewer' },
];

function step(key: string, over: Partial<ReminderStep> = {}): ReminderStep {
  return {
    stepId: `step-${key}`,
    plantingId: PLANTING,
    key,
    kind: 'seed',
    title: 'Broadcast seed',
    date: '2027-09-15',
    status: 'planned',
    doneOn: null,
    assigneeId: null,
    plotId: '40000000-0000-4000-8000-000000000001',
    plotName: 'Creekside strip',
    propertyId: PROPERTY,
    propertyName: 'Hollow Oak Club',
    timeZone: ZONE,
    ...over,
  };
}

/** A prepared-seedbed planting sprayed on 1 Sep, the kill wait ending 15 Sep. */
const spray = step('1', { key: 'spray', kind: 'spray', title: 'Spray the burndown', date: '2027-09-01', status: 'done', doneOn: '2027-09-01' });
const killWait = step('2', { key: 'kill-wait', kind: 'kill-wait', title: 'Kill wait', date: '2027-09-15' });
const seed = step('3', { key: 'seed', kind: 'seed', title: 'Broadcast seed', date: '2027-09-20' });

describe('the reminder hour in the property’s zone', () => {
  it('07:00 in Chicago is 13:00Z in January (CST, UTC−6) and 12:00Z in July (CDT, UTC−5)', () => {
    expect(atLocalHour('2027-01-15', 7, ZONE).toISOString()).toBe('2027-01-15T13:00:00.000Z');
    expect(atLocalHour('2027-07-15', 7, ZONE).toISOString()).toBe('2027-07-15T12:00:00.000Z');
  });

  it('stays 07:00 on the wall clock on both sides of the March and November changes of 2027', () => {
    const expected: Record<string, string> = {
      '2027-03-13': '2027-03-13T13:00:00.000Z', // Saturday, still CST
      '2027-03-14': '2027-03-14T12:00:00.000Z', // the change day: CDT from 02:00
      '2027-03-15': '2027-03-15T12:00:00.000Z',
      '2027-11-06': '2027-11-06T12:00:00.000Z', // Saturday, still CDT
      '2027-11-07': '2027-11-07T13:00:00.000Z', // the change day: CST from 02:00
      '2027-11-08': '2027-11-08T13:00:00.000Z',
    };
    for (const [date, iso] of Object.entries(expected)) {
      const instant = reminderTime(date, ZONE, settings());
      expect(instant.toISOString(), date).toBe(iso);
      expect(wallClock(instant, ZONE), date).toBe(`${date} 07:00`);
    }
  });

  it('follows the zone, not the server: 07:00 in Berlin and in Honolulu', () => {
    // Europe/Berlin is UTC+1 in January; Pacific/Honolulu is UTC−10 all year (IANA tz database).
    expect(atLocalHour('2027-01-15', 7, 'Europe/Berlin').toISOString()).toBe('2027-01-15T06:00:00.000Z');
    expect(atLocalHour('2027-07-15', 7, 'Pacific/Honolulu').toISOString()).toBe('2027-07-15T17:00:00.000Z');
  });
});

describe('quiet hours defer, never drop', () => {
  const night = { quietStartHour: 22, quietEndHour: 8 };

  it('22–08 wraps past midnight', () => {
    expect([21, 22, 23, 0, 7, 8, 12].map((h) => inQuietHours(h, night))).toEqual([false, true, true, true, true, false, false]);
    expect([0, 1, 5, 6, 7].map((h) => inQuietHours(h, { quietStartHour: 1, quietEndHour: 6 }))).toEqual([false, true, true, false, false]);
    expect(inQuietHours(3, { quietStartHour: null, quietEndHour: null })).toBe(false);
  });

  it('a 07:00 reminder inside quiet hours 22–08 goes at 08:00 the same morning', () => {
    const at = reminderTime('2027-01-15', ZONE, settings(night));
    expect(wallClock(at, ZONE)).toBe('2027-01-15 08:00');
    expect(at.toISOString()).toBe('2027-01-15T14:00:00.000Z');
  });

  it('an evening hour inside a spell that wraps midnight goes at the end of it, the next morning', () => {
    const at = reminderTime('2027-01-15', ZONE, settings({ reminderHour: 23, quietStartHour: 22, quietEndHour: 6 }));
    expect(wallClock(at, ZONE)).toBe('2027-01-16 06:00');
  });

  it('an hour outside quiet hours is kept; a spell that does not wrap defers within the night', () => {
    expect(wallClock(reminderTime('2027-01-15', ZONE, settings({ reminderHour: 9, ...night })), ZONE)).toBe('2027-01-15 09:00');
    expect(wallClock(reminderTime('2027-01-15', ZONE, settings({ reminderHour: 3, quietStartHour: 1, quietEndHour: 6 })), ZONE)).toBe('2027-01-15 06:00');
  });

  it('a message deferred over the March change still ends at 08:00 on the wall clock', () => {
    // 23:30 CST on Sat 13 March → the spell ends at 08:00 CDT on Sun 14 March.
    const at = deferPastQuietHours(new Date('2027-03-14T05:30:00Z'), ZONE, night);
    expect(wallClock(at, ZONE)).toBe('2027-03-14 08:00');
    expect(at.toISOString()).toBe('2027-03-14T13:00:00.000Z');
  });

  it('the reminder is not made before the end of quiet hours, and is made once they end', () => {
    const quiet = [OWNER, MANAGER].map((id) => person(id, { settings: settings(night) }));
    const input = (iso: string) => ({ now: new Date(iso), baseUrl: BASE, steps: [spray, killWait, seed], people: quiet, memberships });
    expect(dueReminders(input('2027-09-15T12:30:00Z'))).toEqual([]); // 07:30 CDT, quiet
    const rows = dueReminders(input('2027-09-15T13:00:00Z')); // 08:00 CDT
    expect(rows.length).toBe(4);
    for (const r of rows) expect(r.sendAfter.toISOString()).toBe('2027-09-15T13:00:00.000Z');
  });
});

describe('which reminders are due', () => {
  const everyone = [person(OWNER), person(MANAGER), person(MEMBER), person(VIEWER)];
  const at = (iso: string, steps = [spray, killWait, seed], people = everyone) =>
    dueReminders({ now: new Date(iso), baseUrl: BASE, steps, people, memberships });

  it('kill wait over: nothing at 06:59 local, one e-mail and one push per recipient at 07:00', () => {
    expect(at('2027-09-15T11:59:00Z')).toEqual([]);
    const rows = at('2027-09-15T12:00:00Z');
    expect(rows.map((r) => `${r.kind} ${r.userId} ${r.channel}`).sort()).toEqual([
      `kill-wait-over ${OWNER} email`,
      `kill-wait-over ${OWNER} push`,
      `kill-wait-over ${MANAGER} email`,
      `kill-wait-over ${MANAGER} push`,
    ].sort());
    const email = rows.find((r) => r.channel === 'email' && r.userId === OWNER)!;
    expect(email.dedupeKey).toBe(`${killWait.stepId}:kill-wait-over:${OWNER}:email:2027-09-15`);
    expect(email.stepId).toBe(killWait.stepId);
    const message = email.message as { subject: string; text: string; messageId: string; push: { url: string } };
    expect(message.subject).toBe('The kill wait on Creekside strip is over — seed or till now');
    expect(message.messageId).toBe(messageIdFor(email.dedupeKey));
    expect(message.text).toContain(`${BASE}/settings`);
    expect(message.push.url).toBe(`${BASE}/steps/${killWait.stepId}`);
  });

  it('dedupe keys are stable: the same moment, or a later one, gives the same keys', () => {
    const keys = (iso: string) => at(iso).map((r) => r.dedupeKey).sort();
    expect(keys('2027-09-15T12:00:00Z')).toEqual(keys('2027-09-15T12:00:00Z'));
    expect(keys('2027-09-15T16:45:00Z')).toEqual(keys('2027-09-15T12:00:00Z'));
    expect(dedupeKey('s', 'due-today', 'u', 'push', '2027-09-15')).toBe('s:due-today:u:push:2027-09-15');
  });

  it('no kill wait is "over" while the spraying is not recorded as done', () => {
    const planned = { ...spray, status: 'planned' as const, doneOn: null };
    expect(at('2027-09-15T12:00:00Z', [planned, killWait, seed])).toEqual([]);
  });

  it('due tomorrow goes the day before at the reminder hour, due today on the day', () => {
    const tomorrow = at('2027-09-19T12:00:00Z').filter((r) => r.stepId === seed.stepId);
    expect(tomorrow.map((r) => r.kind)).toEqual(['due-tomorrow', 'due-tomorrow', 'due-tomorrow', 'due-tomorrow']);
    expect(tomorrow[0].dedupeKey).toMatch(/:due-tomorrow:.*:2027-09-20$/);
    const today = at('2027-09-20T12:00:00Z').filter((r) => r.stepId === seed.stepId);
    expect(new Set(today.map((r) => r.kind))).toEqual(new Set(['due-today']));
    // On the day itself a late catch-up never says "tomorrow".
    expect(at('2027-09-20T18:00:00Z').some((r) => r.kind === 'due-tomorrow')).toBe(false);
  });

  it('due reminders only for those who want them; done and skipped steps are not reminded', () => {
    const people = [person(OWNER, { settings: settings({ dueReminders: false }) }), person(MANAGER)];
    const rows = at('2027-09-20T12:00:00Z', [spray, killWait, seed], people);
    expect(new Set(rows.map((r) => r.userId))).toEqual(new Set([MANAGER]));
    expect(at('2027-09-20T12:00:00Z', [spray, killWait, { ...seed, status: 'done', doneOn: '2027-09-20' }])).toEqual([]);
  });

  it('check germination goes on its day, with the check form link for the tap', () => {
    const check = step('4', { key: 'check-germination', kind: 'check-germination', title: 'Check germination', date: '2027-09-30' });
    const seeded = { ...seed, status: 'done' as const, doneOn: '2027-09-20' };
    const rows = at('2027-09-30T12:00:00Z', [spray, seeded, check]).filter((r) => r.kind === 'check-germination');
    expect(rows.length).toBe(4);
    const push = rows.find((r) => r.channel === 'push')!.message as { push: { url: string; title: string } };
    expect(push.push.url).toBe(`${BASE}/plots/${check.plotId}/check?step=${check.stepId}`);
    expect(push.push.title).toBe('Check germination on Creekside strip today');
  });

  it('the morning digest: one per person per local date, listing that day’s steps', () => {
    const till = step('5', { key: 'rake-till', kind: 'rake-till', title: 'Rake or till', date: '2027-09-20' });
    const people = [person(OWNER, { settings: settings({ digest: true, dueReminders: false }), hasPushDevices: false })];
    const rows = at('2027-09-20T12:00:00Z', [spray, killWait, seed, till], people);
    expect(rows.map((r) => r.dedupeKey)).toEqual([`digest:${OWNER}:email:2027-09-20`]);
    const text = (rows[0].message as { text: string }).text;
    expect(text).toContain('Broadcast seed');
    expect(text).toContain('Rake or till');
    expect(at('2027-09-21T12:00:00Z', [spray, killWait, seed, till], people)).toEqual([]); // nothing due: no digest
  });
});

describe('recipients and channels', () => {
  it('the assignee alone; with no assignee, the owners and managers', () => {
    expect(recipientsOf({ assigneeId: MEMBER, propertyId: PROPERTY }, memberships)).toEqual([MEMBER]);
    expect(recipientsOf({ assigneeId: null, propertyId: PROPERTY }, memberships)).toEqual([OWNER, MANAGER].sort());
  });

  it('an assignee who left the property no longer gets the step; the owners and managers do', () => {
    const gone = '00000000-0000-4000-8000-0000000000ff';
    expect(recipientsOf({ assigneeId: gone, propertyId: PROPERTY }, memberships)).toEqual([OWNER, MANAGER].sort());
  });

  it('e-mail when on; push only when on and a device is registered', () => {
    expect(channelsFor(person(OWNER))).toEqual(['email', 'push']);
    expect(channelsFor(person(OWNER, { hasPushDevices: false }))).toEqual(['email']);
    expect(channelsFor(person(OWNER, { settings: settings({ pushEnabled: false }) }))).toEqual(['email']);
    expect(channelsFor(person(OWNER, { settings: settings({ emailEnabled: false }) }))).toEqual(['push']);
  });
});

describe('moved notifications', () => {
  const base = {
    baseUrl: BASE,
    plantingId: PLANTING,
    forecastId: '77',
    propertyId: PROPERTY,
    propertyName: 'Hollow Oak Club',
    plotName: 'Creekside strip',
    timeZone: ZONE,
    memberships,
  };
  const moves = [
    { stepId: seed.stepId, title: 'Broadcast seed', from: '2027-09-20', to: '2027-09-18', reason: 'moved seeding ahead of 0.8 in of rain', assigneeId: MEMBER },
    { stepId: killWait.stepId, title: 'Rake or till', from: '2027-09-20', to: '2027-09-18', reason: 'the day of seeding', assigneeId: null },
  ];

  it('one message per person and channel, listing every move, for the assignee, owners and managers', () => {
    const rows = movedNotifications({ ...base, now: new Date('2027-09-16T15:00:00Z'), moves, people: [person(OWNER), person(MANAGER), person(MEMBER), person(VIEWER)] });
    expect(rows.map((r) => r.dedupeKey).sort()).toEqual(
      [OWNER, MANAGER, MEMBER].flatMap((u) => ['email', 'push'].map((c) => `moved:${PLANTING}:${u}:${c}:77`)).sort(),
    );
    const text = (rows[0].message as { text: string }).text;
    expect(text).toContain('moved seeding ahead of 0.8 in of rain');
    expect(text).toContain('the day of seeding');
    for (const r of rows) expect(r.sendAfter.toISOString()).toBe('2027-09-16T15:00:00.000Z');
  });

  it('waits for the end of quiet hours', () => {
    const quiet = person(OWNER, { settings: settings({ quietStartHour: 21, quietEndHour: 7 }) });
    // 23:00 CDT → 07:00 CDT the next morning.
    const rows = movedNotifications({ ...base, now: new Date('2027-09-17T04:00:00Z'), moves, people: [quiet] });
    expect(rows.length).toBe(2);
    for (const r of rows) expect(wallClock(r.sendAfter, ZONE)).toBe('2027-09-17 07:00');
  });

  it('no moves, no message', () => {
    expect(movedNotifications({ ...base, now: new Date(), moves: [], people: [person(OWNER)] })).toEqual([]);
  });
});
