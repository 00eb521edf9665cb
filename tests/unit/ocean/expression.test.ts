import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
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

describe('ocean functions of the expression language', () => {
  const fx = JSON.parse(readFileSync(new URL('../../fixtures/ocean/seawater.json', import.meta.url), 'utf8')) as { oxygen: { sp: number; pt: number; o2sol: number }[] };
  /** Evaluate with each input given by recipe name; the keys the parser asks for are looked up by name. */
  function evalByName(text: string, byName: Record<string, Float32Array>, n: number): Float32Array {
    const parsed = parseExpression(text);
    const inputs: Record<string, Float32Array> = {};
    for (const i of parsed.inputs) inputs[i.key] = byName[i.name];
    return evaluateExpression(parsed, inputs, n);
  }

  it('oxygen_saturation(theta, S) matches gsw.O2sol_SP_pt to 0.01 µmol/kg (tests/fixtures/ocean/make_fixtures.py)', () => {
    const theta = Float32Array.from(fx.oxygen.map((r) => r.pt)), s = Float32Array.from(fx.oxygen.map((r) => r.sp));
    const got = evalByName('oxygen_saturation(theta, S)', { theta, S: s }, s.length);
    fx.oxygen.forEach((r, i) => expect(Math.abs(got[i] - r.o2sol)).toBeLessThan(0.01));
    expect(fx.oxygen.length).toBeGreaterThan(20);
  });

  it('aou(O2, theta, S) at S = 35, θ = 10 °C, O2 = 200 is 274.5957 − 200 by hand (gsw.O2sol_SP_pt(35, 10), REFERENCES.md)', () => {
    const got = evalByName('aou(O2, theta, S)', { O2: Float32Array.of(200, NaN), theta: Float32Array.of(10, 10), S: Float32Array.of(35, 35) }, 2);
    expect(Math.abs(got[0] - 74.5957)).toBeLessThan(0.01);
    expect(Number.isNaN(got[1])).toBe(true);
  });

  it('nstar is (N − 16 P + 2.90) × 0.87 (Gruber & Sarmiento 1997; from memory), nstar_simple N − 16 P + 2.9', () => {
    const by = { N: Float32Array.of(30), P: Float32Array.of(2) };
    expect(evalByName('nstar(N, P)', by, 1)[0]).toBeCloseTo((30 - 32 + 2.9) * 0.87, 5);
    expect(evalByName('nstar_simple(N, P)', by, 1)[0]).toBeCloseTo(0.9, 5);
  });

  it('a plain variable given to a function is read in the units the function needs; elsewhere as it is', () => {
    const p = parseExpression('aou(O2, T, S) + O2 - nstar(NO3, PO4 * 1)');
    expect(p.variables).toEqual(['O2', 'T', 'S', 'NO3', 'PO4']);
    const byKey = Object.fromEntries(p.inputs.map((i) => [i.key, i.need ?? null]));
    expect(byKey).toEqual({
      'O2 [umol kg-1]': { units: 'umol kg-1', oxygen: true },
      'T [degC]': { units: 'degC' },
      'S [salinity]': { salinity: true },
      'NO3 [umol kg-1]': { units: 'umol kg-1' },
      O2: null,
      PO4: null,
    });
  });

  it('checks the number of arguments and looks functions up without a prototype', () => {
    expect(() => parseExpression('aou(O2, T)')).toThrow(/aou takes 3 arguments, got 2/);
    for (const name of ['constructor', 'toString', '__proto__', 'hasOwnProperty']) {
      expect(() => parseExpression(`${name}(x)`)).toThrow(new RegExp(`unknown function '${name}'`));
    }
    expect(() => ev('constructor + 1')).toThrow(/no variable named 'constructor'/);
  });
});
