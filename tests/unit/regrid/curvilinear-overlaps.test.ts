import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { makeRectilinearGrid } from '../../../app/grid/rectilinear.js';
import type { HorizontalGrid } from '../../../app/grid/types.js';
import { conservativeCurvilinear, frameCellAreas } from '../../../app/regrid/conservative-curvilinear.js';

interface Case {
  name: string;
  nx: number;
  ny: number;
  cornerLon: number[];
  cornerLat: number[];
  lonEdges: number[];
  latEdges: number[];
  cellArea: number[];
  overlaps: [number, number, number][];
}
const fx = JSON.parse(readFileSync(new URL('../../fixtures/regrid/overlaps.json', import.meta.url), 'utf8')) as { cases: Case[] };

function sourceGrid(c: Case): HorizontalGrid {
  const n = c.nx * c.ny;
  const lon = new Float64Array(n), lat = new Float64Array(n);
  for (let s = 0; s < n; s++) {
    lon[s] = c.cornerLon[4 * s];
    lat[s] = c.cornerLat[4 * s];
  }
  const g: HorizontalGrid = {
    kind: 'curvilinear', nx: c.nx, ny: c.ny, lon, lat,
    cornerLon: Float64Array.from(c.cornerLon), cornerLat: Float64Array.from(c.cornerLat),
    boundsDerived: false, periodic: false, area: new Float64Array(n),
  };
  g.area = frameCellAreas(g);
  return g;
}

// Reference: tests/fixtures/regrid/make_fixtures.py — pyproj Geod areas on the sphere, and shapely
// intersections in a Lambert azimuthal equal-area projection of densified outlines.
describe.each(fx.cases)('overlaps of curvilinear cells with lat-lon cells: $name', (c) => {
  const src = sourceGrid(c);
  const tgt = makeRectilinearGrid(Float64Array.from(c.lonEdges), Float64Array.from(c.latEdges));
  const w = conservativeCurvilinear(src, tgt);
  const ours = new Map<string, number>();
  for (let r = 0; r < w.nRows; r++) for (let p = w.rowPtr[r]; p < w.rowPtr[r + 1]; p++) ours.set(`${r}:${w.col[p]}`, w.w[p]);
  // the bar is 1e-6 relative for 2° cells away from the poles; arcs are integrated exactly, so we hold
  // all cases, the poles included, to 1e-8 (the reference itself is good to about 1e-9)
  const tol = 1e-8;

  it('whole-cell areas (great-circle edges) match pyproj Geod on the sphere', () => {
    for (let s = 0; s < c.cellArea.length; s++) expect(Math.abs(src.area[s] / c.cellArea[s] - 1)).toBeLessThan(tol);
  });

  it('every overlap matches the shapely intersection, relative to the source cell area', () => {
    let worst = 0;
    for (const [row, col, area] of c.overlaps) {
      const mine = ours.get(`${row}:${col}`) ?? 0;
      worst = Math.max(worst, Math.abs(mine - area) / c.cellArea[col]);
    }
    expect(worst).toBeLessThan(tol);
  });

  it('finds no overlap that the reference does not have', () => {
    const ref = new Set(c.overlaps.map(([r, s]) => `${r}:${s}`));
    for (const [key, a] of ours) {
      if (!ref.has(key)) expect(a / c.cellArea[Number(key.split(':')[1])]).toBeLessThan(1e-8);
    }
  });

  it('the overlaps of each source cell add up to its area (it lies inside the target grid)', () => {
    const sums = new Float64Array(src.nx * src.ny);
    for (let p = 0; p < w.col.length; p++) sums[w.col[p]] += w.w[p];
    for (let s = 0; s < sums.length; s++) expect(Math.abs(sums[s] / src.area[s] - 1)).toBeLessThan(1e-12);
  });
});

describe('cell areas agree with the grid model', () => {
  it('frame areas equal the spherical-excess areas of app/grid/curvilinear.ts (Van Oosterom & Strackee 1983)', async () => {
    const { quadArea } = await import('../../../app/grid/curvilinear.js');
    for (const c of fx.cases) {
      const g = sourceGrid(c);
      for (let s = 0; s < g.nx * g.ny; s++) expect(Math.abs(g.area[s] / quadArea(g.cornerLon, g.cornerLat, 4 * s) - 1)).toBeLessThan(1e-10);
    }
  });
});
