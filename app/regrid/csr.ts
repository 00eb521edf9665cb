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

/**
 * Triplets collected while building, in blocks (growing never copies, and never holds twice what is needed:
 * a 0.1° source has 8 M of them), turned into CSR by a counting sort on the row; each block is let go as
 * soon as it has been sorted in.
 */
export class TripletBuilder {
  private blocks: { rows: Int32Array; cols: Int32Array; vals: Float64Array }[] = [];
  private rows: Int32Array;
  private cols: Int32Array;
  private vals: Float64Array;
  private fill = 0;
  n = 0;
  constructor(private readonly blockSize = 1024) {
    this.rows = new Int32Array(blockSize);
    this.cols = new Int32Array(blockSize);
    this.vals = new Float64Array(blockSize);
    this.blocks.push({ rows: this.rows, cols: this.cols, vals: this.vals });
  }
  push(row: number, col: number, w: number): void {
    if (this.fill === this.rows.length) this.grow();
    const f = this.fill++;
    this.rows[f] = row;
    this.cols[f] = col;
    this.vals[f] = w;
    this.n++;
  }
  private grow(): void {
    // blocks double up to 1 M entries (16 MB), then stay at that size
    const size = Math.min(Math.max(this.blockSize, this.rows.length * 2), Math.max(this.blockSize, 1 << 20));
    this.rows = new Int32Array(size);
    this.cols = new Int32Array(size);
    this.vals = new Float64Array(size);
    this.fill = 0;
    this.blocks.push({ rows: this.rows, cols: this.cols, vals: this.vals });
  }
  /** CSR with entries of a row in the order they were pushed (stable). The builder is empty afterwards. */
  toCsr(method: RemapMethod, nRows: number, nCols: number): SparseWeights {
    const rowPtr = new Int32Array(nRows + 1);
    const used = (b: number): number => (b === this.blocks.length - 1 ? this.fill : this.blocks[b].rows.length);
    for (let b = 0; b < this.blocks.length; b++) {
      const rows = this.blocks[b].rows;
      for (let p = 0, e = used(b); p < e; p++) rowPtr[rows[p] + 1]++;
    }
    for (let r = 0; r < nRows; r++) rowPtr[r + 1] += rowPtr[r];
    const next = rowPtr.slice(0, nRows);
    const col = new Int32Array(this.n);
    const w = new Float64Array(this.n);
    for (let b = 0; b < this.blocks.length; b++) {
      const { rows, cols, vals } = this.blocks[b];
      for (let p = 0, e = used(b); p < e; p++) {
        const q = next[rows[p]]++;
        col[q] = cols[p];
        w[q] = vals[p];
      }
      this.blocks[b] = EMPTY_BLOCK;
    }
    this.blocks = [];
    this.n = 0;
    this.fill = 0;
    ({ rows: this.rows, cols: this.cols, vals: this.vals } = EMPTY_BLOCK);
    return { method, nRows, nCols, rowPtr, col, w };
  }
}

const EMPTY_BLOCK = { rows: new Int32Array(0), cols: new Int32Array(0), vals: new Float64Array(0) };

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
