// Which notification rows are due, for whom, on which channel and from when. Pure: the steps, the people and
// the instant come in, rows come out — the worker stores them (the unique dedupe key makes a second worker's
// insert a no-op) and sends them.
//
// Times: a reminder goes out at the person's reminder hour on the local date in the PROPERTY's IANA zone
// (date-fns-tz over the Intl time zone database), so 07:00 stays 07:00 on the wall clock across daylight
// saving changes. Quiet hours defer a message to the end of the quiet spell; they never drop it.
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';
import type { NotificationChannel, PropertyRole } from '@/db/database';
import type { NewNotification } from '@/lib/data/notifications';
import type { NotificationSettings } from '@/lib/data/notification-settings';
import { addDays } from '@/lib/schedule/local-dates';
import type { StepKind, StepStatus } from '@/lib/schedule/types';
import { messageIdFor } from './email';
import { checkGermination, killWaitOver, morningDigest, stepDue, stepsMoved, type NotifyMessage } from './messages';

export type ReminderKind = 'kill-wait-over' | 'check-germination' | 'due-today' | 'due-tomorrow' | 'digest' | 'moved';

/** One stored step with what a message about it needs. */
export interface ReminderStep {
  stepId: string;
  plantingId: string;
  key: string;
  kind: StepKind;
  title: string;
  /** Local date in the property's zone. */
  date: string;
  status: StepStatus;
  doneOn: string | null;
  assigneeId: string | null;
  hours?: { start: string; end: string } | null;
  /** What to carry, one line each. */
  carry?: string[];
  cautions?: string[];
  /** Why the step sits on its day, and what the engine warns about it, in its words. */
  reason?: string;
  warnings?: string[];
  plotId: string;
  plotName: string;
  propertyId: string;
  propertyName: string;
  timeZone: string;
}

export interface Person {
  userId: string;
  email: string | null;
  settings: NotificationSettings;
  hasPushDevices: boolean;
  /** The zone of the person's first property: the morning digest follows that clock. null → no digest. */
  homeTimeZone: string | null;
}

export interface Membership {
  propertyId: string;
  userId: string;
  role: PropertyRole;
}

export interface ReminderInput {
  now: Date;
  baseUrl: string;
  /** Every step of the plantings concerned (siblings tell the real spray and seeding dates). */
  steps: ReminderStep[];
  people: Person[];
  memberships: Membership[];
}

/** The stored message: what both channels send, built once so a retry sends the same words. */
export interface StoredMessage extends NotifyMessage {
  /** E-mail rows: derived from the dedupe key, so a resend after a crash is the same message. */
  messageId?: string;
}

const HOUR_MS = 3_600_000;
/** A reminder whose time has come is still sent up to a day late (the worker was down, quiet hours). */
const CATCH_UP_MS = 24 * HOUR_MS;

const pad = (n: number) => String(n).padStart(2, '0');

/** The local date of an instant in a zone. */
export function localDate(instant: Date, timeZone: string): string {
  return formatInTimeZone(instant, timeZone, 'yyyy-MM-dd');
}

/** The instant of a whole local hour on a local date in a zone (a skipped hour resolves forward). */
export function atLocalHour(date: string, hour: number, timeZone: string): Date {
  return fromZonedTime(`${date}T${pad(hour)}:00:00`, timeZone);
}

type Quiet = Pick<NotificationSettings, 'quietStartHour' | 'quietEndHour'>;

/** Is a local hour inside quiet hours [start, end)? A start after the end wraps past midnight (22–08). */
export function inQuietHours(hour: number, quiet: Quiet): boolean {
  const { quietStartHour: start, quietEndHour: end } = quiet;
  if (start == null || end == null || start === end) return false;
  return start < end ? hour >= start && hour < end : hour >= start || hour < end;
}

/**
 * The instant a message may go out: `instant`, or — when its local time falls inside quiet hours — the end of
 * that quiet spell (the same morning, or the next one when the spell started the evening before midnight).
 */
