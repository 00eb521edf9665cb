import { describe, expect, it } from 'vitest';
import { turningPoints } from '../../../app/spinup/turning-points.js';
import { analyseTrack } from '../../../app/spinup/analyse-track.js';
import { firstOrderSeries } from './seeded.js';

const years = (n: number, step: number): number[] => Array.from({ length: n }, (_, i) => (i + 1) * step);

/**
 * Two first-order responses of opposite sign and different timescales (a sum of exponentials, the response
 * of two coupled first-order reservoirs): the fast one dominates first, the slow one wins later, so the
 * trajectory overshoots and turns back.
 */
function twoTimescales(t: number[]): number[] {
  return t.map((ti) => 2 + 1.0 * (1 - Math.exp(-ti / 80)) - 0.8 * (1 - Math.exp(-ti / 900)));
}

describe('non-monotonic trajectories', () => {
  it('flags a two-timescale series that overshoots as non-monotonic, at its maximum', () => {
    const t = years(40, 50);
    const x = twoTimescales(t);
    const turns = turningPoints(x);
    expect(turns).toHaveLength(1);
    // the analytic maximum: dx/dt = 0 where e^(−t/80)/80 = 0.8·e^(−t/900)/900
    const tMax = Math.log((1 / 80) / (0.8 / 900)) / (1 / 80 - 1 / 900);
    expect(Math.abs(t[turns[0]] - tMax)).toBeLessThanOrEqual(50);
    const a = analyseTrack({ years: t, mean: x, inventory: x, units: 'mmol m-3', deep: false, thresholdPercentPerKyr: 0.1 });
    expect(a.monotonic).toBe(false);
    expect(a.turningYears).toEqual([t[turns[0]]]);
    // the fit starts at or after the turning point: what came before it is not part of the last approach
    expect(a.fit!.t0).toBeGreaterThanOrEqual(t[turns[0]]);
    expect(a.fitNote).toMatch(/after the last turning point/);
    expect(a.verdict.sentence).toMatch(/not monotonic/);
  });

  it('after the turning point the fit finds the slow timescale (the fast one has died out)', () => {
    const t = years(80, 50);
    const x = twoTimescales(t);
    const a = analyseTrack({ years: t, mean: x, inventory: x, units: 'mmol m-3', deep: false, thresholdPercentPerKyr: 0.1 });
    expect(Math.abs(a.fit!.tau / 900 - 1)).toBeLessThan(0.05);
    expect(Math.abs(a.fit!.xInf / 2.2 - 1)).toBeLessThan(0.005);
  });

  it('gives no fit, and says why, when fewer than four snapshots remain from the last turning point on', () => {
    const t = years(10, 100);
    const x = [1, 2, 3, 4, 5, 6, 7, 8, 7, 6];
    const a = analyseTrack({ years: t, mean: x, inventory: x, units: 'mmol m-3', deep: false, thresholdPercentPerKyr: 0.1 });
    expect(a.turningYears).toEqual([800]);
    expect(a.fit).toBeNull();
    expect(a.fitNote).toMatch(/only 3 snapshots from the last turning point \(model year 800\) on; a first-order fit needs 4/);
    expect(a.verdict.status).toBe('drifting');
  });

  it('does not flag a monotonic first-order series, with or without noise', () => {
    const t = years(30, 100);
    expect(turningPoints(firstOrderSeries(t, 1, 2, 600))).toEqual([]);
    expect(turningPoints(firstOrderSeries(t, 1, 2, 600, 0.002, 11))).toEqual([]);
  });

  it('does not mistake noise on a settled series for an overshoot', () => {
    const t = years(30, 100);
    expect(turningPoints(firstOrderSeries(t, 3, 3, 600, 0.001, 5))).toEqual([]);
  });
});
