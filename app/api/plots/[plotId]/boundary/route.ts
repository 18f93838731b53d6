import { requirePlotRole } from '@/lib/auth/roles';
import { clearPlotBoundary, getPlotBoundary, savePlotBoundary } from '@/lib/data/plot-boundaries';
import { BoundaryError, boundaryAcres, parseBoundary, type BoundaryFormat } from '@/lib/geo/boundary';
import { json, route } from '@/lib/http';
import { fileText, readUploadedFile, refuseFile } from '@/lib/http-upload';
import { storage } from '@/lib/storage';

type Context = { params: Promise<{ plotId: string }> };

// A walked track of a few acres is tens of kilobytes; 2 MB leaves room for a dense logger's file.
const BOUNDARY_MAX_BYTES = 2 * 1024 * 1024;

// IANA media types: GPX (application/gpx+xml), KML (OGC 07-147r2), GeoJSON (RFC 7946 §12).
const CONTENT_TYPES: Record<BoundaryFormat, string> = {
  gpx: 'application/gpx+xml',
  kml: 'application/vnd.google-earth.kml+xml',
  geojson: 'application/geo+json',
};

export const GET = route(async (_request, { params }: Context) => {
  const { plotId } = await params;
  await requirePlotRole(plotId, 'viewer');
  return json({ boundary: await getPlotBoundary(plotId) });
});

/** Parses and checks the file first; only an outline that passes is stored, so a refusal leaves nothing behind. */
export const POST = route(async (request, { params }: Context) => {
  const { plotId } = await params;
  const { user, plot } = await requirePlotRole(plotId, 'manager');
  const file = await readUploadedFile(request, BOUNDARY_MAX_BYTES, '2 MB');
  const text = fileText(file, 'a boundary must be a GPX, KML or GeoJSON file');
  let feature;
  try {
    feature = parseBoundary(text, file.filename);
  } catch (error) {
    if (error instanceof BoundaryError) throw refuseFile(400, error.message);
    throw error;
  }
  const acres = boundaryAcres(feature);
  const contentType = CONTENT_TYPES[feature.properties?.source as BoundaryFormat];
  const files = storage();
  const storageKey = await files.put('boundary', file.bytes, contentType);
  let saved;
  try {
    saved = await savePlotBoundary({
      plotId,
      propertyId: plot.property_id,
      userId: user.id,
      feature,
      acres,
      file: { filename: file.filename, contentType, sizeBytes: file.bytes.byteLength, sha256: file.sha256, storageKey },
    });
  } catch (error) {
    await files.delete(storageKey).catch(() => undefined);
    throw error;
  }
  if (saved.replacedKey) await files.delete(saved.replacedKey).catch(() => undefined);
  return json({ boundary: saved.boundary }, 201);
});

export const DELETE = route(async (_request, { params }: Context) => {
  const { plotId } = await params;
  await requirePlotRole(plotId, 'manager');
  const { removedKey } = await clearPlotBoundary(plotId);
  if (removedKey) await storage().delete(removedKey).catch(() => undefined);
  return new Response(null, { status: 204 });
});
