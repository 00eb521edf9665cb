import type { FieldSource } from '../cf/field.js';
import { StillwaterError } from '../errors.js';
import type { Grid, HorizontalGrid } from '../grid/types.js';
import { rowSums, type RemapMethod, type SparseWeights } from './csr.js';
import { remapLevel } from './remap-level.js';
import { identityWeights, layerOverlapWeights, linearDepthWeights, type VerticalWeights } from './vertical-weights.js';
import { defaultCacheDir } from './weight-cache.js';
import { remapWeights } from './weights.js';

export interface RegridOptions {
  method?: RemapMethod;
  /** minimum covered fraction of a target cell (0..1); below it the target is NaN. Default 0.5 */
  coverage?: number;
  /** false keeps Σw·v / (target area × thickness) instead of Σw·v / Σ valid w. Default true */
  normalise?: boolean;
  /** folder of the weight cache; null keeps weights in memory only. Default: the user's cache folder */
  cacheDir?: string | null;
  /** 'overlap' (thickness-weighted, default) or 'linear' interpolation between level centres */
  vertical?: 'overlap' | 'linear';
}

export interface RegriddedField extends FieldSource {
  method: RemapMethod;
  verticalMethod: 'overlap' | 'linear' | 'none';
  weights: SparseWeights;
  weightOrigin: 'memory' | 'disk' | 'built';
  /**
   * covered fraction (0..1) of each target cell in the most recently read level k (kept for the last
   * few levels read; copy it to keep it longer, or use readLevelWithCoverage, whose arrays are yours)
   */
  coverage(k: number): Float32Array;
  readLevelWithCoverage(t: number, k: number): Promise<{ values: Float32Array; coverage: Float32Array }>;
  /** source values read so far, and how many of them were valid */
  stats: { sourceValues: number; sourceValid: number };
}

/**
 * A field on another grid, computed lazily level by level: per target level, only the overlapping
 * source levels are read, combined with the vertical weights into Σh·v and Σh (valid) per source
 * column, then remapped with the horizontal sparse weights (separable). Missing source values take
 * no part; the covered fraction of each target cell is kept and below `coverage` the target is NaN.
 */
export async function regridField(src: FieldSource, target: Grid, opts: RegridOptions = {}): Promise<RegriddedField> {
  const method = opts.method ?? 'conservative';
  const threshold = opts.coverage ?? 0.5;
  if (!(threshold >= 0 && threshold <= 1)) throw new StillwaterError('E_INPUT', `The coverage threshold must lie between 0 and 1, got ${threshold}.`);
  const normalise = opts.normalise ?? true;
  const where = `${src.file}, variable '${src.variable}'`;
  const subject = { file: src.file, variable: src.variable };
  const sh = src.grid.horizontal, th = target.horizontal;
  if (method === 'conservative') {
    checkBounds(th, 'The target grid has no usable cell bounds');
    checkBounds(sh, `${where}: the source grid has no usable cell bounds`);
  }
  const cacheDir = opts.cacheDir === undefined ? defaultCacheDir() : opts.cacheDir;
  const { weights, origin } = remapWeights(sh, th, method, { cacheDir });
  if (weights.col.length === 0) throw new StillwaterError('E_GRID', `${where}: its grid and the target grid do not overlap.`, subject);

  const sv = src.grid.vertical, tv = target.vertical;
  let vw: VerticalWeights;
  let verticalMethod: RegriddedField['verticalMethod'] = 'none';
  let outVertical = sv;
  if (sv && tv) {
    verticalMethod = opts.vertical ?? 'overlap';
    vw = verticalMethod === 'linear' ? linearDepthWeights(sv, tv) : layerOverlapWeights(sv, tv);
    if (vw.src.length === 0) throw new StillwaterError('E_GRID', `${where}: its depth range and the target depth range do not overlap.`, subject);
    outVertical = tv;
  } else {
    vw = identityWeights(sv ? sv.nz : 1);
  }

  const nSrc = sh.nx * sh.ny, nTgt = th.nx * th.ny;
  // what the weights of a fully covered target cell add up to
  const rowRef = method === 'conservative' ? th.area : method === 'bilinear' ? rowSums(weights) : rowsPresent(weights);
  const n = new Float64Array(nSrc), d = new Float64Array(nSrc);
  const scratch = method === 'nearest' ? { num: new Float64Array(nTgt), den: new Float64Array(nTgt) } : { num: new Float64Array(0), den: new Float64Array(0) };
  const rule = { threshold, normalise };
  const stats = { sourceValues: 0, sourceValid: 0 };
  const levels = new LevelCache(src, 4);
  const lastCoverage = new Map<number, { data: Float32Array; recyclable: boolean }>();

  async function readOne(t: number, k: number, ownCoverage: boolean): Promise<{ values: Float32Array; coverage: Float32Array }> {
    if (!(k >= 0 && k < vw.nz)) throw new StillwaterError('E_INPUT', `${where}: level ${k} is outside the target's ${vw.nz} levels.`, subject);
    const p0 = vw.start[k], p1 = vw.start[k + 1];
    if (p0 === p1) {
      n.fill(0);
      d.fill(0);
    }
    for (let p = p0; p < p1; p++) {
      const { level, fresh } = await levels.get(t, vw.src[p]);
      const valid = accumulate(level, vw.h[p], n, d, p === p0);
      if (fresh) {
        stats.sourceValues += level.length;
        stats.sourceValid += valid;
      }
    }
    const values = new Float32Array(nTgt);
    const coverage = ownCoverage ? new Float32Array(nTgt) : coverageBuffer(k);
    remapLevel(weights, rowRef, vw.ref[k], n, d, rule, values, coverage, scratch);
    lastCoverage.delete(k);
    lastCoverage.set(k, { data: coverage, recyclable: !ownCoverage });
    if (lastCoverage.size > 4) lastCoverage.delete(lastCoverage.keys().next().value as number);
    return { values, coverage };
  }

  /**
   * A coverage buffer for readLevel, which hands out only values: the oldest of the last few levels'
   * buffers is reused (coverage(k) arrays are valid until a few more levels are read), so reading
   * level after level allocates one array a level, not two.
   */
  function coverageBuffer(k: number): Float32Array {
    const own = lastCoverage.get(k);
    if (own?.recyclable) return own.data;
    if (lastCoverage.size >= 4) {
      const oldest = lastCoverage.keys().next().value as number;
      const e = lastCoverage.get(oldest)!;
      lastCoverage.delete(oldest);
      if (e.recyclable) return e.data;
    }
    return new Float32Array(nTgt);
  }

  // the work buffers are shared, so levels are computed one after another even when asked for at once
  let queue: Promise<unknown> = Promise.resolve();
  function queued(t: number, k: number, ownCoverage: boolean): Promise<{ values: Float32Array; coverage: Float32Array }> {
    const next = queue.then(() => readOne(t, k, ownCoverage));
    queue = next.catch(() => undefined);
    return next;
  }

  return {
    file: src.file,
    variable: src.variable,
    units: src.units,
    standardName: src.standardName,
    longName: src.longName,
    grid: { horizontal: th, vertical: outVertical },
    nt: src.nt,
    time: src.time,
    method,
    verticalMethod,
    weights,
    weightOrigin: origin,
    stats,
    async readLevel(t: number, k: number): Promise<Float32Array> {
      return (await queued(t, k, false)).values;
    },
    readLevelWithCoverage: (t: number, k: number) => queued(t, k, true),
    coverage(k: number): Float32Array {
      const c = lastCoverage.get(k);
      if (!c) throw new StillwaterError('E_INTERNAL', `coverage of level ${k} is asked for before that level was read.`);
      return c.data;
    },
  };
}

