/**
 * Contour lines of a field on a rectilinear lat-lon grid by marching squares over the cell centres (linear
 * interpolation along each edge of the square between four centres; a square with a missing corner draws
 * nothing). The result is line segments in longitude and latitude, per level.
 */

export interface ContourLevel {
  value: number;
  /** segments as [lon0, lat0, lon1, lat1, …], four numbers a segment */
  segments: Float64Array;
}

/** Corner order around a square: (i, j), (i+1, j), (i+1, j+1), (i, j+1). */
const EDGES: [number, number][] = [
  [0, 1],
  [1, 2],
  [2, 3],
  [3, 0],
];

export function contourSegments(values: ArrayLike<number>, lonEdges: ArrayLike<number>, latEdges: ArrayLike<number>, levels: number[]): ContourLevel[] {
  const nx = lonEdges.length - 1;
  const ny = latEdges.length - 1;
  const lon = new Float64Array(nx);
  const lat = new Float64Array(ny);
  for (let i = 0; i < nx; i++) lon[i] = 0.5 * (lonEdges[i] + lonEdges[i + 1]);
  for (let j = 0; j < ny; j++) lat[j] = 0.5 * (latEdges[j] + latEdges[j + 1]);
  const out: ContourLevel[] = [];
  const v = new Float64Array(4);
  const x = new Float64Array(4);
  const y = new Float64Array(4);
  for (const level of levels) {
    const seg: number[] = [];
    for (let j = 0; j + 1 < ny; j++) {
      for (let i = 0; i + 1 < nx; i++) {
        v[0] = values[j * nx + i];
        v[1] = values[j * nx + i + 1];
        v[2] = values[(j + 1) * nx + i + 1];
        v[3] = values[(j + 1) * nx + i];
        if (!(v[0] === v[0] && v[1] === v[1] && v[2] === v[2] && v[3] === v[3])) continue;
        x[0] = lon[i];
        x[1] = lon[i + 1];
        x[2] = lon[i + 1];
        x[3] = lon[i];
        y[0] = lat[j];
        y[1] = lat[j];
        y[2] = lat[j + 1];
        y[3] = lat[j + 1];
        // crossing points on the edges whose ends lie on either side of the level
        const pts: number[] = [];
        for (const [a, b] of EDGES) {
          const da = v[a] - level;
          const db = v[b] - level;
          if ((da < 0) !== (db < 0)) {
            const t = da / (da - db);
            pts.push(x[a] + t * (x[b] - x[a]), y[a] + t * (y[b] - y[a]));
          }
        }
        // two crossings: one segment; four (a saddle): pair them in edge order
        for (let p = 0; p + 3 < pts.length; p += 4) seg.push(pts[p], pts[p + 1], pts[p + 2], pts[p + 3]);
      }
    }
    out.push({ value: level, segments: Float64Array.from(seg) });
  }
  return out;
}
