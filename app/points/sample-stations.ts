/**
 * A field sampled at stations, reading one level at a time (memory: a few arrays per station).
 *
 * trilinear: in each of the four surrounding columns, linear in depth between level centres
 *   (constant above the first centre, and below the deepest wet centre down to that layer's bottom
 *   edge); then bilinear across the wet columns. With every corner wet this is exactly trilinear
 *   interpolation between cell centres.
 * nearest: the layer that contains the depth, in the nearest column that is wet there.
 * seafloor: the bottom wet cell of each surrounding column (nearest: of the nearest wet column).
 * Every station gets a status (see StationStatus); none is dropped.
 */
import type { FieldSource } from '../cf/field-source.js';
import type { HorizontalGrid, VerticalAxis } from '../grid/types.js';
import { pointWeights } from '../lines/location-weights.js';

export type StationMethod = 'trilinear' | 'nearest';
/**
 * ok: the station's own column has water there; from_neighbour: it does not (coast or steep slope),
 * and the value comes from wet neighbouring columns; on_land: no surrounding column has water;
 * below_seafloor: the surrounding columns end above the station; outside_grid: beyond a regional grid.
 */
export type StationStatus = 'ok' | 'from_neighbour' | 'on_land' | 'below_seafloor' | 'outside_grid';

export interface StationPositions {
  lon: ArrayLike<number>;
  lat: ArrayLike<number>;
  /** metres, positive down; ignored where seafloor[i] is 1 */
  depth: ArrayLike<number>;
  seafloor: ArrayLike<number>;
}

export interface StationSamples {
  /** model value, NaN where status is not ok */
  model: Float64Array;
  status: StationStatus[];
  /**
   * model seafloor of the station's own column (bottom edge of its deepest wet layer), m, where it
   * matters: seafloor stations, and stations whose own column is dry at their depth (0 on land);
   * NaN elsewhere (the column reaches the station) and off the grid
   */
  seafloorM: Float64Array;
  /** depth the model value stands for: the station depth, or the bottom cell centre for seafloor stations */
  modelDepthM: Float64Array;
}

export interface StationSampleOptions {
  method?: StationMethod;
  t?: number;
  progress?: (fraction: number) => void;
}

/** Index k with c[k] <= z < c[k+1]; -1 above the first centre; nz - 1 at or below the last. */
function bracketCentres(c: Float64Array, z: number): number {
  if (z < c[0]) return -1;
  let lo = 0, hi = c.length - 1;
  if (z >= c[hi]) return hi;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (c[mid] <= z) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Layer k with edges[k] <= z < edges[k+1]; nz when below the last edge. */
function layerOf(edges: Float64Array, z: number): number {
  const nz = edges.length - 1;
  if (z >= edges[nz]) return z === edges[nz] ? nz - 1 : nz;
  let lo = 0, hi = nz;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (edges[mid] <= z) lo = mid;
    else hi = mid;
  }
  return lo;
}

const SURFACE_ONLY: VerticalAxis = {
  nz: 1,
  centres: Float64Array.of(0),
  edges: Float64Array.of(0, Infinity),
  thickness: Float64Array.of(Infinity),
  boundsDerived: true,
};

/**
 * Stations are worked on in queue order: depth stations grouped by their deeper level (so each is
 * finished as soon as that level has been read), then seafloor stations and stations below the grid.
 * Everything the level loop needs is laid out in that order, front to back: for 100 000 stations,
 * jumping about in memory costs more than the arithmetic.
 */
interface Queue {
  /** queue position → station */
  station: Int32Array;
  /** queue positions of the stations finished at level k: [start[k], start[k + 1]); the rest from start[nz] */
  start: Int32Array;
  /** 1 where both depth levels are the same one */
  single: Uint8Array;
  frac: Float64Array;
  /** station depth, m (NaN at the seafloor) */
  z: Float64Array;
  /** the deepest depth the upper level's value may stand for (the bottom edge of its layer) */
  reach: Float64Array;
  /** upper level per queue position (-1: none) */
  kLo: Int32Array;
  seafloor: Uint8Array;
  /** the last level any station needs */
  lastLevel: number;
}

