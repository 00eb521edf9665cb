/**
 * Where each chunk of a chunked dataset is stored. Version-1 B-trees (layout message v3, what
 * netCDF-4 files written with the 1.8 format bounds use), single-chunk and implicit indexes are
 * read here (HDF5 File Format Specification III.A.1 and VII); other index kinds return undefined
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
    default:
      return undefined;
  }
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
