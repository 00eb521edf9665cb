/** Length of the overlap of two intervals [a0, a1] and [b0, b1] (a0 <= a1, b0 <= b1). */
export function overlap1d(a0: number, a1: number, b0: number, b1: number): number {
  const d = Math.min(a1, b1) - Math.max(a0, b0);
  return d > 0 ? d : 0;
}

/** Overlap of two longitude intervals in degrees, counting every 360° shift of the second. */
export function lonOverlap(a0: number, a1: number, b0: number, b1: number): number {
  const kmin = Math.ceil((a0 - b1) / 360);
  const kmax = Math.floor((a1 - b0) / 360);
  let s = 0;
  for (let k = kmin; k <= kmax; k++) s += overlap1d(a0, a1, b0 + 360 * k, b1 + 360 * k);
  return s;
}
