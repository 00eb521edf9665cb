/**
 * What every format reader returns: raw arrays and attributes, nothing of CF.
 * CF decoding (app/cf) interprets them; the grid model (app/grid) owns geometry.
 */
import { nameOfPath } from './variable-path.js';

export type DType = 'i1' | 'u1' | 'i2' | 'u2' | 'i4' | 'u4' | 'i8' | 'u8' | 'f4' | 'f8' | 'char' | 'string';

/** Attribute values: text, or numbers (64-bit integers converted to number). */
export type AttrValue = string | number[];
export type Attributes = Record<string, AttrValue>;

export type RawArray =
  | Int8Array
  | Uint8Array
  | Int16Array
  | Uint16Array
  | Int32Array
  | Uint32Array
  | Float32Array
  | Float64Array
  | BigInt64Array
  | BigUint64Array;

export type DatasetFormat =
  | 'netcdf3-classic'
  | 'netcdf3-64bit-offset'
  | 'netcdf3-cdf5'
  | 'netcdf4-hdf5'
  | 'geotiff'
  | 'memory';

export interface RawDimension {
  name: string;
  size: number;
  unlimited: boolean;
}

export interface RawVariable {
  name: string;
  dims: string[];
  shape: number[];
  dtype: DType;
  attrs: Attributes;
  /**
   * The stored type of each numeric attribute, where the format says it (NetCDF classic, NetCDF-4; and
   * the GeoTIFF reader's packing, which GDAL keeps in double): CF decides the unpacked type from it.
   */
  attrTypes?: Record<string, DType>;
  /** What a person should know about how this variable was read (e.g. dimensions without names). */
  note?: string;
}

export interface RawDataset {
  readonly path: string;
  readonly format: DatasetFormat;
  readonly dimensions: RawDimension[];
  readonly attrs: Attributes;
  readonly variables: RawVariable[];
  /** What a person should know about what was (not) read, e.g. groups beyond the reader's limits. */
  readonly notes?: string[];
  /** NetCDF-4 groups read, as paths ('/', '/bgc', '/bgc/deep'); objects inside them are named by path */
  readonly groups?: readonly string[];
  /**
   * Read a hyperslab in the variable's own dtype, C order (last dimension fastest), as a new array that the
   * caller owns (decoding may overwrite it).
   * start/count default to the whole variable. char variables come back as Uint8Array.
   * Throws StillwaterError E_VARIABLE for an unknown name, E_INPUT for a slab outside the shape.
   */
  read(name: string, start?: number[], count?: number[]): Promise<RawArray>;
  close(): Promise<void>;
}

/** A variable by name; inside NetCDF-4 groups by its path (`/bgc/chl`, see variable-path.ts). */
export function findVariable(ds: RawDataset, name: string): RawVariable | undefined {
  return ds.variables.find((v) => v.name === name) ?? (name.includes('/') ? ds.variables.find((v) => v.name === nameOfPath(name)) : undefined);
}

export function attrNumber(attrs: Attributes, key: string): number | undefined {
  const v = attrs[key];
  return Array.isArray(v) && v.length > 0 ? v[0] : undefined;
}

export function attrString(attrs: Attributes, key: string): string | undefined {
  const v = attrs[key];
  return typeof v === 'string' ? v : undefined;
}
