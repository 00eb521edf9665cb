/**
 * A field sampled along a line, level by level: values[k * n + s] is level k at sample s.
 * Bilinear samples are means over the wet neighbours, kept only where the wet neighbours carry at
 * least `coverage` of the weight (default 0.5, the remapping default), so coasts are not smeared
 * seaward; nearest takes the closest wet neighbour.
 */
import type { FieldSource } from '../cf/field-source.js';
import type { VerticalAxis } from '../grid/types.js';
import type { SparseWeights } from '../regrid/csr.js';

export interface SectionOptions {
  /** time index (default 0) */
  t?: number;
  /** minimum wet fraction of the bilinear weight (0..1), default 0.5 */
  coverage?: number;
  /** called after each level with the fraction done */
  progress?: (fraction: number) => void;
}

/** Apply point weights to one level; NaN where too little of the weight is wet. */
export function sampleLevel(weights: SparseWeights, level: Float32Array, out: Float32Array, coverage = 0.5): void {
  const { rowPtr, col, w } = weights;
  const firstValid = weights.method === 'nearest';
  for (let r = 0; r < weights.nRows; r++) {
    const b = rowPtr[r], e = rowPtr[r + 1];
    let num = 0, den = 0, all = 0;
    if (firstValid) {
      out[r] = NaN;
      for (let p = b; p < e; p++) {
        const v = level[col[p]];
        if (v === v) {
          out[r] = v;
          break;
        }
      }
      continue;
    }
    for (let p = b; p < e; p++) {
      const v = level[col[p]];
      const wp = w[p];
      all += wp;
      if (v === v) {
        num += wp * v;
        den += wp;
      }
    }
    out[r] = den > 0 && den >= coverage * all - 1e-12 ? num / den : NaN;
  }
}

/** The whole section of one field: all levels at all samples (level-major). */
export async function sampleSection(field: FieldSource, weights: SparseWeights, opts: SectionOptions = {}): Promise<Float32Array> {
  const nz = field.grid.vertical?.nz ?? 1;
  const n = weights.nRows;
  const values = new Float32Array(nz * n);
  for (let k = 0; k < nz; k++) {
    const level = await field.readLevel(opts.t ?? 0, k);
    sampleLevel(weights, level, values.subarray(k * n, (k + 1) * n), opts.coverage ?? 0.5);
    opts.progress?.((k + 1) / nz);
  }
  return values;
}

/**
 * The seafloor outline: the bottom edge of the deepest wet sampled level per sample (metres),
 * 0 where the whole column is dry (land).
 */
export function seafloorOutline(values: Float32Array, n: number, axis: VerticalAxis): Float64Array {
  const floor = new Float64Array(n);
  for (let k = 0; k < axis.nz; k++) {
    const base = k * n;
    for (let s = 0; s < n; s++) if (values[base + s] === values[base + s]) floor[s] = axis.edges[k + 1];
  }
  return floor;
}
