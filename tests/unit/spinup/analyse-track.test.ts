import { describe, expect, it } from 'vitest';
import { analyseTrack, driftRate } from '../../../app/spinup/analyse-track.js';
import { chooseTail } from '../../../app/spinup/tail-window.js';
import { firstOrderSeries } from './seeded.js';

const years = (n: number, step: number, start = 0): number[] => Array.from({ length: n }, (_, i) => start + i * step);
const base = { units: 'mmol m-3', deep: false, thresholdPercentPerKyr: 0.1 };

describe('drift rate and verdict', () => {
  it('reports a constant series as settled with exactly zero drift', () => {
    const t = years(12, 500);
    const x = t.map(() => 2.5);
    const a = analyseTrack({ ...base, years: t, mean: x, inventory: x });
    expect(a.drift!.perKyr).toBe(0);
    expect(a.drift!.percentPerKyr).toBe(0);
    expect(a.verdict.status).toBe('settled');
    expect(a.monotonic).toBe(true);
    expect(a.fit).toBeNull();
  });

  it('measures the rate of a straight line exactly, per 1000 years and relative to the mean', () => {
    const t = years(11, 100, 1000);
    const x = t.map((ti) => 100 + 0.002 * ti); // 2 units per 1000 years
    const d = driftRate({ ...base, years: t, mean: x, inventory: x.map((v) => v * 10) });
    expect(d.perKyr).toBeCloseTo(2, 10);
    expect(d.inventoryPerKyr).toBeCloseTo(20, 9);
    // tail = last 10 % of 1000 years = years 1900 and 2000, fewer than 3 snapshots: the last 3
    expect(d.n).toBe(3);
    const windowMean = (100 + 0.002 * 1800 + 100 + 0.002 * 2000) / 2;
    expect(d.percentPerKyr!).toBeCloseTo((2 / windowMean) * 100, 10);
  });

  it('calls a first-order series drifting early and settled once the rate is below the threshold', () => {
    const t = years(50, 100);
    const x = firstOrderSeries(t, 1, 2, 400);
    const early = analyseTrack({ ...base, years: t.slice(0, 10), mean: x.slice(0, 10), inventory: x.slice(0, 10) });
    expect(early.verdict.status).toBe('drifting');
    const late = analyseTrack({ ...base, years: t, mean: x, inventory: x });
    expect(late.verdict.status).toBe('settled');
  });

  it('predicts when the drift falls below the threshold: analytic time for a first-order series', () => {
    // dense snapshots: the tail slope is the derivative to (h/τ)²/6 ≈ 0.2 %
    const t = years(31, 50);
    const x = firstOrderSeries(t, 1, 2, 800);
    const a = analyseTrack({ ...base, years: t, mean: x, inventory: x });
    expect(a.verdict.status).toBe('drifting');
    const f = a.fit!;
    expect(f.tau / 800 - 1).toBeCloseTo(0, 6);
    // |dx/dt| = (1/800)·e^(−t/800) per year equals the threshold (0.1 % of the tail mean per 1000 years) at t*
    const thresholdPerYear = (0.001 * a.drift!.windowMean) / 1000;
    const tStar = 800 * Math.log(1 / 800 / thresholdPerYear);
    expect(Math.abs(f.yearsToSettle! - (tStar - 1500))).toBeLessThan(5);
    // t90 = τ·ln 10 from x0 at t0
    expect(f.yearsTo90).toBeCloseTo(f.t0 + 800 * Math.LN10 - 1500, 3);
    expect(a.verdict.sentence).toMatch(/Still drifting/);
  });

  it('with a tail long compared with τ, years to settle come from the fit in closed form, not from the tail slope', () => {
    // x(t) = 2 − e^(−t/900) sampled every 100 years to year 3000, tail window 2000 years (exact for a
    // first-order system: the drift is (1/900)·e^(−t/900) per year)
    const tau = 900;
    const t = years(31, 100);
    const x = firstOrderSeries(t, 1, 2, tau);
    const a = analyseTrack({ ...base, years: t, mean: x, inventory: x, tailYears: 2000 });
    const f = a.fit!;
    expect(f.constrained).toBe(true);
    const thresholdPerYear = (0.001 * a.drift!.windowMean) / 1000;
    const tStar = tau * Math.log(1 / tau / thresholdPerYear);
    expect(Math.abs(f.yearsToSettle! - (tStar - 3000))).toBeLessThan(1);
    // the fit's own drift now, and the tail slope, which averages the steeper early part of the window
    const now = (1 / tau) * Math.exp(-3000 / tau) * 1000;
    expect(f.driftPerKyr / now - 1).toBeCloseTo(0, 4);
    expect(Math.abs(a.drift!.perKyr)).toBeGreaterThan(1.5 * Math.abs(now));
    expect(a.verdict.basis).toBe('first-order fit');
    expect(a.verdict.percentPerKyr).toBeCloseTo(f.driftPercentPerKyr!, 12);
    expect(a.verdict.sentence).toMatch(/by the first-order fit at model year 3000 \(the tail slope over model years 1000–3000 is [+−-]?\d/);
  });

  it('without a constrained fit the verdict is judged on the tail slope and says so', () => {
    const t = years(20, 100);
    const x = t.map((y) => 10 + 0.001 * y);
    const a = analyseTrack({ ...base, years: t, mean: x, inventory: x });
    expect(a.verdict.basis).toBe('tail slope');
    expect(a.verdict.percentPerKyr).toBe(a.drift!.percentPerKyr);
    expect(a.verdict.sentence).toMatch(/by the tail slope over model years/);
  });

  it('warns that a short run has not settled in the deep ocean (England 1995) when deep layers are involved', () => {
    const t = years(6, 100);
    const x = t.map(() => 5);
    const deep = analyseTrack({ ...base, deep: true, years: t, mean: x, inventory: x });
    expect(deep.verdict.deepCaution).toBe(true);
    expect(deep.verdict.sentence).toMatch(/England 1995/);
    const shallow = analyseTrack({ ...base, years: t, mean: x, inventory: x });
    expect(shallow.verdict.deepCaution).toBe(false);
    const long = analyseTrack({ ...base, deep: true, years: years(6, 1000), mean: x, inventory: x });
    expect(long.verdict.deepCaution).toBe(false);
  });

  it('chooses the tail: last 10 % of the series, at least 3 snapshots, or the years a person gives', () => {
    expect(chooseTail(years(101, 10)).start).toBe(90);
    expect(chooseTail(years(5, 10)).start).toBe(2);
    expect(chooseTail(years(101, 10), 200).start).toBe(80);
    expect(chooseTail(years(101, 10), 5).start).toBe(99);
  });
});
