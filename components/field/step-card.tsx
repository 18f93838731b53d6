'use client';

import { Check, ChevronRight, Clock, CloudUpload, Pin, Repeat, TriangleAlert, User } from 'lucide-react';
import Link from 'next/link';
import type { ReactNode } from 'react';
import { longDay } from '@/components/calendar/calendar-data';
import { StepKindIcon, STEP_KIND_LOOK, stepKindLabel } from '@/components/steps/step-kind';
import { buttonClasses } from '@/components/ui/button';
import { cn } from '@/components/ui/cn';
import type { MyStep } from '@/lib/planning/my-steps';
import type { Caution } from '@/lib/schedule/types';

/** The card's left edge in the kind's colour (class names written out so Tailwind finds them). */
const EDGE: Record<string, string> = {
  'border-ember': 'border-l-ember',
  'border-straw': 'border-l-straw',
  'border-loam-soft': 'border-l-loam-soft',
  'border-clover': 'border-l-clover',
  'border-rain': 'border-l-rain',
  'border-frost': 'border-l-frost',
};

const TOPICS: Record<Caution['topic'], string> = { herbicide: 'herbicide', fire: 'fire', chainsaw: 'saw and brush cutter', fertilizer: 'fertilizer' };

function when(step: MyStep): string {
  if (step.group === 'recorded') return step.status === 'done' ? `Done ${longDay(step.doneOn ?? step.date)}` : 'Skipped';
  if (step.inDays < 0) return `${longDay(step.date)} · ${-step.inDays} ${step.inDays === -1 ? 'day' : 'days'} overdue`;
  if (step.inDays === 0) return 'Today';
  if (step.inDays === 1) return `Tomorrow, ${longDay(step.date)}`;
  return longDay(step.date);
}

/** Cautions in brief on the card: the topics and the first rule of each (the label is the law), all of them one tap away. */
function CautionsSummary({ cautions }: { cautions: Caution[] }) {
  if (!cautions.length) return null;
  const topics = [...new Set(cautions.map((c) => c.topic))];
  return (
    <details className="rounded-lg border border-ground-line border-l-4 border-l-ember bg-ground-raised px-3 py-2 text-sm">
      <summary className="flex min-h-11 cursor-pointer items-center gap-2 font-semibold text-loam">
        <TriangleAlert className="size-5 shrink-0 text-ember" aria-hidden="true" />
        Cautions — {topics.map((t) => TOPICS[t]).join(', ')}
      </summary>
      <ul className="mt-1 list-disc space-y-1 pb-1 pl-5">
        {cautions.map((c, i) => (
          <li key={i}>{c.text}</li>
        ))}
      </ul>
    </details>
  );
}

