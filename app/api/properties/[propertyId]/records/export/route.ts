import { requireRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { listRecords } from '@/lib/data/application-records';
import { getProperty } from '@/lib/data/properties';
import { notFound, route } from '@/lib/http';
import { recordsCsvFilename, recordsToCsv } from '@/lib/records/csv';
import { localDateOf } from '@/lib/schedule/local-dates';
import { recordFiltersSchema } from '@/lib/validations/application-record';

type Context = { params: Promise<{ propertyId: string }> };

/** The records as a CSV download, with the same filters as the list. Viewers may export: the landowner keeps a copy. */
export const GET = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'viewer');
  const filters = recordFiltersSchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  const property = await getProperty(propertyId);
  if (!property) throw notFound();
  const csv = recordsToCsv(await listRecords(propertyId, filters));
  const filename = recordsCsvFilename(property.name, localDateOf(now(), property.time_zone));
  return new Response(csv, {
    status: 200,
    headers: {
      // RFC 4180 §3 registers text/csv with an optional header parameter.
      'Content-Type': 'text/csv; charset=utf-8; header=present',
      'Content-Disposition': `attachment; filename="${filename}"`,
      'Cache-Control': 'no-store',
    },
  });
});
