/**
 * Step 1 of decoding: raw values → floating point with NaN where the value is missing or invalid.
 * The rules follow netCDF4-python 1.6 (`Variable._toma`), which we hold as the reference decoder:
 *  - values equal to `_FillValue` are missing;
 *  - values equal to any of `missing_value` (a scalar or a list) are missing;
 *  - `_NoFill = "true"` (NetCDF-4's virtual attribute for a variable without fill mode; the GeoTIFF reader
 *    sets it on a raster without nodata, which GDAL reads as all valid) turns the default fill value off;
 *  - without a `_FillValue` attribute, values equal to the NetCDF default fill value of the variable's type
 *    are missing (netCDF4-python does this for every numeric type, bytes included, when the variable's fill
 *    mode is on, which it always is for files read from disk);
 *  - `valid_range` (if it has two values), else `valid_min` / `valid_max`, bound the valid raw values;
 *    netCDF4-python does not turn `_FillValue` into an implied valid minimum or maximum, so neither do we;
 *  - all comparisons are made on the raw (packed) values, with the attributes cast to the variable's type.
 * `_Unsigned = "true"` (the NetCDF-3 convention for unsigned bytes and shorts) reinterprets the raw integers.
 */
import type { Attributes, DType, RawArray, RawVariable } from '../io/types.js';

/** NC_FILL_DOUBLE of netcdf.h; NC_FILL_FLOAT is the same number in single precision. */
export const NC_FILL_DOUBLE = 9.969209968386869e36;

/** NetCDF default fill values (netcdf.h: NC_FILL_BYTE, NC_FILL_SHORT, ...). */
export const DEFAULT_FILL: Partial<Record<DType, number>> = {
  i1: -127,
  u1: 255,
  i2: -32767,
  u2: 65535,
  i4: -2147483647,
  u4: 4294967295,
  i8: Number(-9223372036854775806n), // not exact as a double; 64-bit fills are compared after conversion
  u8: Number(18446744073709551614n),
  f4: Math.fround(NC_FILL_DOUBLE),
  f8: NC_FILL_DOUBLE,
};

export interface MaskRules {
  /** raw values that mean "missing" */
  missing: number[];
  /** inclusive valid bounds on raw values */
  validMin?: number;
  validMax?: number;
  /** reinterpret signed integers as unsigned (_Unsigned = "true") */
  unsigned: boolean;
}

const INTEGER: DType[] = ['i1', 'u1', 'i2', 'u2', 'i4', 'u4', 'i8', 'u8'];

/** The type the raw values effectively have, after `_Unsigned`. */
export function effectiveDtype(v: Pick<RawVariable, 'dtype' | 'attrs'>): DType {
  if (isUnsigned(v.attrs)) {
    const map: Partial<Record<DType, DType>> = { i1: 'u1', i2: 'u2', i4: 'u4', i8: 'u8' };
    return map[v.dtype] ?? v.dtype;
  }
  return v.dtype;
}

function noFill(attrs: Attributes): boolean {
  const f = attrs._NoFill;
  return typeof f === 'string' && f.trim().toLowerCase() === 'true';
}

function isUnsigned(attrs: Attributes): boolean {
  const u = attrs._Unsigned;
  return typeof u === 'string' && u.trim().toLowerCase() === 'true';
}

/** Cast an attribute value to the variable's type, as numpy's array(value, dtype) does. */
function castTo(dtype: DType, x: number): number {
  if (dtype === 'f4') return Math.fround(x);
  if (INTEGER.includes(dtype)) {
    const bits = BITS[dtype]!;
    const t = Math.trunc(x);
    if (bits > 32) return t;
    // wrap around like a C cast (an _Unsigned byte's _FillValue of -1 is 255)
    const mod = 2 ** bits;
    const u = ((t % mod) + mod) % mod;
    return dtype.startsWith('u') || u < mod / 2 ? u : u - mod;
  }
  return x;
}

