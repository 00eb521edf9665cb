/**
 * Undoing the HDF5 filters netCDF-4 writers use: deflate (id 1), shuffle (id 2), fletcher32 (id 3).
 * Deflate runs in Node's native zlib; shuffle is a byte transpose done here.
 */
import { inflateSync } from 'node:zlib';
import type { FilterStep } from './layout.js';

export const FILTER_DEFLATE = 1;
export const FILTER_SHUFFLE = 2;
export const FILTER_FLETCHER32 = 3;
const KNOWN = new Set([FILTER_DEFLATE, FILTER_SHUFFLE, FILTER_FLETCHER32]);

export function filtersWeUndo(filters: FilterStep[]): boolean {
  return filters.every((f) => KNOWN.has(f.id));
}

/** Decode one stored chunk: apply the pipeline backwards, skipping filters masked off for this chunk. */
export function decodeChunk(raw: Uint8Array, filters: FilterStep[], filterMask: number, elementSize: number): Uint8Array {
  let bytes = raw;
  for (let i = filters.length - 1; i >= 0; i--) {
    if (filterMask & (1 << i)) continue;
    const f = filters[i];
    if (f.id === FILTER_DEFLATE) {
      const b = inflateSync(bytes);
      bytes = new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
    } else if (f.id === FILTER_SHUFFLE) {
      bytes = unshuffle(bytes, f.clientData[0] ?? elementSize);
    } else if (f.id === FILTER_FLETCHER32) {
      bytes = bytes.subarray(0, bytes.byteLength - 4);
    }
  }
  return bytes;
}

/**
 * The shuffle filter stores byte 0 of every element, then byte 1 of every element, ...;
 * put the bytes of each element back together. Trailing bytes that do not fill an element are left as is.
 */
export function unshuffle(src: Uint8Array, size: number): Uint8Array {
  if (size <= 1) return src;
  const n = Math.floor(src.byteLength / size);
  const out = new Uint8Array(src.byteLength);
  if (size === 4) {
    const b1 = n, b2 = 2 * n, b3 = 3 * n;
    const out32 = new Uint32Array(out.buffer, 0, n);
    // assemble little-endian words on a little-endian host; byte order is fixed later by the caller
    for (let i = 0; i < n; i++) out32[i] = src[i] | (src[b1 + i] << 8) | (src[b2 + i] << 16) | (src[b3 + i] << 24);
    if (!LITTLE) for (let i = 0; i < n; i++) for (let k = 0; k < 4; k++) out[i * 4 + k] = src[k * n + i];
  } else {
    for (let k = 0; k < size; k++) {
      const base = k * n;
      for (let i = 0, o = k; i < n; i++, o += size) out[o] = src[base + i];
    }
  }
  out.set(src.subarray(n * size), n * size);
  return out;
}

const LITTLE = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
