import { readFileSync } from 'node:fs';
import path from 'node:path';
import turfArea from '@turf/area';
import { describe, expect, it } from 'vitest';
import { ACRE_M2 } from '@/lib/agronomy/units';
import { BoundaryError, boundaryAcres, findCrossing, parseBoundary, type BoundaryFeature } from '@/lib/geo/boundary';

const FIXTURES = path.resolve(__dirname, '../../fixtures/boundaries');
const fixture = (name: string) => readFileSync(path.join(FIXTURES, name), 'utf8');
const parse = (name: string) => parseBoundary(fixture(name), name);
const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
// @turf/area's spherical area (mean radius 6,371,008.8 m), the reference library the issue names.
const turfAcres = (feature: BoundaryFeature) => turfArea(feature as Parameters<typeof turfArea>[0]) / ACRE_M2;

function refusal(text: string, filename: string): string {
  try {
    parseBoundary(text, filename);
  } catch (error) {
    expect(error).toBeInstanceOf(BoundaryError);
    return (error as Error).message;
  }
  throw new Error(`${filename} was accepted`);
}

describe('parseBoundary: one field in three formats', () => {
  const gpx = parse('field.gpx');
  const route = parse('field-route.gpx');
  const kml = parse('field.kml');
  const geojson = parse('field.geojson');

  it('reads a GPX track, a GPX route, a KML polygon and a GeoJSON feature as the same closed polygon', () => {
    for (const f of [gpx, route, kml, geojson]) {
      expect(f.type).toBe('Feature');
      expect(f.geometry.type).toBe('Polygon');
      const [ring] = f.geometry.coordinates as number[][][];
      // The walked track's repeated point is dropped; every ring is closed (RFC 7946 §3.1.6).
      expect(ring).toHaveLength(7);
      expect(ring[0]).toEqual(ring[6]);
      // Elevation is dropped: the boundary is a lon/lat outline.
      expect(ring.every((p) => p.length === 2)).toBe(true);
    }
    expect(gpx.properties).toMatchObject({ source: 'gpx', name: 'Walked field edge' });
    expect(kml.properties).toMatchObject({ source: 'kml' });
    expect(geojson.properties).toMatchObject({ source: 'geojson' });
  });

  it('winds the outer ring counter-clockwise, as RFC 7946 §3.1.6 asks, whatever the file did', () => {
    // field.geojson is written clockwise; the GPX walk goes counter-clockwise.
    expect(geojson.geometry.coordinates).toEqual(gpx.geometry.coordinates);
  });

  it('gives the same acres for the GPX, the KML and the GeoJSON within 0.01% (the issue’s tolerance)', () => {
    const acres = [gpx, route, kml, geojson].map(boundaryAcres);
    for (const a of acres) expect(relative(a, acres[0])).toBeLessThan(1e-4);
    expect(acres[0]).toBeGreaterThan(0.5);
    expect(acres[0]).toBeLessThan(0.8);
  });

  it('agrees with @turf/area (spherical) within 0.6%, the error a sphere makes at most', () => {
    expect(relative(boundaryAcres(gpx), turfAcres(gpx))).toBeLessThan(0.006);
  });
});

describe('boundaryAcres against a rectangle worked by hand', () => {
  it('a 0.001° × 0.001° box at 45° N, 100° W is 2.1652 acres within 0.1%', () => {
    // WGS84 constants from NIMA TR8350.2 (3rd ed.), Table 3.1: a = 6,378,137 m, 1/f = 298.257223563,
    // so e² = f(2 − f) = 0.00669437999014. At the box's middle latitude φ = 45.0005°:
    //   sin²φ = 0.500008727, W = √(1 − e² sin²φ) = 0.998324973
    //   meridional radius  M = a(1 − e²)/W³ = 6,367,382.38 m
    //   prime vertical     N = a/W         = 6,388,838.48 m
    //   0.001° = 1.745329252e-5 rad
    //   north–south side  M·Δφ        = 111.1318 m
    //   east–west side    N·cosφ·Δλ   =  78.8461 m
    //   area = 111.1318 × 78.8461 = 8,762.31 m²; ÷ 4,046.8564224 m²/acre (NIST SP 811, exact) = 2.16521 acres.
    // The box is small enough that treating it as a plane rectangle with those sides errs by far less than 0.1%.
    const box = parse('box-45n.geojson');
    expect(relative(boundaryAcres(box), 2.16521)).toBeLessThan(0.001);
  });

  it('uses the exact international acre of 4,046.8564224 m² (NIST Handbook 44, Appendix C)', () => {
    const box = parse('box-45n.geojson');
    expect(relative(boundaryAcres(box) * 4046.8564224, 8762.31)).toBeLessThan(0.001);
  });
});

