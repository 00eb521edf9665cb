/**
 * Numbers of a 12-month cycle (January first): its range, the month of its maximum, the phase of its first
 * harmonic, and the correlation of two cycles. Phase differences are in months, wrapped into [-6, 6):
 * positive when the first cycle peaks later than the second.
 */

/** Peak-to-trough range, max − min (null if a month is missing). */
export function cycleRange(x: ArrayLike<number>): number | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (let m = 0; m < 12; m++) {
    const v = x[m];
    if (!Number.isFinite(v)) return null;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return hi - lo;
}

/** The month (0 = January) of the cycle's maximum; the first one on a tie. */
export function monthOfMaximum(x: ArrayLike<number>): number | null {
  let best = -1;
  for (let m = 0; m < 12; m++) {
    if (!Number.isFinite(x[m])) return null;
    if (best < 0 || x[m] > x[best]) best = m;
  }
  return best;
}

/**
 * When the first harmonic peaks, in months from January's value (0 ≤ t < 12): with the discrete Fourier
 * coefficient X1 = Σ x_m·e^(−2πi·m/12) (numpy.fft.fft's sign convention), the harmonic is
 * |X1|/6·cos(2π·m/12 + arg X1), largest at m = −arg(X1)·12/(2π). Null for a missing month or a flat cycle.
 */
export function harmonicPeak(x: ArrayLike<number>): number | null {
  let re = 0;
  let im = 0;
  for (let m = 0; m < 12; m++) {
    if (!Number.isFinite(x[m])) return null;
    const a = (2 * Math.PI * m) / 12;
    re += x[m] * Math.cos(a);
    im -= x[m] * Math.sin(a);
  }
  let scale = 0;
  for (let m = 0; m < 12; m++) scale = Math.max(scale, Math.abs(x[m]));
  if (Math.hypot(re, im) <= 1e-12 * scale * 12) return null;
  const t = (-Math.atan2(im, re) * 12) / (2 * Math.PI);
  return ((t % 12) + 12) % 12;
}

/** A difference of months on the circle of the year, in [-6, 6). */
export function wrapMonths(d: number): number {
  return ((((d + 6) % 12) + 12) % 12) - 6;
}

/** Pearson correlation of two cycles over the 12 months; NaN if a month is missing or a cycle is flat. */
export function cycleCorrelation(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let sa = 0;
  let sb = 0;
  for (let m = 0; m < 12; m++) {
    sa += a[m];
    sb += b[m];
  }
  const ma = sa / 12;
  const mb = sb / 12;
  let saa = 0;
  let sbb = 0;
  let sab = 0;
  for (let m = 0; m < 12; m++) {
    const da = a[m] - ma;
    const db = b[m] - mb;
    saa += da * da;
    sbb += db * db;
    sab += da * db;
  }
  return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : NaN;
}
