/**
 * Horizontal weights of scattered points on any grid, as a sparse matrix (rows = points, columns =
 * grid cells; app/regrid/csr.ts), built with the regridder's point locator (app/regrid/locate.ts):
 * - bilinear: the surrounding cell centres with bilinear weights (summing to 1);
 * - nearest: the containing cell, then its neighbours by distance, weight 1 each
 *   (the first wet candidate wins, as in app/regrid/csr.ts applyFirstValid).
 * A point outside a regional grid gets an empty row (NaN when applied).
 */
import type { HorizontalGrid } from '../grid/types.js';
import { TripletBuilder, type SparseWeights } from '../regrid/csr.js';
import { PointLocator, newStencil } from '../regrid/locate.js';

export type PointMethod = 'bilinear' | 'nearest';

export function pointWeights(grid: HorizontalGrid, lon: ArrayLike<number>, lat: ArrayLike<number>, method: PointMethod = 'bilinear'): SparseWeights {
  const loc = new PointLocator(grid);
  const n = lon.length;
  const b = new TripletBuilder(n * (method === 'bilinear' ? 4 : 9) + 4);
  if (method === 'bilinear') {
    const st = newStencil();
    for (let p = 0; p < n; p++) {
      if (!loc.bilinear(lon[p], lat[p], st)) continue;
      for (let k = 0; k < st.n; k++) if (st.w[k] > 0) b.push(p, st.idx[k], st.w[k]);
    }
  } else {
    const cand = new Int32Array(9);
    for (let p = 0; p < n; p++) {
      const m = loc.nearest(lon[p], lat[p], cand);
      for (let k = 0; k < m; k++) b.push(p, cand[k], 1);
    }
  }
  return b.toCsr(method, n, grid.nx * grid.ny);
}
