// The pure parts behind the screen's colour, zoom, contours and lines (issue 14), each against a definition or
// an exact case: CIE 1976 L* (the project's lightness(), itself held to littleCMS in colour-scales.test.ts) for
// the uniformity of our named scales; decades for log ticks; the geometry of a window; the exact contour of a
// linear field; great circles through the poles and across the antimeridian.
import { describe, expect, it } from 'vitest';
import { clipped, log10Values, logTicks, positiveRange } from '../../../app/render/colour-mapping.js';
import { lightness } from '../../../app/render/colour-scales.js';
import { contourSegments } from '../../../app/render/contours.js';
import { greatCirclePath } from '../../../app/render/line-path.js';
import { MAX_ZOOM, panWindow, zoomOf, zoomWindow } from '../../../app/render/map-window.js';
import { DIFF_SCALES, FIELD_SCALES, namedScale, oklabToLinearSrgb } from '../../../app/render/named-scales.js';

const Ls = (rgb: Uint8Array): number[] => Array.from({ length: rgb.length / 3 }, (_, k) => lightness(rgb[k * 3], rgb[k * 3 + 1], rgb[k * 3 + 2]));

describe('named colour scales', () => {
  it('Oklab white is sRGB white and Oklab black is black (Ottosson 2020: L = 1, a = b = 0 is D65 white)', () => {
    const w = oklabToLinearSrgb(1, 0, 0);
    for (const c of w) expect(c).toBeCloseTo(1, 3);
    for (const c of oklabToLinearSrgb(0, 0, 0)) expect(c).toBeCloseTo(0, 12);
  });
  it('every sequential scale rises in CIE L* from end to end, in near-equal steps (perceptually uniform, common practice)', () => {
    for (const s of FIELD_SCALES.filter((x) => x.id !== 'lagoon')) {
      const L = Ls(s.scale.rgb);
      // quantisation to 8 bits lets neighbours tie; over 16 entries lightness must rise
      for (let k = 16; k < L.length; k++) expect(L[k], `${s.id}[${k}]`).toBeGreaterThan(L[k - 16]);
      const steps = [];
      for (let k = 32; k < L.length; k += 32) steps.push(L[k] - L[k - 32]);
      expect(Math.max(...steps) / Math.min(...steps), s.id).toBeLessThan(1.6);
      expect(L[L.length - 1] - L[0], s.id).toBeGreaterThan(60);
    }
  });
  it('every diverging scale is lightest in the middle and about equally dark at both ends', () => {
    for (const s of DIFF_SCALES) {
      const L = Ls(s.scale.rgb);
      const mid = Math.max(...L.slice(120, 136));
      expect(mid, s.id).toBeGreaterThan(Math.max(L[0], L[L.length - 1]) + 40);
      expect(Math.abs(L[0] - L[L.length - 1]), s.id).toBeLessThan(12);
    }
  });
  it('an unknown name falls back to the first scale', () => {
    expect(namedScale(FIELD_SCALES, 'no-such')).toBe(FIELD_SCALES[0].scale);
  });
});

describe('logarithmic stretch', () => {
  it('takes log10, sends values at or below zero to the lowest colour and keeps missing values missing', () => {
    const l = log10Values(Float32Array.from([100, 0.01, 0, -3, NaN]));
    expect(Array.from(l.slice(0, 2))).toEqual([2, -2]);
    expect(l[2]).toBe(-Infinity);
    expect(l[3]).toBe(-Infinity);
    expect(l[4]).toBeNaN();
  });
  it('ticks at 1, 2, 5 × 10^k inside the range; only powers of ten over more than three decades', () => {
    expect(logTicks(0.05, 2)).toEqual([0.05, 0.1, 0.2, 0.5, 1, 2]);
    expect(logTicks(1e-3, 10)).toEqual([0.001, 0.01, 0.1, 1, 10]);
    expect(logTicks(0, 1)).toEqual([]);
  });
  it('a range reaching zero keeps three decades below its top', () => {
    expect(positiveRange(-1, 2)).toEqual([0.002, 2]);
    expect(positiveRange(-2, -1)).toBeNull();
  });
  it('tells whether values fall outside the range (the colour bar arrows)', () => {
    expect(clipped([1, 2, 3, NaN], 0, 5)).toEqual({ below: false, above: false });
    expect(clipped([1, 2, 3], 1.5, 2.5)).toEqual({ below: true, above: true });
  });
});

