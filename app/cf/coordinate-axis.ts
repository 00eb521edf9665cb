/**
 * 1-D coordinate axes put in the grid's order (increasing), with the index map back to the file's order,
 * and cell edges from CF bounds or derived from centres.
 */

export interface OrderedAxis {
  /** centres in grid order (increasing) */
  values: Float64Array;
  /** fileIndex[gridIndex]: where each grid position comes from in the file */
  fileIndex: Int32Array;
  /** true when the file order is already the grid order */
  identity: boolean;
}

/** Why an axis could not be ordered: the index where monotonicity breaks. */
export class NotMonotonic extends Error {
  constructor(
    readonly index: number,
    /** true when the value there is missing rather than out of order */
    readonly missing = false,
  ) {
    super(missing ? `missing value at index ${index}` : `not monotonic at index ${index}`);
  }
}

function identityAxis(values: Float64Array): OrderedAxis {
  const fileIndex = new Int32Array(values.length);
  for (let i = 0; i < values.length; i++) fileIndex[i] = i;
  return { values, fileIndex, identity: true };
}

/** Strictly increasing or strictly decreasing values → increasing (flipped if needed). */
export function orderMonotonic(values: Float64Array): OrderedAxis {
  const n = values.length;
  for (let i = 0; i < n; i++) if (!Number.isFinite(values[i])) throw new NotMonotonic(i, true);
  if (n < 2) return identityAxis(values);
  const up = values[1] > values[0];
  for (let i = 1; i < n; i++) if (up ? !(values[i] > values[i - 1]) : !(values[i] < values[i - 1])) throw new NotMonotonic(i);
  if (up) return identityAxis(values);
  const fileIndex = new Int32Array(n);
  const out = new Float64Array(n);
  for (let g = 0; g < n; g++) {
    fileIndex[g] = n - 1 - g;
    out[g] = values[n - 1 - g];
  }
  return { values: out, fileIndex, identity: false };
}

/**
 * Longitudes: monotonic ones as orderMonotonic; ones that wrap once (e.g. 180..359 then 0..179) are
 * rotated to start after the wrap, so that they increase, keeping the file's range (0..360 or -180..180).
 */
export function orderLongitudes(values: Float64Array): OrderedAxis {
  try {
    return orderMonotonic(values);
  } catch (e) {
    if (!(e instanceof NotMonotonic) || e.missing) throw e;
    const n = values.length;
    // one descent, everything else increasing, and the whole spanning less than a turn
    const drops: number[] = [];
    for (let i = 1; i < n; i++) if (!(values[i] > values[i - 1])) drops.push(i);
    if (drops.length !== 1 || !(values[0] > values[n - 1]) || values[drops[0] - 1] - values[drops[0]] > 360) throw e;
    const shift = drops[0];
    const fileIndex = new Int32Array(n);
    const out = new Float64Array(n);
    for (let g = 0; g < n; g++) {
      fileIndex[g] = (g + shift) % n;
      out[g] = values[fileIndex[g]];
    }
    return { values: out, fileIndex, identity: false };
  }
}

/** Midpoints between centres, extrapolated by half a step at both ends; optionally clipped (±90 for latitude). */
export function deriveEdges(centres: Float64Array, clip?: [number, number]): Float64Array {
  const n = centres.length;
  const edges = new Float64Array(n + 1);
  if (n === 1) {
    edges[0] = centres[0] - 0.5;
    edges[1] = centres[0] + 0.5;
  } else {
    for (let i = 1; i < n; i++) edges[i] = 0.5 * (centres[i - 1] + centres[i]);
    edges[0] = centres[0] - 0.5 * (centres[1] - centres[0]);
    edges[n] = centres[n - 1] + 0.5 * (centres[n - 1] - centres[n - 2]);
  }
  if (clip) for (let i = 0; i <= n; i++) edges[i] = Math.min(clip[1], Math.max(clip[0], edges[i]));
  return edges;
}

/**
 * Edges from CF bounds (n × 2, in the file's order), put in grid order. Each cell's two bounds may come in
 * either order; where neighbouring cells do not share a bound exactly, the edge is their midpoint.
 */
export function edgesFromBounds(bounds: Float64Array, axis: OrderedAxis, clip?: [number, number]): Float64Array {
  const n = axis.fileIndex.length;
  const lo = new Float64Array(n);
  const hi = new Float64Array(n);
  for (let g = 0; g < n; g++) {
    const f = axis.fileIndex[g];
    const a = bounds[2 * f];
    const b = bounds[2 * f + 1];
    lo[g] = Math.min(a, b);
    hi[g] = Math.max(a, b);
  }
  const edges = new Float64Array(n + 1);
  edges[0] = lo[0];
  for (let g = 1; g < n; g++) edges[g] = hi[g - 1] === lo[g] ? lo[g] : 0.5 * (hi[g - 1] + lo[g]);
  edges[n] = hi[n - 1];
  if (clip) for (let i = 0; i <= n; i++) edges[i] = Math.min(clip[1], Math.max(clip[0], edges[i]));
  return edges;
}
