/**
 * How values meet a colour scale beyond the plain linear stretch: a logarithmic stretch for quantities that
 * span decades (nutrients, chlorophyll-like fields), its ticks, and whether values fall outside the range
 * (the colour bar then carries an arrow at that end).
 */

/** log10 of each value; values at or below zero become -Infinity (drawn in the lowest colour), NaN stays NaN. */
export function log10Values(values: Float32Array): Float32Array {
  const out = new Float32Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    out[i] = v !== v ? NaN : v > 0 ? Math.log10(v) : -Infinity;
  }
  return out;
}

/** The positive part of a range for a logarithmic stretch: a lower end at or below zero becomes max / 1000. */
export function positiveRange(min: number, max: number): [number, number] | null {
  if (!(max > 0)) return null;
  const lo = min > 0 ? min : max / 1000;
  return lo < max ? [lo, max] : [max / 10, max];
}

/** Ticks of a logarithmic axis over [min, max] (both > 0): 1, 2, 5 × 10^k, thinned to 1 × 10^k over many decades. */
export function logTicks(min: number, max: number): number[] {
  if (!(min > 0 && max > min)) return [];
  const k0 = Math.floor(Math.log10(min));
  const k1 = Math.ceil(Math.log10(max));
  const mantissas = k1 - k0 > 3 ? [1] : [1, 2, 5];
  const ticks: number[] = [];
  for (let k = k0; k <= k1; k++) {
    for (const m of mantissas) {
      const v = Number((m * 10 ** k).toPrecision(12));
      if (v >= min * (1 - 1e-9) && v <= max * (1 + 1e-9)) ticks.push(v);
    }
  }
  return ticks;
}

/** Whether any value lies below `min` or above `max` (NaN ignored). */
export function clipped(values: ArrayLike<number>, min: number, max: number): { below: boolean; above: boolean } {
  let below = false;
  let above = false;
  for (let i = 0; i < values.length && !(below && above); i++) {
    const v = values[i];
    if (v < min) below = true;
    else if (v > max) above = true;
  }
  return { below, above };
}
