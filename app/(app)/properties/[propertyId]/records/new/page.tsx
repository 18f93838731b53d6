import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { RecordForm } from '@/components/records/record-form';
import { NoAccess } from '@/components/ui/no-access';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { now } from '@/lib/clock';
import { getRecord } from '@/lib/data/application-records';
import { listPlots } from '@/lib/data/plots';
import { localClock, localDateOf } from '@/lib/schedule/local-dates';
import { uuid } from '@/lib/validations/common';
import { propertyAccess } from '../../../../_lib/access';
import { loadProperty } from '../../../../_lib/property';

export const metadata: Metadata = { title: 'Record an application' };

type Search = { step?: string; correct?: string };

/**
 * A new application record, or a correction of one (`?correct=<recordId>`). From a spray, fertilize or lime
 * step (`?step=<stepId>`) the form starts from the plan and the stored forecast for the hour of the work.
 */
export default async function NewRecordPage({ params, searchParams }: { params: Promise<{ propertyId: string }>; searchParams: Promise<Search> }) {
  const { propertyId } = await params;
  const { step, correct } = await searchParams;
  const back = `/properties/${propertyId}/records`;
  const result = await propertyAccess(propertyId, 'member', `/properties/${propertyId}/records/new`);
  if (!result.ok) return <NoAccess message={result.message} backHref={back} backLabel="Back to the records" />;
  const property = await loadProperty(propertyId);
  if (!property) notFound();
  const correcting = correct && uuid.safeParse(correct).success ? await getRecord(correct) : null;
  if (correct && (!correcting || correcting.propertyId !== propertyId)) notFound();
  const stepId = step && uuid.safeParse(step).success ? step : undefined;
  const plots = (await listPlots(propertyId)).map((p) => ({ id: p.id, name: p.name, acres: p.acres }));
  const instant = now();

  return (
    <div className="mx-auto max-w-3xl">
      <PageHeader
        title={correcting ? 'Correct a record' : 'Record an application'}
        back={{ href: back, label: 'Application records' }}
        description={`${property.name} — times are local (${property.timeZone}).`}
      />
      {correcting?.supersededBy ? (
        <Notice tone="error" title="This record has already been corrected">
          Each record is corrected once; <Link href={`${back}#record-${correcting.supersededBy.id}`} className="text-rain underline">correct the newer record</Link> instead.
        </Notice>
      ) : plots.length === 0 ? (
        <Notice tone="info" title="No plots yet">
          A record names the plot it was applied on. Add a plot to the property first.
        </Notice>
      ) : (
        <RecordForm
          propertyId={propertyId}
          plots={plots}
          timeZone={property.timeZone}
          applicatorName={result.access.user.name}
          today={localDateOf(instant, property.timeZone)}
          nowTime={localClock(instant.getTime(), property.timeZone)}
          stepId={correcting ? undefined : stepId}
          correcting={correcting ?? undefined}
        />
      )}
    </div>
  );
}
