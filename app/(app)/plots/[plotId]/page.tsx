import type { Metadata } from 'next';
import { Plus } from 'lucide-react';
import { notFound } from 'next/navigation';
import { ButtonLink } from '@/components/ui/button';
import { PlantingForm } from '@/components/planner/planting-form';
import { PlotPlantings } from '@/components/planner/plot-plantings';
import { PlotBoundary } from '@/components/plots/plot-boundary';
import { SoilTests } from '@/components/plots/soil-tests';
import { RoleBadge } from '@/components/properties/role-badge';
import { Card, CardHeader } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { PlotWeatherChart } from '@/components/weather/plot-weather-chart';
import { now } from '@/lib/clock';
import { formatAcres } from '@/lib/client/format';
import { toPlotDto } from '@/lib/data/plots';
import { getProperty } from '@/lib/data/properties';
import { listPlantingsWithSteps } from '@/lib/data/steps';
import { addDays, localDateOf } from '@/lib/schedule/local-dates';
import { roleAtLeast } from '@/lib/validations/membership';
import { PLOT_COVER_LABELS, PLOT_SUN_LABELS } from '@/lib/validations/plot';
import { plotAccess } from '../../_lib/access';

type Params = Promise<{ plotId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { plotId } = await params;
  const result = await plotAccess(plotId, 'viewer', `/plots/${plotId}`);
  return { title: result.ok ? result.access.plot.name : 'Plot' };
}

export default async function PlotPage({ params }: { params: Params }) {
  const { plotId } = await params;
  const result = await plotAccess(plotId, 'viewer', `/plots/${plotId}`);
  // Every role may view; a 403 cannot happen here, but the type still asks.
  if (!result.ok) notFound();
  const { role, plot: row } = result.access;
  const plot = toPlotDto(row);
  const property = await getProperty(plot.propertyId);
  if (!property) notFound();
  const plantings = await listPlantingsWithSteps(plotId);
  const canManage = roleAtLeast(role, 'manager');
  const canWork = roleAtLeast(role, 'member');
  // Local dates in the property's zone: "today" on the plot, not on the server or in the browser.
  const today = localDateOf(now(), property.time_zone);
  const defaultSeedDate = addDays(today, 14);
  const readyBy = property.season_opens_on && property.season_opens_on >= defaultSeedDate ? property.season_opens_on : null;

  return (
    <div className="space-y-6">
      <PageHeader
        title={plot.name}
        back={{ href: `/properties/${plot.propertyId}`, label: property.name }}
        description={
          <span className="inline-flex items-center gap-2 text-sm">
            <span>Your role:</span> <RoleBadge role={role} />
          </span>
        }
        actions={
          canManage ? (
            <ButtonLink href="#plan-a-planting" variant="secondary">
              <Plus className="size-4" aria-hidden="true" />
              Plan a planting
            </ButtonLink>
          ) : null
        }
      />

      <Card aria-labelledby="plot-facts-heading">
        <CardHeader id="plot-facts-heading" title="The plot" />
        <dl className="grid grid-cols-2 gap-x-8 gap-y-3 text-sm sm:grid-cols-3">
          <div>
            <dt className="font-semibold text-loam-soft">Size</dt>
            <dd className="tabular text-base">{formatAcres(plot.acres)}</dd>
          </div>
          <div>
            <dt className="font-semibold text-loam-soft">Cover now</dt>
            <dd className="text-base">{PLOT_COVER_LABELS[plot.cover]}</dd>
          </div>
          <div>
            <dt className="font-semibold text-loam-soft">Sun</dt>
            <dd className="text-base">{PLOT_SUN_LABELS[plot.sun]}</dd>
          </div>
          <div>
            <dt className="font-semibold text-loam-soft">Soil pH</dt>
            <dd className="tabular text-base">{plot.soilPh === null ? 'Not tested' : plot.soilPh.toFixed(1)}</dd>
          </div>
          <div>
            <dt className="font-semibold text-loam-soft">Property</dt>
            <dd className="text-base">{property.name}</dd>
          </div>
          {plot.notes ? (
            <div>
              <dt className="font-semibold text-loam-soft">Notes</dt>
              <dd className="text-base">{plot.notes}</dd>
            </div>
          ) : null}
        </dl>
      </Card>

      <PlotBoundary plotId={plotId} canManage={canManage} />
      <SoilTests plotId={plotId} canManage={canManage} />

      <PlotWeatherChart plotId={plotId} />

      <PlotPlantings plotId={plotId} propertyId={plot.propertyId} initial={plantings} canManage={canManage} canWork={canWork} today={today} />

      {canManage ? (
        <PlantingForm plotId={plotId} propertyId={plot.propertyId} plotCover={plot.cover} defaultSeedDate={defaultSeedDate} defaultReadyBy={readyBy} today={today} />
      ) : null}
    </div>
  );
}
