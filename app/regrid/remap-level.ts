import { applyFirstValid, type SparseWeights } from './csr.js';

export interface LevelRule {
  /** minimum covered fraction; below it the target is NaN */
  threshold: number;
  /** Σw·v / Σ valid w (true) or Σw·v / full weight (false) */
  normalise: boolean;
}

/**
 * The per-level work of a regridded field: the sums of the source column, then the remapping of one
 * target level. MatrixLevel uses the sparse matrix in JavaScript; SeparableLevel (lat-lon pairs,
 * separable-level.ts) the two factors in WebAssembly.
 */
export interface LevelEngine {
  /** n (+)= h·v and d (+)= h over the valid values of one source level; `first` starts the sums. Returns the valid count. */
  accumulate(level: Float32Array, h: number, first: boolean): number;
  /** no source layer reaches this target level: n = d = 0 */
  clear(): void;
  /** remap the sums into values and coverage; `ref` is the vertical weight of a fully covered layer */
  finish(ref: number, rule: LevelRule, values: Float32Array, coverage: Float32Array): void;
  /** bytes of the work buffers */
  readonly workBytes: number;
}

export class MatrixLevel implements LevelEngine {
  private readonly n: Float64Array;
  private readonly d: Float64Array;
  private readonly scratch: { num: Float64Array; den: Float64Array };
  constructor(
    private readonly weights: SparseWeights,
    /** what the weights of a fully covered target cell add up to */
    private readonly rowRef: Float64Array,
  ) {
    this.n = new Float64Array(weights.nCols);
    this.d = new Float64Array(weights.nCols);
    const m = weights.method === 'nearest' ? weights.nRows : 0;
    this.scratch = { num: new Float64Array(m), den: new Float64Array(m) };
  }
  get workBytes(): number {
    return (this.n.length + this.d.length + this.scratch.num.length + this.scratch.den.length) * 8;
  }
  accumulate(level: Float32Array, h: number, first: boolean): number {
    return accumulate(level, h, this.n, this.d, first);
  }
  clear(): void {
    this.n.fill(0);
    this.d.fill(0);
  }
  finish(ref: number, rule: LevelRule, values: Float32Array, coverage: Float32Array): void {
    remapLevel(this.weights, this.rowRef, ref, this.n, this.d, rule, values, coverage, this.scratch);
  }
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

/**
 * One level through the horizontal weights. Per source cell, n = Σ h·v and d = Σ h over valid
 * values of the overlapping source layers (for 2-D fields, v and 1, or 0 and 0 where missing).
 * `rowRef` is what the weights of a fully covered target cell add up to (its area for conservative
 * weights, 1 for bilinear and nearest) and `ref` the same for the vertical weights.
 */
export function remapLevel(
  weights: SparseWeights,
  rowRef: Float64Array,
  ref: number,
  n: Float64Array,
  d: Float64Array,
  rule: LevelRule,
  values: Float32Array | Float64Array,
  coverage: Float32Array | Float64Array,
  scratch: { num: Float64Array; den: Float64Array },
): void {
  const floor = rule.threshold - 1e-12;
  if (weights.method === 'nearest') {
    const { num, den } = scratch;
    applyFirstValid(weights, n, d, num, den);
    finish(num, den, rowRef, ref, true, floor, values, coverage);
  } else {
    fusedSums(weights.rowPtr, weights.col, weights.w, n, d, inverse(rowRef), ref > 0 ? 1 / ref : 0, rule.normalise, floor, values, coverage);
  }
}

/** Σ w·n and Σ w·d per row, then coverage and value, in one pass (the hot loop of every level). */
function fusedSums(
  rowPtr: Int32Array,
  col: Int32Array,
  w: Float64Array,
  n: Float64Array,
  d: Float64Array,
  invRowRef: Float64Array,
  invRef: number,
  normalise: boolean,
  floor: number,
  values: Float32Array | Float64Array,
  coverage: Float32Array | Float64Array,
): void {
  const nRows = invRowRef.length;
  let p = rowPtr[0];
  for (let r = 0; r < nRows; r++) {
    // missing source values have n = d = 0, so no test is needed inside the loop; two entries a step
    // (measured about a fifth faster than one)
    let a = 0, b = 0;
    const e = rowPtr[r + 1];
    if (e - p === 4) {
      // the common row of lat-lon pairs (2 x 2 overlaps) in one step, summed in the same order as the
      // loop below, so results are bit for bit the same (measured about a sixth faster per level)
      const s0 = col[p], s1 = col[p + 1], s2 = col[p + 2], s3 = col[p + 3];
      const w0 = w[p], w1 = w[p + 1], w2 = w[p + 2], w3 = w[p + 3];
      a = 0 + (w0 * n[s0] + w1 * n[s1]) + (w2 * n[s2] + w3 * n[s3]);
      b = 0 + (w0 * d[s0] + w1 * d[s1]) + (w2 * d[s2] + w3 * d[s3]);
      p = e;
    }
    for (; p + 1 < e; p += 2) {
      const s0 = col[p], s1 = col[p + 1];
      const w0 = w[p], w1 = w[p + 1];
      a += w0 * n[s0] + w1 * n[s1];
      b += w0 * d[s0] + w1 * d[s1];
    }
    if (p < e) {
      const s = col[p];
      a += w[p] * n[s];
      b += w[p] * d[s];
      p++;
    }
    const inv = invRowRef[r] * invRef;
    let c = b * inv;
    if (c > 1) c = 1;
    coverage[r] = c;
    values[r] = b > 0 && c >= floor ? (normalise ? a / b : a * inv) : NaN;
  }
}

/** 1 / rowRef (0 where rowRef is 0), computed once per array: divisions are the slow part of a level. */
const inverses = new WeakMap<Float64Array, Float64Array>();
export function inverse(rowRef: Float64Array): Float64Array {
  let inv = inverses.get(rowRef);
  if (!inv) {
    inv = new Float64Array(rowRef.length);
    for (let r = 0; r < rowRef.length; r++) inv[r] = rowRef[r] > 0 ? 1 / rowRef[r] : 0;
    inverses.set(rowRef, inv);
  }
  return inv;
}

/** Coverage and value per target cell from the two sums. */
function finish(
  num: Float64Array,
  den: Float64Array,
  rowRef: Float64Array,
  ref: number,
  normalise: boolean,
  floor: number,
  values: Float32Array | Float64Array,
  coverage: Float32Array | Float64Array,
): void {
  for (let r = 0; r < num.length; r++) {
    const full = rowRef[r] * ref;
    const b = den[r];
    let c = full > 0 ? b / full : 0;
    if (c > 1) c = 1;
    coverage[r] = c;
    values[r] = b > 0 && c >= floor ? (normalise ? num[r] / b : num[r] / full) : NaN;
  }
}
