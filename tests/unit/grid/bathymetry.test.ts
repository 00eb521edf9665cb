import { describe, expect, it } from 'vitest';
import { bathymetryFromLevels, bottomIndex, levelVolumes } from '../../../app/grid/bathymetry.js';
import { makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { makeVerticalAxis } from '../../../app/grid/vertical.js';
import type { Grid } from '../../../app/grid/types.js';

// A 90°×90° global grid (8 cells) with layers 0-10-30-60 m; data NaN below each column's seafloor.
const grid: Grid = { horizontal: makeRegularGrid(90, 90), vertical: makeVerticalAxis(Float64Array.from([0, 10, 30, 60])) };
const depthLevels = [0, 1, 2, 3, 3, 2, 1, 0]; // wet levels per column, hand-made
const levels = [0, 1, 2].map((k) => Float32Array.from(depthLevels.map((w) => (k < w ? 1 : NaN))));

describe('bathymetry from the data', () => {
  it('counts wet levels from the top and finds the deepest wet cell', async () => {
    const read: number[] = [];
    const b = await bathymetryFromLevels(grid, async (k) => {
      read.push(k);
      return levels[k];
    });
    expect(Array.from(b.wetLevels)).toEqual(depthLevels);
    expect(Array.from(bottomIndex(b))).toEqual(depthLevels.map((w) => w - 1));
    expect(Array.from(b.depth)).toEqual([0, 10, 30, 60, 60, 30, 10, 0]);
    expect(read).toEqual([0, 1, 2]); // level by level
  });
  it('a value below a gap does not make the column deeper', async () => {
    const gap = [Float32Array.from([1]), Float32Array.from([NaN]), Float32Array.from([1])];
    const g1: Grid = { horizontal: makeRegularGrid(360, 180), vertical: grid.vertical };
    const b = await bathymetryFromLevels(g1, async (k) => gap[k]);
    expect(Array.from(b.wetLevels)).toEqual([1]);
  });
  it('stops reading once every column has reached the seafloor', async () => {
    const shallow = [Float32Array.from([1]), Float32Array.from([NaN]), Float32Array.from([NaN])];
    const read: number[] = [];
    const g1: Grid = { horizontal: makeRegularGrid(360, 180), vertical: grid.vertical };
    await bathymetryFromLevels(g1, async (k) => (read.push(k), shallow[k]));
    expect(read).toEqual([0, 1]);
  });
  it('cell volume is area × thickness for wet cells; the wet volume sums to area × depth', async () => {
    const b = await bathymetryFromLevels(grid, async (k) => levels[k]);
    let total = 0;
    for (let k = 0; k < 3; k++) total += levelVolumes(grid, b, k).reduce((a, x) => a + x, 0);
    let expected = 0;
    for (let c = 0; c < 8; c++) expected += grid.horizontal.area[c] * b.depth[c];
    expect(total / expected).toBeCloseTo(1, 12);
    expect(levelVolumes(grid, b, 2)[0]).toBe(0);
    expect(levelVolumes(grid, b, 2)[3]).toBeCloseTo(grid.horizontal.area[3] * 30, 0);
  });
});
