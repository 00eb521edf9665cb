/**
 * NetCDF-4 (HDF5) reader. Metadata (names, dimensions, attributes, types) come from the HDF5
 * library compiled to WebAssembly (h5wasm, which reads the real file lazily through Node's file
 * system), called through hdf5-library.ts so that its calls can run on a thread with a deadline. Data are read by us: the dataset's layout and chunk index are parsed from its object
 * header and each chunk is fetched with one ranged read and inflated by Node's native zlib, which
 * is several times faster than slicing through the library. Layouts or filters we do not read
 * ourselves (compact data, extensible-array, paged fixed-array or v2 B-tree indexes, szip and plugin
 * filters) fall back to the library's own slicing.
 *
 * Measured with tests/bench/io.bench.ts (360x180x102 float32, deflate 4 + shuffle, chunks 1x1x180x360,
 * level by level, idle 2-core machine): ours 50-60 ms a pass against netCDF4-python 67 ms; the library's
 * slice loop was about 1.3x netCDF4-python. Reading ahead on the thread pool is off (see chunked-read.ts).
 */
import { fileError, StillwaterError } from '../errors.js';
import { FileSource, type ByteSource } from './byte-source.js';
import { allocArray, allocArrayForOverwrite, littleEndianToHost, bigEndianToHost, DTYPE_SIZE } from './dtype.js';
import { hdf5Library, type Hdf5Library } from './hdf5-library.js';
import { MAX_CHUNK_BYTES, readChunkIndex } from './hdf5/chunk-index.js';
import { ChunkStore, chunkMap, readChunked, type ChunkedVariable } from './hdf5/chunked-read.js';
import { filtersWeUndo } from './hdf5/filters.js';
import { decodeStorage, type StorageInfo } from './hdf5/layout.js';
import { readObjectHeader } from './hdf5/object-header.js';
import { readSuperblock, UNDEFINED_ADDRESS, type Superblock } from './hdf5/superblock.js';
import type { H5Variable } from './netcdf4-metadata.js';
import { checkSlab } from './slab.js';
import { contiguousStrides, readStrided } from './strided-read.js';
import type { Attributes, RawArray, RawDataset, RawDimension, RawVariable } from './types.js';
import { missingVariableText, nameOfPath } from './variable-path.js';

type Plan =
  | { kind: 'contiguous'; address: number; fill?: Uint8Array }
  | { kind: 'chunked'; chunked: ChunkedVariable }
  | { kind: 'library' };

export async function openNetcdf4(source: ByteSource, path: string): Promise<RawDataset> {
  if (!(source instanceof FileSource)) {
    throw fileError('E_FORMAT', path, 'NetCDF-4/HDF5 files can only be read from a local file.');
  }
  const lib = hdf5Library();
  const { handle, meta, addresses } = await lib.open(source.name);
  try {
    if (meta.variables.length === 0) {
      throw fileError('E_FORMAT', path, 'this HDF5 file holds no datasets we can read in any of its groups (it is not a NetCDF-4 file with variables).');
    }
    const sb = await readSuperblock(source);
    return new Netcdf4Dataset(path, source, lib, handle, sb, meta.dimensions, meta.attrs, meta.variables, meta.notes, meta.groups, (h5path) => addresses[h5path]);
  } catch (e) {
    await lib.close(handle);
    throw e;
  }
}

export class Netcdf4Dataset implements RawDataset {
  readonly format = 'netcdf4-hdf5' as const;
  readonly variables: RawVariable[];
  private readonly plans = new Map<string, Promise<Plan>>();
  private readonly store: ChunkStore;

  constructor(
    readonly path: string,
    private readonly source: ByteSource,
    private readonly lib: Hdf5Library,
    private readonly handle: number,
    private readonly sb: Superblock | undefined,
    readonly dimensions: RawDimension[],
    readonly attrs: Attributes,
    private readonly h5vars: H5Variable[],
    readonly notes: string[],
    readonly groups: string[],
    private readonly objectAddress: (h5path: string) => number | undefined,
  ) {
    this.store = new ChunkStore(source);
    this.variables = h5vars.map(({ name, dims, shape, dtype, attrs, attrTypes, note }) => ({ name, dims, shape, dtype, attrs, ...(attrTypes ? { attrTypes } : {}), ...(note ? { note } : {}) }));
  }

  async read(name: string, start?: number[], count?: number[]): Promise<RawArray> {
    const v = this.variable(name);
    if (!v) throw fileError('E_VARIABLE', this.path, missingVariableText(name, this.h5vars, this.groups), name);
    if (v.dtype === 'string') throw fileError('E_VARIABLE', this.path, 'holds text strings, not numbers, and is not read as data.', name);
    const { s, c } = checkSlab(this.path, v, start, count);
    const plan = await this.planFor(v);
    if (plan.kind === 'library') return this.readWithLibrary(v, s, c);
    const n = c.reduce((a, b) => a * b, 1);
    // chunks tile the slab and a contiguous read covers it, so every byte is overwritten unless storage was never written
    const unwritten = plan.kind === 'contiguous' && plan.address === UNDEFINED_ADDRESS;
    const out = unwritten ? allocArray(v.dtype, n) : allocArrayForOverwrite(v.dtype, n);
    const bytes = new Uint8Array(out.buffer, out.byteOffset, out.byteLength);
    const size = DTYPE_SIZE[v.dtype];
    if (plan.kind === 'contiguous') {
      if (plan.address === UNDEFINED_ADDRESS) fillBytes(bytes, size, plan.fill);
      else await readStrided(this.source, { base: plan.address, elementSize: size, shape: v.shape, strides: contiguousStrides(v.shape, size) }, s, c, bytes);
    } else {
      try {
        await readChunked(this.store, plan.chunked, s, c, bytes);
      } catch (e) {
        if (e instanceof StillwaterError) throw e;
        throw fileError('E_FORMAT', this.path, `a stored chunk is damaged and cannot be decoded (${(e as Error).message}).`, name);
      }
    }
    if (v.littleEndian) littleEndianToHost(bytes, size);
    else bigEndianToHost(bytes, size);
    return out;
  }

