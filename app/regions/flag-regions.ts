/**
 * User regions from a NetCDF integer variable with CF flag_values / flag_meanings (CF 1.10, section 3.5).
 * The mask is looked up at the common grid's cell centres: directly when it is on the common grid,
 * otherwise in the mask cell (of its own lat-lon grid) that contains the centre.
 */
import { StillwaterError } from '../errors.js';
import type { HorizontalGrid } from '../grid/types.js';
import { wrapLon } from './polygon.js';
import { cellsWhere, type Region } from './region.js';

export interface FlagTable {
  values: number[];
  meanings: string[];
}

/** flag_values and flag_meanings (blank-separated words), checked to pair up. */
export function flagTable(flagValues: unknown, flagMeanings: unknown, file: string, variable: string): FlagTable {
  const values = Array.isArray(flagValues) ? flagValues.map(Number) : [];
  const meanings = typeof flagMeanings === 'string' ? flagMeanings.trim().split(/\s+/).filter(Boolean) : [];
  if (values.length === 0 || meanings.length === 0) {
    throw new StillwaterError('E_VARIABLE', `${file}, variable '${variable}': a region mask needs the attributes flag_values and flag_meanings.`, { file, variable });
  }
  if (values.length !== meanings.length) {
    throw new StillwaterError('E_VARIABLE', `${file}, variable '${variable}': flag_values has ${values.length} entries but flag_meanings ${meanings.length}.`, { file, variable });
  }
  return { values, meanings };
}

function sameCentres(a: HorizontalGrid, b: HorizontalGrid): boolean {
  if (a.nx !== b.nx || a.ny !== b.ny) return false;
  for (let c = 0; c < a.lon.length; c++) {
    if (Math.abs(wrapLon(a.lon[c]) - wrapLon(b.lon[c])) > 1e-6 || Math.abs(a.lat[c] - b.lat[c]) > 1e-6) return false;
  }
  return true;
}

/** Index of the interval of increasing `edges` holding x, or -1 outside. */
function findInterval(edges: ArrayLike<number>, x: number): number {
  const n = edges.length - 1;
  if (!(x >= edges[0] && x <= edges[n])) return -1;
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (edges[mid] <= x) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** For each target cell, the mask cell holding its centre (-1 when outside the mask's grid). */
export function maskLookup(mask: HorizontalGrid, target: HorizontalGrid, file: string): Int32Array {
  const n = target.nx * target.ny;
  const out = new Int32Array(n);
  if (sameCentres(mask, target)) {
    for (let c = 0; c < n; c++) out[c] = c;
    return out;
  }
  const axes = mask.axes;
  if (!axes) throw new StillwaterError('E_GRID', `${file}: a region mask must be on the common grid or on a lat-lon grid.`, { file });
  const e0 = axes.lonEdges[0];
  for (let c = 0; c < n; c++) {
    // bring the longitude into the mask's own range [e0, e0 + 360)
    const x = e0 + ((((target.lon[c] - e0) % 360) + 360) % 360);
    const i = findInterval(axes.lonEdges, x);
    const j = findInterval(axes.latEdges, target.lat[c]);
    out[c] = i < 0 || j < 0 ? -1 : j * mask.nx + i;
  }
  return out;
}

export function regionsFromFlags(
  values: ArrayLike<number>,
  mask: HorizontalGrid,
  table: FlagTable,
  target: HorizontalGrid,
  file: string,
  only?: string[],
): Region[] {
  const lookup = maskLookup(mask, target, file);
  const n = target.nx * target.ny;
  const picked = only && only.length ? only : table.meanings;
  return picked.map((name) => {
    const f = table.meanings.indexOf(name);
    if (f < 0) throw new StillwaterError('E_INPUT', `${file}: no flag meaning '${name}' (it has ${table.meanings.join(', ')}).`, { file });
    const v = table.values[f];
    return { name, source: file, cells: cellsWhere(n, (c) => lookup[c] >= 0 && values[lookup[c]] === v) };
  });
}
