/**
 * Colour limits shared by the panels of one figure: one range for the reference and all runs, and one
 * symmetric range for all the differences. Both come from area-weighted percentiles pooled over the panels,
 * so that a panel's colours mean the same number as in its neighbours and a few extreme cells do not
 * stretch the scale.
 */

/** Bins of the first pass: only the cells of the bin where a quantile falls are sorted. */
const BINS = 4096;

/**
 * The q-quantiles (0..1) of values with weights, the inverted empirical distribution function: for each q the
 * smallest value whose cumulative weight reaches q of the total (numpy's percentile, method "inverted_cdf", on
 * a sample where every value appears in proportion to its weight). NaN values and non-positive weights are
 * skipped; null when nothing is left. A histogram of the weights finds the bin where each quantile falls, and
 * only that bin's cells are sorted (the result is the full sort's; sorting a whole level took most of a figure).
 */
export function weightedQuantiles(values: ArrayLike<number>[], weights: ArrayLike<number>[], qs: number[]): (number | null)[] {
  let n = 0;
  let lo = Infinity;
  let hi = -Infinity;
  let total = 0;
  for (let a = 0; a < values.length; a++) {
    const va = values[a];
    const wa = weights[a];
    for (let i = 0; i < va.length; i++) {
      const x = va[i];
      if (x === x && wa[i] > 0) {
        n++;
        total += wa[i];
        if (x < lo) lo = x;
        if (x > hi) hi = x;
      }
    }
  }
  if (n === 0) return qs.map(() => null);
  if (!(hi > lo)) return qs.map(() => lo);
  const scale = BINS / (hi - lo);
  const binOf = (x: number): number => Math.min(BINS - 1, Math.floor((x - lo) * scale));
  const binWeight = new Float64Array(BINS);
  for (let a = 0; a < values.length; a++) {
    const va = values[a];
    const wa = weights[a];
    for (let i = 0; i < va.length; i++) if (va[i] === va[i] && wa[i] > 0) binWeight[binOf(va[i])] += wa[i];
  }
  return qs.map((q) => {
    // relative tolerance: the running sum differs from numpy's normalised cumulative sum by round-off only
    const target = Math.min(1, Math.max(0, q)) * total * (1 - 1e-12);
    let cum = 0;
    for (let b = 0; b < BINS; b++) {
      if (binWeight[b] === 0 || cum + binWeight[b] < target) {
        cum += binWeight[b];
        continue;
      }
      const v: number[] = [];
      const w: number[] = [];
      for (let a = 0; a < values.length; a++) {
        const va = values[a];
        const wa = weights[a];
        for (let i = 0; i < va.length; i++) {
          if (va[i] === va[i] && wa[i] > 0 && binOf(va[i]) === b) {
            v.push(va[i]);
            w.push(wa[i]);
          }
        }
      }
      const order = v.map((_, i) => i).sort((x, y) => v[x] - v[y]);
      for (const i of order) {
        cum += w[i];
        if (cum >= target) return v[i];
      }
    }
    return hi;
  });
}

/** One weighted quantile (see weightedQuantiles). */
export function weightedQuantile(values: ArrayLike<number>[], weights: ArrayLike<number>[], q: number): number | null {
  return weightedQuantiles(values, weights, [q])[0];
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
  const [lo, hi] = weightedQuantiles(fields, fw, [0.02, 0.98]);
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
