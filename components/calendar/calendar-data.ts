'use client';

import type { CalendarEvent } from '@/lib/planning/calendar-events';
import type { StepKind } from '@/lib/schedule/types';

export type { CalendarEvent };

export interface CalendarFilters {
  property: string;
  plot: string;
  kind: StepKind | '';
  assignee: string;
}

export const NO_FILTERS: CalendarFilters = { property: '', plot: '', kind: '', assignee: '' };

export interface CalendarResponse {
  from: string;
  to: string;
  events: CalendarEvent[];
}

export interface MoveRefusal {
  error: string;
  reasons: string[];
  canConfirm: boolean;
}

/** Every calendar query starts with this, so one invalidation refreshes every range and filter after a move. */
export const CALENDAR_KEY = ['calendar'] as const;

export const calendarKey = (from: string, to: string, filters: CalendarFilters) => [...CALENDAR_KEY, from, to, filters] as const;

export function calendarUrl(from: string, to: string, filters: CalendarFilters): string {
  const params = new URLSearchParams({ from, to });
  for (const [name, value] of Object.entries(filters)) if (value) params.set(name, value);
  return `/api/calendar?${params.toString()}`;
}

/** The browser's local calendar day of a Date FullCalendar hands over (its all-day dates are local midnights). */
export function localDay(date: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`;
}

export function addLocalDays(day: string, days: number): string {
  const [y, m, d] = day.split('-').map(Number);
  return localDay(new Date(y, m - 1, d + days));
}

/** "Tue 8 Dec 2026" from a local date, without shifting it through a time zone. */
export function longDay(day: string): string {
  const [y, m, d] = day.split('-').map(Number);
  return new Date(Date.UTC(y, m - 1, d)).toLocaleDateString('en-US', { timeZone: 'UTC', weekday: 'short', day: 'numeric', month: 'short', year: 'numeric' });
}

/** A refused move: the engine's reasons and whether this person may insist. */
export class MoveRefusedError extends Error {
  constructor(public readonly refusal: MoveRefusal) {
    super(refusal.error);
  }
}

/**
 * POST a move. A 409 carries the reasons and `canConfirm` besides the message, which the shared fetch
 * helper does not keep, so it is read here; every other failure goes through the shared helper's wording.
 */
export async function postMove(stepId: string, date: string, confirm: boolean): Promise<void> {
  const url = `/api/steps/${stepId}/move`;
  const body = confirm ? { date, confirm: true } : { date };
  let response: Response;
  try {
    response = await fetch(url, {
      method: 'POST',
      headers: { Accept: 'application/json', 'Content-Type': 'application/json' },
      body: JSON.stringify(body),
      credentials: 'same-origin',
      cache: 'no-store',
    });
  } catch {
    throw new Error('Sowcast could not be reached. Check your connection; the step was not moved.');
  }
  if (response.ok) return;
  const payload = (await response.json().catch(() => null)) as Partial<MoveRefusal> | null;
  if (response.status === 409) {
    throw new MoveRefusedError({
      error: typeof payload?.error === 'string' ? payload.error : 'That day does not suit this step.',
      reasons: Array.isArray(payload?.reasons) ? payload.reasons.filter((r): r is string => typeof r === 'string') : [],
      canConfirm: payload?.canConfirm === true,
    });
  }
  throw new Error(
    typeof payload?.error === 'string'
      ? payload.error
      : response.status === 401
        ? 'Your session has ended. Sign in again.'
        : `The move failed (HTTP ${response.status}). Nothing was changed.`,
  );
}

/** The step's own name: the API's title leads with the plot, which the calendar shows on its own. */
export const stepName = (event: CalendarEvent) =>
  event.title.startsWith(`${event.plotName} · `) ? event.title.slice(event.plotName.length + 3) : event.title;
