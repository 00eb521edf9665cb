/**
 * A base-10 logarithmic axis: where a value lies along it, and its ticks (a major tick at every power of ten,
 * minor ticks at 2–9 times it). Model years of a spin-up span decades, so equal distances mean equal ratios.
 */

export interface LogTicks {
  /** powers of ten inside the domain */
  major: number[];
  /** 2..9 × a power of ten inside the domain */
  minor: number[];
}

/** The domain [lo, hi] widened outwards to whole decades, e.g. [10, 5000] → [10, 10000]. Non-positive values are invalid. */
export function decadeDomain(lo: number, hi: number): [number, number] {
  if (!(lo > 0) || !(hi > 0) || !Number.isFinite(lo) || !Number.isFinite(hi)) throw new RangeError(`a logarithmic axis needs positive finite limits, not ${lo} and ${hi}`);
  const a = Math.floor(Math.log10(Math.min(lo, hi)) + 1e-9);
  let b = Math.ceil(Math.log10(Math.max(lo, hi)) - 1e-9);
  if (b === a) b = a + 1;
  return [10 ** a, 10 ** b];
}

/** Position of v on [r0, r1] for a domain [d0, d1] on a log scale (NaN for v ≤ 0). */
export function logPosition(v: number, domain: [number, number], range: [number, number]): number {
  if (!(v > 0)) return NaN;
  const l0 = Math.log10(domain[0]);
  const l1 = Math.log10(domain[1]);
  return range[0] + ((Math.log10(v) - l0) / (l1 - l0)) * (range[1] - range[0]);
}

/** Major and minor ticks inside [lo, hi] (inclusive, with a relative tolerance for rounding). */
export function logTicks(lo: number, hi: number): LogTicks {
  const major: number[] = [];
  const minor: number[] = [];
  if (!(lo > 0) || !(hi > lo)) return { major, minor };
  const inside = (v: number) => v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9);
  for (let e = Math.floor(Math.log10(lo)); e <= Math.ceil(Math.log10(hi)); e++) {
    const p = 10 ** e;
    if (inside(p)) major.push(p);
    for (let m = 2; m <= 9; m++) if (inside(m * p)) minor.push(m * p);
  }
  return { major, minor };
}

/** A tick label: whole numbers as they are (10, 100, 10000), small powers as decimals (0.1, 0.01). */
export function logTickText(v: number): string {
  if (v >= 1) return String(Math.round(v));
  return String(Number(v.toPrecision(1)));
}
