'use client';

import FullCalendar from '@fullcalendar/react';
import dayGridPlugin from '@fullcalendar/daygrid';
import interactionPlugin from '@fullcalendar/interaction';
import type { DatesSetArg, EventContentArg, EventDropArg, EventInput } from '@fullcalendar/core';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Check, Pin, Repeat } from 'lucide-react';
import { useMemo, useState, useSyncExternalStore, type CSSProperties } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Select } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { cn } from '@/components/ui/cn';
import { STEP_KIND_LOOK, STEP_KIND_ORDER, StepKindIcon, StepKindLegend, stepKindLabel } from '@/components/steps/step-kind';
import { apiFetch, errorMessage } from '@/lib/client/api';
import type { StepKind } from '@/lib/schedule/types';
import {
  addLocalDays, CALENDAR_KEY, calendarKey, calendarUrl, localDay, longDay, MoveRefusedError, NO_FILTERS, postMove, stepName,
  type CalendarEvent, type CalendarFilters, type CalendarResponse, type MoveRefusal,
} from './calendar-data';
import { UpcomingList } from './upcoming-list';

/** Tailwind's `sm` breakpoint: below it the month grid's cells are too small to read or tap. */
const NARROW = '(max-width: 639.98px)';
/** How far ahead the phone list looks. Common practice, no source: about two months covers a season's next steps. */
const LIST_DAYS = 60;

function useNarrow(): boolean {
  return useSyncExternalStore(
    (notify) => {
      const query = window.matchMedia(NARROW);
      query.addEventListener('change', notify);
      return () => query.removeEventListener('change', notify);
    },
    () => window.matchMedia(NARROW).matches,
    () => false,
  );
}


// FullCalendar reads its look from CSS variables; setting them here keeps its buttons and today cell in Sowcast's palette.
const FULLCALENDAR_THEME = {
  '--fc-button-bg-color': '#fffdf8',
  '--fc-button-border-color': '#e4ddcc',
  '--fc-button-text-color': '#4a3b2f',
  '--fc-button-hover-bg-color': '#e3efdf',
  '--fc-button-hover-border-color': '#a39484',
  '--fc-button-active-bg-color': '#e3efdf',
  '--fc-button-active-border-color': '#3d7a3a',
  '--fc-today-bg-color': '#f6ecd2',
  '--fc-border-color': '#e4ddcc',
  '--fc-page-bg-color': '#fffdf8',
  '--fc-neutral-bg-color': '#f7f4ec',
} as CSSProperties;

/**
 * A day's events plot by plot, each planting's steps in plan order (the spray above its seeding), as the
 * route sorts them (compareEvents in lib/planning/calendar-events.ts) — not FullCalendar's default, by title.
 */
const EVENT_ORDER = 'start,plotName,plotId,plantingId,order';

interface PendingMove {
  event: CalendarEvent;
  date: string;
  refusal: MoveRefusal;
}

