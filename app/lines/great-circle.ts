/**
 * Great-circle geometry on a sphere (default radius: GRS 80 mean radius R1, app/grid/types.ts).
 * Points are unit vectors internally, so the antimeridian and the poles need no special cases.
 */
import { EARTH_RADIUS_M } from '../grid/types.js';

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;

export interface LonLat {
  /** degrees east */
  lon: number;
  /** degrees north */
  lat: number;
}

export type Vec3 = [number, number, number];

export function toVector(lon: number, lat: number): Vec3 {
  const cl = Math.cos(lat * RAD);
  return [cl * Math.cos(lon * RAD), cl * Math.sin(lon * RAD), Math.sin(lat * RAD)];
}

/** Longitude in [-180, 180), latitude in [-90, 90]. */
export function fromVector(v: Vec3): LonLat {
  const lat = Math.atan2(v[2], Math.hypot(v[0], v[1])) * DEG;
  const lon = Math.atan2(v[1], v[0]) * DEG;
  return { lon: wrapLongitude(lon), lat };
}

/** Longitude folded into [-180, 180). */
export function wrapLongitude(lon: number): number {
  const w = ((((lon + 180) % 360) + 360) % 360) - 180;
  return w;
}

/**
 * Central angle (radians) between two points: the atan2 form (Vincenty's formula on a sphere),
 * well conditioned for both very close and nearly antipodal points.
 */
export function centralAngle(a: LonLat, b: LonLat): number {
  const p1 = a.lat * RAD;
  const p2 = b.lat * RAD;
  const dl = (b.lon - a.lon) * RAD;
  const c1 = Math.cos(p1), s1 = Math.sin(p1), c2 = Math.cos(p2), s2 = Math.sin(p2);
  const cdl = Math.cos(dl), sdl = Math.sin(dl);
  const x = c2 * sdl;
  const y = c1 * s2 - s1 * c2 * cdl;
  return Math.atan2(Math.hypot(x, y), s1 * s2 + c1 * c2 * cdl);
}

/** Great-circle distance in metres. */
export function greatCircleDistance(a: LonLat, b: LonLat, radius = EARTH_RADIUS_M): number {
  return centralAngle(a, b) * radius;
}

/** Initial azimuth from a towards b, degrees clockwise from north in (-180, 180]. */
export function initialAzimuth(a: LonLat, b: LonLat): number {
  const p1 = a.lat * RAD;
  const p2 = b.lat * RAD;
  const dl = (b.lon - a.lon) * RAD;
  const y = Math.sin(dl) * Math.cos(p2);
  const x = Math.cos(p1) * Math.sin(p2) - Math.sin(p1) * Math.cos(p2) * Math.cos(dl);
  return Math.atan2(y, x) * DEG;
}

/** The point reached from a after `distance` metres on the initial azimuth (degrees from north). */
export function destination(a: LonLat, azimuthDeg: number, distance: number, radius = EARTH_RADIUS_M): LonLat {
  const d = distance / radius;
  const az = azimuthDeg * RAD;
  const p1 = a.lat * RAD;
  const sp2 = Math.sin(p1) * Math.cos(d) + Math.cos(p1) * Math.sin(d) * Math.cos(az);
  const p2 = Math.asin(Math.max(-1, Math.min(1, sp2)));
  const dl = Math.atan2(Math.sin(az) * Math.sin(d) * Math.cos(p1), Math.cos(d) - Math.sin(p1) * sp2);
  return { lon: wrapLongitude(a.lon + dl * DEG), lat: p2 * DEG };
}

/**
 * The point a fraction f (0..1) of the way from a to b along the shorter great circle
 * (spherical linear interpolation of the unit vectors). Throws for antipodal points, whose
 * great circle is not unique; callers check that first.
 */
export function intermediatePoint(a: LonLat, b: LonLat, f: number): LonLat {
  const va = toVector(a.lon, a.lat);
  const vb = toVector(b.lon, b.lat);
  const omega = centralAngle(a, b);
  if (omega < 1e-15) return { lon: wrapLongitude(a.lon), lat: a.lat };
  const so = Math.sin(omega);
  if (so < 1e-12) throw new RangeError('intermediatePoint: the two points are antipodal');
  const wa = Math.sin((1 - f) * omega) / so;
  const wb = Math.sin(f * omega) / so;
  return fromVector([wa * va[0] + wb * vb[0], wa * va[1] + wb * vb[1], wa * va[2] + wb * vb[2]]);
}
