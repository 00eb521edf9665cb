/**
 * CF encoding for writers, the mirror of decoding (mask.ts, unpack.ts): physical values with NaN for missing
 * → stored values with the fill value, packed when a packing is given (CF 1.10 §2.5.1 and §8.1), and the
 * attributes that tell a reader how to decode them. What `encodeValues` writes, `decodeValues` reads back.
 */
import type { Attributes } from '../io/types.js';
import { DEFAULT_FILL } from './mask.js';
import { pack, type Packing } from './unpack.js';

export type EncodedType = 'f4' | 'f8' | 'i1' | 'i2' | 'i4';

export interface Encoding {
  dtype: EncodedType;
  /** stored value that marks a missing value (the NetCDF default fill of the type unless given) */
  fill: number;
  /** integer types only: physical = stored · scale + offset */
  packing?: Packing;
}

const INT_RANGE: Record<'i1' | 'i2' | 'i4', [number, number]> = { i1: [-128, 127], i2: [-32768, 32767], i4: [-2147483648, 2147483647] };

/** Floating point values with the NetCDF default fill. */
export function floatEncoding(dtype: 'f4' | 'f8' = 'f4'): Encoding {
  return { dtype, fill: DEFAULT_FILL[dtype]! };
}

/**
 * Packing into a signed integer type so that [min, max] spans the type's range less the fill value
 * (common practice: scale = (max − min) / (2ⁿ − 2), offset = (max + min) / 2; the default fill, the most
 * negative value but one, stays outside the packed values).
 */
export function packedEncoding(min: number, max: number, dtype: 'i1' | 'i2' | 'i4' = 'i2'): Encoding {
  const [lo, hi] = INT_RANGE[dtype];
  const span = max - min;
  const scale = span > 0 ? span / (hi - lo - 2) : 1;
  return { dtype, fill: DEFAULT_FILL[dtype]!, packing: { scale, offset: (max + min) / 2, packed: true } };
}

/** The attributes a reader needs to decode values written with `e`. */
export function encodingAttributes(e: Encoding): Attributes {
  const attrs: Attributes = { _FillValue: [e.fill] };
  if (e.packing?.packed) {
    attrs.scale_factor = [e.packing.scale];
    attrs.add_offset = [e.packing.offset];
  }
  return attrs;
}

/** Physical values → stored values: NaN (and packed values outside the type) become the fill value. */
export function encodeValues(values: ArrayLike<number>, e: Encoding): Float32Array | Float64Array {
  const out = e.dtype === 'f4' ? new Float32Array(values.length) : new Float64Array(values.length);
  if (!e.packing?.packed) {
    for (let i = 0; i < values.length; i++) out[i] = values[i] === values[i] ? values[i] : e.fill;
    return out;
  }
  const packed = pack(values, e.packing);
  const [lo, hi] = INT_RANGE[e.dtype as 'i1' | 'i2' | 'i4'];
  for (let i = 0; i < packed.length; i++) {
    const p = packed[i];
    out[i] = p === p && p >= lo && p <= hi && p !== e.fill ? p : e.fill;
  }
  return out;
}
