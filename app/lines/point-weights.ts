/**
 * Horizontal weights of scattered points on any grid, as a sparse matrix (rows = points, columns =
 * grid cells; app/regrid/csr.ts), built with the regridder's point locator (app/regrid/locate.ts):
 * - bilinear: the surrounding cell centres with bilinear weights (summing to 1);
 * - nearest: the containing cell, then its neighbours by distance, weight 1 each
 *   (the first wet candidate wins, as in app/regrid/csr.ts applyFirstValid).
 * A point outside a regional grid gets an empty row (NaN when applied).
 */
import type { HorizontalGrid } from '../grid/types.js';
import type { SparseWeights } from '../regrid/csr.js';
import { PointLocator, newStencil } from '../regrid/locate.js';

export type PointMethod = 'bilinear' | 'nearest';

export function pointWeights(grid: HorizontalGrid, lon: ArrayLike<number>, lat: ArrayLike<number>, method: PointMethod = 'bilinear'): SparseWeights {
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
