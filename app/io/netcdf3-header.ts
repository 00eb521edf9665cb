/**
 * The header of a NetCDF classic file (CDF-1, 64-bit offset CDF-2, CDF-5), parsed per the
 * Unidata "NetCDF Classic Format Specification" grammar:
 *   header = magic numrecs dim_list gatt_list var_list
 * In CDF-5 every NON_NEG (counts, lengths, sizes, dimids) is 64-bit; in CDF-2 and CDF-5
 * the variable offsets `begin` are 64-bit.
 */
import { quoted } from '../errors.js';
import { bigEndianToHost, DTYPE_SIZE, toNumbers, viewArray } from './dtype.js';
import type { ByteSource } from './byte-source.js';
import { HeaderCursor } from './header-cursor.js';
import type { Attributes, DType, RawDimension } from './types.js';

const NC_DIMENSION = 0x0a;
const NC_VARIABLE = 0x0b;
const NC_ATTRIBUTE = 0x0c;
/** numrecs written while a file is still being streamed. */
const STREAMING = 0xffffffff;

/** nc_type codes 1..11 of the specification. */
const NC_TYPES: Record<number, DType> = {
  1: 'i1', 2: 'char', 3: 'i2', 4: 'i4', 5: 'f4', 6: 'f8', 7: 'u1', 8: 'u2', 9: 'u4', 10: 'i8', 11: 'u8',
};

export interface Cdf3Variable {
  name: string;
  dimIds: number[];
  dims: string[];
  shape: number[];
  dtype: DType;
  attrs: Attributes;
  attrTypes: Record<string, DType>;
  /** byte offset of the data (of the first record for a record variable) */
  begin: number;
  /** true when the first dimension is the unlimited (record) dimension */
  isRecord: boolean;
}

export interface Cdf3Header {
  version: 1 | 2 | 5;
  numrecs: number;
  dimensions: RawDimension[];
  attrs: Attributes;
  variables: Cdf3Variable[];
  /** bytes from one record to the next (0 when there are no record variables) */
  recsize: number;
}

export async function readCdf3Header(source: ByteSource): Promise<Cdf3Header> {
  const c = new HeaderCursor(source, 'NetCDF classic header');
  const magic = await c.bytes(4);
  const version = magic[3];
  if (magic[0] !== 0x43 || magic[1] !== 0x44 || magic[2] !== 0x46 || (version !== 1 && version !== 2 && version !== 5)) {
    c.damaged('no CDF magic number');
  }
  const cdf5 = version === 5;
  const nonNeg = (): Promise<number> => (cdf5 ? c.u64() : c.u32());
  const offset = (): Promise<number> => (version === 1 ? c.u32() : c.u64());

  let numrecs = await nonNeg();
  const streaming = !cdf5 && numrecs === STREAMING;

  const name = async (): Promise<string> => {
    const n = await nonNeg();
    if (n > 1 << 20) c.damaged(`a name of ${n} bytes`);
    const b = await c.bytes(n);
    await c.skip(pad4(n) - n);
    return new TextDecoder().decode(b);
  };

  const listHeader = async (tag: number, what: string): Promise<number> => {
    const t = await c.u32();
    const n = await nonNeg();
    if (t === 0 && n === 0) return 0; // ABSENT
    if (t !== tag) c.damaged(`expected the ${what} list`);
    return n;
  };

  let types: Record<string, DType> = {};
  /** Attributes of one list; their stored types are left in `types`. */
  const attributes = async (): Promise<Attributes> => {
    const n = await listHeader(NC_ATTRIBUTE, 'attribute');
    const attrs: Attributes = {};
    types = {};
    for (let i = 0; i < n; i++) {
      const key = await name();
      const type = NC_TYPES[await c.u32()];
      if (!type) c.damaged(`attribute ${quoted(key)} has an unknown type`);
      const count = await nonNeg();
      const size = DTYPE_SIZE[type] * count;
      const raw = await c.bytes(size);
      await c.skip(pad4(size) - size);
      if (type === 'char') {
        attrs[key] = new TextDecoder().decode(raw).replace(/\0+$/, '');
      } else {
        bigEndianToHost(raw, DTYPE_SIZE[type]);
        attrs[key] = toNumbers(viewArray(type, raw));
        types[key] = type;
      }
    }
    return attrs;
  };

  const nDims = await listHeader(NC_DIMENSION, 'dimension');
  const dimensions: RawDimension[] = [];
  for (let i = 0; i < nDims; i++) {
    const dname = await name();
    const len = await nonNeg();
    dimensions.push({ name: dname, size: len, unlimited: len === 0 });
  }
  const attrs = await attributes();

  const nVars = await listHeader(NC_VARIABLE, 'variable');
  const variables: Cdf3Variable[] = [];
  for (let i = 0; i < nVars; i++) {
    const vname = await name();
    const rank = await nonNeg();
    const dimIds: number[] = [];
    for (let d = 0; d < rank; d++) {
      const id = await nonNeg();
      if (id >= dimensions.length) c.damaged(`variable ${quoted(vname)} refers to dimension ${id}`);
      dimIds.push(id);
    }
    const vattrs = await attributes();
    const attrTypes = types;
    const dtype = NC_TYPES[await c.u32()];
    if (!dtype) c.damaged(`variable ${quoted(vname)} has an unknown type`);
    await nonNeg(); // vsize: recomputed below, since it saturates for variables over 4 GiB
    const begin = await offset();
    const isRecord = rank > 0 && dimensions[dimIds[0]].unlimited;
    variables.push({
      name: vname,
      dimIds,
      dims: dimIds.map((id) => dimensions[id].name),
      shape: dimIds.map((id) => dimensions[id].size),
      dtype,
      attrs: vattrs,
      attrTypes,
      begin,
      isRecord,
    });
  }

  const recordVars = variables.filter((v) => v.isRecord);
  const recordBytes = (v: Cdf3Variable): number => v.shape.slice(1).reduce((a, b) => a * b, 1) * DTYPE_SIZE[v.dtype];
  // A lone record variable is not padded between records (the specification's special case).
  const recsize = recordVars.length === 1 ? recordBytes(recordVars[0]) : recordVars.reduce((a, v) => a + pad4(recordBytes(v)), 0);
  if (streaming) {
    const first = Math.min(...recordVars.map((v) => v.begin));
    numrecs = recordVars.length && recsize > 0 ? Math.floor((source.size - first) / recsize) : 0;
  }
  for (const d of dimensions) if (d.unlimited) d.size = numrecs;
  for (const v of variables) v.shape = v.dimIds.map((id) => dimensions[id].size);

  return { version: version as 1 | 2 | 5, numrecs, dimensions, attrs, variables, recsize };
}

export function pad4(n: number): number {
  return Math.ceil(n / 4) * 4;
}
