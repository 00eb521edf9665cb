/**
 * Assemble a hyperslab of a chunked dataset from its stored chunks: read each needed chunk with
 * one ranged read, undo its filters, copy the overlapping box. Decoded chunks that reach outside
 * the slab are kept in a small cache, so level-by-level reads of chunks spanning several levels
 * inflate each chunk once.
 */
import { readIntoFrom, type ByteSource } from '../byte-source.js';
import { copyBox } from './box-copy.js';
import type { ChunkEntry } from './chunk-index.js';
import { decodeChunk } from './filters.js';
import type { FilterStep } from './layout.js';
import { UNDEFINED_ADDRESS } from './superblock.js';

export interface ChunkedVariable {
  shape: number[];
  chunk: number[];
  elementSize: number;
  filters: FilterStep[];
  fill?: Uint8Array;
  chunks: Map<string, ChunkEntry>;
}

export function chunkMap(entries: ChunkEntry[], chunk: number[]): Map<string, ChunkEntry> {
  const m = new Map<string, ChunkEntry>();
  for (const e of entries) m.set(e.offset.map((o, i) => Math.floor(o / chunk[i])).join(','), e);
  return m;
}

/** Decoded chunks shared by all variables of a file, bounded in bytes. */
export class ChunkCache {
  private readonly entries = new Map<number, Uint8Array>();
  private bytes = 0;
  constructor(private readonly budget = 64 * 1024 * 1024) {}
  get(address: number): Uint8Array | undefined {
    const hit = this.entries.get(address);
    if (hit) {
      this.entries.delete(address);
      this.entries.set(address, hit); // most recent last
    }
    return hit;
  }
  put(address: number, data: Uint8Array): void {
    if (data.byteLength > this.budget / 4) return;
    this.entries.set(address, data);
    this.bytes += data.byteLength;
    for (const [k, v] of this.entries) {
      if (this.bytes <= this.budget) break;
      this.entries.delete(k);
      this.bytes -= v.byteLength;
    }
  }
}

export async function readChunked(
  source: ByteSource, v: ChunkedVariable, start: number[], count: number[], out: Uint8Array, cache: ChunkCache,
): Promise<void> {
  const rank = v.shape.length;
  const { chunk, elementSize } = v;
  const chunkElems = chunk.reduce((a, b) => a * b, 1);
  const lo = start.map((s, i) => Math.floor(s / chunk[i]));
  const hi = start.map((s, i) => Math.floor((s + count[i] - 1) / chunk[i]));
  if (count.some((c) => c === 0)) return;
  const idx = lo.slice();
  for (;;) {
    const key = idx.join(',');
    const origin = idx.map((c, i) => c * chunk[i]);
    const boxStart = origin.map((o, i) => Math.max(o, start[i]));
    const boxEnd = origin.map((o, i) => Math.min(o + chunk[i], start[i] + count[i]));
    const boxCount = boxEnd.map((e, i) => e - boxStart[i]);
    const whole = boxCount.every((c, i) => c === chunk[i]);
    const entry = v.chunks.get(key);
    let data: Uint8Array | undefined;
    if (!entry || entry.address === UNDEFINED_ADDRESS) {
      data = fillChunk(chunkElems, elementSize, v.fill);
    } else {
      data = cache.get(entry.address);
      if (!data) {
        const raw = new Uint8Array(entry.size);
        await readIntoFrom(source, entry.address, raw);
        data = v.filters.length ? decodeChunk(raw, v.filters, entry.filterMask, elementSize) : raw;
        if (!whole) cache.put(entry.address, data);
      }
    }
    copyBox(
      data, chunk, boxStart.map((b, i) => b - origin[i]),
      out, count, boxStart.map((b, i) => b - start[i]),
      boxCount, elementSize,
    );
    let d = rank - 1;
    for (; d >= 0; d--) {
      if (++idx[d] <= hi[d]) break;
      idx[d] = lo[d];
    }
    if (d < 0) break;
  }
}

function fillChunk(n: number, elementSize: number, fill?: Uint8Array): Uint8Array {
  const out = new Uint8Array(n * elementSize);
  if (fill && fill.byteLength === elementSize && fill.some((b) => b !== 0)) {
    for (let i = 0; i < n; i++) out.set(fill, i * elementSize);
  }
  return out;
}
