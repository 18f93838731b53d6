'use client';

import Link from 'next/link';
import { CalendarDays, CircleCheck, History, Pin, Repeat, SkipForward, User } from 'lucide-react';
import { Notice } from '@/components/ui/notice';
import { formatLocalDate } from '@/lib/client/format';
import type { StepDto } from '@/lib/data/plantings';
import type { PlanStep } from '@/lib/schedule/types';
import { CautionsBlock } from './cautions-block';
import { StepControls, type AssignableMember } from './step-controls';
import { StepKindBadge } from './step-kind-style';

type ShownStep = PlanStep & Partial<Pick<StepDto, 'id' | 'assigneeId'>>;

function isSaved(step: ShownStep): step is StepDto {
  return typeof step.id === 'string';
}

// The engine's reasons are clauses ("1 day before seeding; …"); shown alone they read as a sentence.
const sentence = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

function windowText(step: PlanStep): string | null {
  if (!step.window) return null;
  if (step.window.earliest === step.window.latest) return null;
  return `Can go from ${formatLocalDate(step.window.earliest)} to ${formatLocalDate(step.window.latest)}`;
}

/**
 * A plan's steps in order, each with when, why it sits there and what to carry, and the cautions where the
 * work can hurt someone. The same rendering serves a preview (no ids, no controls) and a saved planting.
 */
export function PlanSteps({
  steps,
  warnings,
  plotId,
  members = [],
  canManage = false,
  canWork = false,
  today,
  linkToSteps = true,
}: {
  linkToSteps?: boolean;
  steps: ShownStep[];
  warnings: string[];
  plotId: string;
  members?: AssignableMember[];
  canManage?: boolean;
  canWork?: boolean;
  today: string;
}) {
  const names = new Map(members.map((m) => [m.userId, m.name]));
  return (
    <div className="space-y-4">
      {warnings.length ? (
        <Notice tone="caution" title="About this plan">
          <ul className="list-disc space-y-1 pl-5">
            {warnings.map((w, i) => (
              <li key={i}>{w}</li>
            ))}
          </ul>
        </Notice>
      ) : null}
      <ol className="space-y-3" aria-label="Steps in order">
        {steps.map((step, index) => {
          const window = windowText(step);
          const assignee = step.assigneeId ? (names.get(step.assigneeId) ?? 'A former member') : null;
          return (
            <li
              key={step.id ?? step.key}
              data-step-kind={step.kind}
              className="rounded-lg border border-ground-line bg-white/60 p-4"
            >
              <div className="flex flex-wrap items-start justify-between gap-2">
                <div className="min-w-0 space-y-1">
                  <div className="flex flex-wrap items-center gap-2">
                    <span className="tabular text-sm font-semibold text-loam-soft">{index + 1}.</span>
                    <StepKindBadge kind={step.kind} />
                    {step.status === 'done' ? (
                      <span className="inline-flex items-center gap-1 text-xs font-semibold text-clover">
                        <CircleCheck className="size-3.5" aria-hidden="true" /> Done{step.doneOn ? ` ${formatLocalDate(step.doneOn)}` : ''}
                      </span>
                    ) : step.status === 'skipped' ? (
                      <span className="inline-flex items-center gap-1 text-xs font-semibold text-loam-soft">
                        <SkipForward className="size-3.5" aria-hidden="true" /> Skipped
                      </span>
                    ) : null}
                    {step.pinned ? (
                      <span className="inline-flex items-center gap-1 text-xs font-semibold text-rain">
                        <Pin className="size-3.5" aria-hidden="true" /> Pinned
                      </span>
                    ) : null}
                  </div>
                  <h3 className="text-base font-semibold text-loam">{step.title}</h3>
                </div>
                <div className="text-right text-sm">
                  <p className="tabular inline-flex items-center gap-1.5 font-semibold text-loam">
                    <CalendarDays className="size-4 text-loam-soft" aria-hidden="true" />
                    {formatLocalDate(step.date)}
                  </p>
                  {step.hours ? (
                    <p className="tabular text-loam-soft">
                      Best {step.hours.start}–{step.hours.end}
                    </p>
                  ) : null}
                </div>
              </div>

              <dl className="mt-3 grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[max-content_1fr]">
                {window ? (
                  <>
                    <dt className="font-semibold text-loam-soft">Window</dt>
                    <dd className="tabular">{window}</dd>
                  </>
                ) : null}
                {isSaved(step) ? (
                  <>
                    <dt className="font-semibold text-loam-soft">Who</dt>
                    <dd className="inline-flex items-center gap-1.5">
                      <User className="size-4 text-loam-soft" aria-hidden="true" />
                      {assignee ?? 'Nobody assigned yet'}
                    </dd>
                  </>
                ) : null}
                <dt className="font-semibold text-loam-soft">Why it sits here</dt>
                <dd>{sentence(step.reason)}</dd>
                {step.quantities.length ? (
                  <>
                    <dt className="font-semibold text-loam-soft">What to carry</dt>
                    <dd>
                      <ul className="tabular list-disc space-y-0.5 pl-5">
                        {step.quantities.map((q, i) => (
                          <li key={i}>{q.detail}</li>
                        ))}
                      </ul>
                    </dd>
                  </>
                ) : null}
                {step.recurrence ? (
                  <>
                    <dt className="font-semibold text-loam-soft">Repeats</dt>
                    <dd className="inline-flex items-center gap-1.5">
                      <Repeat className="size-4 text-loam-soft" aria-hidden="true" />
                      Through the season, from this date
                    </dd>
                  </>
                ) : null}
              </dl>

              {step.warnings.length ? (
                <ul className="mt-3 space-y-1 text-sm text-loam">
                  {step.warnings.map((w, i) => (
                    <li key={i} className="rounded-md bg-straw-light px-3 py-1.5">
                      {w}
                    </li>
                  ))}
                </ul>
              ) : null}

              {step.cautions.length ? (
                <div className="mt-3">
                  <CautionsBlock cautions={step.cautions} />
                </div>
              ) : null}

              {isSaved(step) && linkToSteps ? (
                <div className="mt-3 space-y-3">
                  <Link href={`/steps/${step.id}`} className="inline-flex min-h-10 items-center gap-1.5 text-sm font-medium text-rain hover:underline">
                    <History className="size-4" aria-hidden="true" />
                    Open the step and its history of moves
                  </Link>
                  {step.kind === 'check-germination' && canWork ? <Link href={`/plots/${plotId}/check?step=${step.id}`} className="ml-4 inline-flex min-h-10 items-center text-sm font-medium text-rain hover:underline">Record the germination check</Link> : null}
                  <StepControls step={step} plotId={plotId} members={members} canManage={canManage} canWork={canWork} today={today} />
                </div>
              ) : null}
            </li>
          );
        })}
      </ol>
    </div>
  );
}
