import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { fitFirstOrder, firstOrderValue, t90 } from '../../../app/spinup/first-order-fit.js';
import { firstOrderSeries } from './seeded.js';

const years = (n: number, step: number, start = 0): number[] => Array.from({ length: n }, (_, i) => start + i * step);

/** scipy.optimize.curve_fit on the same points: the reference library's least-squares answer. */
function scipyFit(t: number[], x: number[], p0: [number, number, number]): { xInf: number; x0: number; tau: number } {
  const script = `
import json, sys
import numpy as np
from scipy.optimize import curve_fit
d = json.load(sys.stdin)
t = np.array(d["t"]); x = np.array(d["x"]); t0 = t[0]
f = lambda t, xinf, x0, tau: xinf + (x0 - xinf) * np.exp(-(t - t0) / tau)
p, _ = curve_fit(f, t, x, p0=d["p0"], maxfev=20000, xtol=1e-14, ftol=1e-14)
print(json.dumps({"xInf": p[0], "x0": p[1], "tau": p[2]}))
`;
  const r = spawnSync('/usr/bin/python3', ['-c', script], { input: JSON.stringify({ t, x, p0 }), encoding: 'utf8' });
  if (r.status !== 0) throw new Error(r.stderr);
  return JSON.parse(r.stdout);
}

describe('first-order fit x(t) = x∞ + (x0 − x∞)·e^(−t/τ) (exact for a first-order system)', () => {
  it('recovers τ, x∞ and x0 of a noise-free series to 1e-6', () => {
    const t = years(31, 100);
    const x = firstOrderSeries(t, 1.0, 2.2, 700);
    const f = fitFirstOrder(t, x)!;
    expect(f.tau / 700 - 1).toBeCloseTo(0, 6);
    expect(f.xInf / 2.2 - 1).toBeCloseTo(0, 6);
    expect(f.x0 / 1.0 - 1).toBeCloseTo(0, 6);
    expect(f.constrained).toBe(true);
  });

  it('recovers τ and x∞ within 1 % from a seeded noisy series (noise 0.2 % of the change)', () => {
    const t = years(61, 50);
    for (const seed of [1, 2, 3, 4, 5]) {
      const x = firstOrderSeries(t, 180, 150, 900, 0.06, seed);
      const f = fitFirstOrder(t, x)!;
      expect(Math.abs(f.tau / 900 - 1)).toBeLessThan(0.01);
      expect(Math.abs(f.xInf / 150 - 1)).toBeLessThan(0.01);
    }
  });

  it('agrees with scipy.optimize.curve_fit (reference library) on noisy series and uneven sampling', () => {
    const t = [0, 10, 20, 50, 100, 200, 300, 500, 800, 1200, 1600, 2000, 2500, 3000];
    for (const seed of [7, 8]) {
      const x = firstOrderSeries(t, 2.0, 1.6, 450, 0.004, seed);
      const ours = fitFirstOrder(t, x)!;
      const ref = scipyFit(t, x, [1.5, 2.1, 300]);
      expect(Math.abs(ours.tau / ref.tau - 1)).toBeLessThan(1e-5);
      expect(Math.abs(ours.xInf / ref.xInf - 1)).toBeLessThan(1e-7);
      expect(Math.abs(ours.x0 / ref.x0 - 1)).toBeLessThan(1e-7);
    }
  });

  it('fits a window that starts later than year 0 (t0 is the first point of the window)', () => {
    const t = years(20, 100, 1000);
    const x = t.map((ti) => 5 + 3 * Math.exp(-ti / 1500));
    const f = fitFirstOrder(t, x)!;
    expect(f.t0).toBe(1000);
    expect(f.tau / 1500 - 1).toBeCloseTo(0, 6);
    expect(f.xInf / 5 - 1).toBeCloseTo(0, 6);
    expect(firstOrderValue(f, 2500) / (5 + 3 * Math.exp(-2500 / 1500)) - 1).toBeCloseTo(0, 8);
  });

  it('t90 = τ·ln 10 exactly: 90 % of the change is covered (first-order system)', () => {
    for (const tau of [1, 37.5, 1234]) {
      expect(t90(tau)).toBe(tau * Math.LN10);
      const f = { t0: 0, x0: 0, xInf: 1, tau };
      expect(firstOrderValue(f, t90(tau))).toBeCloseTo(0.9, 12);
    }
  });

  it('marks a straight line as unconstrained (τ runs to the edge of the search)', () => {
    const t = years(10, 100);
    const f = fitFirstOrder(t, t.map((ti) => 3 + 0.001 * ti))!;
    expect(f.constrained).toBe(false);
  });

  it('marks a constant series as unconstrained and returns the constant as x∞', () => {
    const t = years(10, 100);
    const f = fitFirstOrder(t, t.map(() => 4.25))!;
    expect(f.constrained).toBe(false);
    expect(f.xInf).toBe(4.25);
    expect(f.sse).toBe(0);
  });

  it('needs three points', () => {
    expect(fitFirstOrder([0, 1], [1, 2])).toBeNull();
  });
});
