import { describe, expect, it } from 'vitest';
import { DEFAULT_FILL, applyMask, maskRules } from '../../../app/cf/mask.js';
import { decodedType, pack, packingOf, unpack } from '../../../app/cf/unpack.js';
import type { DType } from '../../../app/io/types.js';

// The rules are netCDF4-python 1.6's (Variable._toma and scale handling), which the fixture tests
// (open-field.test.ts) also check value by value on files it wrote. Default fill values: netcdf.h
// (NC_FILL_SHORT = -32767, NC_FILL_FLOAT = 9.9692099683868690e+36, ...).
const v = (dtype: DType, attrs: Record<string, number[] | string> = {}) => ({ dtype, attrs });

describe('mask step', () => {
  it('_FillValue marks missing values; other values pass unchanged', () => {
    const out = applyMask(new Int16Array([1, -999, 3]), maskRules(v('i2', { _FillValue: [-999] })), new Float32Array(3));
    expect(Array.from(out)).toEqual([1, NaN, 3]);
  });
  it('without _FillValue the default fill of the type is missing (netCDF4-python; NC_FILL_SHORT)', () => {
    const out = applyMask(new Int16Array([-32767, -32768, 0]), maskRules(v('i2')), new Float64Array(3));
    expect(Array.from(out)).toEqual([NaN, -32768, 0]);
    expect(DEFAULT_FILL.f4).toBe(Math.fround(9.969209968386869e36));
  });
  it('an explicit _FillValue replaces the default fill', () => {
    const out = applyMask(new Int16Array([-32767, 5]), maskRules(v('i2', { _FillValue: [5] })), new Float64Array(2));
    expect(Array.from(out)).toEqual([-32767, NaN]);
  });
  it('missing_value may be a list', () => {
    const out = applyMask(new Float32Array([1, -1e10, -999, 4]), maskRules(v('f4', { missing_value: [-1e10, -999] })), new Float32Array(4));
    expect(Array.from(out)).toEqual([1, NaN, NaN, 4]);
  });
  it('valid_range wins over valid_min/valid_max; bounds are inclusive', () => {
    const r = maskRules(v('f4', { valid_range: [0, 10], valid_min: [5] }));
    expect(Array.from(applyMask(new Float32Array([-1, 0, 10, 11, 3]), r, new Float32Array(5)))).toEqual([NaN, 0, 10, NaN, 3]);
  });
  it('_FillValue does not act as an implied valid_min (netCDF4-python 1.6 leaves -1000 unmasked beside a fill of -999)', () => {
    const out = applyMask(new Float32Array([-1000, -999]), maskRules(v('f4', { _FillValue: [-999] })), new Float32Array(2));
    expect(Array.from(out)).toEqual([-1000, NaN]);
  });
  it('_Unsigned = "true" reads signed bytes as unsigned, and casts the fill the same way', () => {
    const r = maskRules(v('i1', { _Unsigned: 'true', _FillValue: [-1] }));
    expect(Array.from(applyMask(new Int8Array([-1, -2, 3]), r, new Float32Array(3)))).toEqual([NaN, 254, 3]);
  });
  it('64-bit integers are converted to numbers', () => {
    const out = applyMask(new BigInt64Array([1n, 2n]), maskRules(v('i8', { _FillValue: [2] })), new Float64Array(2));
    expect(Array.from(out)).toEqual([1, NaN]);
  });
});

describe('unpack step', () => {
  it('x * scale_factor + add_offset (CF 1.10 §8.1), NaN stays NaN', () => {
    const p = packingOf(v('i2', { scale_factor: [0.5], add_offset: [10] }));
    expect(Array.from(unpack(new Float64Array([0, 2, NaN]), p))).toEqual([10, 11, NaN]);
  });
  it('single-precision packing of shorts is computed in single precision, like numpy float32 arithmetic', () => {
    const p = packingOf(v('i2', { scale_factor: [Math.fround(0.001)], add_offset: [15] }));
    const got = unpack(new Float32Array([12345]), p)[0];
    expect(got).toBe(Math.fround(Math.fround(12345 * Math.fround(0.001)) + 15));
  });
  it('decoded type follows netCDF4-python: short+float attributes → float32; int or double attributes → float64', () => {
    expect(decodedType(v('i2', { scale_factor: [Math.fround(0.001)] }))).toBe('f4');
    expect(decodedType(v('i2', { scale_factor: [0.01] }))).toBe('f8');
    expect(decodedType(v('i4', { scale_factor: [0.5] }))).toBe('f8');
    expect(decodedType(v('f4'))).toBe('f4');
    expect(decodedType(v('f8'))).toBe('f8');
  });
  it('pack is the inverse of unpack up to rounding', () => {
    const p = packingOf(v('i2', { scale_factor: [0.01], add_offset: [5] }));
    const physical = [5, 5.01, 17.37, -3.2];
    const back = unpack(Float64Array.from(pack(physical, p)), p);
    physical.forEach((x, i) => expect(back[i]).toBeCloseTo(x, 10));
  });
});
