import { describe, expect, it } from 'vitest';
import { evaluateExpression, parseExpression } from '../../../app/ocean/expression.js';

const ev = (text: string, inputs: Record<string, Float32Array | number> = {}, n = 1): Float32Array => evaluateExpression(parseExpression(text), inputs, n);

describe('derived-tracer expressions', () => {
  it('follows the usual precedence: ^ before unary minus before * / before + − (and ^ is right-associative)', () => {
    expect(ev('1 + 2 * 3')[0]).toBe(7);
    expect(ev('(1 + 2) * 3')[0]).toBe(9);
    expect(ev('-2^2')[0]).toBe(-4);
    expect(ev('2^3^2')[0]).toBe(512);
    expect(ev('2^-1')[0]).toBe(0.5);
    expect(ev('8 / 4 / 2')[0]).toBe(1);
    expect(ev('10 - 4 - 3')[0]).toBe(3);
    expect(ev('1.5e2 + .5')[0]).toBe(150.5);
  });
  it('evaluates element-wise over arrays with NaN propagating, numbers broadcast', () => {
    const N = Float32Array.of(30, 20, NaN), P = Float32Array.of(2, 1, 1);
    const r = ev('(N - 16*P + 2.9) * 0.87', { N, P }, 3);
    expect(r[0]).toBeCloseTo((30 - 32 + 2.9) * 0.87, 5);
    expect(r[1]).toBeCloseTo((20 - 16 + 2.9) * 0.87, 5);
    expect(Number.isNaN(r[2])).toBe(true);
  });
  it('has abs, exp, log, log10, min, max', () => {
    const x = Float32Array.of(-2, 100);
    expect(Array.from(ev('abs(x)', { x }, 2))).toEqual([2, 100]);
    expect(ev('log10(x)', { x }, 2)[1]).toBeCloseTo(2, 6);
    expect(Number.isNaN(ev('log(x)', { x }, 2)[0])).toBe(true);
    expect(ev('exp(log(3))')[0]).toBeCloseTo(3, 6);
    expect(Array.from(ev('min(x, 0, 5)', { x }, 2))).toEqual([-2, 0]);
    expect(Array.from(ev('max(x, 0)', { x }, 2))).toEqual([0, 100]);
  });
  it('lists the variables it uses', () => {
    expect(parseExpression('O2sat - O2 + max(O2, 0)').variables).toEqual(['O2sat', 'O2']);
  });
  it('names the position of an error in the expression', () => {
    expect(() => parseExpression('N - 16*P +')).toThrow("Expression 'N - 16*P +': unexpected end of expression at position 11.");
    expect(() => parseExpression('(N - P')).toThrow(/expected '\)' at position 7/);
    expect(() => parseExpression('N $ P')).toThrow(/unexpected character '\$' at position 3/);
    expect(() => parseExpression('sqrt(N)')).toThrow(/unknown function 'sqrt'.*at position 1/);
    expect(() => parseExpression('min(N)')).toThrow(/min takes at least 2 arguments, got 1 at position 1/);
    expect(() => parseExpression('N P')).toThrow(/unexpected 'P' at position 3/);
    expect(() => parseExpression('  ')).toThrow(/empty/);
    expect(() => ev('N + Q', { N: 1 })).toThrow(/no variable named 'Q' at position 5/);
  });
  it('is never evaluated as JavaScript: code-like text is rejected by the tokenizer', () => {
    expect(() => parseExpression('process.exit(1)')).toThrow(/unexpected character '\.'/);
    expect(() => parseExpression('constructor')).not.toThrow();
    expect(() => ev('constructor', {})).toThrow(/no variable named 'constructor'/);
  });
});
