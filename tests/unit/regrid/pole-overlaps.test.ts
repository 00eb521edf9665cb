import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { makeCurvilinearGrid } from '../../../app/grid/curvilinear.js';
import { makeRectilinearGrid, makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { EARTH_RADIUS_M } from '../../../app/grid/types.js';
import { conservativeCurvilinear } from '../../../app/regrid/conservative-curvilinear.js';
import { columnSums, rowSums } from '../../../app/regrid/csr.js';
import { buildWeights } from '../../../app/regrid/weights.js';
import { rotatedEdges, rotatedGrid, rotatedToGeographic, type RotatedSpec } from './rotated-grid.js';

interface Cell {
  i: number;
  j: number;
  lon: number[];
  lat: number[];
  area?: number;
}
interface Case {
  name: string;
  rotation: RotatedSpec;
  cells: Cell[];
  targetLonEdges: number[];
  targetRows: number;
  overlaps: [number, number, number][];
}
// Reference: tests/fixtures/regrid/make_pole_grids.py — corners from PROJ's ob_tran (pyproj), overlaps
// from shapely intersections in a Lambert azimuthal equal-area projection centred on each pole.
const fx = JSON.parse(readFileSync(new URL('../../fixtures/regrid/pole_grids.json', import.meta.url), 'utf8')) as { cases: Case[] };

const RAD = Math.PI / 180;
const unit = (lon: number, lat: number): number[] => [Math.cos(lat * RAD) * Math.cos(lon * RAD), Math.cos(lat * RAD) * Math.sin(lon * RAD), Math.sin(lat * RAD)];

/** The fixture's cells near the poles as one row of a curvilinear grid, with the corners pyproj gave. */
function patch(c: Case) {
  const n = c.cells.length;
  const cLon = new Float64Array(4 * n), cLat = new Float64Array(4 * n);
  c.cells.forEach((cell, k) => {
    cLon.set(cell.lon, 4 * k);
    cLat.set(cell.lat, 4 * k);
  });
  const lon = cLon.filter((_, q) => q % 4 === 0), lat = cLat.filter((_, q) => q % 4 === 0);
  return makeCurvilinearGrid(lon, lat, n, 1, { lon: cLon, lat: cLat });
}

describe.each(fx.cases)('rotated-pole grid, $name: overlaps at the poles are exact', (c) => {
  it('our rotation gives the corners PROJ ob_tran gives (within 1e-12 rad)', () => {
    const { lon: le, lat: pe } = rotatedEdges(c.rotation);
    let worst = 0;
    for (const cell of c.cells) {
      const rl = [le[cell.i], le[cell.i + 1], le[cell.i + 1], le[cell.i]];
      const rp = [pe[cell.j], pe[cell.j], pe[cell.j + 1], pe[cell.j + 1]];
      for (let q = 0; q < 4; q++) {
        const a = unit(...rotatedToGeographic(rl[q], rp[q], c.rotation)), b = unit(cell.lon[q], cell.lat[q]);
        worst = Math.max(worst, Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]));
      }
    }
    expect(worst).toBeLessThan(1e-12);
  });

  it('every overlap with the target rows next to a pole matches shapely to 1e-8 of the source cell', () => {
    const src = patch(c);
    const latEdges = Float64Array.from({ length: 181 }, (_, k) => -90 + k);
    const tgt = makeRectilinearGrid(Float64Array.from(c.targetLonEdges), latEdges);
    const w = conservativeCurvilinear(src, tgt);
    const ours = new Map<string, number>();
    const ntx = tgt.nx;
    for (let r = 0; r < w.nRows; r++) {
      const row = Math.floor(r / ntx);
      if (row >= c.targetRows && row < 180 - c.targetRows) continue;
      // a cell around a pole meets a target column in two pieces, one a turn away from the other
      for (let p = w.rowPtr[r]; p < w.rowPtr[r + 1]; p++) ours.set(`${r}:${w.col[p]}`, (ours.get(`${r}:${w.col[p]}`) ?? 0) + w.w[p]);
    }
    let worst = 0;
    const ref = new Set<string>();
    for (const [row, col, area] of c.overlaps) {
      ref.add(`${row}:${col}`);
      worst = Math.max(worst, Math.abs((ours.get(`${row}:${col}`) ?? 0) - area) / c.cells[col].area!);
    }
    for (const [key, a] of ours) if (!ref.has(key)) worst = Math.max(worst, a / c.cells[Number(key.split(':')[1])].area!);
    expect(c.overlaps.length).toBeGreaterThan(100);
    expect(worst).toBeLessThan(1e-8);
  });

  it('whole-cell areas of the cells at the poles match the projected shapely areas to 1e-8 (the reference\'s own precision)', () => {
    const src = patch(c);
    c.cells.forEach((cell, k) => {
      if (cell.area !== undefined) expect(Math.abs(src.area[k] / cell.area - 1)).toBeLessThan(1e-8);
    });
  });

  it('onto 1° lat-lon the whole grid is conserved: every target cell covered and every source cell spent to 1e-9', () => {
    const src = rotatedGrid(c.rotation);
    const tgt = makeRegularGrid(1, 1);
    const w = buildWeights(src, tgt, 'conservative');
    const rs = rowSums(w), cs = columnSums(w);
    let worstTarget = 0, worstSource = 0, total = 0;
    for (let r = 0; r < rs.length; r++) {
      worstTarget = Math.max(worstTarget, Math.abs(rs[r] / tgt.area[r] - 1));
      total += rs[r];
    }
    for (let s = 0; s < cs.length; s++) worstSource = Math.max(worstSource, Math.abs(cs[s] / src.area[s] - 1));
    expect(worstTarget).toBeLessThan(1e-9);
    expect(worstSource).toBeLessThan(1e-9);
    // the overlaps add up to the sphere, 4πR² (exact geometry)
    expect(Math.abs(total / (4 * Math.PI * EARTH_RADIUS_M ** 2) - 1)).toBeLessThan(1e-12);
  });
});

describe('cells at a pole given clockwise', () => {
  it('a cell around a pole with its corners in the other order has the same overlaps', () => {
    const c = fx.cases.find((k) => k.name.includes('inside'))!;
    const fwd = patch(c);
    const rev = patch(c);
    for (let s = 0; s < rev.nx; s++) {
      for (const arr of [rev.cornerLon, rev.cornerLat]) arr.subarray(4 * s, 4 * s + 4).reverse();
    }
    const tgt = makeRegularGrid(1, 1);
    const a = conservativeCurvilinear(fwd, tgt), b = conservativeCurvilinear(rev, tgt);
    const sa = columnSums(a), sb = columnSums(b);
    for (let s = 0; s < sa.length; s++) expect(Math.abs(sb[s] / sa[s] - 1)).toBeLessThan(1e-12);
    expect(sa.every((v, s) => Math.abs(v / fwd.area[s] - 1) < 1e-9)).toBe(true);
  });
});
