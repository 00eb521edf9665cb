// The pixel-to-cell lookup behind the maps, and the recolour loop over it.
import { describe, expect, it } from 'vitest';
import { makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { OFF_GRID, OFF_MAP, buildPixelLookup, canvasHeightFor, cellAt, findInterval, pixelToProjected, projectedToPixel } from '../../../app/render/pixel-lookup.js';
import { makeProjection } from '../../../app/render/projections.js';
import { packRgba, recolour } from '../../../app/render/recolour.js';

const grid = makeRegularGrid(2, 2); // 180 x 90 cells, edges from -180 and -90
const lonEdges = grid.axes!.lonEdges;
const latEdges = grid.axes!.latEdges;

describe('cell search', () => {
  it('finds the interval of increasing edges', () => {
    const e = [0, 1, 3, 6];
    expect(findInterval(e, 0)).toBe(0);
    expect(findInterval(e, 2.9)).toBe(1);
    expect(findInterval(e, 3)).toBe(2);
    expect(findInterval(e, 6)).toBe(2);
    expect(findInterval(e, -0.1)).toBe(-1);
    expect(findInterval(e, NaN)).toBe(-1);
  });
  it('a periodic grid takes longitudes from any 360° window', () => {
    const c = cellAt(lonEdges, latEdges, 10.5, 20.5); // i = (10.5+180)/2 = 95, j = (20.5+90)/2 = 55
    expect(c).toBe(55 * 180 + 95);
    expect(cellAt(lonEdges, latEdges, 10.5 + 360, 20.5)).toBe(c);
    expect(cellAt(lonEdges, latEdges, 10.5 - 720, 20.5)).toBe(c);
  });
  it('a regional grid leaves the rest of the globe off the grid', () => {
    const lon = Float64Array.from([0, 10, 20]);
    const lat = Float64Array.from([-10, 0, 10]);
    expect(cellAt(lon, lat, 15, 5)).toBe(1 * 2 + 1);
    expect(cellAt(lon, lat, 25, 5)).toBe(OFF_GRID);
    expect(cellAt(lon, lat, 15, 11)).toBe(OFF_GRID);
  });
});

describe('pixel lookup', () => {
  it('equirectangular: every pixel maps to the cell under its centre', () => {
    const proj = makeProjection('plate');
    const w = 360;
    const h = canvasHeightFor(proj, w);
    expect(h).toBe(180);
    const lut = buildPixelLookup(proj, lonEdges, latEdges, w, h);
    // pixel (px, py) covers lon -180 + px .. +1, lat 90 - py .. -1: cell i = px >> 1, j = (179 - py) >> 1
    for (const [px, py] of [[0, 0], [359, 179], [200, 37], [91, 150]]) {
      expect(lut[py * w + px]).toBe(((179 - py) >> 1) * 180 + (px >> 1));
    }
    expect(Array.from(lut).every((c) => c >= 0)).toBe(true);
  });
  it('equal-earth and polar views: pixels off the globe are OFF_MAP, the rest find the cell of their inverse', () => {
    for (const id of ['equal-earth', 'north-polar', 'south-polar'] as const) {
      const proj = makeProjection(id);
      const w = 120;
      const h = canvasHeightFor(proj, w);
      const lut = buildPixelLookup(proj, lonEdges, latEdges, w, h);
      expect(lut[0]).toBe(OFF_MAP); // the top-left corner is never on these maps
      const centre = lut[(h >> 1) * w + (w >> 1)];
      expect(centre).toBeGreaterThanOrEqual(0);
      let onMap = 0;
      for (let py = 0; py < h; py += 7) {
        for (let px = 0; px < w; px += 7) {
          const [x, y] = pixelToProjected(proj, w, h, px, py);
          const ll = proj.inverse(x, y);
          const c = lut[py * w + px];
          if (ll === null) expect(c).toBe(OFF_MAP);
          else {
            onMap++;
            expect(c).toBe(cellAt(lonEdges, latEdges, ll[0], ll[1]));
            // and that cell's box holds the point
            const i = c % 180;
            const j = Math.floor(c / 180);
            expect(ll[1]).toBeGreaterThanOrEqual(latEdges[j] - 1e-9);
            expect(ll[1]).toBeLessThanOrEqual(latEdges[j + 1] + 1e-9);
            expect(((ll[0] + 540) % 360) - 180).toBeGreaterThanOrEqual(lonEdges[i] - 1e-9);
          }
        }
      }
      expect(onMap).toBeGreaterThan(50);
    }
  });
  it('pixel and projected coordinates are inverse to each other', () => {
    const proj = makeProjection('equal-earth');
    const [x, y] = pixelToProjected(proj, 400, 200, 123, 45);
    const [px, py] = projectedToPixel(proj, 400, 200, x, y);
    expect(px).toBeCloseTo(123, 9);
    expect(py).toBeCloseTo(45, 9);
  });
});

describe('recolour', () => {
  it('colours cells through the lookup, with missing and background colours', () => {
    const palette = Uint32Array.from([packRgba(0, 0, 0), packRgba(100, 0, 0), packRgba(200, 0, 0), packRgba(255, 0, 0)]);
    const values = Float32Array.from([0, 1, 2, 3, NaN, 9]);
    const lookup = Int32Array.from([0, 1, 2, 3, 4, 5, OFF_MAP, OFF_GRID, 0]);
    const px = new Uint32Array(lookup.length);
    const missing = packRgba(1, 2, 3);
    const background = packRgba(0, 0, 0, 0);
    recolour(values, lookup, px, { palette, min: 0, max: 4, missing, background });
    expect(Array.from(px)).toEqual([palette[0], palette[1], palette[2], palette[3], missing, palette[3], background, missing, palette[0]]);
  });
  it('packs RGBA in ImageData byte order', () => {
    const u = new Uint32Array([packRgba(1, 2, 3, 4)]);
    expect(Array.from(new Uint8Array(u.buffer))).toEqual([1, 2, 3, 4]);
  });
});

describe('pixel lookup, one inverse projection per row (plate carrée, Equal Earth)', () => {
  // longitude proportional to x along a row: plate carrée by definition, Equal Earth by its formula (Šavrič,
  // Patterson & Jenny 2018, x = 2√3 R λ cos θ / (3 (9 A4 θ⁸ + 7 A3 θ⁶ + 3 A2 θ² + A1)), y from θ alone). The fast
  // lookup must pick the cell of every pixel's own inverse projection (proj4, held against pyproj elsewhere).
  const fine = makeRegularGrid(0.25, 0.25);
  const fl = fine.axes!.lonEdges;
  const ft = fine.axes!.latEdges;
  for (const id of ['plate', 'equal-earth'] as const) {
    it(`${id}: the whole map and a zoomed window agree with the per-pixel inverse`, () => {
      const full = makeProjection(id);
      const e = full.extent;
      const win = { xmin: e.xmin + 0.61 * (e.xmax - e.xmin), xmax: e.xmin + 0.83 * (e.xmax - e.xmin), ymin: e.ymin + 0.05 * (e.ymax - e.ymin), ymax: e.ymin + 0.16 * (e.ymax - e.ymin) };
      for (const proj of [full, { ...full, extent: win }]) {
        const w = 301;
        const h = canvasHeightFor(proj, w);
        const lut = buildPixelLookup(proj, fl, ft, w, h);
        let differ = 0;
        let onMap = 0;
        for (let py = 0; py < h; py++) {
          for (let px = 0; px < w; px++) {
            const [x, y] = pixelToProjected(proj, w, h, px, py);
            const ll = proj.inverse(x, y);
            const want = ll === null ? OFF_MAP : cellAt(fl, ft, ll[0], ll[1]);
            if (ll) onMap++;
            if (lut[py * w + px] !== want) differ++;
          }
        }
        expect(onMap).toBeGreaterThan(w * h * 0.5);
        // round-off may move a pixel centre that lies on a cell edge to the neighbouring cell, nothing more
        expect(differ / (w * h)).toBeLessThan(1e-3);
      }
    });
  }
});
