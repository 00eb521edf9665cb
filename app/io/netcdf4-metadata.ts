/**
 * NetCDF-4 metadata from an HDF5 file opened with h5wasm: dimensions from dimension scales
 * (the NetCDF-4 convention: DIMENSION_LIST on variables, CLASS=DIMENSION_SCALE on dimensions,
 * ordered by _Netcdf4Dimid), variables from the datasets of every group (nested ones too, within
 * limits on depth and count), attributes without the HDF5 and NetCDF-4 bookkeeping ones.
 * Objects inside groups are named by their path (`/bgc/chl`, see variable-path.ts). A variable's
 * dimensions are the scales its DIMENSION_LIST references, so a dimension of a parent group resolves
 * to that group's scale, as netCDF-4 itself does.
 */
import type { Dataset, File as H5File, Group } from 'h5wasm/node';
import { h5wasmLoaded } from './h5wasm-module.js';
import { toNumbers } from './dtype.js';
import type { Attributes, AttrValue, DType, RawArray, RawDimension, RawVariable } from './types.js';
import { baseName, nameOfPath } from './variable-path.js';

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
/**
 * A hostile file can nest groups without end (HDF5 hard links may even point back to a parent): beyond
 * these limits groups are not read, and the notes say which.
 */
export const MAX_GROUP_DEPTH = 16;
export const MAX_GROUPS = 1000;
export const MAX_DATASETS = 20000;

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
  /** the groups read, '/' first */
  groups: string[];
}

interface Scale {
  path: string;
  name: string;
  size: number;
  unlimited: boolean;
  order: number;
}

export function readNetcdf4Metadata(file: H5File): Netcdf4Metadata {
  const h5wasm = h5wasmLoaded();
  const notes: string[] = [];
  const scales: Scale[] = [];
  const datasets: { path: string; ds: Dataset }[] = [];
  const groups: string[] = [];
  const skipped: string[] = [];
  let datasetsSkipped = 0;

  // breadth first, so a limit keeps the groups nearest the root
  const queue: { path: string; group: Group; depth: number }[] = [{ path: '/', group: file as unknown as Group, depth: 0 }];
  while (queue.length) {
    const { path, group, depth } = queue.shift()!;
    groups.push(path);
    let keys: string[];
    try {
      keys = group.keys();
    } catch {
      notes.push(`group ${path} cannot be listed (it is damaged); its variables are not read.`);
      continue;
    }
    for (const key of keys) {
      const childPath = path === '/' ? `/${key}` : `${path}/${key}`;
      let obj: ReturnType<Group['get']>;
      try {
        obj = group.get(key);
      } catch {
        notes.push(`${childPath} cannot be opened (it is damaged) and is not read.`);
        continue;
      }
      if (!obj) continue;
      if (obj instanceof h5wasm.Group) {
        if (depth + 1 > MAX_GROUP_DEPTH || groups.length + queue.length >= MAX_GROUPS) skipped.push(childPath);
        else queue.push({ path: childPath, group: obj, depth: depth + 1 });
        continue;
      }
      if (!(obj instanceof h5wasm.Dataset)) continue;
      if (datasets.length >= MAX_DATASETS) {
        datasetsSkipped++;
        continue;
      }
      const ds = obj;
      const names = Object.keys(ds.attrs);
      if (names.includes('CLASS') && stringAttr(ds, 'CLASS') === 'DIMENSION_SCALE') {
        const shape = ds.shape ?? [0];
        const max = ds.metadata.maxshape ?? shape;
        const dimid = names.includes('_Netcdf4Dimid') ? Number(toNumberList(ds.attrs._Netcdf4Dimid.value)[0]) : scales.length + 1e6;
        scales.push({ path: childPath, name: nameOfPath(childPath), size: shape[0] ?? 0, unlimited: (max[0] ?? 0) >= UNLIMITED, order: dimid });
        if ((stringAttr(ds, 'NAME') ?? '').startsWith(DIMENSION_ONLY)) continue;
      }
      datasets.push({ path: childPath, ds });
    }
  }
  if (skipped.length) {
    const shown = skipped.slice(0, 5).join(', ') + (skipped.length > 5 ? ` and ${skipped.length - 5} more` : '');
    notes.push(`groups nested deeper than ${MAX_GROUP_DEPTH} levels or beyond the first ${MAX_GROUPS} are not read: ${shown}.`);
  }
  if (datasetsSkipped) notes.push(`only the first ${MAX_DATASETS} datasets are read; ${datasetsSkipped} more are not.`);
  // netCDF-4 numbers dimensions across the whole file; a group's own come after its parent's
  scales.sort((a, b) => a.order - b.order);
  const dimensions: RawDimension[] = scales.map(({ name, size, unlimited }) => ({ name, size, unlimited }));
  const scaleByPath = new Map(scales.map((s) => [s.path, s]));

  const variables: H5Variable[] = [];
  for (const { path, ds } of datasets) {
    const meta = ds.metadata;
    const shape = ds.shape;
    const dtype = dtypeOf(meta);
    if (!shape || !dtype) {
      notes.push(`dataset ${path} is skipped: its type or shape is not one we read.`);
      continue;
    }
    const ownScale = scaleByPath.get(path);
    let dims: string[] = shape.map((_, i) => {
      if (ownScale && i === 0) return ownScale.name;
      try {
        const attached = ds.get_attached_scales(i);
        return attached.length ? nameOfPath(attached[0]) : '';
      } catch {
        return '';
      }
    });
    const base = baseName(path);
    const varName = nameOfPath(base.startsWith(NON_COORD_PREFIX) ? path.slice(0, path.length - base.length) + base.slice(NON_COORD_PREFIX.length) : path);
    let note: string | undefined;
    if (dims.some((d) => d === '')) {
      dims = dims.map((d, i) => d || `${varName}_dim${i}`);
      note = `dataset ${path} has dimensions without names (no dimension scales); they are called ${dims.join(', ')}.`;
      notes.push(note);
      dims.forEach((d, i) => {
        if (!dimensions.some((x) => x.name === d)) dimensions.push({ name: d, size: shape[i], unlimited: false });
      });
    }
    variables.push({
      name: varName, dims, shape: shape.slice(), dtype, attrs: attributesOf(ds), attrTypes: attributeTypesOf(ds),
      h5path: path, littleEndian: meta.littleEndian, elementSize: meta.size,
      ...(note ? { note } : {}),
    });
  }
  return { dimensions, variables, attrs: attributesOf(file as unknown as Group), notes, groups };
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
