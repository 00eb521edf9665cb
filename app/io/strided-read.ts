/**
 * Reading a hyperslab out of a strided on-disk layout as few contiguous byte ranges as possible.
 * A (time, depth, lat, lon) level is one range; a whole record of a record variable is one range.
 */
import { readIntoFrom, type ByteSource } from './byte-source.js';

export interface StridedLayout {
  /** byte offset of element [0, 0, ...] */
  base: number;
  /** bytes per element */
  elementSize: number;
  shape: number[];
  /** byte step of each dimension (for a record variable the first is the record size) */
  strides: number[];
}

/** C-order byte strides of a contiguous array. */
export function contiguousStrides(shape: number[], elementSize: number): number[] {
  const s = new Array<number>(shape.length);
  let step = elementSize;
  for (let i = shape.length - 1; i >= 0; i--) {
    s[i] = step;
    step *= shape[i];
  }
  return s;
}

/** Ranges larger than this are read straight into place; smaller ones may be gathered from one larger read. */
const DIRECT_RUN_BYTES = 256 * 1024;

/** The contiguous byte ranges of a slab, in the slab's C order: their offsets and common length. */
export function planRuns(layout: StridedLayout, start: number[], count: number[]): { offsets: number[]; runBytes: number } {
  const { base, elementSize } = layout;
  let { shape, strides } = layout;
  if (shape.length === 0) return { offsets: [base], runBytes: elementSize };
  if (strides[strides.length - 1] !== elementSize) {
    // e.g. a 1-D record variable: its only dimension steps by the record size; add a packed unit dimension.
    shape = [...shape, 1];
    strides = [...strides, elementSize];
    start = [...start, 0];
    count = [...count, 1];
  }
  const rank = shape.length;

  // Grow the contiguous run inwards-out while the inner dimension is taken whole and packed.
  let k = rank - 1;
  let runBytes = count[k] * elementSize; // the last dimension is always packed
  while (k > 0 && count[k] === shape[k] && strides[k - 1] === shape[k] * strides[k]) {
    k--;
    runBytes = count[k] * strides[k];
  }
  const offsets: number[] = [];
  const idx = new Array<number>(k).fill(0);
  let nRuns = 1;
  for (let d = 0; d < k; d++) nRuns *= count[d];
  for (let r = 0; r < nRuns; r++) {
    let off = base + start[k] * strides[k];
    for (let d = 0; d < k; d++) off += (start[d] + idx[d]) * strides[d];
    offsets.push(off);
    for (let d = k - 1; d >= 0; d--) {
      if (++idx[d] < count[d]) break;
      idx[d] = 0;
    }
  }
  return { offsets, runBytes };
}

/**
 * Fill `out` (C order, the slab's own shape) with the slab [start, start+count) of the layout.
 * Bytes land as stored; the caller fixes byte order afterwards.
 */
export async function readStrided(source: ByteSource, layout: StridedLayout, start: number[], count: number[], out: Uint8Array): Promise<void> {
  if (out.byteLength === 0) return;
  const { offsets, runBytes } = planRuns(layout, start, count);
  const nRuns = offsets.length;
  if (nRuns === 1) return readIntoFrom(source, offsets[0], out);
  const first = offsets[0];
  const span = offsets[nRuns - 1] + runBytes - first;
  if (runBytes < DIRECT_RUN_BYTES && span <= Math.max(4 * out.byteLength, 1 << 20)) {
    const buf = new Uint8Array(span);
    await readIntoFrom(source, first, buf);
    for (let r = 0; r < nRuns; r++) out.set(buf.subarray(offsets[r] - first, offsets[r] - first + runBytes), r * runBytes);
    return;
  }
  for (let r = 0; r < nRuns; r++) await readIntoFrom(source, offsets[r], out.subarray(r * runBytes, (r + 1) * runBytes));
}
