/**
 * Where each chunk of a chunked dataset is stored. Version-1 B-trees (layout message v3, what
 * netCDF-4 files written with the 1.8 format bounds use), single-chunk, implicit and (unpaged)
 * fixed-array indexes (newer file formats, fixed-size datasets) are read here (HDF5 File Format Specification III.A.1 and VII); other index kinds return undefined
 * and the caller falls back to the HDF5 library.
 */
import type { ByteSource } from '../byte-source.js';
import type { Layout } from './layout.js';
import { readUint, UNDEFINED_ADDRESS, type Superblock } from './superblock.js';

export interface ChunkEntry {
  /** element coordinates of the chunk's first element */
  offset: number[];
  address: number;
  size: number;
  filterMask: number;
}

/** Largest chunk we decode (the HDF5 library itself allows at most 4 GiB; netCDF writers use kilobytes to megabytes). */
export const MAX_CHUNK_BYTES = 256 * 1024 * 1024;

/**
 * Most bytes a stored (filtered) chunk may take for `chunkBytes` of data: deflate's worst case (zlib's
 * compressBound: n + n/4096 + n/16384 + 13) plus fletcher32's 4-byte checksum, rounded up generously.
 */
export function maxStoredBytes(chunkBytes: number): number {
  return chunkBytes + Math.ceil(chunkBytes / 1024) + 64;
}

/** The index refuses damage with an Error naming what is wrong; the caller turns it into a sentence. */
export async function readChunkIndex(
  source: ByteSource, sb: Superblock, layout: Extract<Layout, { kind: 'chunked' }>, shape: number[], elementSize: number,
): Promise<ChunkEntry[] | undefined> {
  if (layout.address === UNDEFINED_ADDRESS) return [];
  const rank = shape.length;
  const chunkBytes = layout.chunk.reduce((a, b) => a * b, 1) * elementSize;
  const grid = shape.map((n, i) => Math.ceil(n / layout.chunk[i]));
  const chunkCount = grid.reduce((a, b) => a * b, 1);
  const entries = await readEntries(source, sb, layout, shape, rank, chunkBytes, chunkCount);
  if (entries) checkEntries(entries, layout.chunk, shape, chunkBytes, chunkCount, source.size - sb.baseAddress);
  return entries;
}

async function readEntries(
  source: ByteSource, sb: Superblock, layout: Extract<Layout, { kind: 'chunked' }>, shape: number[], rank: number,
  chunkBytes: number, chunkCount: number,
): Promise<ChunkEntry[] | undefined> {
  switch (layout.index) {
    case 'btree1':
      return readBtree1(source, sb, layout.address, rank, chunkCount);
    case 'single':
      return [{ offset: new Array(rank).fill(0), address: layout.address, size: layout.singleSize ?? chunkBytes, filterMask: layout.singleMask ?? 0 }];
    case 'implicit': {
      // chunks stored one after the other in C order of chunk coordinates, never filtered
      const grid = shape.map((n, i) => Math.ceil(n / layout.chunk[i]));
      const total = grid.reduce((a, b) => a * b, 1);
      if (layout.address + total * chunkBytes > source.size) throw new Error('the implicit chunk index runs past the end of the file');
      const out: ChunkEntry[] = [];
      const idx = new Array<number>(rank).fill(0);
      for (let c = 0; c < total; c++) {
        out.push({ offset: idx.map((x, i) => x * layout.chunk[i]), address: layout.address + c * chunkBytes, size: chunkBytes, filterMask: 0 });
        for (let d = rank - 1; d >= 0; d--) {
          if (++idx[d] < grid[d]) break;
          idx[d] = 0;
        }
      }
      return out;
    }
    case 'fixed-array':
      return readFixedArray(source, sb, layout.address, layout.chunk, shape, chunkBytes);
    default:
      return undefined;
  }
}

/**
 * Fixed-array chunk index (HDF5 File Format Specification VII.B, "Fixed Array Header" / "Data Block"):
 * one entry per chunk in C order of the chunk grid. Paged data blocks (more chunks than one page holds)
 * are left to the library.
 */
