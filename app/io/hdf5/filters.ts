/**
 * Undoing the HDF5 filters netCDF-4 writers use: deflate (id 1), shuffle (id 2), fletcher32 (id 3).
 * Deflate runs in Node's native zlib; shuffle is a byte transpose done here.
 */
import { inflate, inflateSync } from 'node:zlib';
import type { FilterStep } from './layout.js';

export const FILTER_DEFLATE = 1;
export const FILTER_SHUFFLE = 2;
export const FILTER_FLETCHER32 = 3;
const KNOWN = new Set([FILTER_DEFLATE, FILTER_SHUFFLE, FILTER_FLETCHER32]);

export function filtersWeUndo(filters: FilterStep[]): boolean {
  return filters.every((f) => KNOWN.has(f.id));
}

/**
 * Decode one stored chunk: apply the pipeline backwards, skipping filters masked off for this chunk.
 * `expected` is the chunk's size in bytes (product of chunk dimensions x element size): inflating never
 * produces more (a damaged stream could otherwise inflate to gigabytes), and a result of another size is damage.
 */
export function decodeChunk(raw: Uint8Array, filters: FilterStep[], filterMask: number, elementSize: number, expected: number, into?: Uint8Array): Uint8Array {
  let bytes = raw;
  for (let i = filters.length - 1; i >= 0; i--) {
    if (filterMask & (1 << i)) continue;
    const f = filters[i];
    if (f.id === FILTER_DEFLATE) {
      const b = inflateCapped(bytes, inflateLimit(expected));
      bytes = new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
    } else if (f.id === FILTER_SHUFFLE) {
      // the last step of a whole chunk that is the whole slab writes straight into the caller's array
      const last = into && into.byteLength === bytes.byteLength && !filters.slice(0, i).some((_, m) => !(filterMask & (1 << m)));
      bytes = unshuffle(bytes, f.clientData[0] ?? elementSize, last ? into : undefined);
    } else if (f.id === FILTER_FLETCHER32) {
      bytes = bytes.subarray(0, Math.max(0, bytes.byteLength - 4));
    }
  }
  return checkDecoded(bytes, expected);
}

/** zlib refuses output pieces smaller than this (zlib.constants.Z_MIN_CHUNK) */
const MIN_CHUNK_SIZE = 64;

/** A filter before deflate in the pipeline may add a little (fletcher32 its 4-byte checksum): allow for it. */
function inflateLimit(expected: number): number {
  return expected + 64;
}

function inflateCapped(bytes: Uint8Array, limit: number): Buffer {
  try {
    // one output buffer of the chunk's size: zlib's default 16 KiB pieces, joined afterwards, cost a third more CPU
    return inflateSync(bytes, { maxOutputLength: limit, chunkSize: Math.max(MIN_CHUNK_SIZE, limit) });
  } catch (e) {
    if ((e as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') throw new Error(`a chunk inflates to more than ${limit} bytes`, { cause: e });
    throw e;
  }
}

function checkDecoded(bytes: Uint8Array, expected: number): Uint8Array {
  if (bytes.byteLength !== expected) throw new Error(`a chunk decodes to ${bytes.byteLength} bytes instead of ${expected}`);
  return bytes;
}

/** As decodeChunk, with the inflate step run on Node's thread pool (for reading ahead). */
export async function decodeChunkAsync(raw: Uint8Array, filters: FilterStep[], filterMask: number, elementSize: number, expected: number): Promise<Uint8Array> {
  let bytes = raw;
  for (let i = filters.length - 1; i >= 0; i--) {
    if (filterMask & (1 << i)) continue;
    const f = filters[i];
    if (f.id === FILTER_DEFLATE) {
      const b = await new Promise<Buffer>((resolve, reject) =>
        inflate(bytes, { maxOutputLength: inflateLimit(expected), chunkSize: Math.max(MIN_CHUNK_SIZE, inflateLimit(expected)) }, (err, out) => (err ? reject(err) : resolve(out))),
      );
      bytes = new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
    } else if (f.id === FILTER_SHUFFLE) {
      bytes = unshuffle(bytes, f.clientData[0] ?? elementSize);
    } else if (f.id === FILTER_FLETCHER32) {
      bytes = bytes.subarray(0, Math.max(0, bytes.byteLength - 4));
    }
  }
  return checkDecoded(bytes, expected);
}

/**
 * The shuffle filter stores byte 0 of every element, then byte 1 of every element, ...;
 * put the bytes of each element back together. Trailing bytes that do not fill an element are left as is.
 */
export function unshuffle(src: Uint8Array, size: number, into?: Uint8Array): Uint8Array {
  if (size <= 1) return src;
  const n = Math.floor(src.byteLength / size);
  const out = into && into.byteLength === src.byteLength ? into : new Uint8Array(src.byteLength);
  if (size === 4 && LITTLE && n % 4 === 0 && src.byteOffset % 4 === 0 && out.byteOffset % 4 === 0) {
    unshuffle4Words(new Uint32Array(src.buffer, src.byteOffset, n), new Uint32Array(out.buffer, out.byteOffset, n), n);
  } else {
    for (let k = 0; k < size; k++) {
      const base = k * n;
      for (let i = 0, o = k; i < n; i++, o += size) out[o] = src[base + i];
    }
  }
  out.set(src.subarray(n * size), n * size);
  return out;
}

/**
 * 4-byte elements, four at a time: one 32-bit word from each byte plane holds byte k of four
 * consecutive elements; a 4x4 byte transpose in registers rebuilds the four elements
 * (a quarter of the memory loads of a byte-by-byte gather).
 */
function unshuffle4Words(src: Uint32Array, out: Uint32Array, n: number): void {
  const q = n >>> 2;
  const p1 = q, p2 = 2 * q, p3 = 3 * q;
  for (let j = 0, o = 0; j < q; j++, o += 4) {
    const a = src[j], b = src[p1 + j], c = src[p2 + j], d = src[p3 + j];
    out[o] = (a & 0xff) | ((b & 0xff) << 8) | ((c & 0xff) << 16) | (d << 24);
    out[o + 1] = ((a >>> 8) & 0xff) | (b & 0xff00) | ((c & 0xff00) << 8) | ((d & 0xff00) << 16);
    out[o + 2] = ((a >>> 16) & 0xff) | ((b >>> 8) & 0xff00) | (c & 0xff0000) | ((d & 0xff0000) << 8);
    out[o + 3] = (a >>> 24) | ((b >>> 16) & 0xff00) | ((c >>> 8) & 0xff0000) | (d & 0xff000000);
  }
}

const LITTLE = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
