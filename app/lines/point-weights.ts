/**
 * Horizontal weights of scattered points on a rectilinear grid, as a sparse matrix
 * (rows = points, columns = grid cells; app/regrid/csr.ts):
 * - bilinear: the four surrounding cell centres with bilinear weights (summing to 1);
 * - nearest: the same four centres as candidates sorted by great-circle distance, weight 1 each
 *   (the first wet candidate wins, as in app/regrid/csr.ts applyFirstValid).
 * Longitude wraps on periodic grids; beyond the first or last latitude centre the nearest row is used.
 * A point outside a non-periodic grid gets an empty row (NaN when applied).
 */
import { StillwaterError } from '../errors.js';
import type { HorizontalGrid } from '../grid/types.js';
import { TripletBuilder, type SparseWeights } from '../regrid/csr.js';
import { centralAngle } from './great-circle.js';

export type PointMethod = 'bilinear' | 'nearest';

/** Index i with axis[i] <= x < axis[i + 1] (axis increasing), -1 below, n - 1 at or above the last. */
function bracket(axis: Float64Array, x: number): number {
  const n = axis.length;
  if (x < axis[0]) return -1;
  if (x >= axis[n - 1]) return n - 1;
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (axis[mid] <= x) lo = mid;
    else hi = mid;
  }
  return lo;
}

export function pointWeights(grid: HorizontalGrid, lon: ArrayLike<number>, lat: ArrayLike<number>, method: PointMethod = 'bilinear'): SparseWeights {
  const axes = grid.axes;
  if (!axes) {
    throw new StillwaterError('E_GRID', 'Sampling along lines and at stations needs a rectilinear (lat-lon) common grid; choose a regular common grid in the recipe.');
  }
  const { nx, ny } = grid;
  const ax = axes.lon;
  const ay = axes.lat;
  const lon0 = axes.lonEdges[0];
  const b = new TripletBuilder(lon.length * 4 + 4);
  const cells = [0, 0, 0, 0];
  const wts = [0, 0, 0, 0];
  for (let p = 0; p < lon.length; p++) {
    let x = lon[p];
    const y = lat[p];
    if (grid.periodic) x = lon0 + ((((x - lon0) % 360) + 360) % 360);
    else if (x < axes.lonEdges[0] || x > axes.lonEdges[nx]) {
      // try the other longitude convention before giving up
      const alt = x < axes.lonEdges[0] ? x + 360 : x - 360;
      if (alt < axes.lonEdges[0] || alt > axes.lonEdges[nx]) continue;
      x = alt;
    }
    // longitude neighbours and fraction
    let i0 = bracket(ax, x), i1: number, fx: number;
    if (i0 === -1 || i0 === nx - 1) {
      if (grid.periodic && nx > 1) {
        // between the last centre and the first centre + 360
        i0 = nx - 1;
        i1 = 0;
        const xl = ax[nx - 1];
        const xr = ax[0] + 360;
        const xx = x < ax[0] ? x + 360 : x;
        fx = (xx - xl) / (xr - xl);
      } else {
        i0 = i0 === -1 ? 0 : nx - 1;
        i1 = i0;
        fx = 0;
      }
    } else {
      i1 = i0 + 1;
      fx = (x - ax[i0]) / (ax[i1] - ax[i0]);
    }
    let j0 = bracket(ay, y), j1: number, fy: number;
    if (j0 === -1 || j0 === ny - 1) {
      j0 = j0 === -1 ? 0 : ny - 1;
      j1 = j0;
      fy = 0;
    } else {
      j1 = j0 + 1;
      fy = (y - ay[j0]) / (ay[j1] - ay[j0]);
    }
    cells[0] = j0 * nx + i0;
    cells[1] = j0 * nx + i1;
    cells[2] = j1 * nx + i0;
    cells[3] = j1 * nx + i1;
    if (method === 'bilinear') {
      wts[0] = (1 - fx) * (1 - fy);
      wts[1] = fx * (1 - fy);
      wts[2] = (1 - fx) * fy;
      wts[3] = fx * fy;
      // merge duplicates (clamped edges), drop zero weights, keep the row short
      for (let c = 0; c < 4; c++) {
        for (let e = 0; e < c; e++) {
          if (cells[e] === cells[c] && wts[e] > 0) {
            wts[e] += wts[c];
            wts[c] = 0;
          }
        }
      }
      for (let c = 0; c < 4; c++) if (wts[c] > 0) b.push(p, cells[c], wts[c]);
    } else {
      const order = [0, 1, 2, 3]
        .filter((c, k, all) => all.findIndex((d) => cells[d] === cells[c]) === k)
        .map((c) => ({ c: cells[c], d: centralAngle({ lon: x, lat: y }, { lon: grid.lon[cells[c]], lat: grid.lat[cells[c]] }) }))
        .sort((u, v) => u.d - v.d);
      for (const o of order) b.push(p, o.c, 1);
    }
  }
  return b.toCsr(method, lon.length, nx * ny);
}
