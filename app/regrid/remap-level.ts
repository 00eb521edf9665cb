import { applyFirstValid, applySums, type SparseWeights } from './csr.js';

export interface LevelRule {
  /** minimum covered fraction; below it the target is NaN */
  threshold: number;
  /** Σw·v / Σ valid w (true) or Σw·v / full weight (false) */
  normalise: boolean;
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
  const { num, den } = scratch;
  if (weights.method === 'nearest') applyFirstValid(weights, n, d, num, den);
  else applySums(weights, n, d, num, den);
  const normalise = rule.normalise || weights.method === 'nearest';
  const floor = rule.threshold - 1e-12;
  for (let r = 0; r < weights.nRows; r++) {
    const full = rowRef[r] * ref;
    const b = den[r];
    const c = full > 0 ? Math.min(1, b / full) : 0;
    coverage[r] = c;
    values[r] = b > 0 && c >= floor ? (normalise ? num[r] / b : num[r] / full) : NaN;
  }
}
