/**
 * The bottom layer, found while the levels stream past (top to bottom, any order works): for every
 * column we keep the deepest level where the model is valid, where the reference is valid, and where both
 * are, with the values there. Memory: a few arrays of one level.
 */
export class BottomTracker {
  /** deepest level with a valid model value (-1: none) */
  readonly modelDeepest: Int32Array;
  readonly refDeepest: Int32Array;
  /** deepest level where both are valid, and the two values there */
  readonly bothDeepest: Int32Array;
  readonly model: Float64Array;
  readonly ref: Float64Array;

  constructor(readonly ncell: number) {
    this.modelDeepest = new Int32Array(ncell).fill(-1);
    this.refDeepest = new Int32Array(ncell).fill(-1);
    this.bothDeepest = new Int32Array(ncell).fill(-1);
    this.model = new Float64Array(ncell).fill(NaN);
    this.ref = new Float64Array(ncell).fill(NaN);
  }

  update(k: number, model: ArrayLike<number>, ref: ArrayLike<number>): void {
    for (let c = 0; c < this.ncell; c++) {
      const m = model[c];
      const r = ref[c];
      const mOk = m - m === 0;
      const rOk = r - r === 0;
      if (mOk && k > this.modelDeepest[c]) this.modelDeepest[c] = k;
      if (rOk && k > this.refDeepest[c]) this.refDeepest[c] = k;
      if (mOk && rOk && k > this.bothDeepest[c]) {
        this.bothDeepest[c] = k;
        this.model[c] = m;
        this.ref[c] = r;
      }
    }
  }

  /**
   * Model and reference values of the bottom layer (NaN where a column is not taken). With a tolerance
   * (metres), a column is taken only when the depths (level centres) of its deepest model cell and its
   * deepest reference cell differ by at most that much.
   */
  select(centres: ArrayLike<number>, tolerance?: number | null): { model: Float64Array; ref: Float64Array; level: Int32Array } {
    const model = new Float64Array(this.ncell).fill(NaN);
    const ref = new Float64Array(this.ncell).fill(NaN);
    const level = new Int32Array(this.ncell).fill(-1);
    for (let c = 0; c < this.ncell; c++) {
      const k = this.bothDeepest[c];
      if (k < 0) continue;
      if (tolerance !== undefined && tolerance !== null) {
        const dz = Math.abs(centres[this.modelDeepest[c]] - centres[this.refDeepest[c]]);
        if (!(dz <= tolerance)) continue;
      }
      model[c] = this.model[c];
      ref[c] = this.ref[c];
      level[c] = k;
    }
    return { model, ref, level };
  }

  /** 1 where the reference has any valid value in the column (for the compared share of the bottom). */
  refColumns(): Float64Array {
    const out = new Float64Array(this.ncell).fill(NaN);
    for (let c = 0; c < this.ncell; c++) if (this.refDeepest[c] >= 0) out[c] = 1;
    return out;
  }
}
