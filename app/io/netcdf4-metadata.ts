/**
 * NetCDF-4 metadata from an HDF5 file opened with h5wasm: dimensions from dimension scales
 * (the NetCDF-4 convention: DIMENSION_LIST on variables, CLASS=DIMENSION_SCALE on dimensions,
 * ordered by _Netcdf4Dimid), variables from the root group's datasets, attributes without the
 * HDF5 and NetCDF-4 bookkeeping ones. Only the root group is read; other groups are named in notes.
 */
import h5wasm, { type Dataset, type File as H5File, type Group } from 'h5wasm/node';
import { toNumbers } from './dtype.js';
import type { Attributes, AttrValue, DType, RawArray, RawDimension, RawVariable } from './types.js';

/** Attributes that are HDF5 dimension-scale or NetCDF-4 bookkeeping, not data description. */
const INTERNAL_ATTRS = new Set([
  'DIMENSION_LIST', 'REFERENCE_LIST', 'CLASS', 'NAME', '_Netcdf4Dimid', '_Netcdf4Coordinates',
  '_NCProperties', '_nc3_strict', '_IsNetcdf4', '_SuperblockVersion',
]);

const DIMENSION_ONLY = 'This is a netCDF dimension but not a netCDF variable';
/** HDF5 writes H5S_UNLIMITED (2^64-1) into maxshape; h5wasm turns it into a huge number. */
const UNLIMITED = 2 ** 53;
/** netCDF-4 renames a variable clashing with a dimension of another meaning. */
const NON_COORD_PREFIX = '_nc4_non_coord_';

export interface H5Variable extends RawVariable {
  /** path of the HDF5 dataset */
  h5path: string;
  littleEndian: boolean;
  elementSize: number;
}

export interface Netcdf4Metadata {
  dimensions: RawDimension[];
  variables: H5Variable[];
  attrs: Attributes;
  notes: string[];
}

export function readNetcdf4Metadata(file: H5File): Netcdf4Metadata {
  const notes: string[] = [];
  const scales: { name: string; size: number; unlimited: boolean; order: number }[] = [];
  const datasets: { name: string; ds: Dataset }[] = [];
  for (const key of file.keys()) {
    const obj = file.get(key);
    if (!obj) continue;
    if (obj instanceof h5wasm.Group) {
      notes.push(`group /${key} is not read (only the root group's variables are).`);
      continue;
    }
    if (!(obj instanceof h5wasm.Dataset)) continue;
    const ds = obj;
    const names = Object.keys(ds.attrs);
    if (names.includes('CLASS') && stringAttr(ds, 'CLASS') === 'DIMENSION_SCALE') {
      const shape = ds.shape ?? [0];
      const max = ds.metadata.maxshape ?? shape;
      const dimid = names.includes('_Netcdf4Dimid') ? Number(toNumberList(ds.attrs._Netcdf4Dimid.value)[0]) : scales.length + 1000;
      scales.push({ name: key, size: shape[0] ?? 0, unlimited: (max[0] ?? 0) >= UNLIMITED, order: dimid });
      if ((stringAttr(ds, 'NAME') ?? '').startsWith(DIMENSION_ONLY)) continue;
    }
    datasets.push({ name: key, ds });
  }
  scales.sort((a, b) => a.order - b.order);
  const dimensions: RawDimension[] = scales.map(({ name, size, unlimited }) => ({ name, size, unlimited }));

  const variables: H5Variable[] = [];
  for (const { name, ds } of datasets) {
    const meta = ds.metadata;
    const shape = ds.shape;
    const dtype = dtypeOf(meta);
    if (!shape || !dtype) {
      notes.push(`dataset /${name} is skipped: its type or shape is not one we read.`);
      continue;
    }
    const isScale = scales.some((s) => s.name === name);
    let dims: string[] = shape.map((_, i) => {
      if (isScale && i === 0) return name;
      try {
        const attached = ds.get_attached_scales(i);
        return attached.length ? attached[0].split('/').pop() ?? '' : '';
      } catch {
        return '';
      }
    });
    const varName = name.startsWith(NON_COORD_PREFIX) ? name.slice(NON_COORD_PREFIX.length) : name;
    let note: string | undefined;
    if (dims.some((d) => d === '')) {
      dims = dims.map((d, i) => d || `${varName}_dim${i}`);
      note = `dataset /${name} has dimensions without names (no dimension scales); they are called ${dims.join(', ')}.`;
      notes.push(note);
      dims.forEach((d, i) => {
        if (!dimensions.some((x) => x.name === d)) dimensions.push({ name: d, size: shape[i], unlimited: false });
      });
    }
    variables.push({
      name: varName, dims, shape: shape.slice(), dtype, attrs: attributesOf(ds), attrTypes: attributeTypesOf(ds),
      h5path: `/${name}`, littleEndian: meta.littleEndian, elementSize: meta.size,
      ...(note ? { note } : {}),
    });
  }
  return { dimensions, variables, attrs: attributesOf(file as unknown as Group), notes };
}

