import './zod-config';
import { z } from 'zod';

/** POST /api/dashboard/visit: the `asOf` of the dashboard the person was shown. */
export const dashboardVisitSchema = z.strictObject({
  seenAt: z.iso.datetime({ offset: true, error: 'Seen at must be an ISO 8601 instant, like 2027-04-01T12:00:00Z' }),
});
