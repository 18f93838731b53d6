import { getRecord } from '@/lib/data/application-records';
import { json, notFound, route } from '@/lib/http';
import { requireRecordRole } from '@/lib/records/access';

type Context = { params: Promise<{ recordId: string }> };

/** One record, with the correction that replaced it when there is one. */
export const GET = route(async (_request, { params }: Context) => {
  const { recordId } = await params;
  const { role } = await requireRecordRole(recordId, 'viewer');
  const record = await getRecord(recordId);
  if (!record) throw notFound();
  return json({ record, role });
});