export function deferPastQuietHours(instant: Date, timeZone: string, quiet: Quiet): Date {
  const hour = Number(formatInTimeZone(instant, timeZone, 'H'));
  if (!inQuietHours(hour, quiet)) return instant;
  const date = localDate(instant, timeZone);
  const end = quiet.quietEndHour as number;
  const endDate = hour >= end ? addDays(date, 1) : date;
  return atLocalHour(endDate, end, timeZone);
}

/** The person's reminder hour on a local date in the property's zone, moved past quiet hours. */
export function reminderTime(date: string, timeZone: string, settings: Pick<NotificationSettings, 'reminderHour'> & Quiet): Date {
  return deferPastQuietHours(atLocalHour(date, settings.reminderHour, timeZone), timeZone, settings);
}

export function dedupeKey(stepId: string, kind: ReminderKind, userId: string, channel: NotificationChannel, localDay: string): string {
  return `${stepId}:${kind}:${userId}:${channel}:${localDay}`;
}

export const digestDedupeKey = (userId: string, channel: NotificationChannel, localDay: string) => `digest:${userId}:${channel}:${localDay}`;

export const movedDedupeKey = (plantingId: string, userId: string, channel: NotificationChannel, forecastId: string) =>
  `moved:${plantingId}:${userId}:${channel}:${forecastId}`;

/** The channels a person gets: e-mail when on (and an address is known), push when on and a device is registered. */
export function channelsFor(person: Person): NotificationChannel[] {
  const out: NotificationChannel[] = [];
  if (person.settings.emailEnabled && person.email) out.push('email');
  if (person.settings.pushEnabled && person.hasPushDevices) out.push('push');
  return out;
}

/**
 * Who hears about a step: its assignee while they still belong to the property; otherwise the property's
 * owners and managers (the people who hand out the work).
 */
export function recipientsOf(step: Pick<ReminderStep, 'assigneeId' | 'propertyId'>, memberships: Membership[]): string[] {
  const members = memberships.filter((m) => m.propertyId === step.propertyId);
  if (step.assigneeId && members.some((m) => m.userId === step.assigneeId)) return [step.assigneeId];
  return [...new Set(members.filter((m) => m.role === 'owner' || m.role === 'manager').map((m) => m.userId))].sort();
}

function row(o: {
  key: string;
  person: Person;
  channel: NotificationChannel;
  kind: ReminderKind;
  propertyId: string | null;
  stepId: string | null;
  message: NotifyMessage;
  sendAfter: Date;
}): NewNotification {
  const message: StoredMessage = o.channel === 'email' ? { ...o.message, messageId: messageIdFor(o.key) } : o.message;
  return {
    dedupeKey: o.key,
    userId: o.person.userId,
    propertyId: o.propertyId,
    stepId: o.stepId,
    kind: o.kind,
    channel: o.channel,
    message,
    sendAfter: o.sendAfter,
  };
}

const isDue = (sendAfter: Date, now: Date) => sendAfter.getTime() <= now.getTime() && now.getTime() - sendAfter.getTime() < CATCH_UP_MS;

interface Candidate {
  kind: ReminderKind;
  /** The local date the message is about (the step's date), part of the dedupe key. */
  aboutDate: string;
  /** The local date it is sent on, at the person's hour. */
  sendOn: string;
  build: (baseUrl: string) => NotifyMessage;
}

