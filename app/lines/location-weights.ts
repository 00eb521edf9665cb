/**
 * Horizontal weights of scattered points on any grid, as a sparse matrix (rows = points, columns =
 * grid cells; app/regrid/csr.ts), built with the regridder's point locator (app/regrid/locate.ts):
 * - bilinear: the surrounding cell centres with bilinear weights (summing to 1);
 * - nearest: the containing cell, then its neighbours by distance, weight 1 each
 *   (the first wet candidate wins, as in app/regrid/csr.ts applyFirstValid).
 * A point outside a regional grid gets an empty row (NaN when applied).
 * Global regular lat-lon grids (the usual common grid) take a shortcut that finds the cell by arithmetic
 * instead of a search; it gives the locator's weights (tests/unit/lines/location-weights.test.ts).
 */
import type { HorizontalGrid } from '../grid/types.js';
import type { SparseWeights } from '../regrid/csr.js';
import { PointLocator, newStencil } from '../regrid/locate.js';

export type PointMethod = 'bilinear' | 'nearest';

export function pointWeights(grid: HorizontalGrid, lon: ArrayLike<number>, lat: ArrayLike<number>, method: PointMethod = 'bilinear'): SparseWeights {
  if (method === 'bilinear') {
    const regular = regularAxes(grid);
    if (regular) return regularBilinear(grid, regular, lon, lat);
  }
  const loc = new PointLocator(grid);
  const n = lon.length;
  const per = method === 'bilinear' ? 4 : 9;
  // rows come in order, so the compressed rows are filled directly
  const rowPtr = new Int32Array(n + 1);
  const col = new Int32Array(n * per);
  const w = new Float64Array(n * per);
  let q = 0;
  if (method === 'bilinear') {
    const st = newStencil();
    for (let p = 0; p < n; p++) {
      if (loc.bilinear(lon[p], lat[p], st)) {
        for (let k = 0; k < st.n; k++) {
          if (st.w[k] > 0) {
            col[q] = st.idx[k];
            w[q++] = st.w[k];
          }
        }
      }
      rowPtr[p + 1] = q;
    }
  } else {
    const cand = new Int32Array(9);
    for (let p = 0; p < n; p++) {
      const m = loc.nearest(lon[p], lat[p], cand);
      for (let k = 0; k < m; k++) {
        col[q] = cand[k];
        w[q++] = 1;
      }
      rowPtr[p + 1] = q;
    }
  }
  return { method, nRows: n, nCols: grid.nx * grid.ny, rowPtr, col: col.slice(0, q), w: w.slice(0, q) };
}

interface RegularAxes {
  x0: number;
  dx: number;
  y0: number;
  dy: number;
  yLo: number;
  yHi: number;
}

/** Centre spacing of a periodic lat-lon grid with equally spaced, increasing axes; null otherwise. */
export function regularAxes(grid: HorizontalGrid): RegularAxes | null {
  const a = grid.axes;
  if (grid.kind !== 'rectilinear' || !a || !grid.periodic || grid.nx < 2 || grid.ny < 2) return null;
  const uniform = (v: Float64Array): number | null => {
    const d = (v[v.length - 1] - v[0]) / (v.length - 1);
    if (!(d > 0)) return null;
    for (let i = 1; i < v.length; i++) if (Math.abs(v[i] - v[i - 1] - d) > 1e-9 * d) return null;
    return d;
  };
  const dx = uniform(a.lon), dy = uniform(a.lat);
  if (dx === null || dy === null || Math.abs(dx * grid.nx - 360) > 1e-6) return null;
  return { x0: a.lon[0], dx, y0: a.lat[0], dy, yLo: a.latEdges[0], yHi: a.latEdges[grid.ny] };
}

/** Bilinear weights on a periodic regular grid: the four centres around each point, by arithmetic. */
function regularBilinear(grid: HorizontalGrid, g: RegularAxes, lon: ArrayLike<number>, lat: ArrayLike<number>): SparseWeights {
  const { nx, ny } = grid;
  const n = lon.length;
  const rowPtr = new Int32Array(n + 1);
  const col = new Int32Array(n * 4);
  const w = new Float64Array(n * 4);
  const yLast = g.y0 + (ny - 1) * g.dy;
  let q = 0;
  for (let p = 0; p < n; p++) {
    const y = lat[p];
    if (y >= g.yLo && y <= g.yHi) {
      // plain assignments: array destructuring is slow before the optimising compiler steps in
      let j0 = 0, fy = 0;
      if (y >= yLast) j0 = ny - 1;
      else if (y > g.y0) {
        const u = (y - g.y0) / g.dy;
        j0 = Math.min(Math.floor(u), ny - 2);
        fy = u - j0;
      }
      let u = (lon[p] - g.x0) / g.dx;
      u -= nx * Math.floor(u / nx);
      let i0 = Math.floor(u);
      let fx = u - i0;
      if (i0 >= nx) {
        i0 = nx - 1;
        fx = 1;
      }
      const i1 = i0 + 1 === nx ? 0 : i0 + 1;
      const r0 = j0 * nx, r1 = (j0 + 1) * nx;
      // the locator's order: (j0, i0), (j0, i1), (j1, i1), (j1, i0); zero weights left out
      const w00 = (1 - fx) * (1 - fy), w01 = fx * (1 - fy), w11 = fx * fy, w10 = (1 - fx) * fy;
      if (w00 > 0) { col[q] = r0 + i0; w[q++] = w00; }
      if (w01 > 0) { col[q] = r0 + i1; w[q++] = w01; }
      if (w11 > 0) { col[q] = r1 + i1; w[q++] = w11; }
      if (w10 > 0) { col[q] = r1 + i0; w[q++] = w10; }
    }
    rowPtr[p + 1] = q;
  }
  return { method: 'bilinear', nRows: n, nCols: nx * ny, rowPtr, col: col.slice(0, q), w: w.slice(0, q) };
}
