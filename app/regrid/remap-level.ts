import { applyFirstValid, type SparseWeights } from './csr.js';

export interface LevelRule {
  /** minimum covered fraction; below it the target is NaN */
  threshold: number;
  /** Σw·v / Σ valid w (true) or Σw·v / full weight (false) */
  normalise: boolean;
}

/** One source layer of a target level: its values and its vertical weight (overlap thickness, or interpolation weight). */
export interface SourceLayer {
  level: Float32Array;
  h: number;
}

/**
 * The per-level work of a regridded field: n = Σ h·v and d = Σ h over the valid values of the source
 * layers, per source cell, then the horizontal remapping into values and coverage, in one synchronous
 * call (so that engines may share their buffers between fields). SeparableLevel (lat-lon pairs) and
 * SparseLevel (any other conservative or bilinear weights) run in WebAssembly; NearestLevel, whose
 * first-valid rule is no weighted sum, in JavaScript.
 */
export interface LevelEngine {
  /** `ref` is the vertical weight of a fully covered layer; returns the valid count of each layer */
  remap(layers: SourceLayer[], ref: number, rule: LevelRule, values: Float32Array, coverage: Float32Array): number[];
  /** bytes of the work buffers */
  readonly workBytes: number;
}

/**
 * Nearest-wet sampling: per target cell the first candidate (nearest first) whose source column has
 * valid data gives the value; coverage is the valid fraction of that column's layers.
 */
export class NearestLevel implements LevelEngine {
  private readonly n: Float64Array;
  private readonly d: Float64Array;
  private readonly num: Float64Array;
  private readonly den: Float64Array;
  private readonly present: Float64Array;

  constructor(private readonly weights: SparseWeights) {
    this.n = new Float64Array(weights.nCols);
    this.d = new Float64Array(weights.nCols);
    this.num = new Float64Array(weights.nRows);
    this.den = new Float64Array(weights.nRows);
    // 1 for target cells with any candidate, else 0
    this.present = new Float64Array(weights.nRows);
    for (let r = 0; r < weights.nRows; r++) this.present[r] = weights.rowPtr[r + 1] > weights.rowPtr[r] ? 1 : 0;
  }

  get workBytes(): number {
    return (this.n.length + this.d.length + this.num.length + this.den.length + this.present.length) * 8;
  }

  remap(layers: SourceLayer[], ref: number, rule: LevelRule, values: Float32Array, coverage: Float32Array): number[] {
    if (layers.length === 0) {
      this.n.fill(0);
      this.d.fill(0);
    }
    const valid = layers.map((l, i) => accumulate(l.level, l.h, this.n, this.d, i === 0));
    const { num, den, present } = this;
    applyFirstValid(this.weights, this.n, this.d, num, den);
    const floor = rule.threshold - 1e-12;
    for (let r = 0; r < num.length; r++) {
      const full = present[r] * ref;
      const b = den[r];
      let c = full > 0 ? b / full : 0;
      if (c > 1) c = 1;
      coverage[r] = c;
      values[r] = b > 0 && c >= floor ? num[r] / b : NaN;
    }
    return valid;
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

/** 1 / x per element (0 where x is 0), computed once per array: divisions are the slow part of a level. */
const inverses = new WeakMap<Float64Array, Float64Array>();
export function inverse(x: Float64Array): Float64Array {
  let inv = inverses.get(x);
  if (!inv) {
    inv = new Float64Array(x.length);
    for (let r = 0; r < x.length; r++) inv[r] = x[r] > 0 ? 1 / x[r] : 0;
    inverses.set(x, inv);
  }
  return inv;
}
