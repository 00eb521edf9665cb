/**
 * Coastlines for a map: land rings (lon/lat degrees, e.g. Natural Earth land from world-atlas)
 * projected and cut into polylines wherever a ring leaves the view or jumps across the map edge.
 */
import type { MapProjection } from './projections.js';

export type Ring = ArrayLike<ArrayLike<number>>;

/** Polylines as flat [x0, y0, x1, y1, ...] in projected metres. */
export function projectRings(proj: MapProjection, rings: Ring[]): Float64Array[] {
  const e = proj.extent;
  // a step longer than a third of the map's width is a wrap across the antimeridian, not a coast
  const maxJump = (e.xmax - e.xmin) / 3;
  const lines: Float64Array[] = [];
  for (const ring of rings) {
    let cur: number[] = [];
    let px = NaN;
    let py = NaN;
    for (let i = 0; i < ring.length; i++) {
      const p = proj.forward(ring[i][0], ring[i][1]);
      if (p === null || (cur.length > 0 && Math.hypot(p[0] - px, p[1] - py) > maxJump)) {
        if (cur.length >= 4) lines.push(Float64Array.from(cur));
        cur = [];
        if (p === null) {
          px = NaN;
          py = NaN;
          continue;
        }
      }
      cur.push(p[0], p[1]);
      px = p[0];
      py = p[1];
    }
    if (cur.length >= 4) lines.push(Float64Array.from(cur));
  }
  return lines;
}
