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

export async function readChunkIndex(
  source: ByteSource, sb: Superblock, layout: Extract<Layout, { kind: 'chunked' }>, shape: number[], elementSize: number,
): Promise<ChunkEntry[] | undefined> {
  if (layout.address === UNDEFINED_ADDRESS) return [];
  const rank = shape.length;
  const chunkBytes = layout.chunk.reduce((a, b) => a * b, 1) * elementSize;
  switch (layout.index) {
    case 'btree1':
      return readBtree1(source, sb, layout.address, rank);
    case 'single':
      return [{ offset: new Array(rank).fill(0), address: layout.address, size: layout.singleSize ?? chunkBytes, filterMask: layout.singleMask ?? 0 }];
    case 'implicit': {
      // chunks stored one after the other in C order of chunk coordinates, never filtered
      const grid = shape.map((n, i) => Math.ceil(n / layout.chunk[i]));
      const total = grid.reduce((a, b) => a * b, 1);
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

async function readBtree1(source: ByteSource, sb: Superblock, root: number, rank: number): Promise<ChunkEntry[]> {
  const O = sb.sizeOfOffsets;
  const keySize = 8 + 8 * (rank + 1);
  const out: ChunkEntry[] = [];
  const pending = [root];
  while (pending.length) {
    const addr = pending.pop() as number;
    const at = sb.baseAddress + addr;
    const head = await source.read(at, 8 + 2 * O);
    if (head[0] !== 0x54 || head[1] !== 0x52 || head[2] !== 0x45 || head[3] !== 0x45) throw new Error(`no B-tree node at ${addr}`);
    const level = head[5];
    const entries = head[6] | (head[7] << 8);
    const bodyLength = entries * (keySize + O) + keySize;
    const body = await source.read(at + 8 + 2 * O, bodyLength);
    const v = new DataView(body.buffer, body.byteOffset, body.byteLength);
    for (let i = 0; i < entries; i++) {
      const k = i * (keySize + O);
      const child = readUint(v, k + keySize, O);
      if (level > 0) {
        pending.push(child);
        continue;
      }
      const offset: number[] = [];
      for (let d = 0; d < rank; d++) offset.push(readUint(v, k + 8 + 8 * d, 8));
      out.push({ offset, address: child, size: v.getUint32(k, true), filterMask: v.getUint32(k + 4, true) });
    }
  }
  return out;
}
