import type { CalendarStepRow } from '@/lib/data/calendar';
import { expandRecurrence } from '@/lib/schedule/rules/upkeep';
import type { StepKind, StepStatus } from '@/lib/schedule/types';
import { roleAtLeast, type Role } from '@/lib/validations/membership';

/** Who may move a step: managers and owners any step, members only the steps given to them, viewers none. */
export function mayMoveStep(role: Role, assigneeId: string | null, userId: string): boolean {
  if (roleAtLeast(role, 'manager')) return true;
  return role === 'member' && assigneeId === userId;
}

export interface CalendarEvent {
  /** The step id, or `${stepId}:${date}` for one occurrence of a recurring step. */
  id: string;
  stepId: string;
  title: string;
  /** Local date in the property's zone. */
  start: string;
  allDay: true;
  kind: StepKind;
  status: StepStatus;
  pinned: boolean;
  plotId: string;
  plotName: string;
  plantingId: string;
  /** The step's place in its planting's plan, so steps on one day read in the order they are done. */
  order: number;
  propertyId: string;
  propertyName: string;
  timeZone: string;
  assigneeId: string | null;
  assigneeName: string | null;
  /** Whether this person may drag it; a recurring occurrence moves with its rule, never alone. */
  canMove: boolean;
  recurring?: true;
  /** The step's RFC 5545 DTSTART;TZID=…/RRULE text. */
  recurrence?: string;
  /** Local wall-clock start of a recurring occurrence ('HH:mm'). */
  clock?: string;
}

/** Calendar events for the stored steps: one per dated step, one per occurrence of a recurring one. */
export function calendarEvents(rows: CalendarStepRow[], userId: string, from: string, to: string): CalendarEvent[] {
  const events: CalendarEvent[] = [];
  for (const row of rows) {
    const base = {
      stepId: row.step_id,
      title: `${row.plot_name} · ${row.title}`,
      allDay: true as const,
      kind: row.kind,
      status: row.status,
      pinned: row.pinned,
      plotId: row.plot_id,
      plotName: row.plot_name,
      plantingId: row.planting_id,
      order: row.position,
      propertyId: row.property_id,
      propertyName: row.property_name,
      timeZone: row.time_zone,
      assigneeId: row.assignee_id,
      assigneeName: row.assignee_name,
    };
    if (row.recurrence) {
      for (const occurrence of expandRecurrence(row.recurrence, from, to)) {
        events.push({
          ...base,
          id: `${row.step_id}:${occurrence.date}`,
          start: occurrence.date,
          canMove: false,
          recurring: true,
          recurrence: row.recurrence,
          clock: occurrence.clock,
        });
      }
      continue;
    }
    if (row.local_date < from || row.local_date > to) continue;
    events.push({
      ...base,
      id: row.step_id,
      start: row.local_date,
      canMove: row.status === 'planned' && mayMoveStep(row.role, row.assignee_id, userId),
    });
  }
  return events.sort(compareEvents);
}

/** By day; within a day plot by plot, and each planting's steps in plan order (a spray before its seeding). */
export function compareEvents(a: CalendarEvent, b: CalendarEvent): number {
  if (a.start !== b.start) return a.start < b.start ? -1 : 1;
  return a.plotName.localeCompare(b.plotName) || a.plotId.localeCompare(b.plotId) || a.plantingId.localeCompare(b.plantingId) || a.order - b.order;
}
