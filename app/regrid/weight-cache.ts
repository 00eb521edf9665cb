import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, renameSync, writeFileSync, unlinkSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';
import type { HorizontalGrid } from '../grid/types.js';
import type { RemapMethod, SparseWeights } from './csr.js';

/** Bump when the weight computation changes, so stale cache files are never reused. */
const FORMAT_VERSION = 5;
const MAGIC = 0x57525753; // "SWRW" little-endian

/** The user's cache folder: $XDG_CACHE_HOME/stillwater, else ~/.cache/stillwater. */
export function defaultCacheDir(): string {
  const xdg = process.env.XDG_CACHE_HOME;
  return join(xdg && xdg.length > 0 ? xdg : join(homedir(), '.cache'), 'stillwater');
}

/** sha256 over both grids' corner arrays, shapes and the method. */
export function weightKey(source: HorizontalGrid, target: HorizontalGrid, method: RemapMethod): string {
  const h = createHash('sha256');
  h.update(`stillwater-weights v${FORMAT_VERSION} ${method}\n`);
  for (const g of [source, target]) {
    h.update(`${g.kind} ${g.nx} ${g.ny}\n`);
    if (g.kind === 'rectilinear' && g.axes && method === 'conservative') {
      // a lat-lon grid's corners are its edges: hashing the edges is the same and much cheaper
      h.update(bytes(g.axes.lonEdges));
      h.update(bytes(g.axes.latEdges));
      continue;
    }
    h.update(bytes(g.cornerLon));
    h.update(bytes(g.cornerLat));
    if (method !== 'conservative') {
      h.update(bytes(g.lon));
      h.update(bytes(g.lat));
    }
  }
  return h.digest('hex');
}

function bytes(a: Float64Array): Uint8Array {
  return new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
}

/** Read cached weights; undefined when absent or damaged (then they are simply rebuilt). */
export function readCachedWeights(dir: string, key: string, method: RemapMethod): SparseWeights | undefined {
  let buf: Buffer;
  try {
    buf = readFileSync(join(dir, `weights-${key}.bin`));
  } catch {
    return undefined;
  }
  if (buf.byteLength < 32) return undefined;
  const head = new DataView(buf.buffer, buf.byteOffset, 32);
  if (head.getUint32(0, true) !== MAGIC || head.getUint32(4, true) !== FORMAT_VERSION) return undefined;
  const nRows = head.getUint32(8, true), nCols = head.getUint32(12, true), nnz = head.getUint32(16, true);
  const expected = 32 + 4 * (nRows + 1) + 4 * nnz + 8 * nnz;
  if (buf.byteLength !== expected) return undefined;
  // copy into aligned typed arrays
  const body = buf.buffer.slice(buf.byteOffset + 32, buf.byteOffset + expected);
  const rowPtr = new Int32Array(body, 0, nRows + 1);
  const col = new Int32Array(body, 4 * (nRows + 1), nnz);
  const wOff = 4 * (nRows + 1) + 4 * nnz;
  const w = wOff % 8 === 0 ? new Float64Array(body, wOff, nnz) : new Float64Array(body.slice(wOff));
  if (rowPtr[0] !== 0 || rowPtr[nRows] !== nnz) return undefined;
  return { method, nRows, nCols, rowPtr, col, w };
}

/** Write weights to the cache: a temporary file renamed into place, so readers never see half a file. */
export function writeCachedWeights(dir: string, key: string, m: SparseWeights): void {
  mkdirSync(dir, { recursive: true });
  const head = new DataView(new ArrayBuffer(32));
  head.setUint32(0, MAGIC, true);
  head.setUint32(4, FORMAT_VERSION, true);
  head.setUint32(8, m.nRows, true);
  head.setUint32(12, m.nCols, true);
  head.setUint32(16, m.col.length, true);
  const final = join(dir, `weights-${key}.bin`);
  const tmp = `${final}.${process.pid}.${Date.now()}.tmp`;
  try {
    writeFileSync(tmp, Buffer.concat([new Uint8Array(head.buffer), u8(m.rowPtr), u8(m.col), u8(m.w)]));
    renameSync(tmp, final);
  } catch {
    // a cache that cannot be written only costs time later
    try {
      unlinkSync(tmp);
    } catch {
      /* nothing to remove */
    }
  }
}

function u8(a: Int32Array | Float64Array): Uint8Array {
  return new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
}
