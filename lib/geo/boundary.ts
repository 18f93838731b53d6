// A plot's boundary from an uploaded file: a GPX track or route walked around the plot, a KML polygon, or
// GeoJSON. The result is one GeoJSON Feature (RFC 7946: WGS84 lon/lat, outer rings counter-clockwise, holes
// clockwise) whose rings are closed, simple and properly nested, and its geodesic area on the WGS84
// ellipsoid (Karney's GeographicLib) in international acres.
import { gpx, kml } from '@tmcw/togeojson';
import { DOMParser } from '@xmldom/xmldom';
// The package is CommonJS that assigns module.exports inside a callback, so Node's ESM loader finds no named
// exports in it: only the default import (module.exports) works both under plain Node and through a bundler.
import geographiclib from 'geographiclib-geodesic';
import { m2ToAcres } from '@/lib/agronomy/units';

// The GeoJSON shapes used here (RFC 7946 §3), so the module needs no types package at run time or build.
export type Position = number[];
export interface Polygon {
  type: 'Polygon';
  coordinates: Position[][];
}
export interface MultiPolygon {
  type: 'MultiPolygon';
  coordinates: Position[][][];
}
export interface Feature<G> {
  type: 'Feature';
  geometry: G;
  properties: Record<string, unknown> | null;
}
export type BoundaryFeature = Feature<Polygon | MultiPolygon>;
export type BoundaryFormat = 'gpx' | 'kml' | 'geojson';

const { Geodesic } = geographiclib;

/** Bad input: the message is written for the person who uploaded the file. */
export class BoundaryError extends Error {
  override name = 'BoundaryError';
}

/** More points than a walked plot boundary needs; the cap keeps the checks below quick on any upload. */
export const MAX_BOUNDARY_POINTS = 50_000;

const EXTENSIONS: Record<string, BoundaryFormat> = { gpx: 'gpx', kml: 'kml', geojson: 'geojson', json: 'geojson' };

type Ring = [number, number][];

export function parseBoundary(text: string, filename: string): BoundaryFeature {
  const extension = /\.([a-z0-9]+)$/i.exec(filename.trim())?.[1]?.toLowerCase() ?? '';
  const format = EXTENSIONS[extension];
  if (!format) {
    throw new BoundaryError(
      `Sowcast reads boundaries from GPX (.gpx), KML (.kml) or GeoJSON (.geojson, .json) files; “${filename}” is none of these.`,
    );
  }
  const body = text.replace(/^\uFEFF/, '').trim();
  if (!body) throw new BoundaryError('The file is empty.');

  const { polygons, name } = format === 'geojson' ? readGeoJson(body) : readXml(body, format);
  if (polygons.length === 0) {
    throw new BoundaryError('The file holds no polygon, track or route to use as the plot’s boundary.');
  }
  const points = polygons.reduce((n, p) => n + p.reduce((m, r) => m + r.length, 0), 0);
  if (points > MAX_BOUNDARY_POINTS) {
    throw new BoundaryError(`The boundary has ${points} points; Sowcast takes at most ${MAX_BOUNDARY_POINTS}.`);
  }
  const checked = checkPolygons(polygons);
  const geometry: Polygon | MultiPolygon =
    checked.length === 1 ? { type: 'Polygon', coordinates: checked[0] } : { type: 'MultiPolygon', coordinates: checked };
  return { type: 'Feature', geometry, properties: { source: format, ...(name ? { name } : {}) } };
}

/** Geodesic area on WGS84 (GeographicLib PolygonArea): outer rings minus their holes, parts summed. */
export function boundaryAcres(feature: BoundaryFeature): number {
  const geometry = feature?.geometry;
  const polygons =
    geometry?.type === 'Polygon' ? [geometry.coordinates] : geometry?.type === 'MultiPolygon' ? geometry.coordinates : null;
  if (!polygons) throw new BoundaryError('A boundary must be a Polygon or MultiPolygon feature.');
  let m2 = 0;
  for (const [outer, ...holes] of polygons) {
    m2 += ringAreaM2(outer);
    for (const hole of holes) m2 -= ringAreaM2(hole);
  }
  return m2ToAcres(m2);
}

