/**
 * The path a transect follows between its waypoints, for drawing on a map: points along each great-circle leg,
 * split where the path crosses the antimeridian so that a map in longitude draws no stroke across the world.
 */
import { centralAngle, intermediatePoint } from '../lines/great-circle.js';

/** Polylines of [lon, lat] along the great circles through the waypoints, about one point a degree of arc. */
export function greatCirclePath(points: [number, number][]): [number, number][][] {
  const pieces: [number, number][][] = [];
  let current: [number, number][] = [];
  for (let w = 0; w + 1 < points.length; w++) {
    const a = { lon: points[w][0], lat: points[w][1] };
    const b = { lon: points[w + 1][0], lat: points[w + 1][1] };
    const steps = Math.max(1, Math.ceil((centralAngle(a, b) * 180) / Math.PI));
    for (let k = w === 0 ? 0 : 1; k <= steps; k++) {
      let p: { lon: number; lat: number };
      try {
        p = intermediatePoint(a, b, k / steps);
      } catch {
        // antipodal waypoints have no single great circle: the leg is not drawn
        continue;
      }
      const prev = current[current.length - 1];
      if (prev && Math.abs(p.lon - prev[0]) > 180) {
        pieces.push(current);
        current = [];
      }
      current.push([p.lon, p.lat]);
    }
  }
  if (current.length) pieces.push(current);
  return pieces;
}