export function SeasonCalendar({ todayHint }: { todayHint?: string }) {
  const narrow = useNarrow();
  const queryClient = useQueryClient();
  const [range, setRange] = useState<{ from: string; to: string } | null>(null);
  const [filters, setFilters] = useState<CalendarFilters>(NO_FILTERS);
  const [pending, setPending] = useState<PendingMove | null>(null);
  const [moveError, setMoveError] = useState<string | null>(null);
  const [moved, setMoved] = useState<string | null>(null);

  const today = todayHint ?? localDay(new Date());
  // From yesterday: a property west of this browser may still be on yesterday's date.
  const listRange = { from: addLocalDays(today, -1), to: addLocalDays(today, LIST_DAYS) };
  const shown = narrow ? listRange : range;

  const eventsQuery = useQuery({
    queryKey: shown ? calendarKey(shown.from, shown.to, filters) : [...CALENDAR_KEY, 'waiting'],
    queryFn: () => apiFetch<CalendarResponse>(calendarUrl(shown!.from, shown!.to, filters)),
    enabled: shown !== null,
    placeholderData: (previous) => previous,
  });
  // The choices in the filters come from the whole range, so narrowing one filter never hides the way back.
  const optionsQuery = useQuery({
    queryKey: shown ? calendarKey(shown.from, shown.to, NO_FILTERS) : [...CALENDAR_KEY, 'waiting'],
    queryFn: () => apiFetch<CalendarResponse>(calendarUrl(shown!.from, shown!.to, NO_FILTERS)),
    enabled: shown !== null,
    placeholderData: (previous) => previous,
  });
  const events = useMemo(() => eventsQuery.data?.events ?? [], [eventsQuery.data]);

  const options = useMemo(() => {
    const all = optionsQuery.data?.events ?? [];
    const properties = new Map<string, string>();
    const plots = new Map<string, { name: string; propertyId: string }>();
    const assignees = new Map<string, string>();
    for (const e of all) {
      properties.set(e.propertyId, e.propertyName);
      plots.set(e.plotId, { name: e.plotName, propertyId: e.propertyId });
      if (e.assigneeId) assignees.set(e.assigneeId, e.assigneeName ?? 'Someone');
    }
    // A chosen value stays listed even when the new range has none of it, so the select never lies.
    for (const e of events) {
      properties.set(e.propertyId, e.propertyName);
      plots.set(e.plotId, { name: e.plotName, propertyId: e.propertyId });
      if (e.assigneeId) assignees.set(e.assigneeId, e.assigneeName ?? 'Someone');
    }
    const byName = <T,>(entries: [string, T][], name: (v: T) => string) => entries.sort((a, b) => name(a[1]).localeCompare(name(b[1])));
    return {
      properties: byName([...properties.entries()], (n) => n),
      plots: byName([...plots.entries()], (p) => p.name).filter(([, p]) => !filters.property || p.propertyId === filters.property),
      assignees: byName([...assignees.entries()], (n) => n),
    };
  }, [optionsQuery.data, events, filters.property]);

  const move = useMutation({
    mutationFn: (o: { event: CalendarEvent; date: string; confirm?: boolean }) => postMove(o.event.stepId, o.date, o.confirm === true),
    onMutate: async ({ event, date }) => {
      setMoveError(null);
      setMoved(null);
      await queryClient.cancelQueries({ queryKey: CALENDAR_KEY });
      const snapshot = queryClient.getQueriesData<CalendarResponse>({ queryKey: CALENDAR_KEY });
      queryClient.setQueriesData<CalendarResponse>({ queryKey: CALENDAR_KEY }, (data) =>
        data ? { ...data, events: data.events.map((e) => (e.id === event.id ? { ...e, start: date, pinned: true } : e)) } : data,
      );
      return { snapshot };
    },
    onError: (error, { event, date }, context) => {
      for (const [key, data] of context?.snapshot ?? []) queryClient.setQueryData(key, data);
      if (error instanceof MoveRefusedError) {
        setPending({ event, date, refusal: error.refusal });
      } else {
        setPending(null);
        setMoveError(errorMessage(error));
      }
    },
    onSuccess: (_data, { event, date }) => {
      setPending(null);
      setMoved(`${event.plotName} · ${stepName(event)} now sits on ${longDay(date)}, pinned there.`);
    },
    onSettled: () => queryClient.invalidateQueries({ queryKey: CALENDAR_KEY }),
  });

  const inputs: EventInput[] = useMemo(
    () =>
      events.map((e) => ({
        id: e.id,
        title: `${e.plotName} · ${stepName(e)}`,
        start: e.start,
        allDay: true,
        editable: e.canMove && !e.recurring && e.status === 'planned',
        classNames: ['sowcast-event', `sowcast-kind-${e.kind}`, e.status !== 'planned' ? 'sowcast-finished' : ''],
        // A real link: a tap opens the step's page, and it opens in a new tab like any link.
        url: `/steps/${e.stepId}`,
        // Read by EVENT_ORDER: FullCalendar sorts a day's events by fields of extendedProps.
        extendedProps: { step: e, plotName: e.plotName, plotId: e.plotId, plantingId: e.plantingId, order: e.order },
      })),
    [events],
  );

  const onDatesSet = (info: DatesSetArg) => {
    const from = localDay(info.start);
    const to = addLocalDays(localDay(info.end), -1); // FullCalendar's end is exclusive
    setRange((r) => (r && r.from === from && r.to === to ? r : { from, to }));
  };

  const onDrop = (info: EventDropArg) => {
    const step = info.event.extendedProps.step as CalendarEvent;
    const date = localDay(info.event.start!);
    // The cache is the calendar's source; put the event back and let the optimistic update place it.
    info.revert();
    if (date === step.start) return;
    move.mutate({ event: step, date });
  };

  const setFilter = (name: keyof CalendarFilters, value: string) =>
    setFilters((f) => ({ ...f, [name]: value, ...(name === 'property' ? { plot: '' } : {}) }));

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <Field label="Property" htmlFor="filter-property" className="min-w-40 flex-1">
          <Select id="filter-property" value={filters.property} onChange={(e) => setFilter('property', e.target.value)}>
            <option value="">All properties</option>
            {options.properties.map(([id, name]) => (
              <option key={id} value={id}>{name}</option>
            ))}
          </Select>
        </Field>
        <Field label="Plot" htmlFor="filter-plot" className="min-w-40 flex-1">
          <Select id="filter-plot" value={filters.plot} onChange={(e) => setFilter('plot', e.target.value)}>
            <option value="">All plots</option>
            {options.plots.map(([id, plot]) => (
              <option key={id} value={id}>{plot.name}</option>
            ))}
          </Select>
        </Field>
        <Field label="Step kind" htmlFor="filter-kind" className="min-w-40 flex-1">
          <Select id="filter-kind" value={filters.kind} onChange={(e) => setFilter('kind', e.target.value as StepKind | '')}>
            <option value="">All kinds</option>
            {STEP_KIND_ORDER.map((kind) => (
              <option key={kind} value={kind}>{stepKindLabel(kind)}</option>
            ))}
          </Select>
        </Field>
        <Field label="Assignee" htmlFor="filter-assignee" className="min-w-40 flex-1">
          <Select id="filter-assignee" value={filters.assignee} onChange={(e) => setFilter('assignee', e.target.value)}>
            <option value="">Anyone</option>
            {options.assignees.map(([id, name]) => (
              <option key={id} value={id}>{name}</option>
            ))}
          </Select>
        </Field>
      </div>

      <StepKindLegend />

      {pending ? (
        <MoveRefusalBlock
          pending={pending}
          busy={move.isPending}
          onConfirm={() => move.mutate({ event: pending.event, date: pending.date, confirm: true })}
          onDismiss={() => setPending(null)}
        />
      ) : null}
      {moveError ? <Notice tone="error" title="The step was not moved">{moveError}</Notice> : null}
      {moved ? <Notice tone="success">{moved}</Notice> : null}
      {eventsQuery.isError ? (
        <Notice tone="error" title="The calendar could not be loaded">
          {errorMessage(eventsQuery.error)}{' '}
          <button type="button" className="font-semibold text-rain underline" onClick={() => eventsQuery.refetch()}>
            Try again
          </button>
        </Notice>
      ) : null}
      <p role="status" aria-live="polite" className={cn('text-sm text-loam-soft', eventsQuery.isFetching ? '' : 'sr-only')}>
        {eventsQuery.isFetching ? 'Loading steps…' : `${events.length} steps shown`}
      </p>

      <div>
        <div className="min-w-0">
          {narrow ? (
            eventsQuery.isPending ? (
              <LoadingBlock label="Loading upcoming steps" />
            ) : (
              <UpcomingList events={events} today={today} days={LIST_DAYS} />
            )
          ) : (
            <div className="rounded-card border border-ground-line bg-ground-raised p-3 shadow-sm" style={FULLCALENDAR_THEME}>
              <FullCalendar
                plugins={[dayGridPlugin, interactionPlugin]}
                initialView="dayGridMonth"
                headerToolbar={{ left: 'prev,next today', center: 'title', right: 'dayGridMonth,dayGridWeek' }}
                buttonText={{ today: 'Today', month: 'Month', week: 'Week' }}
                firstDay={1}
                height="auto"
                dayMaxEvents={4}
                eventStartEditable
                eventDurationEditable={false}
                editable={false}
                eventOrder={EVENT_ORDER}
                eventColor="transparent"
                eventTextColor="#4a3b2f"
                events={inputs}
                datesSet={onDatesSet}
                eventDrop={onDrop}
                eventContent={(arg: EventContentArg) => <EventChip step={arg.event.extendedProps.step as CalendarEvent} />}
              />
            </div>
          )}
        </div>
      </div>
    </div>
  );
}

