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
import type { FieldSource } from '../cf/field.js';
import type { HorizontalGrid, VerticalAxis } from '../grid/types.js';
import { pointWeights } from '../lines/point-weights.js';

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

export async function sampleStations(field: FieldSource, st: StationPositions, opts: StationSampleOptions = {}): Promise<StationSamples> {
  const method = opts.method ?? 'trilinear';
  const t = opts.t ?? 0;
  const grid: HorizontalGrid = field.grid.horizontal;
  const axis = field.grid.vertical ?? SURFACE_ONLY;
  const { nz, centres, edges } = axis;
  const n = st.lon.length;
  const W = pointWeights(grid, st.lon, st.lat, method === 'trilinear' ? 'bilinear' : 'nearest');
  const { rowPtr, col, w } = W;
  const nnz = col.length;

  // vertical plan per station: levels kLo, kHi, fraction f, and the deepest depth kLo may stand for
  const kLo = new Int32Array(n);
  const kHi = new Int32Array(n);
  const frac = new Float64Array(n);
  const loReach = new Float64Array(n);
  let deepest = 0;
  let anySeafloor = false;
  for (let r = 0; r < n; r++) {
    if (st.seafloor[r]) {
      anySeafloor = true;
      kLo[r] = kHi[r] = -1;
      continue;
    }
    const z = st.depth[r];
    if (method === 'nearest') {
      const k = layerOf(edges, z);
      kLo[r] = kHi[r] = k; // k = nz: below the grid, never read
      frac[r] = 0;
      loReach[r] = k < nz ? edges[k + 1] : -Infinity;
    } else {
      const k = bracketCentres(centres, z);
      if (k === -1) {
        kLo[r] = kHi[r] = 0;
        frac[r] = 0;
        loReach[r] = Infinity;
      } else if (k === nz - 1) {
        kLo[r] = kHi[r] = k;
        frac[r] = 0;
        loReach[r] = edges[nz];
      } else {
        kLo[r] = k;
        kHi[r] = k + 1;
        frac[r] = (z - centres[k]) / (centres[k + 1] - centres[k]);
        loReach[r] = edges[k + 1];
      }
    }
    // below the grid: read every level, so that the seafloor it lies below is known
    deepest = Math.max(deepest, Math.min(kHi[r], nz - 1));
  }
  const lastLevel = anySeafloor ? nz - 1 : deepest;

  // stations by the level they need, so that each level touches only its own stations
  const byLo = bucket(kLo, nz);
  const byHi = bucket(kHi, nz);
  const floorRows: number[] = [];
  for (let r = 0; r < n; r++) if (st.seafloor[r]) floorRows.push(r);

  // per weight entry (station × column): values at kLo and kHi, wet at the surface, deepest wet level
  const lo = new Float32Array(nnz).fill(NaN);
  const hi = new Float32Array(nnz).fill(NaN);
  const surfaceWet = new Uint8Array(nnz);
  const bottomK = new Int16Array(nnz).fill(-1);
  const bottomV = new Float32Array(nnz).fill(NaN);
  const track = (level: Float32Array, k: number, rows: ArrayLike<number>): void => {
    for (let q = 0; q < rows.length; q++) {
      const r = rows[q];
      for (let p = rowPtr[r], e = rowPtr[r + 1]; p < e; p++) {
        const v = level[col[p]];
        if (v === v) {
          bottomK[p] = k;
          bottomV[p] = v;
        }
      }
    }
  };
  for (let k = 0; k <= lastLevel; k++) {
    const level = await field.readLevel(t, k);
    if (k === 0) for (let p = 0; p < nnz; p++) surfaceWet[p] = level[col[p]] === level[col[p]] ? 1 : 0;
    for (let q = byLo.start[k]; q < byLo.start[k + 1]; q++) {
      const r = byLo.rows[q];
      for (let p = rowPtr[r], e = rowPtr[r + 1]; p < e; p++) lo[p] = level[col[p]];
    }
    for (let q = byHi.start[k]; q < byHi.start[k + 1]; q++) {
      const r = byHi.rows[q];
      for (let p = rowPtr[r], e = rowPtr[r + 1]; p < e; p++) hi[p] = level[col[p]];
    }
    track(level, k, floorRows);
    opts.progress?.((k + 1) / (lastLevel + 1));
  }

  const model = new Float64Array(n).fill(NaN);
  const seafloorM = new Float64Array(n).fill(NaN);
  const modelDepthM = new Float64Array(n).fill(NaN);
  const status: StationStatus[] = new Array<StationStatus>(n);
  const own = new Int32Array(n).fill(-1);
  for (let r = 0; r < n; r++) {
    const b = rowPtr[r], e = rowPtr[r + 1];
    if (b === e) {
      status[r] = 'outside_grid';
      continue;
    }
    // the station's own column: the nearest candidate, or the largest bilinear weight
    let o = b;
    if (method !== 'nearest') for (let p = b + 1; p < e; p++) if (w[p] > w[o]) o = p;
    own[r] = o;
    let anyWet = false;
    for (let p = b; p < e; p++) if (surfaceWet[p]) anyWet = true;
    let num = 0, den = 0, zNum = 0;
    let ownHasValue = false;
    for (let p = b; p < e; p++) {
      let v: number;
      let zc: number;
      if (st.seafloor[r]) {
        v = bottomV[p];
        zc = bottomK[p] >= 0 ? centres[bottomK[p]] : NaN;
      } else {
        const a = lo[p], c = hi[p];
        if (a !== a) v = NaN;
        else if (c === c) v = a + frac[r] * (c - a);
        else v = st.depth[r] <= loReach[r] ? a : NaN;
        zc = st.depth[r];
      }
      if (v !== v) continue;
      if (p === o) ownHasValue = true;
      if (method === 'nearest') {
        num = v;
        zNum = zc;
        den = 1;
        break;
      }
      num += w[p] * v;
      zNum += w[p] * zc;
      den += w[p];
    }
    if (den > 0) {
      model[r] = num / den;
      modelDepthM[r] = zNum / den;
      status[r] = ownHasValue ? 'ok' : 'from_neighbour';
    } else {
      status[r] = anyWet ? 'below_seafloor' : 'on_land';
    }
    if (!surfaceWet[o]) seafloorM[r] = 0;
  }

  // the seafloor of the own column where it explains a status, or where the station is at the seafloor:
  // a second pass over the levels above, only for the stations whose own column is dry at their depth
  const explain: number[] = [];
  let explainTo = -1;
  for (let r = 0; r < n; r++) {
    if (own[r] < 0 || !surfaceWet[own[r]]) continue;
    if (st.seafloor[r]) {
      seafloorM[r] = bottomK[own[r]] >= 0 ? edges[bottomK[own[r]] + 1] : 0;
    } else if (status[r] === 'from_neighbour' || status[r] === 'below_seafloor') {
      explain.push(r);
      explainTo = Math.max(explainTo, Math.min(kLo[r], nz - 1));
    }
  }
  for (let k = 0; k <= explainTo; k++) track(await field.readLevel(t, k), k, explain);
  for (const r of explain) seafloorM[r] = bottomK[own[r]] >= 0 ? edges[bottomK[own[r]] + 1] : 0;
  return { model, status, seafloorM, modelDepthM };
}

/** Rows grouped by a level key (counting sort); keys outside 0..nz-1 are left out. */
function bucket(keys: Int32Array, nz: number): { start: Int32Array; rows: Int32Array } {
  const start = new Int32Array(nz + 1);
  for (let r = 0; r < keys.length; r++) if (keys[r] >= 0 && keys[r] < nz) start[keys[r] + 1]++;
  for (let k = 0; k < nz; k++) start[k + 1] += start[k];
  const fill = start.slice(0, nz);
  const rows = new Int32Array(start[nz]);
  for (let r = 0; r < keys.length; r++) if (keys[r] >= 0 && keys[r] < nz) rows[fill[keys[r]]++] = r;
  return { start, rows };
}