describe('holes and parts', () => {
  it('subtracts a hole (KML innerBoundaryIs) from the outer ring', () => {
    const withPond = parse('field-with-pond.kml');
    const field = parse('field.kml');
    const pond = parse('field-pond-only.geojson');
    expect(withPond.geometry.type).toBe('Polygon');
    const rings = withPond.geometry.coordinates as number[][][];
    expect(rings).toHaveLength(2);
    expect(relative(boundaryAcres(withPond), boundaryAcres(field) - boundaryAcres(pond))).toBeLessThan(1e-9);
    expect(boundaryAcres(pond)).toBeGreaterThan(0.02);
    // The hole winds clockwise (RFC 7946 §3.1.6), and @turf/area also subtracts it.
    expect(relative(boundaryAcres(withPond), turfAcres(withPond))).toBeLessThan(0.006);
  });

  it('reads a KML MultiGeometry as a MultiPolygon and sums its parts', () => {
    const parts = parse('two-parts.kml');
    expect(parts.geometry.type).toBe('MultiPolygon');
    const box = parse('box-45n.geojson');
    // The two strips are 0.001° wide at the same latitudes as the box: twice its area within 0.01%
    // (only the longitude differs, and the ellipsoid does not change with longitude).
    expect(relative(boundaryAcres(parts), 2 * boundaryAcres(box))).toBeLessThan(1e-4);
  });

  it('makes a GPX track around a pond, with the pond walked as a second segment, a polygon with a hole', () => {
    const outer = (fixture('field.gpx').match(/<trkpt[^>]*>/g) ?? []).join('</trkpt>');
    const hole = '<trkpt lat="40.11245" lon="-98.54650"/><trkpt lat="40.11245" lon="-98.54635"/><trkpt lat="40.11258" lon="-98.54635"/><trkpt lat="40.11258" lon="-98.54650"/>';
    const text = `<gpx xmlns="http://www.topografix.com/GPX/1/1"><trk><trkseg>${outer}</trkpt></trkseg><trkseg>${hole}</trkseg></trk></gpx>`;
    const feature = parseBoundary(text, 'pond-walk.gpx');
    expect(feature.geometry.type).toBe('Polygon');
    expect(relative(boundaryAcres(feature), boundaryAcres(parse('field-with-pond.kml')))).toBeLessThan(1e-9);
  });

  it('accepts a closed GeoJSON LineString as a ring and a bare MultiPolygon', () => {
    const line = { type: 'LineString', coordinates: [[-100, 45], [-99.999, 45], [-99.999, 45.001], [-100, 45.001], [-100, 45]] };
    const multi = { type: 'MultiPolygon', coordinates: [[line.coordinates]] };
    const box = boundaryAcres(parse('box-45n.geojson'));
    expect(relative(boundaryAcres(parseBoundary(JSON.stringify(line), 'line.geojson')), box)).toBeLessThan(1e-12);
    expect(relative(boundaryAcres(parseBoundary(JSON.stringify(multi), 'multi.json')), box)).toBeLessThan(1e-12);
  });
});

