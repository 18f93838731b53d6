import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { PlotForm } from '@/components/plots/plot-form';
import { NoAccess } from '@/components/ui/no-access';
import { PageHeader } from '@/components/ui/page-header';
import { getProperty } from '@/lib/data/properties';
import { propertyAccess } from '../../../../_lib/access';

export const metadata: Metadata = { title: 'Add plot' };

export default async function NewPlotPage({ params }: { params: Promise<{ propertyId: string }> }) {
  const { propertyId } = await params;
  const back = `/properties/${propertyId}`;
  const result = await propertyAccess(propertyId, 'manager', `${back}/plots/new`);
  if (!result.ok) return <NoAccess message={result.message} backHref={back} backLabel="Back to the property" />;
  const property = await getProperty(propertyId);
  if (!property) notFound();
  return (
    <div className="mx-auto max-w-3xl">
      <PageHeader title="Add plot" description={`A food plot on ${property.name}.`} back={{ href: back, label: property.name }} />
      <PlotForm propertyId={propertyId} />
    </div>
  );
}
