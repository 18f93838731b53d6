import { now } from '@/lib/clock';
import { AlreadyCorrected, createCorrection } from '@/lib/data/application-records';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { requireRecordRole } from '@/lib/records/access';
import { placeRecord } from '@/lib/records/place';
import { applicationCorrectionSchema } from '@/lib/validations/application-record';

type Context = { params: Promise<{ recordId: string }> };

/**
 * A correction: a new record that replaces this one, with the reason. The original stays as it was and is
 * shown as corrected; a record that already has a correction is refused (409) — correct the newer one.
 */
export const POST = route(async (request, { params }: Context) => {
  const { recordId } = await params;
  const { user, propertyId } = await requireRecordRole(recordId, 'member');
  const input = await parseBody(request, applicationCorrectionSchema);
  // The correction keeps the original's step, so the step sent (if any) is not checked against the plot.
  const place = await placeRecord(propertyId, input, now(), { checkStep: false });
  try {
    const record = await createCorrection(recordId, input, {
      propertyId,
      plotName: place.plot.name,
      appliedAt: place.appliedAt,
      timeZone: place.timeZone,
      recordedBy: user.id,
    });
    return json({ record }, 201);
  } catch (error) {
    if (error instanceof AlreadyCorrected) throw new HttpError(409, error.message);
    throw error;
  }
});