describe('map window', () => {
  const full = { xmin: -100, xmax: 100, ymin: -50, ymax: 50 };
  it('zooming in keeps the point under the pointer in place and the aspect ratio', () => {
    const w = zoomWindow(full, null, 2, 50, 25)!;
    expect(zoomOf(full, w)).toBeCloseTo(2, 12);
    expect((w.xmax - w.xmin) / (w.ymax - w.ymin)).toBeCloseTo(2, 12);
    // (50, 25) sat at 3/4 across and 3/4 up the whole map; it does in the window too
    expect((50 - w.xmin) / (w.xmax - w.xmin)).toBeCloseTo(0.75, 12);
    expect((25 - w.ymin) / (w.ymax - w.ymin)).toBeCloseTo(0.75, 12);
  });
  it('never leaves the extent, never zooms past the limit, and zooming out to the whole map gives null', () => {
    const w = zoomWindow(full, null, 4, 100, 50)!;
    expect(w.xmax).toBeLessThanOrEqual(100);
    expect(w.ymax).toBeLessThanOrEqual(50);
    expect(zoomOf(full, zoomWindow(full, w, 1000, 0, 0)!)).toBeCloseTo(MAX_ZOOM, 9);
    expect(zoomWindow(full, w, 0.1, 0, 0)).toBeNull();
  });
  it('pans by the given metres, stopping at the edge', () => {
    const w = zoomWindow(full, null, 2, 0, 0)!;
    const p = panWindow(full, w, 10, 0)!;
    expect(p.xmin - w.xmin).toBeCloseTo(10, 12);
    expect(panWindow(full, w, 1e6, 0)!.xmax).toBe(100);
    expect(panWindow(full, null, 10, 0)).toBeNull();
  });
});

describe('contours (marching squares)', () => {
  it('the contour of a field linear in longitude is the meridian where it takes that value (exact for a linear field)', () => {
    // 4 × 3 cells of 1°, value = longitude of the cell centre
    const lonEdges = [0, 1, 2, 3, 4];
    const latEdges = [10, 11, 12, 13];
    const values = new Float32Array(12);
    for (let j = 0; j < 3; j++) for (let i = 0; i < 4; i++) values[j * 4 + i] = i + 0.5;
    const [c] = contourSegments(values, lonEdges, latEdges, [1.75]);
    expect(c.segments.length).toBe(2 * 4); // one segment in each of the two rows of squares
    for (let k = 0; k < c.segments.length; k += 2) expect(c.segments[k]).toBeCloseTo(1.75, 6);
  });
  it('a square with a missing corner draws nothing', () => {
    const values = Float32Array.from([0, 1, NaN, 1]);
    expect(contourSegments(values, [0, 1, 2], [0, 1, 2], [0.5])[0].segments.length).toBe(0);
  });
});

describe('great-circle path of a line', () => {
  it('a leg along a meridian stays on it, one point a degree', () => {
    const [piece] = greatCirclePath([[-30, -60], [-30, 0]]);
    expect(piece.length).toBe(61);
    for (const [lon] of piece) expect(lon).toBeCloseTo(-30, 9);
  });
  it('a leg across the antimeridian is split, never drawn across the map', () => {
    const pieces = greatCirclePath([[170, 0], [-170, 0]]);
    expect(pieces.length).toBe(2);
    for (const p of pieces) for (let k = 1; k < p.length; k++) expect(Math.abs(p[k][0] - p[k - 1][0])).toBeLessThan(2);
  });
});
