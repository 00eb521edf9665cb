/**
 * Turning points of a trajectory that overshoots and turns back. A reversal counts only when the series
 * retreats from its running extreme by more than a tolerance: 5 % of its range, and at least five times the
 * point-to-point noise (estimated from second differences), so that noise on a settled series is not
 * mistaken for an overshoot.
 */
export const TURN_FRACTION_OF_RANGE = 0.05;
const NOISE_MULTIPLE = 5;

/** Robust noise estimate: median |second difference| scaled to a standard deviation (√6 for white noise). */
export function noiseLevel(x: ArrayLike<number>): number {
  const n = x.length;
  if (n < 3) return 0;
  const d = new Float64Array(n - 2);
  for (let i = 1; i < n - 1; i++) d[i - 1] = Math.abs(x[i + 1] - 2 * x[i] + x[i - 1]);
  d.sort();
  const med = d.length % 2 ? d[(d.length - 1) / 2] : 0.5 * (d[d.length / 2 - 1] + d[d.length / 2]);
  // 0.6745 turns a median absolute value into a standard deviation for Gaussian noise
  return med / 0.6745 / Math.sqrt(6);
}

/** Indices of the turning points (the extremes where the direction reverses), in order. */
export function turningPoints(x: ArrayLike<number>): number[] {
  const n = x.length;
  if (n < 3) return [];
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    lo = Math.min(lo, x[i]);
    hi = Math.max(hi, x[i]);
  }
  const tol = Math.max(TURN_FRACTION_OF_RANGE * (hi - lo), NOISE_MULTIPLE * noiseLevel(x));
  if (!(tol > 0)) return [];
  const turns: number[] = [];
  // direction: +1 rising, -1 falling, 0 not yet known
  let dir = 0;
  let ext = 0;
  for (let i = 1; i < n; i++) {
    if (dir === 0) {
      if (x[i] - x[0] > tol) dir = 1;
      else if (x[0] - x[i] > tol) dir = -1;
      if (dir !== 0) ext = i;
      else if (Math.abs(x[i] - x[0]) > Math.abs(x[ext] - x[0])) ext = i;
      continue;
    }
    if (dir === 1) {
      if (x[i] >= x[ext]) ext = i;
      else if (x[ext] - x[i] > tol) {
        turns.push(ext);
        dir = -1;
        ext = i;
      }
    } else {
      if (x[i] <= x[ext]) ext = i;
      else if (x[i] - x[ext] > tol) {
        turns.push(ext);
        dir = 1;
        ext = i;
      }
    }
  }
  return turns;
}
