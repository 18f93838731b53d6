'use client';

import { Check, ChevronRight, Pin, Repeat } from 'lucide-react';
import Link from 'next/link';
import { cn } from '@/components/ui/cn';
import { StepKindIcon, STEP_KIND_LOOK, stepKindLabel } from '@/components/steps/step-kind';
import { longDay, stepName, type CalendarEvent } from './calendar-data';

/** The phone's calendar: upcoming steps grouped by day, each a full-width row to tap. */
export function UpcomingList({ events, today, days }: { events: CalendarEvent[]; today: string; days: number }) {
  // Yesterday is fetched for properties still on it; what was finished there is no longer upcoming.
  events = events.filter((e) => e.start >= today || e.status === 'planned');
  if (!events.length) {
    return (
      <p className="rounded-card border border-ground-line bg-ground-raised p-5 text-loam-soft">
        No steps in the next {days} days for the plots you can see{' '}
        — or none that match the filters above.
      </p>
    );
  }
  const byDay = new Map<string, CalendarEvent[]>();
  for (const e of events) byDay.set(e.start, [...(byDay.get(e.start) ?? []), e]);
  return (
    <ol className="space-y-4" aria-label="Upcoming steps">
      {[...byDay.entries()].map(([day, list]) => (
        <li key={day}>
          <h2 className="mb-1.5 text-sm font-semibold tabular-nums text-loam-soft">{longDay(day)}</h2>
          <ul className="space-y-2">
            {list.map((e) => {
              const done = e.status !== 'planned';
              return (
                <li key={e.id}>
                  <Link
                    href={`/steps/${e.stepId}`}
                    className={cn(
                      'flex min-h-14 w-full items-center gap-3 rounded-lg border-l-4 px-3 py-2 text-left text-loam shadow-sm',
                      STEP_KIND_LOOK[e.kind].chip,
                      done && 'opacity-60',
                    )}
                  >
                    {done ? <Check className="size-5 shrink-0 text-clover-dark" aria-label={e.status} /> : <StepKindIcon kind={e.kind} className="size-5" />}
                    <span className="min-w-0 flex-1">
                      <span className={cn('block font-semibold', done && 'line-through')}>
                        {e.plotName} · {stepName(e)}
                      </span>
                      <span className="block text-xs text-loam-soft">
                        {stepKindLabel(e.kind)} · {e.propertyName}
                        {e.assigneeName ? ` · ${e.assigneeName}` : ''}
                      </span>
                    </span>
                    {e.pinned ? <Pin className="size-4 shrink-0 text-loam-soft" aria-label="pinned" /> : null}
                    {e.recurring ? <Repeat className="size-4 shrink-0 text-loam-soft" aria-label="recurring" /> : null}
                    <ChevronRight className="size-4 shrink-0 text-loam-faint" aria-hidden="true" />
                  </Link>
                </li>
              );
            })}
          </ul>
        </li>
      ))}
    </ol>
  );
}