function dtypeOf(meta: Dataset['metadata']): DType | undefined {
  if (meta.type === 0) {
    const table: Record<number, [DType, DType]> = { 1: ['i1', 'u1'], 2: ['i2', 'u2'], 4: ['i4', 'u4'], 8: ['i8', 'u8'] };
    const pair = table[meta.size];
    return pair ? (meta.signed ? pair[0] : pair[1]) : undefined;
  }
  if (meta.type === 1) return meta.size === 4 ? 'f4' : meta.size === 8 ? 'f8' : undefined;
  if (meta.type === 3) return !meta.vlen && meta.size === 1 ? 'char' : 'string';
  return undefined;
}

function attributesOf(obj: Dataset | Group): Attributes {
  const out: Attributes = {};
  for (const [key, attr] of Object.entries(obj.attrs)) {
    if (INTERNAL_ATTRS.has(key)) continue;
    let value: AttrValue | undefined;
    try {
      value = attrValue(attr.value);
    } catch {
      value = undefined; // a type we cannot turn into text or numbers
    }
    if (value !== undefined) out[key] = value;
  }
  return out;
}

/** Stored types of the numeric attributes (text ones need none). */
function attributeTypesOf(obj: Dataset | Group): Record<string, DType> {
  const out: Record<string, DType> = {};
  for (const [key, attr] of Object.entries(obj.attrs)) {
    if (INTERNAL_ATTRS.has(key)) continue;
    try {
      const t = dtypeOf(attr.metadata);
      if (t && t !== 'char' && t !== 'string') out[key] = t;
    } catch {
      // a type we do not read: its value is skipped too
    }
  }
  return out;
}

function attrValue(v: unknown): AttrValue | undefined {
  if (v === null || v === undefined) return undefined;
  if (typeof v === 'string') return v.replace(/\0+$/, '');
  if (typeof v === 'number' || typeof v === 'bigint' || typeof v === 'boolean') return [Number(v)];
  if (ArrayBuffer.isView(v)) return toNumbers(v as RawArray);
  if (Array.isArray(v)) {
    if (v.every((x) => typeof x === 'string')) return (v as string[]).map((s) => s.replace(/\0+$/, '')).join(v.length > 1 ? ', ' : '');
    return toNumberList(v);
  }
  return undefined;
}

function toNumberList(v: unknown): number[] {
  if (ArrayBuffer.isView(v)) return toNumbers(v as RawArray);
  if (Array.isArray(v)) return v.flatMap((x) => toNumberList(x));
  return [Number(v)];
}

function stringAttr(ds: Dataset, key: string): string | undefined {
  try {
    const v = ds.attrs[key]?.value;
    return typeof v === 'string' ? v : Array.isArray(v) && typeof v[0] === 'string' ? v[0] : undefined;
  } catch {
    return undefined;
  }
}
