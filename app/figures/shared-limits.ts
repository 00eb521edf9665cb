/**
 * Colour limits shared by the panels of one figure: one range for the reference and all runs, and one
 * symmetric range for all the differences. Both come from area-weighted percentiles pooled over the panels,
 * so that a panel's colours mean the same number as in its neighbours and a few extreme cells do not
 * stretch the scale.
 */

/**
 * The q-quantile (0..1) of values with weights, the inverted empirical distribution function: the smallest
 * value whose cumulative weight reaches q of the total (numpy's percentile, method "inverted_cdf", on a
 * sample where every value appears in proportion to its weight). NaN values and non-positive weights are
 * skipped; null when nothing is left.
 */
export function weightedQuantile(values: ArrayLike<number>[], weights: ArrayLike<number>[], q: number): number | null {
  let n = 0;
  for (let a = 0; a < values.length; a++) for (let i = 0; i < values[a].length; i++) if (values[a][i] === values[a][i] && weights[a][i] > 0) n++;
  if (n === 0) return null;
  const v = new Float64Array(n);
  const w = new Float64Array(n);
  let p = 0;
  let total = 0;
  for (let a = 0; a < values.length; a++) {
    const va = values[a];
    const wa = weights[a];
    for (let i = 0; i < va.length; i++) {
      if (va[i] === va[i] && wa[i] > 0) {
        v[p] = va[i];
        w[p] = wa[i];
        total += wa[i];
        p++;
      }
    }
  }
  const order = new Uint32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  order.sort((a, b) => v[a] - v[b]);
  const target = Math.min(1, Math.max(0, q)) * total;
  let cum = 0;
  for (let i = 0; i < n; i++) {
    cum += w[order[i]];
    // relative tolerance: the running sum differs from numpy's normalised cumulative sum by round-off only
    if (cum >= target * (1 - 1e-12)) return v[order[i]];
  }
  return v[order[n - 1]];
}

export interface SharedLimits {
  /** the range of the reference and every run */
  field: [number, number] | null;
  /** ± this for every difference */
  difference: number | null;
  /** how the difference limit was chosen, for a caption */
  differenceSource: 'pooled 98th percentile' | 'fixed by the recipe';
}

/**
 * Shared limits for a multi-panel figure. `area` weighs each cell (the same grid for every panel). The field
 * range spans the pooled area-weighted 2nd to 98th percentile of the reference and the runs; the difference
 * limit is the pooled area-weighted 98th percentile of |run − reference| over the runs, unless `fixed` is given.
 */
export function sharedLimits(fields: ArrayLike<number>[], differences: ArrayLike<number>[], area: ArrayLike<number>, fixed?: number | null): SharedLimits {
  const fw = fields.map(() => area);
  const lo = weightedQuantile(fields, fw, 0.02);
  const hi = weightedQuantile(fields, fw, 0.98);
  let field: [number, number] | null = null;
  if (lo !== null && hi !== null) {
    if (hi > lo) field = [lo, hi];
    else {
      const d = Math.abs(lo) > 0 ? Math.abs(lo) * 0.01 : 1;
      field = [lo - d, hi + d];
    }
  }
  if (fixed !== undefined && fixed !== null) return { field, difference: fixed, differenceSource: 'fixed by the recipe' };
  const magnitudes = differences.map((d) => {
    const m = new Float64Array(d.length);
    for (let i = 0; i < d.length; i++) m[i] = Math.abs(d[i]);
    return m;
  });
  let difference = weightedQuantile(magnitudes, differences.map(() => area), 0.98);
  if (difference !== null && !(difference > 0)) difference = 1e-12 + Math.abs(difference);
  return { field, difference, differenceSource: 'pooled 98th percentile' };
}
