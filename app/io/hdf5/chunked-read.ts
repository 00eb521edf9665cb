/**
 * Assemble a hyperslab of a chunked dataset from its stored chunks: read each needed chunk with
 * one ranged read, undo its filters, copy the overlapping box. Decoded chunks that reach outside
 * the slab are kept in a small cache, so level-by-level reads of chunks spanning several levels
 * inflate each chunk once. When slabs are read one after the other along a dimension (level by
 * level), the chunks of the next slabs are read ahead and inflated on Node's thread pool while the
 * caller works on the current one.
 */
import { readIntoFrom, type ByteSource } from '../byte-source.js';
import { copyBox } from './box-copy.js';
import type { ChunkEntry } from './chunk-index.js';
import { decodeChunk, decodeChunkAsync } from './filters.js';
import type { FilterStep } from './layout.js';
import { UNDEFINED_ADDRESS } from './superblock.js';
import { slabAhead, slabRecord, steadyMove, type SlabRecord } from '../sequential.js';

export interface ChunkedVariable {
  shape: number[];
  chunk: number[];
  elementSize: number;
  filters: FilterStep[];
  fill?: Uint8Array;
  chunks: Map<string, ChunkEntry>;
  /** the previous slab read, to notice reading level after level */
  last?: SlabRecord;
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
  has(address: number): boolean {
    return this.entries.has(address);
  }
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

/**
 * How many slabs ahead to read, and how much may be in flight at once. Off: measured on an idle machine,
 * inflating in line (one synchronous zlib call a chunk) is 2-3x faster than handing chunks to the thread pool;
 * reading ahead only paid off on a heavily loaded machine. Raise it for slow storage (network file systems).
 */
const READ_AHEAD_SLABS = 0;
const MAX_PENDING = 8;
const MAX_AHEAD_CHUNK_BYTES = 16 * 1024 * 1024;

/** Decoded chunks of one file: a bounded cache plus chunks being read ahead. */
export class ChunkStore {
  private readonly cache = new ChunkCache();
  private readonly pending = new Map<number, Promise<Uint8Array>>();
  constructor(private readonly source: ByteSource) {}

  /** The decoded chunk; `into` (a chunk's size) may receive it directly when nothing keeps it (then it is returned). */
  async get(v: ChunkedVariable, entry: ChunkEntry, keep: boolean, into?: Uint8Array): Promise<Uint8Array> {
    const hit = this.cache.get(entry.address);
    if (hit) return hit;
    const ahead = this.pending.get(entry.address);
    let data: Uint8Array;
    if (ahead) {
      this.pending.delete(entry.address);
      data = await ahead;
    } else {
      const raw = new Uint8Array(entry.size);
      await readIntoFrom(this.source, entry.address, raw);
      data = decodeChunk(raw, v.filters, entry.filterMask, v.elementSize, chunkBytes(v), keep ? undefined : into);
    }
    if (keep) this.cache.put(entry.address, data);
    return data;
  }

  readAhead(v: ChunkedVariable, entry: ChunkEntry): void {
    const a = entry.address;
    if (this.pending.size >= MAX_PENDING || this.pending.has(a) || this.cache.has(a)) return;
    if (v.chunk.reduce((x, y) => x * y, 1) * v.elementSize > MAX_AHEAD_CHUNK_BYTES) return;
    const job = (async () => {
      const raw = new Uint8Array(entry.size);
      await readIntoFrom(this.source, a, raw);
      return decodeChunkAsync(raw, v.filters, entry.filterMask, v.elementSize, chunkBytes(v));
    })();
    job.catch(() => undefined); // a failure surfaces when the chunk is asked for
    this.pending.set(a, job);
  }
}

function chunkBytes(v: ChunkedVariable): number {
  return v.chunk.reduce((a, b) => a * b, 1) * v.elementSize;
}

/** Grid coordinates of the chunks a slab touches, C order. */
function chunksOf(v: ChunkedVariable, start: number[], count: number[]): number[][] {
  if (count.some((c) => c === 0)) return [];
  const lo = start.map((s, i) => Math.floor(s / v.chunk[i]));
  const hi = start.map((s, i) => Math.floor((s + count[i] - 1) / v.chunk[i]));
  const out: number[][] = [];
  const idx = lo.slice();
  for (;;) {
    out.push(idx.slice());
    let d = idx.length - 1;
    for (; d >= 0; d--) {
      if (++idx[d] <= hi[d]) break;
      idx[d] = lo[d];
    }
    if (d < 0) return out;
  }
}

export async function readChunked(
  store: ChunkStore, v: ChunkedVariable, start: number[], count: number[], out: Uint8Array,
): Promise<void> {
  const { chunk, elementSize } = v;
  const chunkElems = chunk.reduce((a, b) => a * b, 1);
  const needed = chunksOf(v, start, count);
  const neededKeys = new Set(needed.map((c) => c.join(',')));

  const record = slabRecord(v.last, start, count);
  const move = steadyMove(v.last, record);
  v.last = record;
  if (move) {
    for (let k = 1; k <= READ_AHEAD_SLABS; k++) {
      const next = slabAhead(start, count, move.dim, k, v.shape, move.by);
      if (!next) break;
      for (const c of chunksOf(v, next, count)) {
        const key = c.join(',');
        const entry = v.chunks.get(key);
        if (entry && entry.address !== UNDEFINED_ADDRESS && !neededKeys.has(key)) store.readAhead(v, entry);
      }
    }
  }

  for (const idx of needed) {
    const origin = idx.map((c, i) => c * chunk[i]);
    const boxStart = origin.map((o, i) => Math.max(o, start[i]));
    const boxEnd = origin.map((o, i) => Math.min(o + chunk[i], start[i] + count[i]));
    const boxCount = boxEnd.map((e, i) => e - boxStart[i]);
    const whole = boxCount.every((c, i) => c === chunk[i]);
    const entry = v.chunks.get(idx.join(','));
    // a chunk that is the whole slab is decoded straight into it
    const direct = whole && needed.length === 1 && boxCount.every((c, i) => c === count[i]) ? out : undefined;
    const data = !entry || entry.address === UNDEFINED_ADDRESS
      ? fillChunk(chunkElems, elementSize, v.fill)
      : await store.get(v, entry, !whole, direct);
    if (data === out) continue;
    copyBox(
      data, chunk, boxStart.map((b, i) => b - origin[i]),
      out, count, boxStart.map((b, i) => b - start[i]),
      boxCount, elementSize,
    );
  }
}

function fillChunk(n: number, elementSize: number, fill?: Uint8Array): Uint8Array {
  const out = new Uint8Array(n * elementSize);
  if (fill && fill.byteLength === elementSize && fill.some((b) => b !== 0)) {
    for (let i = 0; i < n; i++) out.set(fill, i * elementSize);
  }
  return out;
}
