import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { PropertyForm } from '@/components/properties/property-form';
import { NoAccess } from '@/components/ui/no-access';
import { PageHeader } from '@/components/ui/page-header';
import { getProperty, toPropertyDto } from '@/lib/data/properties';
import { timeZoneNames } from '@/lib/validations/property';
import { propertyAccess } from '../../../_lib/access';

export const metadata: Metadata = { title: 'Edit property' };

export default async function EditPropertyPage({ params }: { params: Promise<{ propertyId: string }> }) {
  const { propertyId } = await params;
  const back = `/properties/${propertyId}`;
  const result = await propertyAccess(propertyId, 'manager', `${back}/edit`);
  if (!result.ok) return <NoAccess message={result.message} backHref={back} backLabel="Back to the property" />;
  const row = await getProperty(propertyId);
  if (!row) notFound();
  const property = toPropertyDto(row);
  return (
    <div className="mx-auto max-w-3xl">
      <PageHeader title={`Edit ${property.name}`} back={{ href: back, label: property.name }} />
      <PropertyForm timeZones={timeZoneNames()} property={property} />
    </div>
  );
}
