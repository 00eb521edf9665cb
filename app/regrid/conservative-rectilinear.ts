import { sinDiff } from '../grid/rectilinear.js';
import { EARTH_RADIUS_M, type HorizontalGrid } from '../grid/types.js';
import { ascendingEdges, cellRange } from './edge-search.js';
import type { SparseWeights } from './csr.js';
import { lonOverlap } from './overlap1d.js';

const RAD = Math.PI / 180;

export interface AxisOverlap {
  /** per target cell (original index): source cells (original index) and overlap measure */
  start: Int32Array;
  src: Int32Array;
  len: Float64Array;
}

/**
 * Exact first-order conservative weights between two lat-lon grids (Jones 1999): the overlap of two
 * cells is R² × (longitude overlap in radians, periodic) × (overlap in sin latitude).
 */
export function conservativeRectilinear(source: HorizontalGrid, target: HorizontalGrid, radius = EARTH_RADIUS_M): SparseWeights {
  return expandSeparable(separableWeights(source, target, radius));
}

/**
 * The same weights kept as their two 1-D factors: w[(jt, it), (js, is)] = lat[jt → js] · lon[it → is].
 * Applied as two passes (app/regrid/separable-level.ts) they do the work of the full matrix without
 * its index gathers; building them takes well under a millisecond, so they are never cached.
 */
export interface SeparableWeights {
  lon: AxisOverlap;
  /** overlap in sin latitude, already multiplied by R² */
  lat: AxisOverlap;
  srcNx: number;
  srcNy: number;
  tgtNx: number;
  tgtNy: number;
  /** entries of the equivalent full matrix */
  entries: number;
}

export function separableWeights(source: HorizontalGrid, target: HorizontalGrid, radius = EARTH_RADIUS_M): SeparableWeights {
  const { lon, lat } = separableFactors(source, target);
  const r2 = radius * radius;
  const scaled = { start: lat.start, src: lat.src, len: lat.len.map((x) => x * r2) };
  const entries = (lat.start[target.ny] - lat.start[0]) * (lon.start[target.nx] - lon.start[0]);
  return { lon, lat: scaled, srcNx: source.nx, srcNy: source.ny, tgtNx: target.nx, tgtNy: target.ny, entries };
}

/** The full matrix of factored weights: each target cell's entries are (its source rows) x (its source columns). */
export function expandSeparable(w: SeparableWeights): SparseWeights {
  const { lon, lat, srcNx: snx, tgtNx: tnx, tgtNy: tny } = w;
  const nRows = tnx * tny;
  const rowPtr = new Int32Array(nRows + 1);
  for (let j = 0; j < tny; j++) {
    const nLat = lat.start[j + 1] - lat.start[j];
    for (let i = 0; i < tnx; i++) rowPtr[j * tnx + i + 1] = nLat * (lon.start[i + 1] - lon.start[i]);
  }
  for (let r = 0; r < nRows; r++) rowPtr[r + 1] += rowPtr[r];
  const col = new Int32Array(rowPtr[nRows]);
  const wt = new Float64Array(rowPtr[nRows]);
  for (let j = 0; j < tny; j++) {
    for (let i = 0; i < tnx; i++) {
      let q = rowPtr[j * tnx + i];
      for (let p = lat.start[j]; p < lat.start[j + 1]; p++) {
        const base = lat.src[p] * snx, ds = lat.len[p];
        for (let m = lon.start[i]; m < lon.start[i + 1]; m++) {
          col[q] = base + lon.src[m];
          wt[q++] = ds * lon.len[m];
        }
      }
    }
  }
  return { method: 'conservative', nRows, nCols: snx * w.srcNy, rowPtr, col, w: wt };
}

/** The weights as two factors, one per axis: w[(jt, it), (js, is)] = R² · lat[jt → js] · lon[it → is]. */
export interface SeparableFactors {
  lon: AxisOverlap;
  lat: AxisOverlap;
}

export function separableFactors(source: HorizontalGrid, target: HorizontalGrid): SeparableFactors {
  const sa = source.axes!, ta = target.axes!;
  return { lon: lonOverlaps(sa.lonEdges, ta.lonEdges), lat: latOverlaps(sa.latEdges, ta.latEdges) };
}

function lonOverlaps(srcEdges: Float64Array, tgtEdges: Float64Array): AxisOverlap {
  const s = ascendingEdges(srcEdges), t = ascendingEdges(tgtEdges);
  const nt = tgtEdges.length - 1;
  const lists: { src: number; len: number }[][] = Array.from({ length: nt }, () => []);
  const ns = s.edges.length - 1;
  const seen = new Int32Array(ns).fill(-1);
  for (let c = 0; c < nt; c++) {
    const a = t.edges[c], bb = t.edges[c + 1];
    const out = lists[t.index[c]];
    for (let k = -2; k <= 2; k++) {
      const [c0, c1] = cellRange(s.edges, a + 360 * k, bb + 360 * k);
      for (let sc = c0; sc < c1; sc++) {
        if (seen[sc] === c) continue;
        seen[sc] = c;
        const len = lonOverlap(s.edges[sc], s.edges[sc + 1], a, bb) * RAD;
        if (len > 0) out.push({ src: s.index[sc], len });
      }
    }
    out.sort((x, y) => x.src - y.src);
  }
  return pack(lists);
}

function latOverlaps(srcEdges: Float64Array, tgtEdges: Float64Array): AxisOverlap {
  const s = ascendingEdges(srcEdges), t = ascendingEdges(tgtEdges);
  const nt = tgtEdges.length - 1;
  const lists: { src: number; len: number }[][] = Array.from({ length: nt }, () => []);
  for (let c = 0; c < nt; c++) {
    const a = t.edges[c], bb = t.edges[c + 1];
    const [c0, c1] = cellRange(s.edges, a, bb);
    const out = lists[t.index[c]];
    for (let sc = c0; sc < c1; sc++) {
      const lo = Math.max(a, s.edges[sc]), hi = Math.min(bb, s.edges[sc + 1]);
      if (!(hi > lo)) continue;
      // overlap in sin(latitude); the difference form keeps precision for thin overlaps
      const len = sinDiff(lo, hi);
      if (len > 0) out.push({ src: s.index[sc], len });
    }
    out.sort((x, y) => x.src - y.src);
  }
  return pack(lists);
}

function pack(lists: { src: number; len: number }[][]): AxisOverlap {
  const start = new Int32Array(lists.length + 1);
  for (let c = 0; c < lists.length; c++) start[c + 1] = start[c] + lists[c].length;
  const src = new Int32Array(start[lists.length]);
  const len = new Float64Array(start[lists.length]);
  let p = 0;
  for (const l of lists) for (const e of l) {
    src[p] = e.src;
    len[p++] = e.len;
  }
  return { start, src, len };
}
