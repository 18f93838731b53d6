// Properties close together share one forecast fetch. Open-Meteo's models have a grid spacing of about
// 1–3 km (regional models such as HRRR) to 11–25 km (global GFS, ICON, IFS) — Open-Meteo API documentation,
// "Data Source" table — so two properties inside one 0.1° cell (≈ 11 km north–south, less east–west away from
// the equator) read the same or neighbouring model cells. The 0.1° size itself is common practice, no source.
const CELLS_PER_DEG = 10;

export interface GridCell {
  key: string; // '41.9,-87.6'
  /** The cell's centre, the point the shared fetch asks for, so the answer does not depend on which property asked first. */
  latitude: number;
  longitude: number;
}

function snap(value: number): number {
  const snapped = Math.round(value * CELLS_PER_DEG) / CELLS_PER_DEG;
  return snapped === 0 ? 0 : snapped; // no '-0.0' keys
}

/** Longitude into [−180, 180), so 180° E and 180° W are one cell. */
function wrapLongitude(longitude: number): number {
  const wrapped = ((((longitude + 180) % 360) + 360) % 360) - 180;
  return wrapped;
}

export function gridCell(latitude: number, longitude: number): GridCell {
  if (!Number.isFinite(latitude) || latitude < -90 || latitude > 90) {
    throw new RangeError(`Latitude must be between −90 and 90 degrees, not ${latitude}.`);
  }
  if (!Number.isFinite(longitude)) throw new RangeError(`Longitude must be a number of degrees, not ${longitude}.`);
  const lat = snap(latitude);
  let lon = snap(wrapLongitude(longitude));
  if (lon >= 180) lon = -180;
  return { key: `${lat.toFixed(1)},${lon.toFixed(1)}`, latitude: lat, longitude: lon };
}

/** One key per ~0.1° grid cell: refreshes of properties with the same key share one fetch. */
export function gridCellKey(latitude: number, longitude: number): string {
  return gridCell(latitude, longitude).key;
}
