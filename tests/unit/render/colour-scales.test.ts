// Colour scales for fields and differences. Tables against matplotlib's published data (fixture from
// tests/fixtures/render/make_render_fixtures.py); CIE L* against littleCMS (via Pillow's ImageCms, 8-bit Lab).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { DIVERGING, SEQUENTIAL, formatTick, lightness, niceTicks, quantileRange, selectKth, symmetricRange } from '../../../app/render/colour-scales.js';
import { paletteIndex } from '../../../app/render/recolour.js';

const maps = (JSON.parse(readFileSync(new URL('../../fixtures/render/colour-maps.json', import.meta.url), 'utf8')) as {
  maps: Record<string, { rgb: number[][]; lightness_lcms: number[] }>;
}).maps;

const L = (s: typeof SEQUENTIAL, k: number): number => lightness(s.rgb[k * 3], s.rgb[k * 3 + 1], s.rgb[k * 3 + 2]);

describe('CIE lightness', () => {
  it('agrees with littleCMS within its 8-bit quantisation', () => {
    for (const key of ['greys', 'viridis', 'diverging']) {
      const m = maps[key];
      m.rgb.forEach((c, i) => expect(Math.abs(lightness(c[0], c[1], c[2]) - m.lightness_lcms[i]), `${key}[${i}]`).toBeLessThan(1.0));
    }
  });
  it('black is 0 and white is 100 (CIE 1976 L*, definition)', () => {
    expect(lightness(0, 0, 0)).toBeCloseTo(0, 6);
    expect(lightness(255, 255, 255)).toBeCloseTo(100, 3);
  });
});

describe('sequential scale (viridis)', () => {
  it('is the published viridis table, entry by entry', () => {
    expect(SEQUENTIAL.packed.length).toBe(256);
    maps.viridis.rgb.forEach((c, k) => expect([SEQUENTIAL.rgb[k * 3], SEQUENTIAL.rgb[k * 3 + 1], SEQUENTIAL.rgb[k * 3 + 2]]).toEqual(c));
  });
  it('rises in lightness monotonically from dark to light', () => {
    // entry to entry within the 8-bit rounding of the table (at most 0.1 L*), strictly over every 4 entries
    for (let k = 1; k < 256; k++) expect(L(SEQUENTIAL, k)).toBeGreaterThan(L(SEQUENTIAL, k - 1) - 0.1);
    for (let k = 4; k < 256; k++) expect(L(SEQUENTIAL, k)).toBeGreaterThan(L(SEQUENTIAL, k - 4));
    expect(L(SEQUENTIAL, 255) - L(SEQUENTIAL, 0)).toBeGreaterThan(70);
  });
});

describe('diverging scale', () => {
  it('is lightest at its centre and darkens monotonically towards both ends', () => {
    const n = DIVERGING.packed.length;
    const ls = Array.from({ length: n }, (_, k) => L(DIVERGING, k));
    const peak = ls.indexOf(Math.max(...ls));
    expect(Math.abs(peak - (n - 1) / 2)).toBeLessThanOrEqual(2);
    for (let k = 1; k <= peak; k++) expect(ls[k]).toBeGreaterThanOrEqual(ls[k - 1] - 0.05);
    for (let k = peak + 1; k < n; k++) expect(ls[k]).toBeLessThanOrEqual(ls[k - 1] + 0.05);
  });
  it('goes from blue (low) to red (high)', () => {
    const n = DIVERGING.packed.length;
    expect(DIVERGING.rgb[2]).toBeGreaterThan(DIVERGING.rgb[0]); // low end: more blue than red
    expect(DIVERGING.rgb[(n - 1) * 3]).toBeGreaterThan(DIVERGING.rgb[(n - 1) * 3 + 2]); // high end: more red than blue
  });
  it('a symmetric range puts zero on the centre of the palette', () => {
    const r = symmetricRange([Float32Array.from([-3, -1, 0.5, 2, 7, NaN])], 1)!;
    expect(r[0]).toBe(-r[1]);
    expect(r[1]).toBe(7);
    const n = DIVERGING.packed.length;
    // zero falls on the boundary between the two middle entries; either side of it is the centre
    const k = paletteIndex(0, r[0], r[1], n);
    expect([n / 2 - 1, n / 2]).toContain(k);
    expect(paletteIndex(-1e-9, r[0], r[1], n)).toBe(n / 2 - 1);
    expect(paletteIndex(r[0], r[0], r[1], n)).toBe(0);
    expect(paletteIndex(r[1], r[0], r[1], n)).toBe(n - 1);
  });
});

describe('ranges and ticks', () => {
  it('selection finds the k-th smallest value as a full sort does', () => {
    let seed = 7;
    const rnd = (): number => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) * 100 - 50;
    const a = Float64Array.from({ length: 5001 }, () => Math.round(rnd() * 10) / 10); // with many ties
    const sorted = Float64Array.from(a).sort();
    for (const k of [0, 1, 100, 2500, 4900, 5000]) expect(selectKth(Float64Array.from(a), a.length, k)).toBe(sorted[k]);
  });
  it('quantile range on a large array gives the order statistics a full sort gives', () => {
    let seed = 11;
    const rnd = (): number => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
    const a = Float32Array.from({ length: 200_003 }, (_, i) => (i % 97 === 0 ? NaN : Math.exp(6 * rnd()) - 20));
    const b = Float32Array.from({ length: 1000 }, () => 1e6 * rnd());
    const valid = Float64Array.from([...a, ...b].filter((v) => v === v)).sort();
    const n = valid.length;
    const [lo, hi] = quantileRange([a, b], 0.02, 0.98)!;
    expect(lo).toBe(valid[Math.round(0.02 * (n - 1))]);
    expect(hi).toBe(valid[Math.round(0.98 * (n - 1))]);
  });
  it('quantile range ignores NaN and the extreme tails', () => {
    const a = new Float32Array(1001);
    for (let i = 0; i < 1001; i++) a[i] = i;
    a[5] = NaN;
    const [lo, hi] = quantileRange([a], 0.02, 0.98)!;
    expect(lo).toBeGreaterThan(15);
    expect(lo).toBeLessThan(25);
    expect(hi).toBeGreaterThan(975);
    expect(hi).toBeLessThan(985);
    expect(quantileRange([new Float32Array([NaN])])).toBeNull();
  });
  it('tick text tells neighbouring ticks apart', () => {
    expect([0, 2.5, 5, 7.5].map((v) => formatTick(v, 2.5))).toEqual(['0', '2.5', '5.0', '7.5']);
    expect(formatTick(0.25, 0.25)).toBe('0.25');
    expect(formatTick(20, 10)).toBe('20');
  });
  it('ticks are round numbers inside the range', () => {
    expect(niceTicks(0, 10, 5)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(niceTicks(-0.37, 0.37, 4)).toEqual([-0.2, 0, 0.2]);
    for (const t of niceTicks(3.1, 47.9, 6)) {
      expect(t).toBeGreaterThanOrEqual(3.1);
      expect(t).toBeLessThanOrEqual(47.9);
    }
  });
});
