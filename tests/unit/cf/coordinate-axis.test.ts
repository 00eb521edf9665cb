import { describe, expect, it } from 'vitest';
import { NotMonotonic, deriveEdges, edgesFromBounds, orderLongitudes, orderMonotonic } from '../../../app/cf/coordinate-axis.js';

const f = (a: number[]) => Float64Array.from(a);
// Bounds rules of CF 1.10 §7.1 (a cell's two bounds in either order; neighbours share a bound) and the
// common practice of deriving edges as midpoints, extrapolated by half a step, latitude clipped to ±90.
describe('axis order', () => {
  it('descending values are flipped, with the map back to the file', () => {
    const a = orderMonotonic(f([60, 0, -60]));
    expect(Array.from(a.values)).toEqual([-60, 0, 60]);
    expect(Array.from(a.fileIndex)).toEqual([2, 1, 0]);
    expect(a.identity).toBe(false);
  });
  it('non-monotonic values and NaN are refused with the index', () => {
    expect(() => orderMonotonic(f([0, 1, 1]))).toThrow(NotMonotonic);
    try {
      orderMonotonic(f([0, 2, 1, 3]));
    } catch (e) {
      expect((e as NotMonotonic).index).toBe(2);
    }
    expect(() => orderMonotonic(f([0, NaN]))).toThrow(/missing value at index 1/);
    expect(() => orderLongitudes(f([0, NaN]))).toThrow(/missing value at index 1/);
  });
  it('longitudes wrapped once are rotated, keeping the file range', () => {
    const a = orderLongitudes(f([180, 270, 0, 90]));
    expect(Array.from(a.values)).toEqual([0, 90, 180, 270]);
    expect(Array.from(a.fileIndex)).toEqual([2, 3, 0, 1]);
    expect(() => orderLongitudes(f([0, 90, 45, 180]))).toThrow(NotMonotonic);
  });
  it('derived edges: midpoints, half a step beyond the ends, latitude clipped', () => {
    expect(Array.from(deriveEdges(f([-89, -87, 87, 89]), [-90, 90]))).toEqual([-90, -88, 0, 88, 90]);
    expect(Array.from(deriveEdges(f([0.5, 1.5, 2.5])))).toEqual([0, 1, 2, 3]);
  });
  it('edges from bounds follow the grid order and accept reversed pairs', () => {
    const axis = orderMonotonic(f([45, -45]));
    expect(Array.from(edgesFromBounds(f([90, 0, 0, -90]), axis))).toEqual([-90, 0, 90]);
  });
});
