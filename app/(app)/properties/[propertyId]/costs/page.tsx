import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { CostsView } from '@/components/costs/costs-view';
import { NoAccess } from '@/components/ui/no-access';
import { PageHeader } from '@/components/ui/page-header';
import { propertyAccess } from '../../../_lib/access';
import { loadProperty } from '../../../_lib/property';

export const metadata: Metadata = { title: 'Costs' };

/** The club's money for one property: owners and managers only (the API refuses everyone else too). */
export default async function CostsPage({ params }: { params: Promise<{ propertyId: string }> }) {
  const { propertyId } = await params;
  const back = `/properties/${propertyId}`;
  const result = await propertyAccess(propertyId, 'manager', `${back}/costs`);
  if (!result.ok) return <NoAccess message={result.message} backHref={back} backLabel="Back to the property" />;
  const property = await loadProperty(propertyId);
  if (!property) notFound();
  return (
    <div className="mx-auto max-w-5xl">
      <PageHeader
        title={`Costs — ${property.name}`}
        back={{ href: back, label: property.name }}
        description="What the plots cost, per acre and per season, and how the club splits it."
      />
      <CostsView propertyId={propertyId} currentUserId={result.access.user.id} />
    </div>
  );
}