function ringAreaM2(ring: Position[]): number {
  const polygon = Geodesic.WGS84.Polygon(false);
  // GeographicLib closes the ring itself; the repeated last point would add a zero-length edge, so skip it.
  const open = samePoint(ring[0], ring[ring.length - 1]) ? ring.slice(0, -1) : ring;
  for (const [lon, lat] of open) polygon.AddPoint(lat, lon);
  // sign=true: a clockwise ring gives a negative area rather than "the rest of the earth".
  return Math.abs(polygon.Compute(false, true).area ?? 0);
}

// ---------------------------------------------------------------------------------------------------------
// Reading the formats. Each returns polygons as lists of rings, outer ring first, in [lon, lat].

interface Read {
  polygons: Ring[][];
  name: string | null;
}

function readXml(body: string, format: BoundaryFormat): Read {
  if (!body.startsWith('<')) {
    throw new BoundaryError(`The file is named .${format} but does not hold XML.`);
  }
  // No GPX or KML needs a DTD. Refusing it outright keeps out entity expansion ("billion laughs") and
  // external entities whatever the parser would do with them.
  if (/<!DOCTYPE|<!ENTITY/i.test(body)) {
    throw new BoundaryError('The file declares a DOCTYPE or XML entities, which Sowcast refuses in GPX and KML files.');
  }
  const problems: string[] = [];
  let doc: ReturnType<DOMParser['parseFromString']>;
  try {
    doc = new DOMParser({
      onError: (level, message) => {
        if (level !== 'warning') problems.push(message);
      },
    }).parseFromString(body, 'text/xml');
  } catch (error) {
    throw new BoundaryError(`The file is not well-formed XML: ${cleanXmlMessage(error)}.`);
  }
  if (problems.length) throw new BoundaryError(`The file is not well-formed XML: ${cleanXmlMessage(problems[0])}.`);
  const root = doc.documentElement?.localName ?? doc.documentElement?.nodeName ?? '';
  if (root !== 'gpx' && root !== 'kml') {
    throw new BoundaryError(`The XML is neither GPX (a <gpx> document) nor KML (a <kml> document); it starts with <${root}>.`);
  }
  const collection = root === 'gpx' ? gpx(doc) : kml(doc);
  const polygons: Ring[][] = [];
  const loose: Ring[] = [];
  let name: string | null = null;
  for (const feature of collection.features) {
    const before = polygons.length + loose.length;
    collect(feature.geometry, polygons, loose, root === 'gpx');
    const featureName = feature.properties?.name;
    if (!name && typeof featureName === 'string' && polygons.length + loose.length > before) name = featureName.trim() || null;
  }
  return { polygons: [...polygons, ...nestRings(loose)], name };
}

