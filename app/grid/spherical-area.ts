/**
 * Areas of spherical polygons whose edges are great-circle arcs, from the solid angle of triangles
 * (Van Oosterom, A. & Strackee, J. (1983), IEEE Trans. Biomed. Eng. BME-30, 125–126):
 * tan(E/2) = a·(b×c) / (1 + a·b + b·c + c·a) for unit vectors a, b, c. Exact for any triangle
 * (no small-angle approximation), and signed by orientation, so a polygon is a fan of triangles.
 */
import { EARTH_RADIUS_M } from './types.js';

const RAD = Math.PI / 180;

export type Vec3 = [number, number, number];

export function toUnitVector(lonDeg: number, latDeg: number): Vec3 {
  const lon = lonDeg * RAD;
  const lat = latDeg * RAD;
  const c = Math.cos(lat);
  return [c * Math.cos(lon), c * Math.sin(lon), Math.sin(lat)];
}

export function fromUnitVector(v: Vec3): { lon: number; lat: number } {
  const r = Math.hypot(v[0], v[1], v[2]);
  const lat = Math.asin(Math.max(-1, Math.min(1, v[2] / r))) / RAD;
  const lon = Math.atan2(v[1], v[0]) / RAD;
  return { lon, lat };
}

/** Signed solid angle of the spherical triangle a, b, c (positive when counter-clockwise seen from outside). */
export function triangleSolidAngle(a: Vec3, b: Vec3, c: Vec3): number {
  const cross = [b[1] * c[2] - b[2] * c[1], b[2] * c[0] - b[0] * c[2], b[0] * c[1] - b[1] * c[0]];
  const triple = a[0] * cross[0] + a[1] * cross[1] + a[2] * cross[2];
  const dot = (p: Vec3, q: Vec3): number => p[0] * q[0] + p[1] * q[1] + p[2] * q[2];
  const denom = 1 + dot(a, b) + dot(b, c) + dot(c, a);
  return 2 * Math.atan2(triple, denom);
}

/** Area of a spherical polygon with great-circle edges (vertices in order, lon/lat in degrees), m². */
export function sphericalPolygonArea(lon: ArrayLike<number>, lat: ArrayLike<number>, radius = EARTH_RADIUS_M): number {
  const n = lon.length;
  if (n < 3) return 0;
  const p0 = toUnitVector(lon[0], lat[0]);
  let omega = 0;
  let prev = toUnitVector(lon[1], lat[1]);
  for (let i = 2; i < n; i++) {
    const cur = toUnitVector(lon[i], lat[i]);
    omega += triangleSolidAngle(p0, prev, cur);
    prev = cur;
  }
  return Math.abs(omega) * radius * radius;
}
