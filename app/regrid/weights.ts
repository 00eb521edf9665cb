import { StillwaterError } from '../errors.js';
import type { HorizontalGrid } from '../grid/types.js';
import { conservativeCurvilinear } from './conservative-curvilinear.js';
import { conservativeRectilinear } from './conservative-rectilinear.js';
import type { RemapMethod, SparseWeights } from './csr.js';
import { bilinearWeights, nearestWeights } from './interpolation-weights.js';
import { clearSeparableEngines } from './separable-level.js';
import { readCachedWeights, weightKey, writeCachedWeights } from './weight-cache.js';

/** Weights kept in memory for the life of the process, so variables and runs on one grid share them. */
const memory = new Map<string, SparseWeights>();
const MEMORY_LIMIT = 6;

export interface WeightOptions {
  /** folder of the disk cache; null keeps weights in memory only */
  cacheDir: string | null;
}

/** Weights from the memory cache, the disk cache, or built now (and then stored in both). */
export function remapWeights(source: HorizontalGrid, target: HorizontalGrid, method: RemapMethod, opts: WeightOptions): { weights: SparseWeights; origin: 'memory' | 'disk' | 'built' } {
  const key = weightKey(source, target, method);
  const hit = memory.get(key);
  if (hit) return { weights: hit, origin: 'memory' };
  let origin: 'disk' | 'built' = 'disk';
  let w = opts.cacheDir ? readCachedWeights(opts.cacheDir, key, method) : undefined;
  if (!w || w.nRows !== target.nx * target.ny || w.nCols !== source.nx * source.ny) {
    w = buildWeights(source, target, method);
    origin = 'built';
    if (opts.cacheDir) writeCachedWeights(opts.cacheDir, key, w);
  }
  if (memory.size >= MEMORY_LIMIT) memory.delete(memory.keys().next().value as string);
  memory.set(key, w);
  return { weights: w, origin };
}

/** Build weights without any cache. */
export function buildWeights(source: HorizontalGrid, target: HorizontalGrid, method: RemapMethod): SparseWeights {
  if (method === 'bilinear') return bilinearWeights(source, target);
  if (method === 'nearest') return nearestWeights(source, target);
  const srcLatLon = isLatLon(source), tgtLatLon = isLatLon(target);
  if (srcLatLon && tgtLatLon) return conservativeRectilinear(source, target);
  if (tgtLatLon) return conservativeCurvilinear(source, target);
  if (srcLatLon) return transpose(conservativeCurvilinear(target, source));
  throw new StillwaterError('E_GRID', 'Conservative remapping needs a lat-lon grid on one side; both grids here are curvilinear.');
}

/** A grid whose cells are lat-lon rectangles given by two axes. */
export function isLatLon(g: HorizontalGrid): boolean {
  return g.kind === 'rectilinear' && !!g.axes;
}

/** The transposed matrix (overlap areas are symmetric in source and target). */
export function transpose(m: SparseWeights): SparseWeights {
  const rowPtr = new Int32Array(m.nCols + 1);
  for (let p = 0; p < m.col.length; p++) rowPtr[m.col[p] + 1]++;
  for (let r = 0; r < m.nCols; r++) rowPtr[r + 1] += rowPtr[r];
  const fill = rowPtr.slice(0, m.nCols);
  const col = new Int32Array(m.col.length);
  const w = new Float64Array(m.col.length);
  for (let r = 0; r < m.nRows; r++) {
    for (let p = m.rowPtr[r]; p < m.rowPtr[r + 1]; p++) {
      const q = fill[m.col[p]]++;
      col[q] = r;
      w[q] = m.w[p];
    }
  }
  return { method: m.method, nRows: m.nCols, nCols: m.nRows, rowPtr, col, w };
}

/** Forget the in-memory weights (tests, or after a large job). */
export function clearWeightMemory(): void {
  memory.clear();
  clearSeparableEngines();
}