function EventChip({ step }: { step: CalendarEvent }) {
  const done = step.status !== 'planned';
  const look = STEP_KIND_LOOK[step.kind];
  return (
    <span
      className={cn('flex w-full min-w-0 items-start gap-1 whitespace-normal rounded border-l-4 px-1 py-0.5 text-xs leading-tight text-loam', look.chip, done && 'opacity-60')}
      title={`${step.plotName} · ${stepName(step)}${done ? ` (${step.status})` : ''}`}
    >
      {done ? <Check className="mt-px size-3.5 shrink-0 text-clover-dark" aria-label={step.status} /> : <StepKindIcon kind={step.kind} className="mt-px size-3.5" />}
      <span className={cn('min-w-0 flex-1 break-words', done && 'line-through')}>
        <span className="block font-semibold">{step.plotName}</span>
        <span className="block">{stepName(step)}</span>
      </span>
      {step.pinned ? <Pin className="size-3 shrink-0 text-loam-soft" aria-label="pinned" /> : null}
      {step.recurring ? <Repeat className="size-3 shrink-0 text-loam-soft" aria-label="recurring" /> : null}
    </span>
  );
}

function MoveRefusalBlock({ pending, busy, onConfirm, onDismiss }: { pending: PendingMove; busy: boolean; onConfirm: () => void; onDismiss: () => void }) {
  const { event, date, refusal } = pending;
  return (
    <div role="status" className="rounded-lg border-l-4 border-ember bg-ground-raised px-4 py-3 text-sm text-loam shadow-sm">
      <p className="font-semibold">
        {event.plotName} · {stepName(event)} stays on {longDay(event.start)}: {longDay(date)} is a poor day for it.
      </p>
      {refusal.reasons.length ? (
        <ul className="mt-2 list-disc space-y-1 pl-5">
          {refusal.reasons.map((reason) => (
            <li key={reason}>{reason}</li>
          ))}
        </ul>
      ) : (
        <p className="mt-1">{refusal.error}</p>
      )}
      <div className="mt-3 flex flex-wrap gap-2">
        {refusal.canConfirm ? (
          <Button variant="danger-outline" size="sm" pending={busy} onClick={onConfirm}>
            Move anyway
          </Button>
        ) : (
          <p className="self-center text-loam-soft">Only a manager or owner can move it there anyway.</p>
        )}
        <Button variant="quiet" size="sm" onClick={onDismiss}>
          Keep the planned day
        </Button>
      </div>
    </div>
  );
}