function cleanXmlMessage(error: unknown): string {
  const text = error instanceof Error ? error.message : String(error);
  // xmldom appends its locator block; the first line says what is wrong.
  return text.split('\n')[0].replace(/\s*@#\[line:.*$/, '').replace(/[.\s]+$/, '') || 'it could not be read';
}

function readGeoJson(body: string): Read {
  let data: unknown;
  try {
    data = JSON.parse(body);
  } catch (error) {
    throw new BoundaryError(`The file is not valid JSON: ${(error as Error).message}.`);
  }
  const type = (data as { type?: unknown } | null)?.type;
  const known = ['Feature', 'FeatureCollection', 'Polygon', 'MultiPolygon', 'LineString', 'MultiLineString', 'GeometryCollection'];
  if (typeof data !== 'object' || data === null || Array.isArray(data) || typeof type !== 'string' || !known.includes(type)) {
    throw new BoundaryError(
      'The JSON is not GeoJSON with an outline: Sowcast expects a Feature, a FeatureCollection, a Polygon or a MultiPolygon.',
    );
  }
  const polygons: Ring[][] = [];
  const loose: Ring[] = [];
  let name: string | null = null;
  const features =
    type === 'FeatureCollection'
      ? (data as { features?: unknown }).features
      : type === 'Feature'
        ? [data]
        : [{ type: 'Feature', geometry: data, properties: null }];
  if (!Array.isArray(features)) throw new BoundaryError('The GeoJSON FeatureCollection has no "features" list.');
  for (const feature of features as { type?: unknown; geometry?: unknown; properties?: { name?: unknown } | null }[]) {
    if (feature?.type !== 'Feature') throw new BoundaryError('The GeoJSON FeatureCollection holds something that is not a Feature.');
    const before = polygons.length + loose.length;
    collect(feature.geometry, polygons, loose, false);
    const featureName = feature.properties?.name;
    if (!name && typeof featureName === 'string' && polygons.length + loose.length > before) name = featureName.trim() || null;
  }
  return { polygons: [...polygons, ...nestRings(loose)], name };
}

/**
 * Polygons go in as they are; lines become rings. A GPX track or route is walked around the plot, so it is
 * closed whatever its ends; a GeoJSON or KML line is an outline only when it already ends where it began.
 */
function collect(geometry: unknown, polygons: Ring[][], loose: Ring[], closeLines: boolean) {
  if (!geometry || typeof geometry !== 'object') return;
  const g = geometry as { type?: unknown; coordinates?: unknown; geometries?: unknown };
  switch (g.type) {
    case 'Polygon':
      polygons.push(rings(g.coordinates, 'Polygon'));
      return;
    case 'MultiPolygon':
      if (!Array.isArray(g.coordinates)) throw badCoordinates('MultiPolygon');
      for (const part of g.coordinates) polygons.push(rings(part, 'MultiPolygon'));
      return;
    case 'LineString':
      addLine(g.coordinates, loose, closeLines);
      return;
    case 'MultiLineString':
      if (!Array.isArray(g.coordinates)) throw badCoordinates('MultiLineString');
      for (const line of g.coordinates) addLine(line, loose, closeLines);
      return;
    case 'GeometryCollection':
      if (Array.isArray(g.geometries)) for (const inner of g.geometries) collect(inner, polygons, loose, closeLines);
      return;
    default:
      // Points (waypoints, placemarks) carry no outline.
      return;
  }
}

function addLine(coordinates: unknown, loose: Ring[], closeLines: boolean) {
  const line = positions(coordinates, 'LineString');
  if (line.length === 0) return;
  if (closeLines || (line.length > 3 && samePoint(line[0], line[line.length - 1]))) loose.push(line);
}

const badCoordinates = (type: string) => new BoundaryError(`The ${type} in the file has no usable coordinates.`);

function rings(coordinates: unknown, type: string): Ring[] {
  if (!Array.isArray(coordinates) || coordinates.length === 0) throw badCoordinates(type);
  return coordinates.map((ring) => positions(ring, type));
}

function positions(coordinates: unknown, type: string): Ring {
  if (!Array.isArray(coordinates)) throw badCoordinates(type);
  return coordinates.map((p) => {
    if (!Array.isArray(p) || p.length < 2 || typeof p[0] !== 'number' || typeof p[1] !== 'number') throw badCoordinates(type);
    const [lon, lat] = p as number[];
    if (!Number.isFinite(lon) || !Number.isFinite(lat) || lon < -180 || lon > 180 || lat < -90 || lat > 90) {
      throw new BoundaryError(
        `A point of the outline is not a valid longitude/latitude (${lon}, ${lat}): longitude must be within ±180°, latitude within ±90°.`,
      );
    }
    return [lon, lat] as [number, number];
  });
}

/** Loose rings (GPX segments, closed lines): a ring lying inside another is a hole of it, the rest are parts. */
function nestRings(loose: Ring[]): Ring[][] {
  const cleaned = loose.map((r, i) => cleanRing(r, `Outline ${loose.length > 1 ? `${i + 1} ` : ''}`));
  const parents = cleaned.map((ring, i) =>
    cleaned.findIndex((other, j) => j !== i && pointInRing(ring[0], other) && Math.abs(planarArea(other)) > Math.abs(planarArea(ring))),
  );
  return cleaned
    .map((ring, i) => (parents[i] === -1 ? [ring, ...cleaned.filter((_, j) => parents[j] === i)] : null))
    .filter((p): p is Ring[] => p !== null);
}

// ---------------------------------------------------------------------------------------------------------
// Checks: closed, three distinct points, not self-crossing, holes inside their outer ring, parts apart.

function samePoint(a: Position | undefined, b: Position | undefined) {
  return !!a && !!b && a[0] === b[0] && a[1] === b[1];
}

/** Drops consecutive repeats and the closing point; refuses a ring of fewer than three distinct points. */
function cleanRing(ring: Ring, label: string): Ring {
  const out: Ring = [];
  for (const p of ring) if (!samePoint(out[out.length - 1], p)) out.push(p);
  while (out.length > 1 && samePoint(out[0], out[out.length - 1])) out.pop();
  const distinct = new Set(out.map((p) => `${p[0]},${p[1]}`)).size;
  if (distinct < 3) {
    throw new BoundaryError(
      `${label}has ${distinct === 1 ? 'only one distinct point' : `only ${distinct} distinct points`}; an outline needs at least three.`,
    );
  }
  return out;
}

function checkPolygons(polygons: Ring[][]): Position[][][] {
  const many = polygons.length > 1;
  const cleaned = polygons.map((polygon, p) =>
    polygon.map((ring, r) => {
      // Rings from nestRings are already cleaned; cleaning again is harmless.
      const where = many ? `part ${p + 1}` : '';
      const label = r === 0 ? `The outline${where ? ` of ${where}` : ''} ` : `Hole ${r}${where ? ` of ${where}` : ''} `;
      return { ring: cleanRing(ring, label), label: label.trim(), polygon: p, index: r };
    }),
  );
  const all = cleaned.flat();
  // One sweep over every edge of every ring: a ring crossing itself, a hole crossing its outline, two parts
  // crossing each other are all two edges that meet where they should not.
  const crossing = findCrossing(all.map((r) => r.ring));
  if (crossing) {
    const a = all[Math.min(crossing.ringA, crossing.ringB)];
    const b = all[Math.max(crossing.ringA, crossing.ringB)];
    const at = `near ${formatPoint(crossing.at)}`;
    throw new BoundaryError(
      crossing.ringA === crossing.ringB
        ? `${a.label} crosses itself ${at}. Walk the boundary again, or fix the file so the line does not cross or touch itself.`
        : `${a.label} and ${b.label.charAt(0).toLowerCase()}${b.label.slice(1)} cross or touch ${at}.`,
    );
  }
  for (const ring of all) {
    if (planarArea(ring.ring) === 0) throw new BoundaryError(`${ring.label} encloses no area: its points lie on one line.`);
  }
  for (const polygon of cleaned) {
    const [outer, ...holes] = polygon;
    for (const hole of holes) {
      if (!pointInRing(hole.ring[0], outer.ring)) throw new BoundaryError(`${hole.label} lies outside ${outer.label.charAt(0).toLowerCase()}${outer.label.slice(1)}.`);
      for (const other of holes) {
        if (other !== hole && pointInRing(hole.ring[0], other.ring)) throw new BoundaryError(`${hole.label} lies inside ${other.label.toLowerCase()}.`);
      }
    }
  }
  for (const a of cleaned) {
    for (const b of cleaned) {
      if (a !== b && pointInRing(a[0].ring[0], b[0].ring) && !b.slice(1).some((h) => pointInRing(a[0].ring[0], h.ring))) {
        throw new BoundaryError(`Part ${a[0].polygon + 1} of the boundary lies inside part ${b[0].polygon + 1}; parts must not overlap.`);
      }
    }
  }
  // RFC 7946 §3.1.6: exterior rings counter-clockwise, holes clockwise; each ring closed.
  return cleaned.map((polygon) =>
    polygon.map(({ ring, index }) => {
      const ccw = planarArea(ring) > 0;
      // Reversed from the same first point, so the outline still starts where the file started it.
      const oriented = (index === 0) === ccw ? ring : [ring[0], ...ring.slice(1).reverse()];
      return [...oriented, oriented[0]].map((p) => [p[0], p[1]]);
    }),
  );
}

const formatPoint = ([lon, lat]: [number, number]) =>
  `${Math.abs(lat).toFixed(5)}° ${lat >= 0 ? 'N' : 'S'}, ${Math.abs(lon).toFixed(5)}° ${lon >= 0 ? 'E' : 'W'}`;

/** Twice the signed shoelace area in degrees²: positive counter-clockwise. Only its sign and zero matter. */
function planarArea(ring: Ring): number {
  let sum = 0;
  for (let i = 0; i < ring.length; i++) {
    const [x1, y1] = ring[i];
    const [x2, y2] = ring[(i + 1) % ring.length];
    sum += x1 * y2 - x2 * y1;
  }
  return sum;
}

/** Even–odd ray casting (the point is a vertex of another ring only when rings touch, which is refused first). */
function pointInRing([x, y]: [number, number], ring: Ring): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i];
    const [xj, yj] = ring[j];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