export function StepCard({
  step,
  queued,
  children,
  onMarkDone,
  formOpen,
}: {
  step: MyStep;
  /** A waiting outcome of this step in the phone's queue. */
  queued: 'waiting' | 'refused' | null;
  children?: ReactNode;
  onMarkDone: () => void;
  formOpen: boolean;
}) {
  const look = STEP_KIND_LOOK[step.kind];
  const headingId = `step-${step.id}`;
  const firstCaution = step.cautions[0];
  return (
    <article aria-labelledby={headingId} className={cn('rounded-card border border-ground-line border-l-8 bg-ground-raised p-4 shadow-sm', EDGE[look.chip.split(' ')[0]])} data-step-id={step.stepId}>
      <div className="flex items-start gap-3">
        <span className={cn('mt-0.5 flex size-11 shrink-0 items-center justify-center rounded-lg', look.chip.split(' ').slice(1).join(' '))}>
          <StepKindIcon kind={step.kind} className="size-6" />
        </span>
        <div className="min-w-0 flex-1">
          <h3 id={headingId} className="text-lg font-bold leading-snug text-loam">
            {step.title}
          </h3>
          <p className="text-base font-semibold text-loam">
            {step.plotName} <span className="font-normal text-loam-soft">· {step.propertyName}</span>
          </p>
          <p className={cn('mt-0.5 flex flex-wrap items-center gap-x-2 text-sm tabular-nums', step.inDays < 0 && step.group === 'overdue' ? 'font-semibold text-ember' : 'text-loam')}>
            <span>{when(step)}</span>
            {step.hours ? (
              <span className="inline-flex items-center gap-1 text-loam-soft">
                <Clock className="size-4" aria-hidden="true" /> best {step.hours.start}–{step.hours.end}
              </span>
            ) : null}
            {step.clock ? <span className="text-loam-soft">at {step.clock}</span> : null}
            {step.pinned ? <Pin className="size-4 text-loam-soft" aria-label="date pinned" /> : null}
            {step.recurring ? <Repeat className="size-4 text-loam-soft" aria-label="recurring" /> : null}
          </p>
          <p className="mt-0.5 flex items-center gap-1 text-sm text-loam-soft">
            <User className="size-4" aria-hidden="true" />
            {stepKindLabel(step.kind)} · {step.assigneeName ? `for ${step.assigneeName}` : 'not assigned yet — anyone may do it'}
          </p>
        </div>
      </div>

      {step.quantities.length ? (
        <div className="mt-3">
          <h4 className="text-sm font-semibold text-loam">What to carry</h4>
          <ul className="mt-1 space-y-0.5 text-base text-loam">
            {step.quantities.map((q, i) => (
              <li key={i} className="tabular-nums">
                {q.detail}
              </li>
            ))}
          </ul>
        </div>
      ) : null}

      {firstCaution ? (
        <div className="mt-3 space-y-1">
          <p className="text-sm text-loam">{firstCaution.text}</p>
          <CautionsSummary cautions={step.cautions} />
        </div>
      ) : null}

      {step.warnings.length ? (
        <ul className="mt-2 space-y-1 text-sm font-medium text-ember">
          {step.warnings.map((w, i) => (
            <li key={i}>{w}</li>
          ))}
        </ul>
      ) : null}

      {step.group === 'recorded' ? (
        <p className="mt-3 text-sm text-loam">
          {step.status === 'done' ? 'Done' : 'Skipped'}
          {step.doneBy ? ` by ${step.doneBy}` : ''}
          {step.doneAt ? ` at ${new Date(step.doneAt).toLocaleTimeString('en-US', { hour: 'numeric', minute: '2-digit', timeZone: step.timeZone })}` : ''}
          {recordLine(step.record)}
          {step.notes ? ` — “${step.notes}”` : ''}
        </p>
      ) : null}

      {children}

      <div className="mt-4 flex flex-wrap items-center justify-end gap-2">
        <Link href={`/steps/${step.stepId}`} className={buttonClasses('secondary', 'md', 'min-h-12')}>
          Open step
          <ChevronRight className="size-5" aria-hidden="true" />
        </Link>
        {queued ? (
          <span
            role="status"
            className={cn(
              'inline-flex min-h-12 items-center gap-2 rounded-lg border px-4 font-semibold',
              queued === 'waiting' ? 'border-straw bg-straw-light text-loam' : 'border-ember bg-ember-light text-loam',
            )}
          >
            <CloudUpload className="size-5" aria-hidden="true" />
            {queued === 'waiting' ? 'Waiting to send (offline)' : 'Not saved — see above'}
          </span>
        ) : step.canComplete && !formOpen ? (
          <button type="button" onClick={onMarkDone} className={buttonClasses('primary', 'md', 'min-h-12 px-6 text-lg')}>
            <Check className="size-5" aria-hidden="true" />
            Mark done
          </button>
        ) : null}
      </div>
      {step.recurring ? <p className="mt-2 text-right text-xs text-loam-soft">Recurring upkeep: nothing to mark for one visit.</p> : null}
    </article>
  );
}

function recordLine(record: unknown): string {
  const r = record as { seedLb?: number } | null;
  return r && typeof r.seedLb === 'number' ? ` · ${r.seedLb} lb of seed broadcast` : '';
}
