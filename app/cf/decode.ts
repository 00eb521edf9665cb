/** Mask then unpack: raw values of a variable → physical values with NaN (netCDF4-python's decoding). */
import type { RawArray, RawVariable } from '../io/types.js';
import { applyMask, maskRules } from './mask.js';
import { decodedType, packingOf, unpack } from './unpack.js';

/**
 * `raw` is the caller's to give away (readers hand out new arrays): values already of the decoded type are
 * decoded in place, since a fresh array of a level of millions of cells costs more in page faults than the work.
 */
export function decodeValues(v: Pick<RawVariable, 'dtype' | 'attrs' | 'attrTypes'>, raw: RawArray): Float32Array | Float64Array {
  const f4 = decodedType(v) === 'f4';
  const inPlace = f4 ? raw instanceof Float32Array : raw instanceof Float64Array;
  const out = inPlace ? (raw as Float32Array | Float64Array) : f4 ? new Float32Array(raw.length) : new Float64Array(raw.length);
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
