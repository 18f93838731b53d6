import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { CheckForm } from '@/components/germination/check-form';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { expectedStand } from '@/lib/agronomy/stand';
import { SPECIES } from '@/lib/agronomy/species';
import { now } from '@/lib/clock';
import { formatLocalDate } from '@/lib/client/format';
import { getProperty } from '@/lib/data/properties';
import { listPlantingsWithSteps } from '@/lib/data/steps';
import { localDateOf } from '@/lib/schedule/local-dates';
import { roleAtLeast } from '@/lib/validations/membership';
import { METHOD_LABELS, plantingSchema } from '@/lib/validations/planting';
import { plotAccess } from '../../../_lib/access';

type Params = Promise<{ plotId: string }>;
type Search = Promise<{ step?: string | string[] }>;

const speciesName = new Map(SPECIES.map((s) => [s.id, s.name]));

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { plotId } = await params;
  const result = await plotAccess(plotId, 'viewer', `/plots/${plotId}/check`);
  return { title: result.ok ? `Germination check — ${result.access.plot.name}` : 'Germination check' };
}

/**
 * The germination check of a plot, opened from the reminder (?step=<the check step>). Phone first: one
 * column, big targets. Viewers see the page's facts but cannot record a check.
 */
export default async function CheckPage({ params, searchParams }: { params: Params; searchParams: Search }) {
  const { plotId } = await params;
  const { step: stepParam } = await searchParams;
  const path = `/plots/${plotId}/check${typeof stepParam === 'string' ? `?step=${encodeURIComponent(stepParam)}` : ''}`;
  const result = await plotAccess(plotId, 'viewer', path);
  if (!result.ok) notFound();
  const { role, plot } = result.access;
  const property = await getProperty(plot.property_id);
  if (!property) notFound();
  const plantings = await listPlantingsWithSteps(plotId);
  const today = localDateOf(now(), property.time_zone);

  const wanted = typeof stepParam === 'string' ? stepParam : null;
  const fromLink = wanted
    ? plantings.flatMap((p) => p.steps.filter((s) => s.id === wanted && s.kind === 'check-germination').map((s) => ({ planting: p, step: s })))[0]
    : undefined;
  const pending = plantings.flatMap((p) => p.steps.filter((s) => s.kind === 'check-germination' && s.status === 'planned').map((s) => ({ planting: p, step: s })))[0];
  const chosen = fromLink ?? pending ?? (plantings[0] ? { planting: plantings[0], step: plantings[0].steps.find((s) => s.kind === 'check-germination') ?? null } : null);

  const header = (
    <PageHeader
      title="Germination check"
      back={{ href: `/plots/${plotId}`, label: plot.name }}
      description={`${plot.name} · ${property.name}`}
    />
  );
  if (!chosen) {
    return (
      <div className="mx-auto max-w-xl space-y-4">
        {header}
        <Notice tone="info" title="Nothing planted here yet">
          A germination check belongs to a planting. Plan one on the plot page first.
        </Notice>
      </div>
    );
  }
  const form = plantingSchema.parse(chosen.planting.input);
  const expected = expectedStand(form.blend, chosen.planting.method);
  const seed = chosen.planting.steps.find((s) => s.kind === 'seed' || s.kind === 'frost-seed');
  const blendWords = form.blend.map((p) => `${speciesName.get(p.speciesId) ?? p.speciesId}${p.share < 1 ? ` (${Math.round(p.share * 100)} %)` : ''}`).join(', ');

  return (
    <div className="mx-auto max-w-xl space-y-4">
      {header}
      {wanted && !fromLink ? (
        <Notice tone="caution" title="That link is not a check of this plot">
          The step in the link is not a germination check of {plot.name}; the form below is for its{' '}
          {chosen.step ? `check planned for ${formatLocalDate(chosen.step.date)}` : 'latest planting'}.
        </Notice>
      ) : null}
      <p className="text-sm text-loam-soft">
        {chosen.planting.season === 'fall' ? 'Fall' : 'Spring'} {chosen.planting.year} · {METHOD_LABELS[chosen.planting.method]} · {blendWords}
        {seed ? ` · seeded ${formatLocalDate(seed.status === 'done' ? (seed.doneOn ?? seed.date) : seed.date)}${seed.status === 'done' ? '' : ' (planned)'}` : ''}
      </p>
      <CheckForm
        plotId={plotId}
        plantingId={chosen.planting.id}
        step={chosen.step ? { id: chosen.step.id, date: chosen.step.date, status: chosen.step.status } : null}
        expected={{ lowPerSqFt: expected.lowPerSqFt, highPerSqFt: expected.highPerSqFt, midPerSqFt: expected.midPerSqFt, source: expected.source }}
        today={today}
        canWork={roleAtLeast(role, 'member')}
        canManage={roleAtLeast(role, 'manager')}
      />
    </div>
  );
}
