/**
 * Sparse remapping weights in compressed sparse row form: one row per target cell, one column per
 * source cell. For conservative remapping a weight is the overlap area in m²; for bilinear it is
 * a fraction of the target cell's area; for nearest it orders candidates (first valid wins).
 */
export interface SparseWeights {
  method: RemapMethod;
  /** number of target cells */
  nRows: number;
  /** number of source cells */
  nCols: number;
  rowPtr: Int32Array;
  col: Int32Array;
  w: Float64Array;
}

export type RemapMethod = 'conservative' | 'bilinear' | 'nearest';

/** Triplets collected while building, turned into CSR by a counting sort on the row. */
export class TripletBuilder {
  private rows: Int32Array;
  private cols: Int32Array;
  private vals: Float64Array;
  n = 0;
  constructor(capacity = 1024) {
    this.rows = new Int32Array(capacity);
    this.cols = new Int32Array(capacity);
    this.vals = new Float64Array(capacity);
  }
  push(row: number, col: number, w: number): void {
    if (this.n === this.rows.length) this.grow();
    this.rows[this.n] = row;
    this.cols[this.n] = col;
    this.vals[this.n] = w;
    this.n++;
  }
  private grow(): void {
    const cap = this.rows.length * 2;
    const r = new Int32Array(cap), c = new Int32Array(cap), v = new Float64Array(cap);
    r.set(this.rows);
    c.set(this.cols);
    v.set(this.vals);
    this.rows = r;
    this.cols = c;
    this.vals = v;
  }
  /** CSR with entries of a row in the order they were pushed (stable). */
  toCsr(method: RemapMethod, nRows: number, nCols: number): SparseWeights {
    const rowPtr = new Int32Array(nRows + 1);
    for (let p = 0; p < this.n; p++) rowPtr[this.rows[p] + 1]++;
    for (let r = 0; r < nRows; r++) rowPtr[r + 1] += rowPtr[r];
    const fill = rowPtr.slice(0, nRows);
    const col = new Int32Array(this.n);
    const w = new Float64Array(this.n);
    for (let p = 0; p < this.n; p++) {
      const q = fill[this.rows[p]]++;
      col[q] = this.cols[p];
      w[q] = this.vals[p];
    }
    return { method, nRows, nCols, rowPtr, col, w };
  }
}

/** Σ over a row of the weights: the overlap area of a target cell with the whole source grid. */
export function rowSums(m: SparseWeights): Float64Array {
  const s = new Float64Array(m.nRows);
  for (let r = 0; r < m.nRows; r++) {
    let a = 0;
    for (let p = m.rowPtr[r]; p < m.rowPtr[r + 1]; p++) a += m.w[p];
    s[r] = a;
  }
  return s;
}

/** Σ over a column: how much of each source cell the target grid receives. */
export function columnSums(m: SparseWeights): Float64Array {
  const s = new Float64Array(m.nCols);
  for (let p = 0; p < m.col.length; p++) s[m.col[p]] += m.w[p];
  return s;
}

/** Nearest-wet: the first candidate of a row with valid data wins (candidates sorted by distance). */
export function applyFirstValid(m: SparseWeights, n: Float64Array, d: Float64Array, num: Float64Array, den: Float64Array): void {
  const { rowPtr, col } = m;
  for (let r = 0; r < m.nRows; r++) {
    num[r] = 0;
    den[r] = 0;
    for (let p = rowPtr[r], e = rowPtr[r + 1]; p < e; p++) {
      const s = col[p];
      if (d[s] > 0) {
        num[r] = n[s];
        den[r] = d[s];
        break;
      }
    }
  }
}
