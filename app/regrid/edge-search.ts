/**
 * Edges of a 1-D axis in increasing order with the map back to the original cell index, so that
 * descending axes (latitude from north to south, longitudes running west) need no special cases.
 */
export interface AscendingEdges {
  edges: Float64Array;
  /** original cell index of ascending cell c */
  index: Int32Array;
}

export function ascendingEdges(edges: Float64Array): AscendingEdges {
  const n = edges.length - 1;
  const index = new Int32Array(n);
  if (n >= 1 && edges[n] < edges[0]) {
    const asc = new Float64Array(n + 1);
    for (let i = 0; i <= n; i++) asc[i] = edges[n - i];
    for (let c = 0; c < n; c++) index[c] = n - 1 - c;
    return { edges: asc, index };
  }
  for (let c = 0; c < n; c++) index[c] = c;
  return { edges, index };
}

/** Index of the last edge <= x (binary search), clamped to [0, edges.length - 1]. */
export function lowerEdge(edges: Float64Array, x: number): number {
  let lo = 0, hi = edges.length - 1;
  if (x < edges[0]) return 0;
  if (x >= edges[hi]) return hi;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (edges[mid] <= x) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Cells [c0, c1) of ascending edges that may overlap [a, b]. */
export function cellRange(edges: Float64Array, a: number, b: number): [number, number] {
  const n = edges.length - 1;
  if (b <= edges[0] || a >= edges[n]) return [0, 0];
  const c0 = lowerEdge(edges, a);
  let c1 = lowerEdge(edges, b) + 1;
  if (c1 > n) c1 = n;
  return [Math.min(c0, n), c1];
}
