import type { Metadata } from 'next';
import { ArrowRight, Bot, User } from 'lucide-react';
import Link from 'next/link';
import { notFound, redirect } from 'next/navigation';
import { PlanSteps } from '@/components/planner/plan-steps';
import { Card, CardHeader } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { requireUser } from '@/lib/auth/session';
import { now } from '@/lib/clock';
import { formatInstantDate, formatLocalDate } from '@/lib/client/format';
import { signInPath } from '@/lib/client/navigation';
import { toStepDto } from '@/lib/data/plantings';
import { getStepDetail, listStepMovesWithPeople } from '@/lib/data/steps';
import { HttpError } from '@/lib/http';
import { localDateOf } from '@/lib/schedule/local-dates';
import { uuid } from '@/lib/validations/common';
import { METHOD_LABELS } from '@/lib/validations/planting';
import { plotAccess } from '../../_lib/access';

type Params = Promise<{ stepId: string }>;

async function loadStep(stepId: string) {
  const path = `/steps/${stepId}`;
  // Signed-out visitors go to sign-in first, so whether a step exists is told only to its property's people.
  try {
    await requireUser();
  } catch (error) {
    if (error instanceof HttpError && error.status === 401) redirect(signInPath(path));
    throw error;
  }
  if (!uuid.safeParse(stepId).success) notFound();
  const step = await getStepDetail(stepId);
  if (!step) notFound();
  const access = await plotAccess(step.plot_id, 'viewer', path);
  if (!access.ok) notFound();
  return { step, role: access.access.role };
}

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { stepId } = await params;
  const { step } = await loadStep(stepId);
  return { title: `${step.title} — ${step.plot_name}` };
}

export default async function StepPage({ params }: { params: Params }) {
  const { stepId } = await params;
  const { step } = await loadStep(stepId);
  const moves = await listStepMovesWithPeople(stepId);
  const dto = toStepDto(step);
  const today = localDateOf(now(), step.time_zone);

  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <PageHeader
        title={step.title}
        back={{ href: `/plots/${step.plot_id}`, label: step.plot_name }}
        description={`${step.property_name} · ${step.plot_name} · ${step.planting_season} ${step.planting_year} · ${METHOD_LABELS[step.planting_method]}`}
      />

      <PlanSteps
        steps={[dto]}
        warnings={[]}
        plotId={step.plot_id}
        members={step.assignee_id ? [{ userId: step.assignee_id, name: step.assignee_name ?? '' }] : []}
        today={today}
        linkToSteps={false}
      />
      <p className="text-sm text-loam-soft">
        To assign this step, pin its date or mark it done, open{' '}
        <Link href={`/plots/${step.plot_id}`} className="font-medium text-rain hover:underline">
          the plot&apos;s plan
        </Link>
        .
      </p>

      {dto.rules.length ? (
        <Card aria-labelledby="rules-heading">
          <CardHeader id="rules-heading" title="What the rules said about this date" />
          <ul className="space-y-1.5 text-sm">
            {dto.rules.map((rule, i) => (
              <li key={i} className={rule.ok ? 'text-loam' : 'font-medium text-ember'}>
                {rule.ok ? '✓' : '✗'} {rule.reason}
              </li>
            ))}
          </ul>
        </Card>
      ) : null}

      <Card aria-labelledby="moves-heading">
        <CardHeader id="moves-heading" title="History of moves" description="Every change to this step's date, with who made it and why." />
        {moves.length === 0 ? (
          <p className="text-loam-soft">Not moved since it was planned for {formatLocalDate(dto.date)}.</p>
        ) : (
          <ol className="space-y-3">
            {moves.map((move) => (
              <li key={move.id} className="rounded-lg border border-ground-line bg-white/60 p-3 text-sm">
                <p className="tabular flex flex-wrap items-center gap-2 font-semibold">
                  {formatLocalDate(move.from)}
                  <ArrowRight className="size-4 text-loam-soft" aria-label="to" />
                  {formatLocalDate(move.to)}
                </p>
                <p className="mt-1 flex items-center gap-1.5 text-loam-soft">
                  {move.movedBy ? <User className="size-4" aria-hidden="true" /> : <Bot className="size-4" aria-hidden="true" />}
                  {move.movedBy ? `Moved by ${move.movedBy.name}` : 'Moved by the planning engine'} on {formatInstantDate(move.at)}
                </p>
                <p className="mt-1">{move.reason}</p>
              </li>
            ))}
          </ol>
        )}
      </Card>
    </div>
  );
}
