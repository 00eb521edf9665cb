/**
 * NetCDF classic writer, 64-bit offset variant (CDF-2), per the Unidata classic format specification.
 * Fixed-size dimensions only (no record dimension): every variable is one contiguous block, so a level
 * (a slab along the leading dimensions) is one positional write. Files are written to a temporary name
 * beside the target and renamed into place on close, so a failed export never leaves half a file.
 */
import { open, rename, rm, type FileHandle } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { StillwaterError } from '../errors.js';
import type { Attributes, AttrValue } from './types.js';

export type WritableDType = 'i1' | 'i2' | 'i4' | 'f4' | 'f8' | 'char';

export interface WriteVariable {
  name: string;
  dims: string[];
  dtype: WritableDType;
  attrs?: Attributes;
  /** stored types of numeric attributes (default: the variable's type for CF's value attributes, else double) */
  attrTypes?: Record<string, WritableDType>;
}

export interface WriteHeader {
  dimensions: { name: string; size: number }[];
  attrs?: Attributes;
  variables: WriteVariable[];
}

type NumericArray = Int8Array | Int16Array | Int32Array | Float32Array | Float64Array | Uint8Array | number[];

export interface NetcdfWriter {
  /**
   * Write `data` (C order) starting at index `start` (default all zeros). The slab must be contiguous
   * in the file: a run of whole trailing dimensions, e.g. one level (k, :, :) of a (k, j, i) variable.
   */
  write(name: string, data: NumericArray | string, start?: number[]): Promise<void>;
  /** Finish: flush and rename into place. */
  close(): Promise<void>;
  /** Give up: remove the temporary file. */
  abort(): Promise<void>;
}

const NC_DIMENSION = 0x0a;
const NC_VARIABLE = 0x0b;
const NC_ATTRIBUTE = 0x0c;
const TYPE_CODE: Record<WritableDType, number> = { i1: 1, char: 2, i2: 3, i4: 4, f4: 5, f8: 6 };
const TYPE_SIZE: Record<WritableDType, number> = { i1: 1, char: 1, i2: 2, i4: 4, f4: 4, f8: 8 };
/** Attributes that CF requires to have the variable's own type. */
const TYPED_LIKE_VARIABLE = new Set(['_FillValue', 'missing_value', 'valid_min', 'valid_max', 'valid_range', 'flag_values', 'flag_masks', 'actual_range']);

class HeaderBuilder {
  private chunks: number[] = [];
  int32(v: number): void {
    this.chunks.push((v >>> 24) & 255, (v >>> 16) & 255, (v >>> 8) & 255, v & 255);
  }
  int64(v: number): void {
    const hi = Math.floor(v / 2 ** 32);
    this.int32(hi);
    this.int32(v - hi * 2 ** 32);
  }
  bytes(b: Uint8Array): void {
    for (const x of b) this.chunks.push(x);
    while (this.chunks.length % 4) this.chunks.push(0);
  }
  name(s: string): void {
    const b = new TextEncoder().encode(s);
    this.int32(b.length);
    this.bytes(b);
  }
  get length(): number {
    return this.chunks.length;
  }
  toBytes(): Uint8Array {
    return Uint8Array.from(this.chunks);
  }
}

function encodeValues(dtype: WritableDType, values: ArrayLike<number>): Uint8Array {
  const n = values.length;
  const out = new Uint8Array(n * TYPE_SIZE[dtype]);
  const view = new DataView(out.buffer);
  for (let i = 0; i < n; i++) {
    const v = values[i];
    switch (dtype) {
      case 'i1':
      case 'char':
        view.setInt8(i, v);
        break;
      case 'i2':
        view.setInt16(i * 2, v, false);
        break;
      case 'i4':
        view.setInt32(i * 4, v, false);
        break;
      case 'f4':
        view.setFloat32(i * 4, v, false);
        break;
      case 'f8':
        view.setFloat64(i * 8, v, false);
        break;
    }
  }
  return out;
}

function writeAttributes(h: HeaderBuilder, attrs: Attributes, varType?: WritableDType, attrTypes?: Record<string, WritableDType>): void {
  const entries = Object.entries(attrs);
  if (entries.length === 0) {
    h.int32(0);
    h.int32(0);
    return;
  }
  h.int32(NC_ATTRIBUTE);
  h.int32(entries.length);
  for (const [key, value] of entries) {
    h.name(key);
    writeAttributeValue(h, key, value, varType, attrTypes?.[key]);
  }
}

function writeAttributeValue(h: HeaderBuilder, key: string, value: AttrValue, varType?: WritableDType, stored?: WritableDType): void {
  if (typeof value === 'string') {
    const b = new TextEncoder().encode(value);
    h.int32(TYPE_CODE.char);
    h.int32(b.length);
    h.bytes(b);
    return;
  }
  const t: WritableDType = stored && stored !== 'char' ? stored : varType && varType !== 'char' && TYPED_LIKE_VARIABLE.has(key) ? varType : 'f8';
  h.int32(TYPE_CODE[t]);
  h.int32(value.length);
  h.bytes(encodeValues(t, value));
}

