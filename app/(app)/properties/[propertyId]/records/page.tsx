import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { RecordsTable } from '@/components/records/records-table';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { roleAtLeast } from '@/lib/validations/membership';
import { propertyAccess } from '../../../_lib/access';
import { loadProperty } from '../../../_lib/property';

type Params = Promise<{ propertyId: string }>;

export const metadata: Metadata = { title: 'Application records' };

/** Every herbicide, fertilizer and lime application on the property: read and exported by anyone on it. */
export default async function RecordsPage({ params, searchParams }: { params: Params; searchParams: Promise<{ saved?: string }> }) {
  const { propertyId } = await params;
  const result = await propertyAccess(propertyId, 'viewer', `/properties/${propertyId}/records`);
  if (!result.ok) notFound();
  const property = await loadProperty(propertyId);
  if (!property) notFound();
  const canWrite = roleAtLeast(result.access.role, 'member');
  const { saved } = await searchParams;
  return (
    <div className="space-y-6">
      <PageHeader
        title="Application records"
        back={{ href: `/properties/${propertyId}`, label: property.name }}
        description="Herbicide, fertilizer and lime applied on this property. Records are never changed: a correction is a new record, and the original stays."
      />
      {saved ? <Notice tone="success">Saved the record.</Notice> : null}
      <RecordsTable propertyId={propertyId} canWrite={canWrite} />
    </div>
  );
}
