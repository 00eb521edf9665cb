import { createHash } from 'node:crypto';
import { closeSync, fstatSync, mkdirSync, openSync, readSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';
import { cornerRow } from '../grid/corners.js';
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
    // row by row: the same bytes as the 4-per-cell arrays, without making them for a grid that keeps a lattice
    const row = new Float64Array(4 * g.nx);
    for (const which of ['lon', 'lat'] as const) for (let j = 0; j < g.ny; j++) h.update(bytes(cornerRow(g, j, which, row)));
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
  let fd: number;
  try {
    fd = openSync(join(dir, `weights-${key}.bin`), 'r');
  } catch {
    return undefined;
  }
  try {
    // straight into the arrays: no whole-file buffer beside them (a 0.1° source's weights are 100 MB)
    const size = fstatSync(fd).size;
    const headBytes = new Uint8Array(32);
    if (size < 32 || readSync(fd, headBytes, 0, 32, 0) !== 32) return undefined;
    const head = new DataView(headBytes.buffer);
    if (head.getUint32(0, true) !== MAGIC || head.getUint32(4, true) !== FORMAT_VERSION) return undefined;
    const nRows = head.getUint32(8, true), nCols = head.getUint32(12, true), nnz = head.getUint32(16, true);
    if (size !== 32 + 4 * (nRows + 1) + 4 * nnz + 8 * nnz) return undefined;
    const rowPtr = new Int32Array(nRows + 1);
    const col = new Int32Array(nnz);
    const w = new Float64Array(nnz);
    let at = 32;
    for (const a of [rowPtr, col, w]) {
      if (readFully(fd, u8(a), at) !== a.byteLength) return undefined;
      at += a.byteLength;
    }
    if (rowPtr[0] !== 0 || rowPtr[nRows] !== nnz) return undefined;
    return { method, nRows, nCols, rowPtr, col, w };
  } catch {
    return undefined;
  } finally {
    closeSync(fd);
  }
}

function readFully(fd: number, into: Uint8Array, position: number): number {
  let done = 0;
  while (done < into.byteLength) {
    const got = readSync(fd, into, done, Math.min(into.byteLength - done, 1 << 30), position + done);
    if (got === 0) break;
    done += got;
  }
  return done;
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
    // piece by piece: no copy of the whole matrix in one buffer
    const fd = openSync(tmp, 'w');
    try {
      for (const piece of [new Uint8Array(head.buffer), u8(m.rowPtr), u8(m.col), u8(m.w)]) writeSync(fd, piece);
    } finally {
      closeSync(fd);
    }
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
