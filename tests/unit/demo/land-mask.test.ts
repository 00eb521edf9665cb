// The demo's land comes from Natural Earth (world-atlas). Outside check: the ocean covers about
// 3.61e14 m² (Charette & Smith 2010, Oceanography 23(2)); a 1° mask from these shapes should give that
// within 3 %. Cell areas use the exact lat-lon formula with R = 6 371 008.8 m (Moritz 2000).
import { describe, expect, it } from 'vitest';
import { makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { loadLandRings, rasteriseLand } from '../../../sample-data/generator/land.js';

describe('demo land mask from Natural Earth', () => {
  const rings = loadLandRings('50m');

  it('gives the ocean area of Charette & Smith (2010) within 3 % at 1°', () => {
    const mask = rasteriseLand(rings, 360, 180);
    const grid = makeRegularGrid(1, 1);
    let ocean = 0;
    for (let c = 0; c < mask.length; c++) if (!mask[c]) ocean += grid.area[c];
    expect(Math.abs(ocean / 3.61e14 - 1)).toBeLessThan(0.03);
  });

  it('puts known places on the right side of the coast (common knowledge of geography)', () => {
    const mask = rasteriseLand(rings, 360, 180);
    const at = (lon: number, lat: number): number => mask[Math.floor(lat + 90) * 360 + Math.floor(lon + 180)];
    expect(at(-140.5, 0.5)).toBe(0); // central equatorial Pacific
    expect(at(-30.5, 30.5)).toBe(0); // North Atlantic
    expect(at(20.5, 10.5)).toBe(1); // Chad, Africa
    expect(at(100.5, 60.5)).toBe(1); // Siberia
    expect(at(45.5, -85.5)).toBe(1); // East Antarctica
    expect(at(50.5, 42.5)).toBe(0); // the Caspian Sea is a hole in the land
  });
});
