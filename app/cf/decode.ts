/** Mask then unpack: raw values of a variable → physical values with NaN (netCDF4-python's decoding). */
import type { RawArray, RawVariable } from '../io/types.js';
import { applyMask, maskRules } from './mask.js';
import { decodedType, packingOf, unpack } from './unpack.js';

export function decodeValues(v: Pick<RawVariable, 'dtype' | 'attrs' | 'attrTypes'>, raw: RawArray): Float32Array | Float64Array {
  const out = decodedType(v) === 'f4' ? new Float32Array(raw.length) : new Float64Array(raw.length);
  applyMask(raw, maskRules(v), out);
  return unpack(out, packingOf(v));
}

/** Decode into single precision (what fields hand out level by level). */
export function decodeValuesF32(v: Pick<RawVariable, 'dtype' | 'attrs' | 'attrTypes'>, raw: RawArray): Float32Array {
  const d = decodeValues(v, raw);
  return d instanceof Float32Array ? d : Float32Array.from(d);
}

/** Decode a coordinate (always double precision). */
export function decodeCoordinate(v: Pick<RawVariable, 'dtype' | 'attrs' | 'attrTypes'>, raw: RawArray): Float64Array {
  const d = decodeValues(v, raw);
  return d instanceof Float64Array ? d : Float64Array.from(d);
}
