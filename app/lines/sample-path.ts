/**
 * Points along a line, every `spacingKm` of distance: transects through waypoints (great circles),
 * sections along a meridian, sections along a parallel. Waypoints are kept as sample points
 * so that corners are not cut; the distance axis is explicit, so spacing may be shorter there.
 */
import { StillwaterError } from '../errors.js';
import { EARTH_RADIUS_M } from '../grid/types.js';
import { centralAngle, intermediatePoint, wrapLongitude, type LonLat } from './great-circle.js';
import { checkWaypoint, checkWaypoints } from './waypoints.js';

export type LineKind = 'great-circle' | 'meridian' | 'parallel';

export interface SampledLine {
  kind: LineKind;
  /** sample longitudes, degrees east in [-180, 180) */
  lon: Float64Array;
  /** sample latitudes, degrees north */
  lat: Float64Array;
  /** distance from the start along the line, km */
  distanceKm: Float64Array;
  /** the waypoints as given, and their distance along the line (km) */
  waypoints: LonLat[];
  waypointKm: number[];
  spacingKm: number;
}

export const DEFAULT_SPACING_KM = 50;
/**
 * More samples than this is almost certainly a typo in the spacing (and the section files would run to
 * gigabytes): 10 000 samples is a 5 000 km line every 500 m.
 */
export const MAX_SAMPLES = 10_000;

export function checkSpacing(spacingKm: number): void {
  if (!(spacingKm > 0) || !Number.isFinite(spacingKm)) {
    throw new StillwaterError('E_INPUT', `--spacing-km must be a positive number of kilometres, got ${spacingKm}.`);
  }
}

function checkCount(n: number, spacingKm: number): void {
  if (n > MAX_SAMPLES) {
    throw new StillwaterError('E_INPUT', `--spacing-km ${spacingKm} gives ${Math.round(n)} samples along this line, more than the ${MAX_SAMPLES} a line may have; choose a larger spacing.`);
  }
}

/** Merge the regular stations k·s with the waypoint distances (sorted, duplicates within 1 mm dropped). */
function stationDistances(totalKm: number, spacingKm: number, waypointKm: number[]): Float64Array {
  const regular = Math.floor(totalKm / spacingKm + 1e-9);
  checkCount(regular + waypointKm.length, spacingKm);
  const all: number[] = [];
  for (let k = 0; k <= regular; k++) all.push(Math.min(k * spacingKm, totalKm));
  all.push(...waypointKm);
  all.sort((a, b) => a - b);
  const out: number[] = [];
  for (const d of all) if (out.length === 0 || d - out[out.length - 1] > 1e-6) out.push(d);
  return Float64Array.from(out);
}

/** A transect through waypoints, each leg the shorter great circle. */
export function sampleGreatCircles(waypoints: LonLat[], spacingKm = DEFAULT_SPACING_KM, radius = EARTH_RADIUS_M): SampledLine {
  checkWaypoints(waypoints);
  checkSpacing(spacingKm);
  const legKm: number[] = [];
  for (let i = 0; i + 1 < waypoints.length; i++) {
    const omega = centralAngle(waypoints[i], waypoints[i + 1]);
    if (Math.PI - omega < 1e-9) {
      throw new StillwaterError('E_INPUT', `path waypoints ${i + 1} and ${i + 2} are antipodal, so the great circle between them is not unique; add a waypoint between them.`);
    }
    legKm.push((omega * radius) / 1000);
  }
  const waypointKm = [0];
  for (const l of legKm) waypointKm.push(waypointKm[waypointKm.length - 1] + l);
  const total = waypointKm[waypointKm.length - 1];
  if (!(total > 0)) throw new StillwaterError('E_INPUT', 'path: all waypoints are the same point, so the line has no length.');
  const d = stationDistances(total, spacingKm, waypointKm);
  const lon = new Float64Array(d.length);
  const lat = new Float64Array(d.length);
  let leg = 0;
  for (let s = 0; s < d.length; s++) {
    while (leg < legKm.length - 1 && d[s] > waypointKm[leg + 1]) leg++;
    const f = legKm[leg] > 0 ? Math.min(1, Math.max(0, (d[s] - waypointKm[leg]) / legKm[leg])) : 0;
    const p = intermediatePoint(waypoints[leg], waypoints[leg + 1], f);
    lon[s] = p.lon;
    lat[s] = p.lat;
  }
  return { kind: 'great-circle', lon, lat, distanceKm: d, waypoints, waypointKm, spacingKm };
}

/** A section along one meridian from lat0 to lat1 (either direction); over a pole, use waypoints instead. */
export function sampleMeridian(lon: number, lat0 = -90, lat1 = 90, spacingKm = DEFAULT_SPACING_KM, radius = EARTH_RADIUS_M): SampledLine {
  checkWaypoint({ lon, lat: lat0 }, 'meridian section start');
  checkWaypoint({ lon, lat: lat1 }, 'meridian section end');
  checkSpacing(spacingKm);
  if (lat0 === lat1) throw new StillwaterError('E_INPUT', 'meridian section: the start and end latitudes are equal, so the line has no length.');
  const kmPerDeg = (radius * Math.PI) / 180 / 1000;
  const total = Math.abs(lat1 - lat0) * kmPerDeg;
  const d = stationDistances(total, spacingKm, [0, total]);
  const sign = Math.sign(lat1 - lat0);
  const lons = new Float64Array(d.length).fill(wrapLongitude(lon));
  const lats = d.map((x) => lat0 + (sign * x) / kmPerDeg);
  const waypoints = [
    { lon, lat: lat0 },
    { lon, lat: lat1 },
  ];
  return { kind: 'meridian', lon: lons, lat: lats, distanceKm: d, waypoints, waypointKm: [0, total], spacingKm };
}

/**
 * A section along a parallel, eastwards from lon0 to lon1 (crossing the antimeridian when lon1 < lon0;
 * lon1 = lon0 + 360 goes all the way round). Distance is measured along the parallel, R cos φ Δλ.
 */
export function sampleParallel(lat: number, lon0 = -180, lon1 = 180, spacingKm = DEFAULT_SPACING_KM, radius = EARTH_RADIUS_M): SampledLine {
  checkWaypoint({ lon: lon0, lat }, 'parallel section start');
  checkWaypoint({ lon: lon1, lat }, 'parallel section end');
  checkSpacing(spacingKm);
  if (Math.abs(lat) > 89.999) throw new StillwaterError('E_INPUT', `parallel section: latitude ${lat} is a pole, where a parallel has no length.`);
  let span = lon1 - lon0;
  while (span <= 0) span += 360;
  if (span > 360) span = 360;
  const kmPerDeg = ((radius * Math.PI) / 180 / 1000) * Math.cos((lat * Math.PI) / 180);
  const total = span * kmPerDeg;
  const d = stationDistances(total, spacingKm, [0, total]);
  const lons = d.map((x) => wrapLongitude(lon0 + x / kmPerDeg));
  const lats = new Float64Array(d.length).fill(lat);
  const waypoints = [
    { lon: lon0, lat },
    { lon: lon1, lat },
  ];
  return { kind: 'parallel', lon: lons, lat: lats, distanceKm: d, waypoints, waypointKm: [0, total], spacingKm };
}
