import type { FieldSource } from '../cf/field.js';
import { StillwaterError } from '../errors.js';
import { PointLocator, newStencil } from './locate.js';

export type SampleMethod = 'nearest' | 'bilinear' | 'trilinear';

export interface PointSampler {
  readonly method: SampleMethod;
  /**
   * The field's value at a point: lon/lat in degrees, depth in metres (positive down; ignored for
   * 2-D fields), time index t. NaN outside the grid, on land or below the seafloor.
   */
  sample(lon: number, lat: number, depth: number, t?: number): Promise<number>;
  /** Many points at once (same time index). */
  sampleMany(lon: ArrayLike<number>, lat: ArrayLike<number>, depth: ArrayLike<number>, t?: number): Promise<Float64Array>;
}

/**
 * Point sampling for sections, transects and stations. `nearest`: the nearest wet cell of the layer
 * holding the depth; `bilinear`: between the four surrounding centres of that layer; `trilinear`:
 * bilinear on the two levels whose centres bracket the depth, then linear in depth. Missing
 * neighbours are left out and the rest renormalised when they carry at least half the weight.
 * The few most recent levels are kept, so points along a line read each level once.
 */
export function makePointSampler(field: FieldSource, method: SampleMethod, opts: { cacheLevels?: number } = {}): PointSampler {
  const loc = new PointLocator(field.grid.horizontal);
  const vertical = field.grid.vertical;
  const limit = Math.max(2, opts.cacheLevels ?? 8);
  const cache = new Map<string, Float32Array>();
  const st = newStencil();
  const cand = new Int32Array(9);

  async function level(t: number, k: number): Promise<Float32Array> {
    const key = `${t}:${k}`;
    let v = cache.get(key);
    if (v) {
      cache.delete(key);
    } else {
      v = await field.readLevel(t, k);
    }
    cache.set(key, v);
    if (cache.size > limit) cache.delete(cache.keys().next().value as string);
    return v;
  }

  /** Layer holding the depth (by layer edges), or -1 below the grid. */
  function layerAt(depth: number): number {
    if (!vertical) return 0;
    if (!Number.isFinite(depth)) return -1;
    const e = vertical.edges;
    if (depth < e[0] || depth > e[vertical.nz]) return -1;
    let k = 0;
    while (k < vertical.nz - 1 && depth >= e[k + 1]) k++;
    return k;
  }

  async function horizontal(lon: number, lat: number, t: number, k: number): Promise<number> {
    const v = await level(t, k);
    if (method === 'nearest') {
      const n = loc.nearest(lon, lat, cand);
      for (let q = 0; q < n; q++) {
        const x = v[cand[q]];
        if (x === x) return x;
      }
      return NaN;
    }
    if (!loc.bilinear(lon, lat, st)) return NaN;
    let s = 0, w = 0;
    for (let q = 0; q < st.n; q++) {
      const x = v[st.idx[q]];
      if (x === x) {
        s += st.w[q] * x;
        w += st.w[q];
      }
    }
    return w >= 0.5 - 1e-12 ? s / w : NaN;
  }

  async function sample(lon: number, lat: number, depth: number, t = 0): Promise<number> {
    if (!(t >= 0 && t < field.nt)) throw new StillwaterError('E_INPUT', `${field.file}, variable '${field.variable}': time index ${t} is outside its ${field.nt} steps.`);
    if (method !== 'trilinear' || !vertical) {
      const k = layerAt(depth);
      return k < 0 ? NaN : horizontal(lon, lat, t, k);
    }
    if (layerAt(depth) < 0) return NaN;
    const c = vertical.centres, nz = vertical.nz;
    let k0: number, k1: number, f: number;
    if (depth <= c[0]) [k0, k1, f] = [0, 0, 0];
    else if (depth >= c[nz - 1]) [k0, k1, f] = [nz - 1, nz - 1, 0];
    else {
      k0 = 0;
      while (c[k0 + 1] < depth) k0++;
      k1 = k0 + 1;
      f = (depth - c[k0]) / (c[k1] - c[k0]);
    }
    const a = await horizontal(lon, lat, t, k0);
    if (k1 === k0 || f === 0) return a;
    const b = await horizontal(lon, lat, t, k1);
    if (a === a && b === b) return a + f * (b - a);
    if (a === a && f <= 0.5) return a;
    if (b === b && f >= 0.5) return b;
    return NaN;
  }

  return {
    method,
    sample,
    async sampleMany(lon, lat, depth, t = 0) {
      const out = new Float64Array(lon.length);
      for (let i = 0; i < lon.length; i++) out[i] = await sample(lon[i], lat[i], depth[i], t);
      return out;
    },
  };
}
