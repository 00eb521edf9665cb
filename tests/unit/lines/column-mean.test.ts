import { describe, expect, it } from 'vitest';
import { makeVerticalAxis } from '../../../app/grid/vertical.js';
import { checkDepthRange, columnMeans, layerOverlap } from '../../../app/lines/column-mean.js';

// Irregular layers, as in ocean models: thin at the top, thick below.
const edges = Float64Array.from([0, 10, 25, 50, 100, 200, 500, 1000, 2000, 3500, 5500]);
const axis = makeVerticalAxis(edges);

/**
 * A profile linear in depth, c(z) = a + b z. The mean of a layer [z1, z2] is a + b (z1 + z2) / 2
 * (exact: the mean of a linear function over an interval is its value at the midpoint), so each
 * layer holds that value; the thickness-weighted mean over [top, bottom] must be a + b (top + bottom) / 2.
 */
function linearSection(a: number[], b: number[]): Float32Array {
  const n = a.length;
  const v = new Float32Array(axis.nz * n);
  for (let k = 0; k < axis.nz; k++) for (let s = 0; s < n; s++) v[k * n + s] = a[s] + b[s] * 0.5 * (edges[k] + edges[k + 1]);
  return v;
}

describe('column means (thickness-weighted, analytic means of linear profiles)', () => {
  it('the whole column of a linear profile has the mean at mid-depth', () => {
    const a = [2.1, 0.5, -1];
    const b = [0.001, 0.0003, 0.002];
    const { mean, thickness } = columnMeans(linearSection(a, b), 3, axis);
    for (let s = 0; s < 3; s++) {
      expect(mean[s]).toBeCloseTo(a[s] + b[s] * 2750, 4);
      expect(thickness[s]).toBe(5500);
    }
  });
  it('a depth range on layer edges has the mean at the middle of the range', () => {
    const { mean } = columnMeans(linearSection([1], [0.004]), 1, axis, { top: 100, bottom: 2000 });
    expect(mean[0]).toBeCloseTo(1 + 0.004 * 1050, 4);
  });
  it('an unweighted mean of the levels would differ (the check can fail)', () => {
    const v = linearSection([1], [0.004]);
    const plain = v.reduce((x, y) => x + y, 0) / v.length;
    expect(Math.abs(plain - (1 + 0.004 * 2750))).toBeGreaterThan(1);
  });
  it('the seafloor ends the column: dry layers do not count', () => {
    const v = linearSection([3], [0.01]);
    for (let k = 7; k < axis.nz; k++) v[k] = NaN; // seafloor at 1000 m
    const { mean, thickness } = columnMeans(v, 1, axis, { top: 0, bottom: 3000 });
    expect(thickness[0]).toBe(1000);
    expect(mean[0]).toBeCloseTo(3 + 0.01 * 500, 4);
  });
  it('a land column has no mean', () => {
    const v = new Float32Array(axis.nz).fill(NaN);
    expect(Number.isNaN(columnMeans(v, 1, axis).mean[0])).toBe(true);
  });
  it('a layer cut by the range counts with the part inside it', () => {
    const w = layerOverlap(axis, { top: 30, bottom: 150 });
    expect(Array.from(w.slice(0, 6))).toEqual([0, 0, 20, 50, 50, 0]);
  });
});

describe('depth ranges are checked against the grid', () => {
  it('a range below the deepest layer', () => {
    expect(() => checkDepthRange({ top: 6000, bottom: 7000 }, axis)).toThrow(/--depth-range 6000\.\.7000 m lies outside the grid, whose layers span 0\.\.5500 m/);
  });
  it('a reversed or negative range', () => {
    expect(() => checkDepthRange({ top: 500, bottom: 100 }, axis)).toThrow(/give a top and a deeper bottom/);
    expect(() => checkDepthRange({ top: -5, bottom: 100 }, axis)).toThrow(/give a top and a deeper bottom/);
  });
  it('a range overlapping the grid is accepted', () => {
    expect(() => checkDepthRange({ top: 0, bottom: 6000 }, axis)).not.toThrow();
  });
});
