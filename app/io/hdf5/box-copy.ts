/**
 * Copy a box of `count` elements from one C-ordered byte array into another, one contiguous
 * run at a time (whole inner dimensions merge into longer runs).
 */
import { contiguousStrides } from '../strided-read.js';
export function copyBox(
  src: Uint8Array, srcShape: number[], srcStart: number[],
  dst: Uint8Array, dstShape: number[], dstStart: number[],
  count: number[], elementSize: number,
): void {
  const rank = count.length;
  if (rank === 0) {
    dst.set(src.subarray(0, elementSize));
    return;
  }
  if (count.some((c) => c === 0)) return;
  const srcStrides = contiguousStrides(srcShape, elementSize);
  const dstStrides = contiguousStrides(dstShape, elementSize);
  // merge inner dimensions that are whole in both arrays
  let k = rank - 1;
  let run = count[k] * elementSize;
  while (k > 0 && count[k] === srcShape[k] && count[k] === dstShape[k]) {
    k--;
    run = count[k] * srcStrides[k];
  }
  let srcBase = 0;
  let dstBase = 0;
  for (let d = 0; d < rank; d++) {
    srcBase += srcStart[d] * srcStrides[d];
    dstBase += dstStart[d] * dstStrides[d];
  }
  if (k === 0) {
    dst.set(src.subarray(srcBase, srcBase + run), dstBase);
    return;
  }
  const idx = new Array<number>(k).fill(0);
  let rows = 1;
  for (let d = 0; d < k; d++) rows *= count[d];
  for (let r = 0; r < rows; r++) {
    let so = srcBase;
    let dO = dstBase;
    for (let d = 0; d < k; d++) {
      so += idx[d] * srcStrides[d];
      dO += idx[d] * dstStrides[d];
    }
    dst.set(src.subarray(so, so + run), dO);
    for (let d = k - 1; d >= 0; d--) {
      if (++idx[d] < count[d]) break;
      idx[d] = 0;
    }
  }
}