describe('refused files, each with a message a person can act on', () => {
  it('a truncated GPX', () => expect(refusal(fixture('truncated.gpx'), 'truncated.gpx')).toMatch(/not well-formed XML/));
  it('a malformed KML (mismatched tags)', () => expect(refusal(fixture('malformed.kml'), 'malformed.kml')).toMatch(/not well-formed XML.*(tag|mismatch)/i));
  it('an XML entity bomb', () => expect(refusal(fixture('entity-bomb.gpx'), 'entity-bomb.gpx')).toMatch(/DOCTYPE or XML entities/));
  it('a self-crossing ring (a bow tie)', () => expect(refusal(fixture('self-crossing.geojson'), 'self-crossing.geojson')).toMatch(/crosses itself near 40\.11255° N, 98\.54635° W/));
  it('a track of two distinct points', () => expect(refusal(fixture('two-points.gpx'), 'two-points.gpx')).toMatch(/only 2 distinct points.*at least three/));
  it('an empty file', () => expect(refusal(fixture('empty.gpx'), 'empty.gpx')).toMatch(/The file is empty/));
  it('JSON that is not GeoJSON', () => expect(refusal(fixture('not-geojson.json'), 'not-geojson.json')).toMatch(/not GeoJSON/));
  it('JSON that does not parse', () => expect(refusal('{"type": "Feature", ', 'cut.geojson')).toMatch(/not valid JSON/));
  it('a file of another kind', () => expect(refusal('a,b\n1,2', 'corners.csv')).toMatch(/GPX \(\.gpx\), KML \(\.kml\) or GeoJSON/));
  it('a .gpx that is not XML', () => expect(refusal('{"type":"Polygon"}', 'field.gpx')).toMatch(/does not hold XML/));
  it('XML that is neither GPX nor KML', () => expect(refusal('<svg><path d="M0 0"/></svg>', 'drawing.kml')).toMatch(/neither GPX.*<svg>/));
  it('a GPX with only waypoints', () =>
    expect(refusal('<gpx><wpt lat="40.1" lon="-98.5"/><wpt lat="40.2" lon="-98.5"/></gpx>', 'gate.gpx')).toMatch(/no polygon, track or route/));
  it('a latitude out of range', () =>
    expect(refusal(JSON.stringify({ type: 'Polygon', coordinates: [[[-98, 40], [-98, 91], [-97, 40], [-98, 40]]] }), 'x.geojson')).toMatch(/latitude within ±90°/));
  it('three points on one line', () =>
    expect(refusal(JSON.stringify({ type: 'Polygon', coordinates: [[[-98, 40], [-98, 40.001], [-98, 40.002], [-98, 40]]] }), 'x.geojson')).toMatch(/(no area|crosses itself)/));
  it('a hole outside its outer ring', () => {
    const outer = [[-100, 45], [-99.999, 45], [-99.999, 45.001], [-100, 45.001], [-100, 45]];
    const away = [[-99.99, 45], [-99.99, 45.0005], [-99.9895, 45.0005], [-99.99, 45]];
    expect(refusal(JSON.stringify({ type: 'Polygon', coordinates: [outer, away] }), 'x.geojson')).toMatch(/Hole 1 lies outside the outline/);
  });
  it('a hole crossing its outer ring', () => {
    const outer = [[-100, 45], [-99.999, 45], [-99.999, 45.001], [-100, 45.001], [-100, 45]];
    const across = [[-99.9995, 45.0005], [-99.9985, 45.0005], [-99.9985, 45.0007], [-99.9995, 45.0005]];
    expect(refusal(JSON.stringify({ type: 'Polygon', coordinates: [outer, across] }), 'x.geojson')).toMatch(/The outline and hole 1 cross or touch/);
  });
  it('overlapping parts', () => {
    const a = [[-100, 45], [-99.999, 45], [-99.999, 45.001], [-100, 45.001], [-100, 45]];
    const inside = [[-99.9996, 45.0004], [-99.9994, 45.0004], [-99.9994, 45.0006], [-99.9996, 45.0004]];
    expect(refusal(JSON.stringify({ type: 'MultiPolygon', coordinates: [[a], [inside]] }), 'x.geojson')).toMatch(/parts must not overlap/);
  });
  it('a path that doubles back along itself', () => {
    const spur = [[-100, 45], [-99.999, 45], [-99.9995, 45], [-99.9995, 45.001], [-100, 45]];
    expect(refusal(JSON.stringify({ type: 'Polygon', coordinates: [spur] }), 'x.geojson')).toMatch(/crosses itself/);
  });
});

describe('findCrossing (segment intersection, planar)', () => {
  // Cases worked by hand on graph paper (from memory of the standard orientation test, no other source).
  it('finds the crossing point of a bow tie', () => {
    const hit = findCrossing([[[0, 0], [2, 2], [2, 0], [0, 2]]]);
    expect(hit?.at).toEqual([1, 1]);
  });
  it('finds nothing in a square, a concave L and a triangle', () => {
    expect(findCrossing([[[0, 0], [1, 0], [1, 1], [0, 1]]])).toBeNull();
    expect(findCrossing([[[0, 0], [2, 0], [2, 1], [1, 1], [1, 2], [0, 2]]])).toBeNull();
    expect(findCrossing([[[0, 0], [1, 0], [0, 1]]])).toBeNull();
  });
  it('counts a vertex touching another edge as a crossing', () => {
    expect(findCrossing([[[0, 0], [2, 0], [2, 2], [1, 0.0], [0, 2]]])?.at).toEqual([1, 0]);
  });
  it('allows a redundant vertex in the middle of a straight side', () => {
    expect(findCrossing([[[0, 0], [1, 0], [2, 0], [2, 2], [0, 2]]])).toBeNull();
  });
  it('compares edges of different rings', () => {
    const hit = findCrossing([
      [[0, 0], [4, 0], [4, 4], [0, 4]],
      [[3, 1], [5, 1], [5, 3], [3, 3]],
    ]);
    expect(hit).toMatchObject({ ringA: expect.any(Number), ringB: expect.any(Number) });
    expect(hit!.ringA).not.toBe(hit!.ringB);
  });
  it('stays quick on a walked track of 20,000 points', () => {
    const ring: [number, number][] = [];
    for (let i = 0; i < 20_000; i++) {
      const t = (2 * Math.PI * i) / 20_000;
      ring.push([-98.5 + 0.001 * Math.cos(t), 40.1 + 0.0008 * Math.sin(t)]);
    }
    const started = performance.now();
    expect(findCrossing([ring])).toBeNull();
    expect(performance.now() - started).toBeLessThan(2000);
  });
});
