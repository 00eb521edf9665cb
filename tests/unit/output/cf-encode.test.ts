/**
 * CF encoding mirrors decoding: what encodeValues writes with encodingAttributes, our decoder (held to
 * netCDF4-python's in tests/unit/cf/decode-steps.test.ts) reads back. CF 1.10 §2.5.1 (_FillValue) and
 * §8.1 (scale_factor, add_offset); the NetCDF default fill values are those of netcdf.h (NC_FILL_FLOAT,
 * NC_FILL_SHORT). The packing rule scale = (max − min)/(2ⁿ − 2) is common practice.
 */
import { describe, expect, it } from 'vitest';
import { encodeValues, encodingAttributes, floatEncoding, packedEncoding } from '../../../app/cf/encode.js';
import { decodeValues } from '../../../app/cf/decode.js';
import { DEFAULT_FILL } from '../../../app/cf/mask.js';

describe('CF encoding', () => {
  it('floats: NaN becomes NC_FILL_FLOAT, declared as _FillValue, and decodes back to NaN', () => {
    const values = Float32Array.of(1.5, NaN, -2);
    const e = floatEncoding('f4');
    const stored = encodeValues(values, e);
    expect(stored[1]).toBe(Math.fround(9.969209968386869e36));
    const attrs = encodingAttributes(e);
    expect(attrs).toEqual({ _FillValue: [DEFAULT_FILL.f4] });
    expect(Array.from(decodeValues({ dtype: 'f4', attrs }, stored))).toEqual([1.5, NaN, -2]);
  });

  it('packed shorts: values come back within half a step, the fill stays outside the packed values', () => {
    const values = Float64Array.of(0, 0.25, NaN, 31.9, 32);
    const e = packedEncoding(0, 32, 'i2');
    const stored = encodeValues(values, e);
    expect(stored[2]).toBe(-32767); // NC_FILL_SHORT
    expect(Math.min(...Array.from(stored).filter((x) => x !== -32767))).toBeGreaterThan(-32767);
    const attrs = encodingAttributes(e);
    expect(Object.keys(attrs).sort()).toEqual(['_FillValue', 'add_offset', 'scale_factor']);
    const back = decodeValues({ dtype: 'i2', attrs }, Int16Array.from(stored));
    const step = (attrs.scale_factor as number[])[0];
    for (const i of [0, 1, 3, 4]) expect(Math.abs(back[i] - values[i])).toBeLessThanOrEqual(step / 2 + 1e-12);
    expect(back[2]).toBeNaN();
  });
});
