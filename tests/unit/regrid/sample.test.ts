import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { makeRectilinearGrid, makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { edgesFromCentres, makeVerticalAxis } from '../../../app/grid/vertical.js';
import { regridField } from '../../../app/regrid/field.js';
import { makePointSampler } from '../../../app/regrid/sample.js';
import { distortedGrid, functionField, memoryField } from './helpers.js';

interface Interp {
  lon: number[];
  lat: number[];
  depth: number[];
  values: number[];
  points: [number, number, number][];
  trilinear: number[];
  bilinearLevel: number;
  bilinear: number[];
}
const fx = JSON.parse(readFileSync(new URL('../../fixtures/regrid/interp.json', import.meta.url), 'utf8')) as Interp;

/** Cell edges halfway between centres (the grid's own bounds do not matter between centres). */
function edgesOf(c: number[]): Float64Array {
  const e = new Float64Array(c.length + 1);
  for (let i = 1; i < c.length; i++) e[i] = 0.5 * (c[i - 1] + c[i]);
  e[0] = c[0] - 0.5 * (c[1] - c[0]);
  e[c.length] = c[c.length - 1] + 0.5 * (c[c.length - 1] - c[c.length - 2]);
  return e;
}

function fixtureField() {
  const h = makeRectilinearGrid(edgesOf(fx.lon), edgesOf(fx.lat));
  const centres = Float64Array.from(fx.depth);
  const v = makeVerticalAxis(edgesFromCentres(centres), true, centres);
  const per = fx.lon.length * fx.lat.length;
  const levels = fx.depth.map((_, k) => Float32Array.from(fx.values.slice(k * per, (k + 1) * per)));
  return memoryField({ horizontal: h, vertical: v }, levels);
}

describe('point sampling against scipy.interpolate.RegularGridInterpolator (tests/fixtures/regrid/make_fixtures.py)', () => {
  it('trilinear in (depth, lat, lon) matches method="linear" at 40 random points', async () => {
    const s = makePointSampler(fixtureField(), 'trilinear');
    for (let p = 0; p < fx.points.length; p++) {
      const [z, lat, lon] = fx.points[p];
      expect(await s.sample(lon, lat, z)).toBeCloseTo(fx.trilinear[p], 3);
    }
  });

  it('bilinear on one level matches method="linear" in (lat, lon)', async () => {
    const s = makePointSampler(fixtureField(), 'bilinear');
    const z = fx.depth[fx.bilinearLevel];
    const many = await s.sampleMany(fx.points.map((p) => p[2]), fx.points.map((p) => p[1]), fx.points.map(() => z));
    for (let p = 0; p < fx.points.length; p++) expect(many[p]).toBeCloseTo(fx.bilinear[p], 3);
  });

  it('is NaN outside the grid and below the deepest layer', async () => {
    const s = makePointSampler(fixtureField(), 'trilinear');
    expect(Number.isNaN(await s.sample(100, 0, 10))).toBe(true);
    expect(Number.isNaN(await s.sample(12, -2, 5000))).toBe(true);
  });
});

describe('nearest-wet and missing neighbours', () => {
  const h = makeRegularGrid(10, 10);
  const v = new Float32Array(h.nx * h.ny).map((_, i) => i);
  const land = 9 * 36 + 18; // the cell holding (5°E, 5°N)
  v[land] = NaN;

  it('nearest returns the nearest wet cell when the point lies on land', async () => {
    const s = makePointSampler(memoryField({ horizontal: h, vertical: null }, [v]), 'nearest');
    expect(await s.sample(4, 4, 0)).toBe(v[land - 1]);
    expect(await s.sample(15, 15, 0)).toBe(v[10 * 36 + 19]);
  });

  it('bilinear leaves out missing neighbours and renormalises while they carry less than half the weight', async () => {
    const s = makePointSampler(memoryField({ horizontal: h, vertical: null }, [v]), 'bilinear');
    // (7.5, 7.5) is a quarter of the way from centre (5, 5) towards (15, 15): weight 9/16 on the land cell
    expect(Number.isNaN(await s.sample(7.5, 7.5, 0))).toBe(true);
    // (12.5, 12.5): weight 1/16 on the land cell; the other three renormalised
    const w = [3 / 16, 3 / 16, 9 / 16];
    const vals = [v[land + 1], v[land + 36], v[land + 37]];
    expect(await s.sample(12.5, 12.5, 0)).toBeCloseTo((w[0] * vals[0] + w[1] * vals[1] + w[2] * vals[2]) / (15 / 16), 4);
  });
});

describe('bilinear regridding from a curvilinear source', () => {
  it('samples a smooth field between curvilinear centres to within the second-order error', async () => {
    const src = distortedGrid(90, 45, -90, 90, 0.5);
    const f = functionField({ horizontal: src, vertical: null }, (lon, lat) => Math.sin((lat * Math.PI) / 180) + 0.5 * Math.cos((lat * Math.PI) / 180) * Math.cos((lon * Math.PI) / 180));
    const tgt = makeRegularGrid(5, 5);
    const bil = await regridField(f, { horizontal: tgt, vertical: null }, { cacheDir: null, method: 'bilinear' });
    const vb = await bil.readLevel(0, 0);
    let worst = 0, count = 0;
    for (let t = 0; t < vb.length; t++) {
      if (Math.abs(tgt.lat[t]) > 80) continue;
      const exact = Math.sin((tgt.lat[t] * Math.PI) / 180) + 0.5 * Math.cos((tgt.lat[t] * Math.PI) / 180) * Math.cos((tgt.lon[t] * Math.PI) / 180);
      worst = Math.max(worst, Math.abs(vb[t] - exact));
      count++;
    }
    expect(count).toBeGreaterThan(2000);
    // second-order interpolation of a smooth field sampled at ~4° spacing
    expect(worst).toBeLessThan(5e-3);
  });
});
