import type { HorizontalGrid } from '../grid/types.js';
import { separableWeights, type AxisOverlap, type SeparableWeights } from './conservative-rectilinear.js';
import { KernelLevel } from './kernel-level.js';
import { inverse } from './remap-level.js';
import { weightKey } from './weight-cache.js';

/** Engines of the last few lat-lon pairs, by a hash of both grids' edges: fields on one pair share one. */
const engines = new Map<string, SeparableLevel>();
const ENGINES_KEPT = 6;

/** The engine for conservative remapping from one lat-lon grid onto another (made on first use). */
export function separableEngine(source: HorizontalGrid, target: HorizontalGrid): SeparableLevel {
  const key = weightKey(source, target, 'conservative');
  let e = engines.get(key);
  if (e) engines.delete(key);
  else e = new SeparableLevel(separableWeights(source, target), inverse(target.area));
  engines.set(key, e);
  if (engines.size > ENGINES_KEPT) engines.delete(engines.keys().next().value as string);
  return e;
}

/** Forget the kept engines (with the weights kept in memory: tests, or after a large job). */
export function clearSeparableEngines(): void {
  engines.clear();
}

/**
 * Conservative remapping between two lat-lon grids with the weights kept as their two factors, run in
 * WebAssembly target row by target row (kernels/remap.as.ts, remapSeparable). About twice as fast as
 * the full sparse matrix, and equal to it to rounding (the products are grouped per axis).
 */
export class SeparableLevel extends KernelLevel<'lonIdx' | 'lonW' | 'latStart' | 'latSrc' | 'latLen' | 'row' | 'ab'> {
  private readonly slots: number;

  constructor(
    /** the two factors */
    readonly factors: SeparableWeights,
    invRowRef: Float64Array,
  ) {
    const w = factors;
    const lon = ellpack(w.lon, w.tgtNx);
    super(w.srcNx * w.srcNy, w.tgtNx * w.tgtNy, invRowRef, {
      lonIdx: lon.idx,
      lonW: lon.w,
      latStart: w.lat.start,
      latSrc: w.lat.src,
      latLen: w.lat.len,
      row: 16 * w.srcNx,
      ab: 16 * w.tgtNx,
    });
    this.slots = lon.slots;
  }

  protected apply(invRef: number, floor: number, normalise: number): void {
    const { k, p } = this;
    const w = this.factors;
    k.remapSeparable(w.tgtNy, w.tgtNx, w.srcNx, p.latStart, p.latSrc, p.latLen, this.slots, p.lonIdx, p.lonW, p.nd, p.row, p.ab, p.invRowRef, invRef, floor, normalise, p.val, p.cov);
  }
}

/**
 * A per-target-column list (CSR) as `slots` rows of one entry per column, padded with weight 0 on the
 * column's first source (n and d are finite, so a padded entry adds exactly 0).
 */
export function ellpack(f: AxisOverlap, nt: number): { slots: number; idx: Int32Array; w: Float64Array } {
  let slots = 1;
  for (let t = 0; t < nt; t++) slots = Math.max(slots, f.start[t + 1] - f.start[t]);
  const idx = new Int32Array(slots * nt), w = new Float64Array(slots * nt);
  for (let t = 0; t < nt; t++) {
    const p0 = f.start[t], count = f.start[t + 1] - p0;
    for (let s = 0; s < slots; s++) {
      idx[s * nt + t] = count > 0 ? f.src[p0 + Math.min(s, count - 1)] : 0;
      w[s * nt + t] = s < count ? f.len[p0 + s] : 0;
    }
  }
  return { slots, idx, w };
}