function validateHeader(path: string, header: WriteHeader): Map<string, number> {
  const sizes = new Map<string, number>();
  for (const d of header.dimensions) {
    if (!(Number.isInteger(d.size) && d.size > 0)) {
      throw new StillwaterError('E_INPUT', `${path}: dimension '${d.name}' needs a positive whole size, got ${d.size}.`, { file: path });
    }
    sizes.set(d.name, d.size);
  }
  for (const v of header.variables) {
    for (const d of v.dims) {
      if (!sizes.has(d)) throw new StillwaterError('E_INPUT', `${path}: variable '${v.name}' uses unknown dimension '${d}'.`, { file: path, variable: v.name });
    }
  }
  return sizes;
}

interface Layout {
  shape: number[];
  dtype: WritableDType;
  begin: number;
  count: number;
}

export async function createNetcdf(path: string, header: WriteHeader): Promise<NetcdfWriter> {
  const sizes = validateHeader(path, header);
  const shapes = header.variables.map((v) => v.dims.map((d) => sizes.get(d) ?? 0));
  const counts = shapes.map((s) => s.reduce((a, b) => a * b, 1));
  const vsizes = header.variables.map((v, i) => Math.ceil((counts[i] * TYPE_SIZE[v.dtype]) / 4) * 4);

  // The header is built twice: once to learn its length (begin offsets have a fixed width), once for real.
  const build = (begins: number[]): HeaderBuilder => {
    const h = new HeaderBuilder();
    h.bytes(Uint8Array.from([0x43, 0x44, 0x46, 0x02]));
    h.int32(0); // numrecs: no record dimension
    if (header.dimensions.length) {
      h.int32(NC_DIMENSION);
      h.int32(header.dimensions.length);
      for (const d of header.dimensions) {
        h.name(d.name);
        h.int32(d.size);
      }
    } else {
      h.int32(0);
      h.int32(0);
    }
    writeAttributes(h, header.attrs ?? {});
    if (header.variables.length) {
      h.int32(NC_VARIABLE);
      h.int32(header.variables.length);
      header.variables.forEach((v, i) => {
        h.name(v.name);
        h.int32(v.dims.length);
        for (const d of v.dims) h.int32(header.dimensions.findIndex((x) => x.name === d));
        writeAttributes(h, v.attrs ?? {}, v.dtype, v.attrTypes);
        h.int32(TYPE_CODE[v.dtype]);
        h.int32(Math.min(vsizes[i], 2 ** 32 - 4));
        h.int64(begins[i]);
      });
    } else {
      h.int32(0);
      h.int32(0);
    }
    return h;
  };
  const headerLength = build(header.variables.map(() => 0)).length;
  const begins: number[] = [];
  let offset = headerLength;
  for (const vs of vsizes) {
    begins.push(offset);
    offset += vs;
  }
  const headerBytes = build(begins).toBytes();
  const total = offset;

  const layouts = new Map<string, Layout>();
  header.variables.forEach((v, i) => layouts.set(v.name, { shape: shapes[i], dtype: v.dtype, begin: begins[i], count: counts[i] }));

  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.${Date.now()}.partial`);
  let handle: FileHandle;
  try {
    handle = await open(tmp, 'w');
  } catch {
    throw new StillwaterError('E_FILE', `${path}: cannot write in folder '${dirname(path)}'.`, { file: path });
  }
  try {
    await handle.write(headerBytes, 0, headerBytes.length, 0);
    if (total > headerLength) await handle.truncate(total); // unwritten data reads as zeros, as the format allows
  } catch (e) {
    await handle.close().catch(() => undefined);
    await rm(tmp, { force: true });
    throw e;
  }
  let finished = false;

  return {
    async write(name, data, start) {
      const layout = layouts.get(name);
      if (!layout) throw new StillwaterError('E_INTERNAL', `${path}: writing unknown variable '${name}'.`, { file: path, variable: name });
      const values = typeof data === 'string' ? new TextEncoder().encode(data) : data;
      let index = 0;
      const s = start ?? layout.shape.map(() => 0);
      for (let d = 0; d < layout.shape.length; d++) index = index * layout.shape[d] + (s[d] ?? 0);
      if (index + values.length > layout.count) {
        throw new StillwaterError('E_INTERNAL', `${path}: slab of ${values.length} values at [${s}] overflows variable '${name}'.`, { file: path, variable: name });
      }
      const bytes = encodeValues(layout.dtype, values);
      await handle.write(bytes, 0, bytes.length, layout.begin + index * TYPE_SIZE[layout.dtype]);
    },
    async close() {
      if (finished) return;
      finished = true;
      await handle.close();
      await rename(tmp, path);
    },
    async abort() {
      if (finished) return;
      finished = true;
      await handle.close().catch(() => undefined);
      await rm(tmp, { force: true });
    },
  };
}