  /** How a variable's data are read: by us from contiguous bytes or chunks, or by the HDF5 library. */
  async readRoute(name: string): Promise<Plan['kind'] | undefined> {
    const v = this.variable(name);
    return v ? (await this.planFor(v)).kind : undefined;
  }

  /** By name, or inside groups by path (`/bgc/chl`, `bgc/chl`). */
  private variable(name: string): H5Variable | undefined {
    const wanted = nameOfPath(name);
    return this.h5vars.find((x) => x.name === name) ?? this.h5vars.find((x) => x.name === wanted);
  }

  private planFor(v: H5Variable): Promise<Plan> {
    let p = this.plans.get(v.name);
    if (!p) {
      // a structure our own parser does not follow: the library still reads it (on its own thread, with a
      // deadline); damage we recognise (a StillwaterError) is refused here
      p = this.makePlan(v).catch((e: unknown): Plan => {
        if (e instanceof StillwaterError) throw e;
        return { kind: 'library' };
      });
      this.plans.set(v.name, p);
    }
    return p;
  }

  private async makePlan(v: H5Variable): Promise<Plan> {
    const address = this.objectAddress(v.h5path);
    if (!this.sb || address === undefined || v.elementSize !== DTYPE_SIZE[v.dtype]) return { kind: 'library' };
    const messages = await readObjectHeader(this.source, this.sb, address);
    const storage: StorageInfo = decodeStorage(messages, this.sb, v.shape.length);
    const { layout } = storage;
    if (layout.kind === 'contiguous') {
      if (storage.filters.length) return { kind: 'library' };
      const base = layout.address === UNDEFINED_ADDRESS ? UNDEFINED_ADDRESS : this.sb.baseAddress + layout.address;
      if (base !== UNDEFINED_ADDRESS && base + v.shape.reduce((a, b) => a * b, 1) * v.elementSize > this.source.size) {
        throw fileError('E_FORMAT', this.path, 'its data lie past the end of the file (the file is truncated or damaged).', v.name);
      }
      return { kind: 'contiguous', address: base, fill: storage.fill };
    }
    if (layout.kind !== 'chunked' || !filtersWeUndo(storage.filters) || v.shape.length === 0) return { kind: 'library' };
    const chunkBytes = layout.chunk.reduce((a, b) => a * b, 1) * v.elementSize;
    if (layout.chunk.length !== v.shape.length || !layout.chunk.every((n) => Number.isInteger(n) && n >= 1) || chunkBytes > MAX_CHUNK_BYTES) {
      throw fileError('E_FORMAT', this.path, `its chunk shape [${layout.chunk}] is damaged (it must have one size of at least 1 per dimension and at most ${MAX_CHUNK_BYTES / 2 ** 20} MiB).`, v.name);
    }
    let entries;
    try {
      entries = await readChunkIndex(this.source, this.sb, layout, v.shape, v.elementSize);
    } catch (e) {
      if (e instanceof StillwaterError) throw e;
      throw fileError('E_FORMAT', this.path, `its chunk index is damaged (${(e as Error).message}).`, v.name);
    }
    if (!entries) return { kind: 'library' };
    for (const e of entries) if (e.address !== UNDEFINED_ADDRESS) e.address += this.sb.baseAddress;
    return {
      kind: 'chunked',
      chunked: {
        shape: v.shape, chunk: layout.chunk, elementSize: v.elementSize, filters: storage.filters, fill: storage.fill,
        chunks: chunkMap(entries, layout.chunk),
      },
    };
  }

  /** The HDF5 library's own hyperslab read: slower, but reads every layout and filter it knows. */
  private async readWithLibrary(v: H5Variable, s: number[], c: number[]): Promise<RawArray> {
    const ranges = v.shape.length === 0 ? null : s.map((x, i): [number, number] => [x, x + c[i]]);
    const data = await this.lib.slice(this.handle, v.h5path, ranges, { file: this.path, variable: v.name });
    const n = c.reduce((a, b) => a * b, 1);
    const out = allocArray(v.dtype, n);
    if (v.dtype === 'char') {
      const text = Array.isArray(data) ? data.join('') : String(data ?? '');
      const bytes = new TextEncoder().encode(text);
      (out as Uint8Array).set(bytes.subarray(0, n));
    } else if (ArrayBuffer.isView(data)) {
      (out as Float64Array).set(data as unknown as Float64Array);
    } else {
      (out as Float64Array)[0] = data as number;
    }
    return out;
  }

  async close(): Promise<void> {
    await this.lib.close(this.handle);
    await this.source.close();
  }
}

function fillBytes(bytes: Uint8Array, size: number, fill?: Uint8Array): void {
  if (!fill || fill.byteLength !== size) return;
  for (let o = 0; o < bytes.byteLength; o += size) bytes.set(fill, o);
}