interface Edge {
  ring: number;
  index: number;
  count: number;
  a: [number, number];
  b: [number, number];
  minX: number;
  maxX: number;
}

/**
 * The first pair of edges that cross or touch, other than neighbours of one ring sharing their vertex.
 * Planar in lon/lat, which is exact enough for the few hundred metres of a plot (a segment's curvature on
 * the ellipsoid is far below GPS noise at that size). Edges are swept by their west end, so only edges
 * whose longitude spans overlap are compared.
 */
export function findCrossing(rings: [number, number][][]): { ringA: number; ringB: number; at: [number, number] } | null {
  const edges: Edge[] = [];
  rings.forEach((ring, r) => {
    for (let i = 0; i < ring.length; i++) {
      const a = ring[i];
      const b = ring[(i + 1) % ring.length];
      edges.push({ ring: r, index: i, count: ring.length, a, b, minX: Math.min(a[0], b[0]), maxX: Math.max(a[0], b[0]) });
    }
  });
  edges.sort((e, f) => e.minX - f.minX);
  for (let i = 0; i < edges.length; i++) {
    const e = edges[i];
    for (let j = i + 1; j < edges.length && edges[j].minX <= e.maxX; j++) {
      const f = edges[j];
      if (Math.max(e.a[1], e.b[1]) < Math.min(f.a[1], f.b[1]) || Math.max(f.a[1], f.b[1]) < Math.min(e.a[1], e.b[1])) continue;
      const hit = edgesMeet(e, f);
      if (hit) return { ringA: e.ring, ringB: f.ring, at: hit };
    }
  }
  return null;
}