const BITS: Partial<Record<DType, number>> = { i1: 8, u1: 8, i2: 16, u2: 16, i4: 32, u4: 32, i8: 64, u8: 64 };

function numbers(attrs: Attributes, key: string): number[] | undefined {
  const v = attrs[key];
  return Array.isArray(v) ? v : undefined;
}

/** Read the masking rules of a variable from its attributes. */
export function maskRules(v: Pick<RawVariable, 'dtype' | 'attrs'>): MaskRules {
  const dtype = effectiveDtype(v);
  const missing: number[] = [];
  const fill = numbers(v.attrs, '_FillValue');
  if (fill && fill.length > 0) missing.push(castTo(dtype, fill[0]));
  else if (DEFAULT_FILL[dtype] !== undefined && !noFill(v.attrs)) missing.push(DEFAULT_FILL[dtype]!);
  for (const m of numbers(v.attrs, 'missing_value') ?? []) missing.push(castTo(dtype, m));
  const rules: MaskRules = { missing: [...new Set(missing)], unsigned: isUnsigned(v.attrs) };
  const range = numbers(v.attrs, 'valid_range');
  if (range && range.length === 2) {
    rules.validMin = castTo(dtype, range[0]);
    rules.validMax = castTo(dtype, range[1]);
  } else {
    const lo = numbers(v.attrs, 'valid_min');
    const hi = numbers(v.attrs, 'valid_max');
    if (lo && lo.length > 0) rules.validMin = castTo(dtype, lo[0]);
    if (hi && hi.length > 0) rules.validMax = castTo(dtype, hi[0]);
  }
  return rules;
}

function asUnsigned(raw: RawArray): RawArray {
  if (raw instanceof Int8Array) return new Uint8Array(raw.buffer, raw.byteOffset, raw.length);
  if (raw instanceof Int16Array) return new Uint16Array(raw.buffer, raw.byteOffset, raw.length);
  if (raw instanceof Int32Array) return new Uint32Array(raw.buffer, raw.byteOffset, raw.length);
  if (raw instanceof BigInt64Array) return new BigUint64Array(raw.buffer, raw.byteOffset, raw.length);
  return raw;
}

/**
 * Apply the mask: returns `out` (allocated in the requested float type when absent) holding the raw values
 * as numbers, NaN where missing or outside the valid range. NaN raw values stay NaN.
 */
export function applyMask<T extends Float32Array | Float64Array>(raw: RawArray, rules: MaskRules, out: T): T {
  const src = rules.unsigned ? asUnsigned(raw) : raw;
  const n = src.length;
  const lo = rules.validMin ?? -Infinity;
  const hi = rules.validMax ?? Infinity;
  const miss = rules.missing;
  const big = src instanceof BigInt64Array || src instanceof BigUint64Array;
  if (!big && miss.length <= 2) return maskFloat(src as Float64Array, lo, hi, miss, out);
  for (let i = 0; i < n; i++) {
    const x = big ? Number((src as BigInt64Array)[i]) : (src as Float64Array)[i];
    let bad = x < lo || x > hi;
    for (let m = 0; !bad && m < miss.length; m++) bad = x === miss[m];
    out[i] = bad ? NaN : x;
  }
  return out;
}

/**
 * The same rule for the common case (numbers, at most two missing values) without the inner loop: a model
 * level of millions of cells is masked here once per level read. NaN stands in for an absent missing value
 * (it equals nothing). `out` may be `src` itself.
 */
function maskFloat<T extends Float32Array | Float64Array>(src: ArrayLike<number>, lo: number, hi: number, miss: number[], out: T): T {
  const n = src.length;
  const m0 = miss.length > 0 ? miss[0] : NaN;
  const m1 = miss.length > 1 ? miss[1] : NaN;
  for (let i = 0; i < n; i++) {
    const x = src[i];
    out[i] = x < lo || x > hi || x === m0 || x === m1 ? NaN : x;
  }
  return out;
}
