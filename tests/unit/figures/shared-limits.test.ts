import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { sharedLimits, weightedQuantile, weightedQuantiles } from '../../../app/figures/shared-limits.js';

// tests/fixtures/figures/make_figures_fixtures.py: numpy's percentile (method "inverted_cdf") of a sample in
// which each value appears as often as its integer weight, i.e. the weighted inverted-CDF percentile
const fx = JSON.parse(readFileSync(join(__dirname, '../../fixtures/figures/pooled-percentile.json'), 'utf8')) as {
  weights: number[];
  reference: (number | null)[];
  runs: (number | null)[][];
  difference_p98_abs: number;
  field_p02: number;
  field_p98: number;
};
const arr = (a: (number | null)[]) => Float64Array.from(a, (v) => (v === null ? NaN : v));

describe('shared colour limits of a multi-panel figure', () => {
  const ref = arr(fx.reference);
  const runs = fx.runs.map(arr);
  const diffs = runs.map((r) => r.map((v, i) => v - ref[i]));
  const w = Float64Array.from(fx.weights);

  it('the difference limit is the pooled area-weighted 98th percentile of |run − reference| (numpy)', () => {
    const lim = sharedLimits([ref, ...runs], diffs, w);
    expect(lim.difference).toBeCloseTo(fx.difference_p98_abs, 12);
    expect(lim.differenceSource).toBe('pooled 98th percentile');
  });

  it('the field range spans the pooled area-weighted 2nd to 98th percentiles of reference and runs (numpy)', () => {
    const lim = sharedLimits([ref, ...runs], diffs, w);
    expect(lim.field![0]).toBeCloseTo(fx.field_p02, 12);
    expect(lim.field![1]).toBeCloseTo(fx.field_p98, 12);
  });

  it('a limit fixed by the recipe wins over the percentile', () => {
    expect(sharedLimits([ref], diffs, w, 7.5).difference).toBe(7.5);
  });

  it('pooling matters: one run with large errors widens the scale of all differences', () => {
    const small = sharedLimits([ref], [diffs[0]], w).difference!;
    const pooled = sharedLimits([ref], diffs, w).difference!;
    expect(pooled).toBeGreaterThan(small);
  });

  it('weights count: a heavy cell pulls the quantile to itself (inverted CDF definition)', () => {
    expect(weightedQuantile([Float64Array.of(1, 2, 3)], [Float64Array.of(1, 1, 100)], 0.05)).toBe(3);
    expect(weightedQuantile([Float64Array.of(1, 2, 3)], [Float64Array.of(1, 1, 1)], 0.5)).toBe(2);
  });

  it('no values: no limit', () => {
    expect(weightedQuantile([Float64Array.of(NaN)], [Float64Array.of(1)], 0.5)).toBeNull();
    expect(sharedLimits([Float64Array.of(NaN)], [Float64Array.of(NaN)], Float64Array.of(1)).difference).toBeNull();
  });
});

describe('weighted quantiles found through a histogram', () => {
  // the definition (inverted CDF, as numpy's percentile method "inverted_cdf" on a weight-repeated sample):
  // sort everything, the first value whose cumulative weight reaches q of the total
  const bySorting = (v: number[], w: number[], q: number): number => {
    const order = v.map((_, i) => i).sort((a, b) => v[a] - v[b]);
    const total = w.reduce((s, x) => s + x, 0);
    let cum = 0;
    for (const i of order) {
      cum += w[i];
      if (cum >= q * total * (1 - 1e-12)) return v[i];
    }
    return v[order[order.length - 1]];
  };
  it('equal the full sort on clustered values with ties and NaN (one bin holding most cells)', () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const v: number[] = [];
    const w: number[] = [];
    for (let i = 0; i < 20000; i++) {
      const r = rnd();
      v.push(r < 0.01 ? 1e6 * rnd() : r < 0.05 ? NaN : Math.round(rnd() * 50) / 10);
      w.push(0.1 + rnd());
    }
    const kept = v.map((x, i) => [x, w[i]]).filter(([x]) => x === x);
    const qs = [0, 0.02, 0.25, 0.5, 0.9, 0.98, 0.999, 1];
    const got = weightedQuantiles([Float64Array.from(v)], [Float64Array.from(w)], qs);
    qs.forEach((q, i) => expect(got[i]).toBe(bySorting(kept.map((k) => k[0]), kept.map((k) => k[1]), q)));
  });
});