/** Which levels each station needs, how to weigh them, and the order to work in. */
function makeQueue(st: StationPositions, axis: VerticalAxis, method: StationMethod): Queue {
  const { nz, centres, edges } = axis;
  const n = st.lon.length;
  const nearest = method === 'nearest';
  // first pass, in station order: the level bracket (nearest: the layer) and the sort key
  const bracket = new Int32Array(n);
  const key = new Int32Array(n);
  let deepest = 0;
  let anyFloor = false;
  for (let r = 0; r < n; r++) {
    if (st.seafloor[r]) {
      anyFloor = true;
      bracket[r] = -2;
      key[r] = nz;
      continue;
    }
    const k = nearest ? layerOf(edges, st.depth[r]) : bracketCentres(centres, st.depth[r]);
    bracket[r] = k;
    // the deeper level of the pair; the nearest layer itself; nz (last in the queue) below the grid
    const hi = nearest ? k : k === -1 ? 0 : k === nz - 1 ? k : k + 1;
    key[r] = hi;
    // below the grid: read every level, so that the seafloor it lies below is known
    const need = hi < nz - 1 ? hi : nz - 1;
    if (need > deepest) deepest = need;
  }
  // a stable counting sort by the deeper level; seafloor and below-grid stations (key nz) last
  const start = new Int32Array(nz + 2);
  for (let r = 0; r < n; r++) start[key[r] + 1]++;
  for (let k = 0; k <= nz; k++) start[k + 1] += start[k];
  const fill = start.slice(0, nz + 1);
  const station = new Int32Array(n);
  for (let r = 0; r < n; r++) station[fill[key[r]]++] = r;
  // second pass, in queue order: weights of the two levels
  const single = new Uint8Array(n);
  const frac = new Float64Array(n);
  const z = new Float64Array(n);
  const reach = new Float64Array(n);
  const kLo = new Int32Array(n);
  const seafloor = new Uint8Array(n);
  for (let q = 0; q < n; q++) {
    const r = station[q];
    const k = bracket[r];
    if (k === -2) {
      seafloor[q] = 1;
      z[q] = NaN;
      kLo[q] = -1;
      single[q] = 1;
      continue;
    }
    const d = st.depth[r];
    z[q] = d;
    if (nearest) {
      kLo[q] = k; // k = nz: below the grid, never read
      single[q] = 1;
      reach[q] = k < nz ? edges[k + 1] : -Infinity;
    } else if (k === -1) {
      single[q] = 1;
      reach[q] = Infinity;
    } else if (k === nz - 1) {
      kLo[q] = k;
      single[q] = 1;
      reach[q] = edges[nz];
    } else {
      kLo[q] = k;
      frac[q] = (d - centres[k]) / (centres[k + 1] - centres[k]);
      reach[q] = edges[k + 1];
    }
  }
  return { station, start, single, frac, z, reach, kLo, seafloor, lastLevel: anyFloor ? nz - 1 : deepest };
}

interface Stencils {
  rowPtr: Int32Array;
  col: Int32Array;
  w: Float64Array;
}

/** Per queue position: results and bookkeeping. */
interface Work {
  value: Float64Array;
  valueDepth: Float64Array;
  /** entry of the station's own column: the nearest candidate, or the largest bilinear weight (-1 off the grid) */
  ownAt: Int32Array;
  ownOk: Uint8Array;
}

/**
 * The stations whose deeper level is k, now that levels k - 1 (prev) and k (cur) are at hand: the value
 * in each surrounding column (linear in depth between the two, or the upper one held down to the bottom
 * edge of its layer), then across the columns (bilinear over the wet ones, or the first wet candidate).
 */
function evaluate(Q: Queue, W: Stencils, out: Work, k: number, prev: Float32Array | null, cur: Float32Array, nearest: boolean): void {
  const { rowPtr, col, w } = W;
  const { single, frac, z, reach } = Q;
  const { value, valueDepth, ownAt, ownOk } = out;
  for (let q = Q.start[k], end = Q.start[k + 1]; q < end; q++) {
    const upper = single[q] || prev === null ? cur : prev;
    const f = frac[q];
    let num = 0, den = 0;
    for (let p = rowPtr[q], e = rowPtr[q + 1]; p < e; p++) {
      const c = col[p];
      const a = upper[c];
      if (a !== a) continue;
      const bv = cur[c];
      const v = bv === bv ? a + f * (bv - a) : z[q] <= reach[q] ? a : NaN;
      if (v !== v) continue;
      if (p === ownAt[q]) ownOk[q] = 1;
      if (nearest) {
        num = v;
        den = 1;
        break;
      }
      num += w[p] * v;
      den += w[p];
    }
    if (den > 0) {
      value[q] = num / den;
      valueDepth[q] = z[q];
    }
  }
}

/** Remember the deepest wet level (and its value) of the columns of queue positions [from, to) or a list. */
function trackBottom(level: Float32Array, k: number, rows: ArrayLike<number>, W: Stencils, bottomK: Int16Array, bottomV: Float32Array): void {
  const { rowPtr, col } = W;
  for (let i = 0; i < rows.length; i++) {
    const q = rows[i];
    for (let p = rowPtr[q], e = rowPtr[q + 1]; p < e; p++) {
      const v = level[col[p]];
      if (v === v) {
        bottomK[p] = k;
        bottomV[p] = v;
      }
    }
  }
}

