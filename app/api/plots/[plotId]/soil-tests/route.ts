import { fileTypeFromBuffer } from 'file-type';
import { requirePlotRole } from '@/lib/auth/roles';
import { createSoilTest, listSoilTests } from '@/lib/data/soil-tests';
import { json, route } from '@/lib/http';
import { fileText, readUploadedFile, refuseFile } from '@/lib/http-upload';
import { parseSoilTestCsv, SoilTestCsvError } from '@/lib/soil-tests/csv';
import { storage } from '@/lib/storage';
import { pictureWithoutMetadata, sha256Hex, UploadRefused } from '@/lib/storage/photos';
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
 * A PDF of the report is kept as it is and a picture re-encoded without its metadata (a phone photo's EXIF
 * holds the field's GPS position), with the values typed beside it; a lab's CSV is read for its values. The
 * type is decided from the bytes, never from the name or the browser's claim. PDFs are not rewritten: their
 * metadata is what the lab's software wrote, and rewriting a PDF could change the report itself.
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
  let stored = file.bytes;
  if (contentType === 'image/jpeg' || contentType === 'image/png') {
    try {
      stored = await pictureWithoutMetadata(file.bytes, contentType);
    } catch (error) {
      if (error instanceof UploadRefused) throw refuseFile(error.status, error.message);
      throw error;
    }
  }
  const files = storage();
  const storageKey = await files.put('soil-test', stored, contentType);
  try {
    const soilTest = await createSoilTest({
      plotId,
      propertyId: plot.property_id,
      userId: user.id,
      values: input,
      file: { filename: file.filename, contentType, sizeBytes: stored.byteLength, sha256: stored === file.bytes ? file.sha256 : sha256Hex(stored), storageKey },
    });
    return json({ soilTest }, 201);
  } catch (error) {
    await files.delete(storageKey).catch(() => undefined);
    throw error;
  }
});
