import type { Metadata } from 'next';
import { PlotForm } from '@/components/plots/plot-form';
import { NoAccess } from '@/components/ui/no-access';
import { PageHeader } from '@/components/ui/page-header';
import { getPlot, toPlotDto } from '@/lib/data/plots';
import { plotAccess } from '../../../_lib/access';

export const metadata: Metadata = { title: 'Edit plot' };

export default async function EditPlotPage({ params }: { params: Promise<{ plotId: string }> }) {
  const { plotId } = await params;
  const result = await plotAccess(plotId, 'manager', `/plots/${plotId}/edit`);
  if (!result.ok) {
    // Only a member of the plot's property gets this far, so the property may be named in the way back.
    const propertyId = (await getPlot(plotId))?.property_id;
    return propertyId ? (
      <NoAccess message={result.message} backHref={`/properties/${propertyId}`} backLabel="Back to the property" />
    ) : (
      <NoAccess message={result.message} backHref="/properties" backLabel="Back to properties" />
    );
  }
  const plot = toPlotDto(result.access.plot);
  const back = `/properties/${plot.propertyId}`;
  return (
    <div className="mx-auto max-w-3xl">
      <PageHeader title={`Edit ${plot.name}`} back={{ href: back, label: 'Back to the property' }} />
      <PlotForm propertyId={plot.propertyId} plot={plot} />
    </div>
  );
}
