'use client';

import { useQuery } from '@tanstack/react-query';
import { ArrowRight, CloudOff, Pin, Repeat, Search } from 'lucide-react';
import Link from 'next/link';
import { useEffect, type ReactNode } from 'react';
import { Card, CardHeader } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { StepKindIcon, STEP_KIND_LOOK, stepKindLabel } from '@/components/steps/step-kind';
import { cn } from '@/components/ui/cn';
import { longDay, stepName } from '@/components/calendar/calendar-data';
import { apiFetch, errorMessage } from '@/lib/client/api';
import type { Dashboard } from '@/lib/data/dashboard';
import type { CalendarEvent } from '@/lib/planning/calendar-events';

const when = (instant: string) =>
  new Date(instant).toLocaleString('en-US', { weekday: 'short', day: 'numeric', month: 'short', hour: 'numeric', minute: '2-digit' });

export function DashboardView() {
  // Once the overview is shown, the visit is marked (an explicit POST: reading the dashboard changes
  // nothing). Asking again on every focus would then empty "moved since your last visit" while the person
  // is still reading it.
  const query = useQuery({
    queryKey: ['dashboard'],
    queryFn: () => apiFetch<Dashboard>('/api/dashboard'),
    staleTime: Infinity,
    refetchOnWindowFocus: false,
  });
  const shownAsOf = query.data?.asOf;
  useEffect(() => {
    if (!shownAsOf) return;
    // Failing to mark a visit only means the same moves are listed once more next time.
    apiFetch('/api/dashboard/visit', { method: 'POST', body: { seenAt: shownAsOf } }).catch(() => undefined);
  }, [shownAsOf]);
  if (query.isPending) return <LoadingBlock label="Loading your steps" rows={4} />;
  if (query.isError) {
    return (
      <Notice tone="error" title="Your overview could not be loaded">
        {errorMessage(query.error)}{' '}
        <button type="button" className="font-semibold text-rain underline" onClick={() => query.refetch()}>
          Try again
        </button>
      </Notice>
    );
  }
  const d = query.data;
  return (
    <div className="grid gap-5 lg:grid-cols-2">
      <Section title="Today" description="Steps given to you, and unassigned steps on properties you manage.">
        <StepList events={d.today} empty="Nothing to do today. Enjoy the quiet." />
        <Link href="/my-steps" className="mt-3 inline-flex min-h-12 items-center gap-2 font-semibold text-rain underline-offset-2 hover:underline">
          Open My steps — mark work done in the field, offline too <ArrowRight className="size-4" aria-hidden="true" />
        </Link>
      </Section>
      <Section title="This week" description="The six days after today.">
        <StepList events={d.thisWeek} empty="No steps for you in the rest of the week." showDate />
      </Section>
      <Section
        title="Moved since your last visit"
        description={d.firstVisit ? `First visit: moves of the last two weeks (since ${when(d.since)}).` : `Since ${when(d.since)}.`}
      >
        {d.moves.length ? (
          <ul className="space-y-3">
            {d.moves.map((m) => (
              <li key={m.id} className={cn('rounded-lg border-l-4 px-3 py-2', STEP_KIND_LOOK[m.kind].chip)}>
                <p className="flex items-center gap-2 font-semibold text-loam">
                  <StepKindIcon kind={m.kind} />
                  {m.plotName} · {m.stepTitle}
                </p>
                <p className="mt-0.5 flex flex-wrap items-center gap-1 text-sm tabular-nums">
                  {longDay(m.fromDate)} <ArrowRight className="size-3.5" aria-label="to" /> {longDay(m.toDate)}
                </p>
                <p className="mt-1 text-sm text-loam">{m.reason}</p>
                <p className="mt-0.5 text-xs text-loam-soft">
                  {m.movedBy ? `Moved by ${m.movedBy}` : 'Moved by the plan'} · {when(m.movedAt)} · {m.propertyName}
                </p>
              </li>
            ))}
          </ul>
        ) : (
          <Empty>No step has moved since then.</Empty>
        )}
      </Section>
      <Section title="Germination checks due" description="Plots where it is time to walk and look for seedlings.">
        {d.germination.length ? (
          <ul className="space-y-2">
            {d.germination.map((g) => (
              <li key={g.stepId}>
                <Link href={`/plots/${g.plotId}`} className="flex min-h-12 items-center gap-3 rounded-lg border border-ground-line px-3 py-2 hover:bg-white">
                  <Search className="size-5 shrink-0 text-clover-dark" aria-hidden="true" />
                  <span className="min-w-0 flex-1">
                    <span className="block font-semibold">{g.plotName}</span>
                    <span className="block text-xs text-loam-soft">
                      {g.propertyName} · {g.daysLate === 0 ? 'due today' : `due since ${longDay(g.date)} (${g.daysLate} ${g.daysLate === 1 ? 'day' : 'days'})`}
                    </span>
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        ) : (
          <Empty>No germination check is due.</Empty>
        )}
      </Section>
      <Section title="Forecasts" description="Sowcast keeps the last good forecast when a refresh fails.">
        {d.staleForecasts.length ? (
          <ul className="space-y-2">
            {d.staleForecasts.map((f) => (
              <li key={f.propertyId} className="flex gap-3 rounded-lg border-l-4 border-frost bg-frost-light px-3 py-2">
                <CloudOff className="mt-0.5 size-5 shrink-0 text-[#4f6b80]" aria-hidden="true" />
                <div className="text-sm">
                  <Link href={`/properties/${f.propertyId}`} className="font-semibold text-loam underline-offset-2 hover:underline">
                    {f.propertyName}
                  </Link>
                  <p>
                    The forecast could not be refreshed since {when(f.failingSince)}.{' '}
                    {f.lastSuccessAt ? `Plans use the one from ${when(f.lastSuccessAt)}.` : 'No forecast has arrived yet.'}
                  </p>
                </div>
              </li>
            ))}
          </ul>
        ) : (
          <Empty>Every forecast is up to date.</Empty>
        )}
      </Section>
      <Card className="flex flex-col justify-center gap-2">
        <p className="text-loam-soft">The whole season, every plot:</p>
        <Link href="/calendar" className="inline-flex min-h-11 items-center gap-2 font-semibold text-rain underline-offset-2 hover:underline">
          Open the season calendar <ArrowRight className="size-4" aria-hidden="true" />
        </Link>
      </Card>
    </div>
  );
}

function Section({ title, description, children }: { title: string; description?: ReactNode; children: ReactNode }) {
  return (
    <Card>
      <CardHeader title={title} description={description} />
      {children}
    </Card>
  );
}

function Empty({ children }: { children: ReactNode }) {
  return <p className="text-loam-soft">{children}</p>;
}

function StepList({ events, empty, showDate }: { events: CalendarEvent[]; empty: string; showDate?: boolean }) {
  if (!events.length) return <Empty>{empty}</Empty>;
  return (
    <ul className="space-y-2">
      {events.map((e) => (
        <li key={e.id}>
          <Link
            href={`/steps/${e.stepId}`}
            className={cn('flex min-h-12 items-center gap-3 rounded-lg border-l-4 px-3 py-2 text-loam hover:brightness-[1.02]', STEP_KIND_LOOK[e.kind].chip)}
          >
            <StepKindIcon kind={e.kind} className="size-5" />
            <span className="min-w-0 flex-1">
              <span className="block font-semibold">
                {e.plotName} · {stepName(e)}
              </span>
              <span className="block text-xs text-loam-soft">
                {showDate ? `${longDay(e.start)} · ` : ''}
                {stepKindLabel(e.kind)} · {e.propertyName} · {e.assigneeName ?? 'not assigned yet'}
              </span>
            </span>
            {e.pinned ? <Pin className="size-4 shrink-0 text-loam-soft" aria-label="pinned" /> : null}
            {e.recurring ? <Repeat className="size-4 shrink-0 text-loam-soft" aria-label="recurring" /> : null}
          </Link>
        </li>
      ))}
    </ul>
  );
}
