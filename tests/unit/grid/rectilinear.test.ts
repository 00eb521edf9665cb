import { describe, expect, it } from 'vitest';
import { latLonCellArea, makeRectilinearGrid, makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { EARTH_RADIUS_M } from '../../../app/grid/types.js';

// Exact geometry: a lat-lon cell covers R²·Δλ·(sin φ2 − sin φ1); all cells of a global grid cover 4πR².
// R = 6 371 008.8 m, the mean radius R1 of GRS 80 (Moritz 2000); 4πR1² = 5.10066 × 10¹⁴ m².
describe('rectilinear cell areas', () => {
  for (const [dLon, dLat] of [[1, 1], [2, 1.5], [0.25, 0.25], [360, 180]]) {
    it(`a global ${dLon}°×${dLat}° grid sums to 4πR²`, () => {
      const g = makeRegularGrid(dLon, dLat);
      const total = g.area.reduce((a, b) => a + b, 0);
      expect(total / (4 * Math.PI * EARTH_RADIUS_M ** 2)).toBeCloseTo(1, 12);
      expect(total / 5.10066e14).toBeCloseTo(1, 5);
    });
  }
  it('a hemisphere band between the equator and 30°N is a quarter of the sphere (sin 30° = ½)', () => {
    expect(latLonCellArea(-180, 180, 0, 30) / (4 * Math.PI * EARTH_RADIUS_M ** 2)).toBeCloseTo(0.25, 14);
  });
  it('irregular edges keep their own areas; bad edges are refused', () => {
    const g = makeRectilinearGrid(Float64Array.from([0, 10, 40]), Float64Array.from([-90, 0, 90]));
    expect(g.area[1] / g.area[0]).toBeCloseTo(3, 12);
    expect(() => makeRectilinearGrid(Float64Array.from([0, 10, 5]), Float64Array.from([-90, 90]))).toThrow(/increase/);
  });
});
