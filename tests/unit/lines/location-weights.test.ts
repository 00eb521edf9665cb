import { describe, expect, it } from 'vitest';
import { makeRectilinearGrid, makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { pointWeights, regularAxes } from '../../../app/lines/location-weights.js';
import { PointLocator, newStencil } from '../../../app/regrid/locate.js';

/** The regridder's locator, point by point: the weights the shortcut must reproduce. */
function locatorRows(grid: ReturnType<typeof makeRegularGrid>, lon: number[], lat: number[]): Map<number, number>[] {
  const loc = new PointLocator(grid);
  const st = newStencil();
  return lon.map((x, p) => {
    const m = new Map<number, number>();
    if (loc.bilinear(x, lat[p], st)) for (let k = 0; k < st.n; k++) if (st.w[k] > 0) m.set(st.idx[k], st.w[k]);
    return m;
  });
}

describe('point weights on regular grids agree with the regridder locator', () => {
  for (const [name, grid] of [
    ['1° from -180', makeRegularGrid(1, 1)],
    ['2° × 1.5° from 0', makeRegularGrid(2, 1.5, 0)],
    ['5° from -180', makeRegularGrid(5, 5)],
  ] as const) {
    it(name, () => {
      expect(regularAxes(grid)).not.toBeNull();
      let s = 7;
      const rand = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
      const lon: number[] = [], lat: number[] = [];
      for (let i = 0; i < 2000; i++) {
        lon.push(-400 + 800 * rand());
        lat.push(-90 + 180 * rand());
      }
      // edges, centres, the wrap, the poles
      lon.push(-180, 180, 0, 359.999, -179.999, 0.5, 1, 179.5, 0, 10);
      lat.push(0, 0, 90, -90, 89.9, 0.5, 1, -89.5, 45.25, 89.5);
      const w = pointWeights(grid, lon, lat, 'bilinear');
      const ref = locatorRows(grid, lon, lat);
      ref.forEach((m, p) => {
        const got = new Map<number, number>();
        for (let q = w.rowPtr[p]; q < w.rowPtr[p + 1]; q++) got.set(w.col[q], (got.get(w.col[q]) ?? 0) + w.w[q]);
        expect([...got.keys()].sort()).toEqual([...m.keys()].sort());
        for (const [c, x] of m) expect(got.get(c)!).toBeCloseTo(x, 9);
      });
    });
  }
  it('irregular or regional grids go through the locator', () => {
    expect(regularAxes(makeRectilinearGrid(Float64Array.of(0, 1, 3, 6), Float64Array.of(0, 1, 2)))).toBeNull();
  });
});
