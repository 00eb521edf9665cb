// Logarithmic axis helper. Check values follow from the definition of the base-10 logarithm (common practice
// for log axes: equal distances for equal ratios, majors at powers of ten, minors at 2..9 of each decade).
import { describe, expect, it } from 'vitest';
import { decadeDomain, logPosition, logTicks, logTickText } from '../../../app/render/log-axis.js';

describe('log axis', () => {
  it('widens a domain to whole decades', () => {
    expect(decadeDomain(10, 5000)).toEqual([10, 10000]);
    expect(decadeDomain(12, 80)).toEqual([10, 100]);
    expect(decadeDomain(100, 100)).toEqual([100, 1000]);
    expect(() => decadeDomain(0, 100)).toThrow(/positive/);
  });

  it('places equal ratios at equal distances', () => {
    const d: [number, number] = [10, 10000];
    const r: [number, number] = [0, 600];
    expect(logPosition(10, d, r)).toBeCloseTo(0, 12);
    expect(logPosition(100, d, r)).toBeCloseTo(200, 12);
    expect(logPosition(1000, d, r)).toBeCloseTo(400, 12);
    // log10(2) = 0.30103 (from memory; also Math.log10 by definition): 20 lies 0.30103 of a decade past 10
    expect(logPosition(20, d, r)).toBeCloseTo(200 * 0.30103, 3);
    expect(logPosition(50, d, r) - logPosition(5, d, r)).toBeCloseTo(200, 9);
    expect(logPosition(0, d, r)).toBeNaN();
    expect(logPosition(-3, d, r)).toBeNaN();
  });

  it('ticks at powers of ten with 2..9 between', () => {
    const t = logTicks(10, 10000);
    expect(t.major).toEqual([10, 100, 1000, 10000]);
    expect(t.minor.length).toBe(3 * 8);
    expect(t.minor.slice(0, 8)).toEqual([20, 30, 40, 50, 60, 70, 80, 90]);
    expect(logTicks(15, 450)).toEqual({ major: [100], minor: [20, 30, 40, 50, 60, 70, 80, 90, 200, 300, 400] });
    expect(logTicks(-1, 10)).toEqual({ major: [], minor: [] });
  });

  it('labels ticks plainly', () => {
    expect([10, 100, 1000, 10000].map(logTickText)).toEqual(['10', '100', '1000', '10000']);
    expect(logTickText(0.1)).toBe('0.1');
    expect(logTickText(0.01)).toBe('0.01');
  });
});
