import { requireRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { createRecord, listRecords } from '@/lib/data/application-records';
import { json, parseBody, route } from '@/lib/http';
import { placeRecord } from '@/lib/records/place';
import { applicationRecordSchema, recordFiltersSchema } from '@/lib/validations/application-record';

type Context = { params: Promise<{ propertyId: string }> };

/** The property's application records; everyone on the property may read them (the landowner too). */
export const GET = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'viewer');
  const filters = recordFiltersSchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  return json({ records: await listRecords(propertyId, filters) });
});

/** A new record: members who do the work log it. Records are never changed afterwards, only corrected. */
export const POST = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  const { user } = await requireRole(propertyId, 'member');
  const input = await parseBody(request, applicationRecordSchema);
  const place = await placeRecord(propertyId, input, now());
  const record = await createRecord(input, {
    propertyId,
    plotName: place.plot.name,
    appliedAt: place.appliedAt,
    timeZone: place.timeZone,
    recordedBy: user.id,
  });
  return json({ record }, 201);
});
