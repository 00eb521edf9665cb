/**
 * Corners kept once each (the lattice of a grid whose cells share corners) must give the very doubles that
 * 4-per-cell corners give: the same corners cell by cell, the same areas, the same conservative weights and
 * the same weight-cache key (common practice: a compact form may change memory, never results). The grid
 * is a rotated-pole grid (tests/unit/regrid/rotated-grid.ts, checked against pyproj by make_pole_grids.py).
 */
import { describe, expect, it } from 'vitest';
import { cellCorners, nearLongitude } from '../../../app/grid/corners.js';
import { makeCurvilinearGrid } from '../../../app/grid/curvilinear.js';
import { LatticeBuilder } from '../../../app/grid/lattice-builder.js';
import { makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { conservativeCurvilinear } from '../../../app/regrid/conservative-curvilinear.js';
import { weightKey } from '../../../app/regrid/weight-cache.js';
import { rotatedGrid } from '../regrid/rotated-grid.js';
import { TripletBuilder } from '../../../app/regrid/csr.js';

const spec = { poleLat: 40, lon0: -170, spacing: 10, offset: [0, 0] as [number, number] };

/** The raw grid's corners unwrapped next to each centre, as the CF reader does with 4-per-cell bounds. */
function unwrapped(raw: ReturnType<typeof rotatedGrid>): { lon: Float64Array; lat: Float64Array } {
  const lon = Float64Array.from(raw.cornerLon, (x, q) => nearLongitude(x, raw.lon[Math.floor(q / 4)]));
  return { lon, lat: Float64Array.from(raw.cornerLat) };
}

function latticeOf(raw: ReturnType<typeof rotatedGrid>, band: number): LatticeBuilder {
  const b = new LatticeBuilder(raw.lon, raw.nx, raw.ny);
  for (let j0 = 0; j0 < raw.ny; j0 += band) {
    const j1 = Math.min(raw.ny, j0 + band);
    b.addRows(j0, raw.cornerLon.subarray(4 * j0 * raw.nx, 4 * j1 * raw.nx), raw.cornerLat.subarray(4 * j0 * raw.nx, 4 * j1 * raw.nx));
  }
  return b;
}

describe('corners on a lattice', () => {
  const raw = rotatedGrid(spec);
  const perCell = makeCurvilinearGrid(Float64Array.from(raw.lon), Float64Array.from(raw.lat), raw.nx, raw.ny, unwrapped(raw));
  const builder = latticeOf(raw, 5);
  const onLattice = makeCurvilinearGrid(Float64Array.from(raw.lon), Float64Array.from(raw.lat), raw.nx, raw.ny, { lattice: builder.result() });

  it('a rotated grid read in bands of rows shares its corners', () => {
    expect(builder.shared).toBe(true);
    expect(onLattice.lattice).toBeDefined();
  });

  it('gives the same corners, areas, weights and cache key as 4 per cell, bit for bit', () => {
    const a = new Float64Array(4), b = new Float64Array(4), c = new Float64Array(4), d = new Float64Array(4);
    for (let s = 0; s < raw.nx * raw.ny; s++) {
      cellCorners(perCell, s, a, b);
      cellCorners(onLattice, s, c, d);
      expect([...c, ...d]).toEqual([...a, ...b]);
    }
    expect(Array.from(onLattice.area)).toEqual(Array.from(perCell.area));
    const target = makeRegularGrid(5, 5);
    const w1 = conservativeCurvilinear(perCell, target), w2 = conservativeCurvilinear(onLattice, target);
    expect(Array.from(w2.rowPtr)).toEqual(Array.from(w1.rowPtr));
    expect(Array.from(w2.col)).toEqual(Array.from(w1.col));
    expect(Array.from(w2.w)).toEqual(Array.from(w1.w));
    expect(weightKey(onLattice, target, 'conservative')).toBe(weightKey(perCell, target, 'conservative'));
    // asked for, the 4-per-cell arrays are made and equal
    expect(Array.from(onLattice.cornerLon)).toEqual(Array.from(perCell.cornerLon));
  });

  it('bounds stored a whole turn apart across the seam still share their corners', () => {
    // two cells either side of 180°E, the second's bounds stored as −180..−179 (exact doubles)
    const b = new LatticeBuilder(Float64Array.of(179.5, -179.5), 2, 1);
    b.addRows(0, [179, 180, 180, 179, -180, -179, -179, -180], [0, 0, 1, 1, 0, 0, 1, 1]);
    expect(b.shared).toBe(true);
    const g = makeCurvilinearGrid(Float64Array.of(179.5, -179.5), Float64Array.of(0.5, 0.5), 2, 1, { lattice: b.result() });
    const lon = new Float64Array(4), lat = new Float64Array(4);
    cellCorners(g, 1, lon, lat);
    expect(Array.from(lon)).toEqual([-180, -179, -179, -180]);
    cellCorners(g, 0, lon, lat);
    expect(Array.from(lon)).toEqual([179, 180, 180, 179]);
  });

  it('bounds that do not meet are not forced onto a lattice', () => {
    const lat = Float64Array.from(raw.cornerLat);
    lat[4 * (raw.nx + 3) + 0] += 1e-9; // one corner of one cell in the second row
    const b = new LatticeBuilder(raw.lon, raw.nx, raw.ny);
    b.addRows(0, raw.cornerLon, lat);
    expect(b.shared).toBe(false);
  });
});

describe('TripletBuilder in blocks', () => {
  it('gives the CSR a plain stable sort by row gives, across many blocks', () => {
    const b = new TripletBuilder(3);
    const t: [number, number, number][] = [];
    for (let p = 0; p < 5000; p++) {
      const row = (p * 7919) % 37, col = p, w = p * 0.5;
      b.push(row, col, w);
      t.push([row, col, w]);
    }
    const m = b.toCsr('conservative', 37, 5000);
    const sorted = t.map((x, i) => [...x, i]).sort((x, y) => x[0] - y[0] || x[3] - y[3]);
    expect(Array.from(m.col)).toEqual(sorted.map((x) => x[1]));
    expect(Array.from(m.w)).toEqual(sorted.map((x) => x[2]));
    expect(m.rowPtr[37]).toBe(5000);
    b.push(1, 2, 3);
    expect(b.toCsr('conservative', 2, 3).col[0]).toBe(2);
  });
});