async function readFixedArray(
  source: ByteSource, sb: Superblock, address: number, chunk: number[], shape: number[], chunkBytes: number,
): Promise<ChunkEntry[] | undefined> {
  const O = sb.sizeOfOffsets;
  const L = sb.sizeOfLengths;
  const head = await source.read(sb.baseAddress + address, 8 + L + O);
  if (String.fromCharCode(head[0], head[1], head[2], head[3]) !== 'FAHD') throw new Error('no fixed array header');
  const hv = new DataView(head.buffer, head.byteOffset, head.byteLength);
  const clientId = head[5];
  const entrySize = head[6];
  const pageBits = head[7];
  const nEntries = readUint(hv, 8, L);
  const blockAddress = readUint(hv, 8 + L, O);
  if (nEntries > 2 ** pageBits) return undefined; // paged
  const grid0 = shape.map((n, i) => Math.ceil(n / chunk[i]));
  if (nEntries !== grid0.reduce((a, b) => a * b, 1)) throw new Error(`the fixed array holds ${nEntries} chunks, not one per chunk of the grid`);
  if (entrySize < O || (clientId === 1 && entrySize < O + 5)) throw new Error('the fixed array entries are too small');
  const prefix = 6 + O; // signature, version, client id, header address
  const body = await source.read(sb.baseAddress + blockAddress, prefix + nEntries * entrySize);
  if (String.fromCharCode(body[0], body[1], body[2], body[3]) !== 'FADB') throw new Error('no fixed array data block');
  const v = new DataView(body.buffer, body.byteOffset, body.byteLength);
  const grid = shape.map((n, i) => Math.ceil(n / chunk[i]));
  const out: ChunkEntry[] = [];
  const idx = new Array<number>(shape.length).fill(0);
  for (let e = 0; e < nEntries; e++) {
    const at = prefix + e * entrySize;
    const addr = readUint(v, at, O);
    let size = chunkBytes;
    let filterMask = 0;
    if (clientId === 1) {
      size = readUint(v, at + O, entrySize - O - 4);
      filterMask = v.getUint32(at + entrySize - 4, true);
    }
    out.push({ offset: idx.map((x, i) => x * chunk[i]), address: addr, size, filterMask });
    for (let d = shape.length - 1; d >= 0; d--) {
      if (++idx[d] < grid[d]) break;
      idx[d] = 0;
    }
  }
  return out;
}


/**
 * Version-1 B-tree of chunks (HDF5 File Format Specification III.A.1): every node visited once (a node that
 * points back at itself or an ancestor is damage, not a reason to loop), levels strictly decreasing, and
 * no more leaf entries than the dataset has chunks.
 */
async function readBtree1(source: ByteSource, sb: Superblock, root: number, rank: number, chunkCount: number): Promise<ChunkEntry[]> {
  const O = sb.sizeOfOffsets;
  const keySize = 8 + 8 * (rank + 1);
  const out: ChunkEntry[] = [];
  const seen = new Set<number>();
  const pending: { addr: number; level: number }[] = [{ addr: root, level: -1 }];
  while (pending.length) {
    const { addr, level: expectedLevel } = pending.pop() as { addr: number; level: number };
    if (seen.has(addr)) throw new Error(`the chunk B-tree reaches node ${addr} twice`);
    seen.add(addr);
    if (seen.size > chunkCount + 1) throw new Error('the chunk B-tree has more nodes than the dataset has chunks');
    const at = sb.baseAddress + addr;
    const head = await source.read(at, 8 + 2 * O);
    if (head[0] !== 0x54 || head[1] !== 0x52 || head[2] !== 0x45 || head[3] !== 0x45) throw new Error(`no B-tree node at ${addr}`);
    if (head[4] !== 1) throw new Error(`the B-tree node at ${addr} is not a chunk node`);
    const level = head[5];
    if (expectedLevel >= 0 && level !== expectedLevel) throw new Error(`the B-tree node at ${addr} has level ${level} where ${expectedLevel} belongs`);
    const entries = head[6] | (head[7] << 8);
    if (level === 0 && out.length + entries > chunkCount) throw new Error('the chunk B-tree lists more chunks than the dataset has');
    const bodyLength = entries * (keySize + O) + keySize;
    const body = await source.read(at + 8 + 2 * O, bodyLength);
    const v = new DataView(body.buffer, body.byteOffset, body.byteLength);
    for (let i = 0; i < entries; i++) {
      const k = i * (keySize + O);
      const child = readUint(v, k + keySize, O);
      if (level > 0) {
        pending.push({ addr: child, level: level - 1 });
        continue;
      }
      const offset: number[] = [];
      for (let d = 0; d < rank; d++) offset.push(readUint(v, k + 8 + 8 * d, 8));
      out.push({ offset, address: child, size: v.getUint32(k, true), filterMask: v.getUint32(k + 4, true) });
    }
  }
  return out;
}

/**
 * Every entry a chunk of the grid, once, stored inside the file, no larger than its data can be stored:
 * a damaged index becomes a sentence instead of a wrong answer or a gigabyte allocation.
 */
function checkEntries(entries: ChunkEntry[], chunk: number[], shape: number[], chunkBytes: number, chunkCount: number, fileSize: number): void {
  if (entries.length > chunkCount) throw new Error('the chunk index lists more chunks than the dataset has');
  const keys = new Set<string>();
  const limit = maxStoredBytes(chunkBytes);
  for (const e of entries) {
    if (e.offset.length !== shape.length) throw new Error('a chunk index entry has the wrong number of dimensions');
    for (let d = 0; d < shape.length; d++) {
      const o = e.offset[d];
      if (o % chunk[d] !== 0 || o >= Math.max(shape[d], 1)) throw new Error('a chunk index entry lies outside the dataset');
    }
    const key = e.offset.join(',');
    if (keys.has(key)) throw new Error('the chunk index lists a chunk twice');
    keys.add(key);
    if (e.address === UNDEFINED_ADDRESS) continue;
    if (e.size > limit || e.size < 0) throw new Error(`a stored chunk of ${e.size} bytes is larger than its ${chunkBytes} bytes of data can be`);
    if (e.address < 0 || e.address + e.size > fileSize) throw new Error('a stored chunk lies past the end of the file');
  }
}