function candidatesFor(step: ReminderStep, siblings: ReminderStep[], today: string, dueReminders: boolean): Candidate[] {
  if (step.status !== 'planned') return [];
  const out: Candidate[] = [];
  const sibling = (kinds: StepKind[]) => siblings.find((s) => kinds.includes(s.kind));
  if (step.kind === 'kill-wait') {
    // The wait counts from the real spray date; without a recorded spraying there is no wait to be over.
    const spray = sibling(['spray']);
    if (!spray || spray.status !== 'done') return [];
    const sprayedOn = spray.doneOn ?? spray.date;
    const next = siblings
      .filter((s) => s.status === 'planned' && s.kind !== 'kill-wait' && s.date >= step.date)
      .sort((a, b) => a.date.localeCompare(b.date))[0];
    out.push({
      kind: 'kill-wait-over',
      aboutDate: step.date,
      sendOn: step.date,
      build: (baseUrl) =>
        killWaitOver({
          baseUrl,
          stepId: step.stepId,
          plotName: step.plotName,
          propertyName: step.propertyName,
          endsOn: step.date,
          sprayedOn,
          waitDays: Math.round((Date.parse(step.date) - Date.parse(sprayedOn)) / 86_400_000),
          next: next ? { title: next.title, date: next.date } : null,
        }),
    });
    return out; // a kill wait is not work to do: no "due" reminders
  }
  if (step.kind === 'check-germination') {
    const seed = sibling(['seed', 'frost-seed']);
    const seededOn = seed && seed.status === 'done' ? (seed.doneOn ?? seed.date) : null;
    out.push({
      kind: 'check-germination',
      aboutDate: step.date,
      sendOn: step.date,
      build: (baseUrl) =>
        checkGermination({ baseUrl, plotId: step.plotId, stepId: step.stepId, plotName: step.plotName, propertyName: step.propertyName, date: step.date, seededOn }),
    });
  } else if (dueReminders) {
    out.push({
      kind: 'due-today',
      aboutDate: step.date,
      sendOn: step.date,
      build: (baseUrl) => stepDue({ baseUrl, when: 'today', ...dueFields(step) }),
    });
  }
  // "Due tomorrow" only while it is still the day before (a late catch-up must not say "tomorrow" on the day).
  if (dueReminders && today < step.date) {
    out.push({
      kind: 'due-tomorrow',
      aboutDate: step.date,
      sendOn: addDays(step.date, -1),
      build: (baseUrl) => stepDue({ baseUrl, when: 'tomorrow', ...dueFields(step) }),
    });
  }
  return out;
}

function dueFields(step: ReminderStep) {
  return {
    stepId: step.stepId,
    stepTitle: step.title,
    plotName: step.plotName,
    propertyName: step.propertyName,
    date: step.date,
    hours: step.hours ?? null,
    carry: step.carry ?? [],
    cautions: step.cautions ?? [],
    reason: step.reason,
    warnings: step.warnings ?? [],
  };
}

/**
 * The reminder rows whose time has come at `now`: kill wait over (on the wait's last day), check germination
 * (on its day), due today and due tomorrow (when the person wants them), and the morning digest (one per person
 * per local date, when wanted). Rows are made only once due, so a step moved in the meantime is told on its
 * new date, never the old one.
 */
