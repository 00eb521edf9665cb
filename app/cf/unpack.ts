/**
 * Step 2 of decoding: packed values → physical values, x · scale_factor + add_offset (CF 1.10 §8.1).
 * The result type (decodedType) follows CF and netCDF4-python 1.6: bytes and shorts packed with
 * single-precision attributes decode to Float32 (and the arithmetic is done in single precision, as numpy
 * does); 32- and 64-bit integers, doubles, and double-precision attributes decode to Float64.
 */
import type { DType, RawVariable } from '../io/types.js';
import { effectiveDtype } from './mask.js';

export interface Packing {
  scale: number;
  offset: number;
  /** whether scale_factor / add_offset are present at all */
  packed: boolean;
}

export function packingOf(v: Pick<RawVariable, 'attrs'>): Packing {
  const s = v.attrs.scale_factor;
  const o = v.attrs.add_offset;
  const scale = Array.isArray(s) && s.length > 0 ? s[0] : 1;
  const offset = Array.isArray(o) && o.length > 0 ? o[0] : 0;
  return { scale, offset, packed: Array.isArray(s) || Array.isArray(o) };
}

const SMALL: DType[] = ['i1', 'u1', 'i2', 'u2', 'char'];

/**
 * Float32 or Float64: the type of the decoded values. Unpacked (CF 1.10 §8.1): the type of scale_factor
 * (else add_offset) for bytes and shorts, as netCDF4-python 1.6 gives; double for 32- and 64-bit integers
 * (netCDF4-python's numpy promotion, and single precision could not hold them); for float data, double when
 * a packing attribute is double (CF: the unpacked type is the attributes' type; netCDF4-python stays in
 * single precision there). Not packed: single precision for bytes, shorts and floats, double otherwise.
 * Where the reader does not say an attribute's stored type, it counts as single precision when its value
 * is exact in single precision.
 */
export function decodedType(v: Pick<RawVariable, 'dtype' | 'attrs' | 'attrTypes'>): 'f4' | 'f8' {
  const dtype = effectiveDtype(v);
  const small = SMALL.includes(dtype);
  if (!small && dtype !== 'f4') return 'f8';
  const p = packingOf(v);
  if (!p.packed) return 'f4';
  const typeOf = (key: 'scale_factor' | 'add_offset', value: number): DType | undefined => {
    if (!Array.isArray(v.attrs[key])) return undefined;
    return v.attrTypes?.[key] ?? (Math.fround(value) === value ? 'f4' : 'f8');
  };
  const scaleType = typeOf('scale_factor', p.scale);
  const offsetType = typeOf('add_offset', p.offset);
  if (dtype === 'f4') return scaleType === 'f8' || offsetType === 'f8' ? 'f8' : 'f4';
  const t = scaleType ?? offsetType;
  return t === 'f8' || t === 'i4' || t === 'u4' || t === 'i8' || t === 'u8' ? 'f8' : 'f4';
}

/** Apply scale_factor and add_offset in place; NaN stays NaN. */
export function unpack<T extends Float32Array | Float64Array>(values: T, p: Packing): T {
  if (!p.packed || (p.scale === 1 && p.offset === 0)) return values;
  const n = values.length;
  const { scale, offset } = p;
  if (values instanceof Float32Array) {
    const s = Math.fround(scale);
    const o = Math.fround(offset);
    for (let i = 0; i < n; i++) values[i] = Math.fround(values[i] * s) + o;
  } else {
    for (let i = 0; i < n; i++) values[i] = values[i] * scale + offset;
  }
  return values;
}

/** The inverse of unpack (for writers): physical → packed, rounded to the nearest integer. */
export function pack(values: ArrayLike<number>, p: Packing): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = Math.round((values[i] - p.offset) / p.scale);
  return out;
}
