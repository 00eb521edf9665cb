import type { VerticalAxis } from '../grid/types.js';

/**
 * Vertical remapping as a small sparse matrix: for target layer k, source layers src[p] with weight
 * h[p] for p in [start[k], start[k+1]). `ref[k]` is what the weights of a fully covered layer add
 * up to, so that coverage = Σ valid weights / ref.
 */
export interface VerticalWeights {
  nz: number;
  start: Int32Array;
  src: Int32Array;
  h: Float64Array;
  ref: Float64Array;
}

/** Thickness-weighted overlap of source layers [e_k, e_k+1] with target layers (conserves the column integral). */
export function layerOverlapWeights(source: VerticalAxis, target: VerticalAxis): VerticalWeights {
  const src: number[] = [], h: number[] = [];
  const start = new Int32Array(target.nz + 1);
  const se = source.edges, te = target.edges;
  for (let k = 0; k < target.nz; k++) {
    const top = te[k], bot = te[k + 1];
    for (let s = 0; s < source.nz; s++) {
      const d = Math.min(bot, se[s + 1]) - Math.max(top, se[s]);
      if (d > 0) {
        src.push(s);
        h.push(d);
      }
    }
    start[k + 1] = src.length;
  }
  return { nz: target.nz, start, src: Int32Array.from(src), h: Float64Array.from(h), ref: Float64Array.from(target.thickness) };
}

/**
 * Linear interpolation in depth between source level centres at each target centre. Above the first
 * centre (within the top layer) and below the last (within the bottom layer) the nearest level holds.
 */
export function linearDepthWeights(source: VerticalAxis, target: VerticalAxis): VerticalWeights {
  const src: number[] = [], h: number[] = [];
  const start = new Int32Array(target.nz + 1);
  const c = source.centres, n = source.nz;
  for (let k = 0; k < target.nz; k++) {
    const z = target.centres[k];
    if (z >= source.edges[0] && z <= source.edges[n]) {
      if (z <= c[0]) {
        src.push(0);
        h.push(1);
      } else if (z >= c[n - 1]) {
        src.push(n - 1);
        h.push(1);
      } else {
        let s = 0;
        while (c[s + 1] < z) s++;
        const f = (z - c[s]) / (c[s + 1] - c[s]);
        if (f < 1) {
          src.push(s);
          h.push(1 - f);
        }
        if (f > 0) {
          src.push(s + 1);
          h.push(f);
        }
      }
    }
    start[k + 1] = src.length;
  }
  return { nz: target.nz, start, src: Int32Array.from(src), h: Float64Array.from(h), ref: new Float64Array(target.nz).fill(1) };
}

/** Same levels on both sides (or a 2-D field): each target level is its source level. */
export function identityWeights(nz: number): VerticalWeights {
  const start = new Int32Array(nz + 1);
  const src = new Int32Array(nz);
  for (let k = 0; k < nz; k++) {
    start[k + 1] = k + 1;
    src[k] = k;
  }
  return { nz, start, src, h: new Float64Array(nz).fill(1), ref: new Float64Array(nz).fill(1) };
}