/**
 * n += h·v and d += h where v is valid; the first layer of a target level sets instead of adding.
 * (A plain function, so the engine optimises the loop.)
 */
function accumulate(level: Float32Array, h: number, n: Float64Array, d: Float64Array, first: boolean): number {
  let valid = 0;
  if (first) {
    for (let s = 0; s < level.length; s++) {
      const v = level[s];
      if (v === v) {
        n[s] = h * v;
        d[s] = h;
        valid++;
      } else {
        n[s] = 0;
        d[s] = 0;
      }
    }
    return valid;
  }
  for (let s = 0; s < level.length; s++) {
    const v = level[s];
    if (v === v) {
      n[s] += h * v;
      d[s] += h;
      valid++;
    }
  }
  return valid;
}

/** 1 for target cells with any nearest-wet candidate, else 0. */
function rowsPresent(w: SparseWeights): Float64Array {
  const out = new Float64Array(w.nRows);
  for (let r = 0; r < w.nRows; r++) out[r] = w.rowPtr[r + 1] > w.rowPtr[r] ? 1 : 0;
  return out;
}

function checkBounds(g: HorizontalGrid, sentence: string): void {
  const n = g.nx * g.ny;
  let bad = 0;
  for (let c = 0; c < n; c++) {
    if (!(g.area[c] > 0)) bad++;
    else {
      for (let q = 4 * c; q < 4 * c + 4; q++) {
        if (!Number.isFinite(g.cornerLon[q]) || !Number.isFinite(g.cornerLat[q])) {
          bad++;
          break;
        }
      }
    }
  }
  if (bad === n || n === 0) throw new StillwaterError('E_GRID', `${sentence} (no cell has finite corners and a positive area).`);
}

/** The few most recent source levels, so neighbouring target levels do not read a source level twice. */
class LevelCache {
  private readonly map = new Map<string, Float32Array>();
  constructor(
    private readonly src: FieldSource,
    private readonly size: number,
  ) {}
  /** the level, and whether it was just read (not from the cache) */
  async get(t: number, k: number): Promise<{ level: Float32Array; fresh: boolean }> {
    const key = `${t}:${k}`;
    const hit = this.map.get(key);
    if (hit) {
      this.map.delete(key);
      this.map.set(key, hit);
      return { level: hit, fresh: false };
    }
    const level = await this.src.readLevel(t, k);
    this.map.set(key, level);
    if (this.map.size > this.size) this.map.delete(this.map.keys().next().value as string);
    return { level, fresh: true };
  }
}
