import type { FieldSource } from '../cf/field-source.js';
import { StillwaterError } from '../errors.js';
import { cellCorners } from '../grid/corners.js';
import type { Grid, HorizontalGrid } from '../grid/types.js';
import { rowSums, type RemapMethod, type SparseWeights } from './csr.js';
import type { SeparableWeights } from './conservative-rectilinear.js';
import { inverse, NearestLevel, type LevelEngine, type SourceLayer } from './remap-level.js';
import { separableEngine } from './separable-level.js';
import { SparseLevel } from './sparse-level.js';
import { identityWeights, layerOverlapWeights, linearDepthWeights, type VerticalWeights } from './vertical-weights.js';
import { defaultCacheDir } from './weight-cache.js';
import { isLatLon, remapWeights } from './weights.js';

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
  /** the horizontal weights as one sparse matrix (for lat-lon pairs built on first use: they are applied as two factors) */
  weights: SparseWeights;
  /** entries of that matrix */
  weightEntries: number;
  /** bytes held for the weights as applied (the two factors, or the matrix) and for the per-level work buffers */
  heldBytes: { weights: number; work: number };
  /** 'separable': conservative between two lat-lon grids, applied as two 1-D factors built in well under a millisecond, not cached */
  weightOrigin: 'memory' | 'disk' | 'built' | 'separable';
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
  const separable = method === 'conservative' && isLatLon(sh) && isLatLon(th) ? separableEngine(sh, th) : null;
  const factors: SeparableWeights | null = separable ? separable.factors : null;
  let matrix = factors ? null : remapWeights(sh, th, method, { cacheDir });
  const origin = matrix ? matrix.origin : 'separable';
  const entries = factors ? factors.entries : matrix!.weights.col.length;
  const fullMatrix = (): SparseWeights => (matrix ??= remapWeights(sh, th, method, { cacheDir })).weights;
  if (entries === 0) throw new StillwaterError('E_GRID', `${where}: its grid and the target grid do not overlap.`, subject);

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

  const nTgt = th.nx * th.ny;
  const rule = { threshold, normalise };
  const stats = { sourceValues: 0, sourceValid: 0 };
  const engine: LevelEngine =
    separable ?? (method === 'nearest' ? new NearestLevel(fullMatrix()) : SparseLevel.of(fullMatrix(), () => inverse(method === 'conservative' ? th.area : rowSums(fullMatrix()))));
  const levels = new LevelCache(src, 4);
  const lastCoverage = new Map<number, { data: Float32Array; recyclable: boolean }>();

  async function readOne(t: number, k: number, ownCoverage: boolean): Promise<{ values: Float32Array; coverage: Float32Array }> {
    if (!(k >= 0 && k < vw.nz)) throw new StillwaterError('E_INPUT', `${where}: level ${k} is outside the target's ${vw.nz} levels.`, subject);
    const p0 = vw.start[k], p1 = vw.start[k + 1];
    const layers: SourceLayer[] = [];
    const fresh: boolean[] = [];
    for (let p = p0; p < p1; p++) {
      const got = await levels.get(t, vw.src[p]);
      layers.push({ level: got.level, h: vw.h[p] });
      fresh.push(got.fresh);
    }
    const values = new Float32Array(nTgt);
    const coverage = ownCoverage ? new Float32Array(nTgt) : coverageBuffer(k);
    const valid = engine.remap(layers, vw.ref[k], rule, values, coverage);
    for (let i = 0; i < layers.length; i++) {
      if (!fresh[i]) continue;
      stats.sourceValues += layers[i].level.length;
      stats.sourceValid += valid[i];
    }
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
    get weights() {
      return fullMatrix();
    },
    weightEntries: entries,
    heldBytes: { weights: factors ? factorBytes(factors) : matrixBytes(fullMatrix()), work: engine.workBytes },
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

function factorBytes(f: SeparableWeights): number {
  return [f.lon, f.lat].reduce((sum, a) => sum + a.start.byteLength + a.src.byteLength + a.len.byteLength, 0);
}

function matrixBytes(w: SparseWeights): number {
  return w.rowPtr.byteLength + w.col.byteLength + w.w.byteLength;
}

function checkBounds(g: HorizontalGrid, sentence: string): void {
  const n = g.nx * g.ny;
  let bad = 0;
  const cl = new Float64Array(4), ca = new Float64Array(4);
  for (let c = 0; c < n; c++) {
    if (!(g.area[c] > 0)) bad++;
    else {
      cellCorners(g, c, cl, ca);
      for (let q = 0; q < 4; q++) {
        if (!Number.isFinite(cl[q]) || !Number.isFinite(ca[q])) {
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