const orient = (p: [number, number], q: [number, number], r: [number, number]) =>
  Math.sign((q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]));

const onSegment = (p: [number, number], q: [number, number], r: [number, number]) =>
  Math.min(p[0], r[0]) <= q[0] && q[0] <= Math.max(p[0], r[0]) && Math.min(p[1], r[1]) <= q[1] && q[1] <= Math.max(p[1], r[1]);

function edgesMeet(e: Edge, f: Edge): [number, number] | null {
  if (e.ring === f.ring) {
    const next = (e.index + 1) % e.count === f.index;
    const prev = (f.index + 1) % f.count === e.index;
    if (next || prev) {
      // Neighbours share one vertex; they only go wrong when the path doubles back along itself.
      const [first, second] = next ? [e, f] : [f, e];
      const shared = first.b;
      const forward = onSegment(first.a, shared, second.b);
      return orient(first.a, shared, second.b) === 0 && !forward ? shared : null;
    }
  }
  const [p1, q1, p2, q2] = [e.a, e.b, f.a, f.b];
  const o1 = orient(p1, q1, p2);
  const o2 = orient(p1, q1, q2);
  const o3 = orient(p2, q2, p1);
  const o4 = orient(p2, q2, q1);
  if (o1 !== o2 && o3 !== o4) return intersection(p1, q1, p2, q2);
  if (o1 === 0 && onSegment(p1, p2, q1)) return p2;
  if (o2 === 0 && onSegment(p1, q2, q1)) return q2;
  if (o3 === 0 && onSegment(p2, p1, q2)) return p1;
  if (o4 === 0 && onSegment(p2, q1, q2)) return q1;
  return null;
}

function intersection(p1: [number, number], q1: [number, number], p2: [number, number], q2: [number, number]): [number, number] {
  const d = (q1[0] - p1[0]) * (q2[1] - p2[1]) - (q1[1] - p1[1]) * (q2[0] - p2[0]);
  if (d === 0) return p2;
  const t = ((p2[0] - p1[0]) * (q2[1] - p2[1]) - (p2[1] - p1[1]) * (q2[0] - p2[0])) / d;
  return [p1[0] + t * (q1[0] - p1[0]), p1[1] + t * (q1[1] - p1[1])];
}
