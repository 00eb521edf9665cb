import type { SparseWeights } from './csr.js';
import { KernelLevel } from './kernel-level.js';

/**
 * One engine per weights, shared by every field regridded with them: its memory holds them, and the weights'
 * arrays become views of that memory (a 0.1° source's weights, 100 MB, are then held once, not twice).
 */
const engines = new WeakMap<SparseWeights, SparseLevel>();

/**
 * Conservative (curvilinear sources) or bilinear weights as a sparse matrix, applied in WebAssembly
 * (kernels/remap.as.ts, remapSparse): (n, d) move as one pair, two entries a step. `invRowRef` is
 * 1 / what the weights of a fully covered target cell add up to (its area, or the row sum).
 */
export class SparseLevel extends KernelLevel<'rowPtr' | 'col' | 'w'> {
  /** The engine of these weights, made on first use (`invRowRef` is asked for only then). */
  static of(weights: SparseWeights, invRowRef: () => Float64Array): SparseLevel {
    let e = engines.get(weights);
    if (!e) {
      e = new SparseLevel(weights, invRowRef());
      engines.set(weights, e);
    }
    return e;
  }

  constructor(
    private readonly weights: SparseWeights,
    invRowRef: Float64Array,
  ) {
    super(weights.nCols, weights.nRows, invRowRef, { rowPtr: weights.rowPtr, col: weights.col, w: weights.w });
    weights.rowPtr = this.region('rowPtr', weights.rowPtr);
    weights.col = this.region('col', weights.col);
    weights.w = this.region('w', weights.w);
  }

  protected apply(invRef: number, floor: number, normalise: number): void {
    const { k, p } = this;
    k.remapSparse(this.weights.nRows, p.rowPtr, p.col, p.w, p.nd, p.invRowRef, invRef, floor, normalise, p.val, p.cov);
  }
}
