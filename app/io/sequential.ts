/**
 * Noticing level-by-level reading: a slab with the same count as the previous one, its start
 * moved by exactly that count along one dimension. Readers use it to fetch the next slab ahead.
 */
export interface SlabRecord {
  start: number[];
  count: number[];
}

/** The dimension along which `start` follows `last`, or -1. */
export function stepDimension(last: SlabRecord | undefined, start: number[], count: number[]): number {
  if (!last || last.count.length !== count.length) return -1;
  let dim = -1;
  for (let i = 0; i < count.length; i++) {
    if (last.count[i] !== count[i]) return -1;
    if (last.start[i] === start[i]) continue;
    if (dim >= 0 || start[i] !== last.start[i] + count[i]) return -1;
    dim = i;
  }
  return dim;
}

/** The slab `k` steps further along `dim`, or undefined past the end of `shape`. */
export function slabAhead(start: number[], count: number[], dim: number, k: number, shape: number[]): number[] | undefined {
  const next = start.slice();
  next[dim] += k * count[dim];
  return next[dim] + count[dim] <= shape[dim] ? next : undefined;
}
