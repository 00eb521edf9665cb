/**
 * A curvilinear grid's cell corners read one cell at a time, whatever form the grid keeps them in: 4 per
 * cell (cornerLon/cornerLat), or each corner once on the (ny + 1) × (nx + 1) lattice of a grid whose
 * neighbouring cells share their corners (a 0.1° grid's corners take 104 MB so instead of 415 MB). A
 * lattice corner's longitude is unwrapped next to the cell's centre exactly as 4-per-cell corners are
 * (nearLongitude), so both forms give the same doubles.
 */
import type { HorizontalGrid } from './types.js';

/** Corners once each, vertex (jj, ii) at jj * (nx + 1) + ii, degrees as read or derived (not unwrapped). */
export interface CornerLattice {
  lon: Float64Array;
  lat: Float64Array;
}

/** Longitude `x` moved by whole turns to lie within 180° of `ref`. */
export function nearLongitude(x: number, ref: number): number {
  return x - 360 * Math.round((x - ref) / 360);
}

/**
 * The four corners of cell s into lon[0..3] and lat[0..3], counter-clockwise:
 * (i-, j-), (i+, j-), (i+, j+), (i-, j+).
 */
export function cellCorners(g: HorizontalGrid, s: number, lon: Float64Array, lat: Float64Array): void {
  const v = g.lattice;
  if (!v) {
    const o = 4 * s;
    const cl = g.cornerLon, ca = g.cornerLat;
    lon[0] = cl[o]; lon[1] = cl[o + 1]; lon[2] = cl[o + 2]; lon[3] = cl[o + 3];
    lat[0] = ca[o]; lat[1] = ca[o + 1]; lat[2] = ca[o + 2]; lat[3] = ca[o + 3];
    return;
  }
  const nx = g.nx, w = nx + 1;
  const j = Math.floor(s / nx), i = s - j * nx;
  const a = j * w + i, d = a + w;
  const ref = g.lon[s];
  lon[0] = nearLongitude(v.lon[a], ref);
  lon[1] = nearLongitude(v.lon[a + 1], ref);
  lon[2] = nearLongitude(v.lon[d + 1], ref);
  lon[3] = nearLongitude(v.lon[d], ref);
  lat[0] = v.lat[a];
  lat[1] = v.lat[a + 1];
  lat[2] = v.lat[d + 1];
  lat[3] = v.lat[d];
}

/** 4 corners per cell (ny * nx * 4) from a lattice: the form the grid model exposes as cornerLon/cornerLat. */
export function expandLattice(v: CornerLattice, lon2d: Float64Array, nx: number, ny: number): { lon: Float64Array; lat: Float64Array } {
  const n = nx * ny;
  const lon = new Float64Array(4 * n), lat = new Float64Array(4 * n);
  const g = { nx, lon: lon2d, lattice: v } as HorizontalGrid;
  const cl = new Float64Array(4), ca = new Float64Array(4);
  for (let s = 0; s < n; s++) {
    cellCorners(g, s, cl, ca);
    lon.set(cl, 4 * s);
    lat.set(ca, 4 * s);
  }
  return { lon, lat };
}

/** One row of cells' corners (nx * 4), longitudes or latitudes, into `out`: for hashing or comparing row by row. */
export function cornerRow(g: HorizontalGrid, j: number, which: 'lon' | 'lat', out: Float64Array): Float64Array {
  if (!g.lattice) {
    const src = which === 'lon' ? g.cornerLon : g.cornerLat;
    return src.subarray(4 * j * g.nx, 4 * (j + 1) * g.nx);
  }
  const cl = new Float64Array(4), ca = new Float64Array(4);
  for (let i = 0; i < g.nx; i++) {
    cellCorners(g, j * g.nx + i, cl, ca);
    out.set(which === 'lon' ? cl : ca, 4 * i);
  }
  return out;
}
