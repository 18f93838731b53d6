// lib/geo/boundary.ts under plain Node ESM (issue #12). Vitest and Next link modules through a bundler, which
// hides how Node itself loads `geographiclib-geodesic` (CommonJS); a script or the worker runs TypeScript
// with `node --import tsx`, where Node's own ESM loader links it. So the module is imported in a child process.
// Outside reference: GeographicLib's JavaScript test suite (geographiclib-geodesic 2.2.0, test/geodesictest.js,
// "Planimeter0"): the geodesic quadrilateral with vertices (lat, lon) (0, −1), (−1, 0), (0, 1), (1, 0) on
// WGS84 has area 24,619,419,146 m² (checked there to 1 m²).
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { expect, it } from 'vitest';
import { ACRE_M2 } from '@/lib/agronomy/units';

const ROOT = path.resolve(__dirname, '../../..');
const PLANIMETER0_AREA_M2 = 24_619_419_146;

const script = `
import { boundaryAcres, parseBoundary } from '@/lib/geo/boundary';
const diamond = { type: 'Polygon', coordinates: [[[-1, 0], [0, -1], [1, 0], [0, 1], [-1, 0]]] };
const feature = parseBoundary(JSON.stringify(diamond), 'diamond.geojson');
process.stdout.write(JSON.stringify({ acres: boundaryAcres(feature) }));
`;

it('imports under `node --import tsx` and gives GeographicLib’s own area for its Planimeter0 quadrilateral', () => {
  const child = spawnSync(process.execPath, ['--import', 'tsx', '--input-type=module', '--eval', script], {
    cwd: ROOT,
    encoding: 'utf8',
    timeout: 60_000,
  });
  expect(child.stderr).toBe('');
  expect(child.status).toBe(0);
  const { acres } = JSON.parse(child.stdout) as { acres: number };
  expect(Math.abs(acres * ACRE_M2 - PLANIMETER0_AREA_M2)).toBeLessThan(1);
});
