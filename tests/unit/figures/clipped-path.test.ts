/**
 * Map panels cut their coastlines and graticule to the panel themselves (no SVG clip path, which rasterisers
 * draw as a figure-sized layer). Check values by exact geometry: where a straight segment meets a rectangle's
 * edge (Liang, Y.-D. & Barsky, B. A. (1984), ACM Trans. Graph. 3(1), 1–22, give the parametric form used).
 */
import { describe, expect, it } from 'vitest';
import { ClippedPath, mapOverlay } from '../../../app/figures/map-frame.js';
import { serialise } from '../../../app/figures/svg-tree.js';
import { makeProjection } from '../../../app/render/projections.js';

const box = { x: 0, y: 0, w: 10, h: 10 };
const path = (pts: [number, number][]) => {
  const p = new ClippedPath(box);
  for (const [x, y] of pts) p.lineTo(x, y);
  return p.toString();
};

describe('ClippedPath', () => {
  it('keeps a polyline inside the rectangle as it is', () => {
    expect(path([[1, 1], [5, 2], [9, 9]])).toBe('M1,1L5,2L9,9');
  });
  it('cuts a segment leaving the rectangle at the edge: (5,5)→(15,10) meets x = 10 at y = 7.5', () => {
    expect(path([[5, 5], [15, 10]])).toBe('M5,5L10,7.5');
  });
  it('starts a new piece where a polyline comes back in', () => {
    // (5,5)→(15,5) leaves at (10,5); (15,5)→(5,8) re-enters at x = 10, y = 5 + 3·(5/10) = 6.5
    expect(path([[5, 5], [15, 5], [5, 8]])).toBe('M5,5L10,5M10,6.5L5,8');
  });
  it('draws nothing of a segment wholly outside, and cuts one crossing both sides', () => {
    expect(path([[-5, -5], [-1, 20]])).toBe('');
    expect(path([[-10, 5], [20, 5]])).toBe('M0,5L10,5');
  });
  it('a lifted pen starts a new piece', () => {
    const p = new ClippedPath(box);
    p.lineTo(1, 1);
    p.lineTo(2, 2);
    p.lift();
    p.lineTo(3, 3);
    p.lineTo(4, 4);
    expect(p.toString()).toBe('M1,1L2,2M3,3L4,4');
  });
});

describe('map panel overlay', () => {
  it('uses no clip path and stays inside its panel', () => {
    const p = makeProjection('north-polar');
    const r = { x: 20, y: 30, w: 100, h: 100 };
    // a coastline projected far outside the panel and back
    const e = p.extent;
    const coast = [Float64Array.of(e.xmin, e.ymin, e.xmax * 3, e.ymax * 3, (e.xmin + e.xmax) / 2, (e.ymin + e.ymax) / 2)];
    const svg = serialise(mapOverlay(p, r, coast, { lat: false, lon: false }));
    expect(svg).not.toMatch(/clip-path|clipPath/);
    const coastD = /class="coastline"/.test(svg) ? svg.match(/d="([^"]*)"[^>]*class="coastline"/)![1] : '';
    const nums = [...coastD.matchAll(/(-?[\d.]+),(-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
    expect(nums.length).toBeGreaterThan(1);
    for (const [x, y] of nums) {
      expect(x).toBeGreaterThanOrEqual(r.x - 0.05);
      expect(x).toBeLessThanOrEqual(r.x + r.w + 0.05);
      expect(y).toBeGreaterThanOrEqual(r.y - 0.05);
      expect(y).toBeLessThanOrEqual(r.y + r.h + 0.05);
    }
  });
});