export function dueReminders(input: ReminderInput): NewNotification[] {
  const { now, baseUrl } = input;
  const people = new Map(input.people.map((p) => [p.userId, p]));
  const byPlanting = new Map<string, ReminderStep[]>();
  for (const s of input.steps) {
    const list = byPlanting.get(s.plantingId) ?? [];
    list.push(s);
    byPlanting.set(s.plantingId, list);
  }
  const rows: NewNotification[] = [];
  const digestSteps = new Map<string, ReminderStep[]>();

  for (const step of input.steps) {
    const today = localDate(now, step.timeZone);
    // Only steps around today can have a message due (the day before, the day, a deferral into the next).
    if (step.date < addDays(today, -1) || step.date > addDays(today, 1)) continue;
    const siblings = (byPlanting.get(step.plantingId) ?? []).filter((s) => s.stepId !== step.stepId);
    for (const userId of recipientsOf(step, input.memberships)) {
      const person = people.get(userId);
      if (!person) continue;
      if (step.status === 'planned' && step.kind !== 'kill-wait' && person.settings.digest) {
        const list = digestSteps.get(userId) ?? [];
        list.push(step);
        digestSteps.set(userId, list);
      }
      const channels = channelsFor(person);
      if (!channels.length) continue;
      for (const c of candidatesFor(step, siblings, today, person.settings.dueReminders)) {
        const sendAfter = reminderTime(c.sendOn, step.timeZone, person.settings);
        if (!isDue(sendAfter, now)) continue;
        const message = c.build(baseUrl);
        for (const channel of channels) {
          rows.push(
            row({
              key: dedupeKey(step.stepId, c.kind, userId, channel, c.aboutDate),
              person,
              channel,
              kind: c.kind,
              propertyId: step.propertyId,
              stepId: step.stepId,
              message,
              sendAfter,
            }),
          );
        }
      }
    }
  }

  for (const person of input.people) {
    if (!person.settings.digest || !person.homeTimeZone) continue;
    const channels = channelsFor(person);
    if (!channels.length) continue;
    const day = localDate(now, person.homeTimeZone);
    const sendAfter = reminderTime(day, person.homeTimeZone, person.settings);
    if (!isDue(sendAfter, now)) continue;
    // Each step is "today" in its own property's zone.
    const steps = (digestSteps.get(person.userId) ?? [])
      .filter((s) => s.date === localDate(now, s.timeZone))
      .sort((a, b) => a.propertyName.localeCompare(b.propertyName) || a.plotName.localeCompare(b.plotName) || a.title.localeCompare(b.title));
    // An empty digest every morning would teach people to ignore Sowcast's mail.
    if (!steps.length) continue;
    const message = morningDigest({
      baseUrl,
      date: day,
      steps: steps.map((s) => ({ stepId: s.stepId, stepTitle: s.title, plotName: s.plotName, propertyName: s.propertyName, hours: s.hours ?? null })),
    });
    for (const channel of channels) {
      const key = digestDedupeKey(person.userId, channel, day);
      rows.push(row({ key, person, channel, kind: 'digest', propertyId: null, stepId: null, message, sendAfter }));
    }
  }
  return rows;
}

export interface Move {
  stepId: string;
  title: string;
  from: string;
  to: string;
  reason: string;
  assigneeId: string | null;
}

export interface MovedInput {
  now: Date;
  baseUrl: string;
  plantingId: string;
  /** The stored forecast the replan read: one message per person per channel per forecast. */
  forecastId: string;
  propertyId: string;
  propertyName: string;
  plotName: string;
  timeZone: string;
  moves: Move[];
  people: Person[];
  memberships: Membership[];
}

/**
 * The "moved" rows of one replan: one message per person and channel listing every move, for the moved steps'
 * assignees and the property's owners and managers. Sent now, or at the end of quiet hours.
 */
export function movedNotifications(input: MovedInput): NewNotification[] {
  if (!input.moves.length) return [];
  const members = input.memberships.filter((m) => m.propertyId === input.propertyId);
  const memberIds = new Set(members.map((m) => m.userId));
  const recipients = new Set(members.filter((m) => m.role === 'owner' || m.role === 'manager').map((m) => m.userId));
  for (const move of input.moves) if (move.assigneeId && memberIds.has(move.assigneeId)) recipients.add(move.assigneeId);
  const message = stepsMoved({
    baseUrl: input.baseUrl,
    moves: input.moves.map((m) => ({
      stepId: m.stepId,
      stepTitle: m.title,
      plotName: input.plotName,
      propertyName: input.propertyName,
      from: m.from,
      to: m.to,
      reason: m.reason,
    })),
  });
  const rows: NewNotification[] = [];
  const people = new Map(input.people.map((p) => [p.userId, p]));
  for (const userId of [...recipients].sort()) {
    const person = people.get(userId);
    if (!person) continue;
    const sendAfter = deferPastQuietHours(input.now, input.timeZone, person.settings);
    for (const channel of channelsFor(person)) {
      rows.push(
        row({
          key: movedDedupeKey(input.plantingId, userId, channel, input.forecastId),
          person,
          channel,
          kind: 'moved',
          propertyId: input.propertyId,
          stepId: input.moves.length === 1 ? input.moves[0].stepId : null,
          message,
          sendAfter,
        }),
      );
    }
  }
  return rows;
}
