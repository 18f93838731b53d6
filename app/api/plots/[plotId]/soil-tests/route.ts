import { fileTypeFromBuffer } from 'file-type';
import { requirePlotRole } from '@/lib/auth/roles';
import { createSoilTest, listSoilTests } from '@/lib/data/soil-tests';
import { json, route } from '@/lib/http';
import { fileText, readUploadedFile, refuseFile } from '@/lib/http-upload';
import { parseSoilTestCsv, SoilTestCsvError } from '@/lib/soil-tests/csv';
import { storage } from '@/lib/storage';
import { soilTestFormValues, soilTestValuesSchema } from '@/lib/validations/soil-test';

type Context = { params: Promise<{ plotId: string }> };

// A scanned lab report is a few megabytes at most; phone photos of one fit too.
const SOIL_TEST_MAX_BYTES = 10 * 1024 * 1024;
const STORED_AS_IS = new Set(['application/pdf', 'image/jpeg', 'image/png']);

export const GET = route(async (_request, { params }: Context) => {
  const { plotId } = await params;
  await requirePlotRole(plotId, 'viewer');
  return json({ soilTests: await listSoilTests(plotId) });
});

/**
 * A PDF or picture of the report is kept as it is, with the values typed beside it; a lab's CSV is read for
 * its values. The type is decided from the bytes, never from the name or the browser's claim.
 */
export const POST = route(async (request, { params }: Context) => {
  const { plotId } = await params;
  const { user, plot } = await requirePlotRole(plotId, 'manager');
  const file = await readUploadedFile(request, SOIL_TEST_MAX_BYTES, '10 MB');
  const typed = soilTestFormValues(file.form);
  const detected = await fileTypeFromBuffer(file.bytes);
  let contentType: string;
  let values: Record<string, unknown>;
  if (detected && STORED_AS_IS.has(detected.mime)) {
    contentType = detected.mime;
    values = typed;
  } else if (!detected && /\.csv$/i.test(file.filename)) {
    contentType = 'text/csv';
    try {
      // What the person typed fills what the lab's file leaves out (a lab name, the date sampled).
      values = { ...typed, ...parseSoilTestCsv(fileText(file, 'a soil-test CSV must be text')) };
    } catch (error) {
      if (error instanceof SoilTestCsvError) throw refuseFile(400, error.message);
      throw error;
    }
  } else {
    throw refuseFile(
      415,
      `A soil-test report must be a PDF, a JPEG or PNG picture, or the lab’s CSV; this file is ${detected ? `${detected.ext.toUpperCase()} (${detected.mime})` : 'none of these'}.`,
    );
  }
  const input = soilTestValuesSchema.parse(values);
  const files = storage();
  const storageKey = await files.put('soil-test', file.bytes, contentType);
  try {
    const soilTest = await createSoilTest({
      plotId,
      propertyId: plot.property_id,
      userId: user.id,
      values: input,
      file: { filename: file.filename, contentType, sizeBytes: file.bytes.byteLength, sha256: file.sha256, storageKey },
    });
    return json({ soilTest }, 201);
  } catch (error) {
    await files.delete(storageKey).catch(() => undefined);
    throw error;
  }
});
