// The browser-mode wire format keeps what JSON alone loses (ECMA-404 JSON has no NaN or Infinity, and
// JSON.stringify turns a Float32Array into an object of indices): typed arrays of every kind, NaN, ±Infinity.
import { describe, expect, it } from 'vitest';
import { decodeWire, encodeWire } from '../../../contract/wire.js';

describe('wire format', () => {
  it('round-trips typed arrays of every element type, values and types intact', () => {
    const value = {
      f32: Float32Array.from([1.5, NaN, -0, 3e38]),
      f64: Float64Array.from([Math.PI, -Infinity]),
      i8: Int8Array.from([-128, 127]),
      u8: Uint8Array.from([0, 255, 7]),
      i16: Int16Array.from([-32768]),
      u16: Uint16Array.from([65535]),
      i32: Int32Array.from([-2147483648]),
      u32: Uint32Array.from([4294967295]),
      big: BigInt64Array.from([-(2n ** 63n)]),
    };
    const back = decodeWire(encodeWire(value)) as typeof value;
    for (const [k, v] of Object.entries(value)) {
      const b = (back as Record<string, ArrayLike<unknown>>)[k];
      expect(b.constructor.name, k).toBe(v.constructor.name);
      expect(Array.from(b), k).toEqual(Array.from(v as ArrayLike<unknown>));
    }
    expect(Object.is(back.f32[2], -0)).toBe(true);
  });
  it('keeps NaN and infinities in plain numbers, nested in arrays and objects', () => {
    const back = decodeWire(encodeWire({ rows: [{ corr: NaN, n: 3 }, { corr: Infinity, n: -Infinity }] })) as { rows: { corr: number; n: number }[] };
    expect(Number.isNaN(back.rows[0].corr)).toBe(true);
    expect(back.rows[1].corr).toBe(Infinity);
    expect(back.rows[1].n).toBe(-Infinity);
    expect(back.rows[0].n).toBe(3);
  });
  it('encodes a view of part of a larger buffer as that part only', () => {
    const whole = Float32Array.from([0, 1, 2, 3, 4, 5]);
    const part = whole.subarray(2, 4);
    const bytes = encodeWire({ part });
    const back = decodeWire(bytes) as { part: Float32Array };
    expect(Array.from(back.part)).toEqual([2, 3]);
  });
  it('aligns typed arrays so a Float64Array view is possible after odd-length text', () => {
    const back = decodeWire(encodeWire({ s: 'abc', a: Uint8Array.from([1, 2, 3]), d: Float64Array.from([2.5]) })) as { s: string; d: Float64Array };
    expect(back.s).toBe('abc');
    expect(back.d[0]).toBe(2.5);
  });
  it('refuses bytes that are not its format', () => {
    expect(() => decodeWire(new TextEncoder().encode('{"a":1}'))).toThrow(/not a Stillwater result/);
  });
});