export async function sampleStations(field: FieldSource, st: StationPositions, opts: StationSampleOptions = {}): Promise<StationSamples> {
  const method = opts.method ?? 'trilinear';
  const nearest = method === 'nearest';
  const t = opts.t ?? 0;
  const grid: HorizontalGrid = field.grid.horizontal;
  const axis = field.grid.vertical ?? SURFACE_ONLY;
  const { nz, centres, edges } = axis;
  const n = st.lon.length;
  const Q = makeQueue(st, axis, method);
  // horizontal weights built in queue order, so that the level loop reads them front to back
  const lonQ = new Float64Array(n), latQ = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    lonQ[i] = st.lon[Q.station[i]];
    latQ[i] = st.lat[Q.station[i]];
  }
  const W = pointWeights(grid, lonQ, latQ, nearest ? 'nearest' : 'bilinear');
  const { rowPtr, col, w } = W;
  const nnz = col.length;
  const out: Work = { value: new Float64Array(n).fill(NaN), valueDepth: new Float64Array(n).fill(NaN), ownAt: new Int32Array(n).fill(-1), ownOk: new Uint8Array(n) };
  for (let q = 0; q < n; q++) {
    const b = rowPtr[q], e = rowPtr[q + 1];
    if (b === e) continue;
    let o = b;
    if (!nearest) for (let p = b + 1; p < e; p++) if (w[p] > w[o]) o = p;
    out.ownAt[q] = o;
  }

  // the seafloor stations are a run of the queue's tail
  const floorRows: number[] = [];
  for (let q = Q.start[nz]; q < n; q++) if (Q.seafloor[q]) floorRows.push(q);
  // the surface level is kept, to tell land from seafloor for the few stations without a value
  let surface: Float32Array = new Float32Array(0);
  const bottomK = new Int16Array(nnz).fill(-1);
  const bottomV = new Float32Array(floorRows.length ? nnz : 0).fill(NaN);
  let prev: Float32Array | null = null;
  for (let k = 0; k <= Q.lastLevel; k++) {
    const cur = await field.readLevel(t, k);
    if (k === 0) surface = cur;
    evaluate(Q, W, out, k, prev, cur, nearest);
    if (floorRows.length) trackBottom(cur, k, floorRows, W, bottomK, bottomV);
    prev = cur;
    opts.progress?.((k + 1) / (Q.lastLevel + 1));
  }

  // seafloor stations: the bottom wet cell of each surrounding column
  for (const q of floorRows) {
    let num = 0, den = 0, zNum = 0;
    for (let p = rowPtr[q], e = rowPtr[q + 1]; p < e; p++) {
      if (bottomK[p] < 0) continue;
      if (p === out.ownAt[q]) out.ownOk[q] = 1;
      const ww = nearest ? 1 : w[p];
      num += ww * bottomV[p];
      zNum += ww * centres[bottomK[p]];
      den += ww;
      if (nearest) break;
    }
    if (den > 0) {
      out.value[q] = num / den;
      out.valueDepth[q] = zNum / den;
    }
  }

  // statuses, and the seafloor of the own column where it explains one (a second pass over the
  // levels above, only for the stations whose own column is dry at their depth); written straight
  // back into the stations' own order
  const model = new Float64Array(n);
  const modelDepthM = new Float64Array(n);
  const seafloorM = new Float64Array(n).fill(NaN);
  const status = new Array<StationStatus>(n);
  const explain: number[] = [];
  let explainTo = -1;
  for (let q = 0; q < n; q++) {
    const r = Q.station[q];
    const v = out.value[q];
    model[r] = v;
    modelDepthM[r] = out.valueDepth[q];
    const o = out.ownAt[q];
    if (o < 0) {
      status[r] = 'outside_grid';
      continue;
    }
    if (v === v && out.ownOk[q]) {
      status[r] = 'ok';
      if (!Q.seafloor[q]) continue;
    }
    let anyWet = false;
    for (let p = rowPtr[q], e = rowPtr[q + 1]; p < e; p++) if (surface[col[p]] === surface[col[p]]) anyWet = true;
    if (v === v) status[r] = out.ownOk[q] ? 'ok' : 'from_neighbour';
    else status[r] = anyWet ? 'below_seafloor' : 'on_land';
    if (surface[col[o]] !== surface[col[o]]) seafloorM[r] = 0;
    else if (Q.seafloor[q]) seafloorM[r] = bottomK[o] >= 0 ? edges[bottomK[o] + 1] : 0;
    else {
      explain.push(q);
      explainTo = Math.max(explainTo, Math.min(Q.kLo[q], nz - 1));
    }
  }
  if (explain.length) {
    const k2 = new Int16Array(nnz).fill(-1);
    const v2 = new Float32Array(nnz);
    for (let k = 0; k <= explainTo; k++) trackBottom(await field.readLevel(t, k), k, explain, W, k2, v2);
    for (const q of explain) seafloorM[Q.station[q]] = k2[out.ownAt[q]] >= 0 ? edges[k2[out.ownAt[q]] + 1] : 0;
  }
  return { model, status, seafloorM, modelDepthM };
}
