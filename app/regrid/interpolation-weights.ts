import type { HorizontalGrid } from '../grid/types.js';
import { TripletBuilder, type SparseWeights } from './csr.js';
import { PointLocator, newStencil } from './locate.js';

/** Bilinear weights: each target cell centre sampled between the four surrounding source centres. */
export function bilinearWeights(source: HorizontalGrid, target: HorizontalGrid): SparseWeights {
  const loc = new PointLocator(source);
  const st = newStencil();
  const n = target.nx * target.ny;
  const b = new TripletBuilder(n * 4);
  for (let t = 0; t < n; t++) {
    if (!loc.bilinear(target.lon[t], target.lat[t], st)) continue;
    for (let k = 0; k < st.n; k++) if (st.w[k] > 0) b.push(t, st.idx[k], st.w[k]);
  }
  return b.toCsr('bilinear', n, source.nx * source.ny);
}

/** Nearest-wet candidates: the source cell holding the target centre, then its neighbours by distance. */
export function nearestWeights(source: HorizontalGrid, target: HorizontalGrid): SparseWeights {
  const loc = new PointLocator(source);
  const cand = new Int32Array(9);
  const n = target.nx * target.ny;
  const b = new TripletBuilder(n * 9);
  for (let t = 0; t < n; t++) {
    const m = loc.nearest(target.lon[t], target.lat[t], cand);
    for (let k = 0; k < m; k++) b.push(t, cand[k], 1);
  }
  return b.toCsr('nearest', n, source.nx * source.ny);
}
