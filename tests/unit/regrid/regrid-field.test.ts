import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { makeRectilinearGrid, makeRegularGrid } from '../../../app/grid/rectilinear.js';
import type { Grid, HorizontalGrid } from '../../../app/grid/types.js';
import { makeVerticalAxis } from '../../../app/grid/vertical.js';
import { regridField } from '../../../app/regrid/regrid-field.js';
import { clearWeightMemory } from '../../../app/regrid/weights.js';
import { memoryField } from '../memory-field.js';
import { distortedGrid, functionField } from './helpers.js';

const edges = (a: number, b: number, d: number): Float64Array => Float64Array.from({ length: Math.round((b - a) / d) + 1 }, (_, i) => a + i * d);
const flat = (h: HorizontalGrid): Grid => ({ horizontal: h, vertical: null });
const tmp = mkdtempSync(join(tmpdir(), 'sw-regrid-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

describe('masks and coverage', () => {
  // 2° source cells nest four to a 4° target cell: the expected values are area-weighted means
  const src = makeRectilinearGrid(edges(0, 8, 2), edges(40, 48, 2));
  const tgt = makeRectilinearGrid(edges(0, 8, 4), edges(40, 48, 4));
  const v = Float32Array.from({ length: 16 }, (_, i) => 10 + i);
  // target cell (0,0) holds source cells 0, 1, 4, 5; mask one of them. Target (0,1) holds 2, 3, 6, 7: mask three.
  v[5] = NaN;
  v[2] = v[3] = v[6] = NaN;
  const A = src.area;

  it('a target value is Σ w·v / Σ w over the valid overlap, and the covered fraction is kept', async () => {
    const r = await regridField(memoryField(flat(src), [v]), flat(tgt), { cacheDir: null });
    const { values, coverage } = await r.readLevelWithCoverage(0, 0);
    const cov0 = (A[0] + A[1] + A[4]) / tgt.area[0];
    expect(coverage[0]).toBeCloseTo(cov0, 6);
    expect(values[0]).toBeCloseTo((A[0] * v[0] + A[1] * v[1] + A[4] * v[4]) / (A[0] + A[1] + A[4]), 4);
    expect(coverage[1]).toBeCloseTo(A[7] / tgt.area[1], 6);
    expect(Number.isNaN(values[1])).toBe(true); // about a quarter covered: below the default 0.5
    expect(r.coverage(0)).toBe(coverage);
  });

  it('a lower threshold keeps thinly covered cells; the unnormalised form divides by the whole cell', async () => {
    const low = await regridField(memoryField(flat(src), [v]), flat(tgt), { cacheDir: null, coverage: 0.2 });
    expect((await low.readLevel(0, 0))[1]).toBeCloseTo(v[7], 4);
    const raw = await regridField(memoryField(flat(src), [v]), flat(tgt), { cacheDir: null, coverage: 0.2, normalise: false });
    expect((await raw.readLevel(0, 0))[1]).toBeCloseTo((A[7] * v[7]) / tgt.area[1], 4);
  });

  it('nearest-wet takes the nearest valid neighbour where the nearest cell is missing', async () => {
    const fine = makeRectilinearGrid(edges(1, 7, 2), edges(41, 47, 2));
    const r = await regridField(memoryField(flat(src), [v]), flat(fine), { cacheDir: null, method: 'nearest' });
    const out = await r.readLevel(0, 0);
    // fine cell (0,0) is centred at (2, 42), the corner of source cells 0, 1, 4, 5; fine cell 1 at (4, 42)
    expect(Number.isNaN(out[0])).toBe(false);
    expect([v[0], v[1], v[4]]).toContain(out[0]);
    expect(out.every((x) => !Number.isNaN(x))).toBe(true);
  });
});

describe('longitude conventions of the target', () => {
  const src = makeRegularGrid(3, 3);
  const field = functionField(flat(src), (lon, lat) => Math.cos((lat * Math.PI) / 180) * (1 + Math.sin((lon * Math.PI) / 90)));

  it('a target on 0..360 gives the same cells as one on −180..180 (periodic longitude)', async () => {
    const a = await regridField(field, flat(makeRegularGrid(2, 2, -180)), { cacheDir: null });
    const b = await regridField(field, flat(makeRegularGrid(2, 2, 0)), { cacheDir: null });
    const va = await a.readLevel(0, 0), vb = await b.readLevel(0, 0);
    // cell i of b (starting at 0°E) is cell i + 90 of a
    for (let j = 0; j < 90; j += 7) for (let i = 0; i < 180; i += 11) expect(vb[j * 180 + i]).toBeCloseTo(va[j * 180 + ((i + 90) % 180)], 5);
  });

  it('descending target longitudes and latitudes map to the same cells', async () => {
    const asc = makeRegularGrid(5, 5, -180);
    const desc = reversedGrid(asc);
    const a = await regridField(field, flat(asc), { cacheDir: null });
    const d = await regridField(field, flat(desc), { cacheDir: null });
    const va = await a.readLevel(0, 0), vd = await d.readLevel(0, 0);
    const { nx, ny } = asc;
    for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) expect(vd[(ny - 1 - j) * nx + (nx - 1 - i)]).toBeCloseTo(va[j * nx + i], 5);
  });
});

/** The same lat-lon grid with both axes running backwards (a hand-built grid: the maker insists on increasing edges). */
function reversedGrid(g: HorizontalGrid): HorizontalGrid {
  const { nx, ny } = g;
  const n = nx * ny;
  const out: HorizontalGrid = { ...g, lon: new Float64Array(n), lat: new Float64Array(n), cornerLon: new Float64Array(4 * n), cornerLat: new Float64Array(4 * n), area: new Float64Array(n) };
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
    const to = j * nx + i, from = (ny - 1 - j) * nx + (nx - 1 - i);
    out.lon[to] = g.lon[from];
    out.lat[to] = g.lat[from];
    out.area[to] = g.area[from];
    for (let q = 0; q < 4; q++) {
      out.cornerLon[4 * to + q] = g.cornerLon[4 * from + q];
      out.cornerLat[4 * to + q] = g.cornerLat[4 * from + q];
    }
  }
  const ax = g.axes!;
  out.axes = { lon: ax.lon.slice().reverse(), lat: ax.lat.slice().reverse(), lonEdges: ax.lonEdges.slice().reverse(), latEdges: ax.latEdges.slice().reverse() };
  return out;
}

describe('vertical layer overlap (thickness-weighted), applied separably', () => {
  const h = makeRectilinearGrid(edges(0, 4, 2), edges(0, 2, 2));
  const srcV = makeVerticalAxis(Float64Array.of(0, 10, 30, 60, 100));
  const tgtV = makeVerticalAxis(Float64Array.of(0, 20, 50, 100));
  const layer = [1, 2, 3, 4];
  // column 0 is wet to the bottom; column 1 has no water below 60 m
  const levels = layer.map((x, k) => Float32Array.of(x, k === 3 ? NaN : 10 * x));

  it('target layers are thickness-weighted means of the overlapping source layers', async () => {
    const r = await regridField(memoryField({ horizontal: h, vertical: srcV }, levels), { horizontal: h, vertical: tgtV }, { cacheDir: null });
    expect(r.grid.vertical).toBe(tgtV);
    expect((await r.readLevel(0, 0))[0]).toBeCloseTo((10 * 1 + 10 * 2) / 20, 5);
    expect((await r.readLevel(0, 1))[0]).toBeCloseTo((10 * 2 + 20 * 3) / 30, 5);
    expect((await r.readLevel(0, 2))[0]).toBeCloseTo((10 * 3 + 40 * 4) / 50, 5);
  });

  it('keeps the column integral (volume integral per unit area) where the target covers the source', async () => {
    const r = await regridField(memoryField({ horizontal: h, vertical: srcV }, levels), { horizontal: h, vertical: tgtV }, { cacheDir: null });
    let tgt = 0;
    for (let k = 0; k < 3; k++) tgt += tgtV.thickness[k] * (await r.readLevel(0, k))[0];
    const srcSum = 10 * 1 + 20 * 2 + 30 * 3 + 40 * 4;
    expect(Math.abs(tgt / srcSum - 1)).toBeLessThan(1e-7);
  });

  it('partial coverage at the seafloor follows the coverage rule', async () => {
    const r = await regridField(memoryField({ horizontal: h, vertical: srcV }, levels), { horizontal: h, vertical: tgtV }, { cacheDir: null });
    const { values, coverage } = await r.readLevelWithCoverage(0, 2);
    expect(coverage[1]).toBeCloseTo(10 / 50, 6);
    expect(Number.isNaN(values[1])).toBe(true);
    const low = await regridField(memoryField({ horizontal: h, vertical: srcV }, levels), { horizontal: h, vertical: tgtV }, { cacheDir: null, coverage: 0.1 });
    expect((await low.readLevel(0, 2))[1]).toBeCloseTo(30, 4);
  });

  it('reads only the source levels that overlap the target level', async () => {
    const f = functionField({ horizontal: h, vertical: srcV }, (_lo, _la, z) => z);
    const r = await regridField(f, { horizontal: h, vertical: tgtV }, { cacheDir: null });
    await r.readLevel(0, 0);
    expect(f.reads).toBe(2);
  });

  it("linear interpolation in depth between level centres is the 'linear' option", async () => {
    const std = makeVerticalAxis(Float64Array.of(0, 10, 40, 100), false, Float64Array.of(5, 32.5, 80));
    const r = await regridField(memoryField({ horizontal: h, vertical: srcV }, levels), { horizontal: h, vertical: std }, { cacheDir: null, vertical: 'linear' });
    expect(r.verticalMethod).toBe('linear');
    // source centres 5, 20, 45, 80: 32.5 lies halfway between 20 (value 2) and 45 (value 3)
    expect((await r.readLevel(0, 1))[0]).toBeCloseTo(2.5, 5);
    expect((await r.readLevel(0, 2))[0]).toBeCloseTo(4, 5);
  });
});

describe('weights cache on disk', () => {
  // conservative weights between two lat-lon grids are kept as two 1-D factors and never cached
  // (separable.test.ts); the matrices of the other pairs are, as checked here with bilinear weights
  const src = makeRegularGrid(4, 4);
  const tgt = makeRegularGrid(3, 3);
  const field = functionField(flat(src), (lon) => lon);

  it('builds once, then reuses the file keyed by a hash of both grids and the method', async () => {
    clearWeightMemory();
    const dir = join(tmp, 'cache1');
    const a = await regridField(field, flat(tgt), { cacheDir: dir, method: 'bilinear' });
    expect(a.weightOrigin).toBe('built');
    const files = readdirSync(dir);
    expect(files).toHaveLength(1);
    expect(files[0]).toMatch(/^weights-[0-9a-f]{64}\.bin$/);
    expect((await regridField(field, flat(tgt), { cacheDir: dir, method: 'bilinear' })).weightOrigin).toBe('memory');
    clearWeightMemory();
    const b = await regridField(field, flat(tgt), { cacheDir: dir, method: 'bilinear' });
    expect(b.weightOrigin).toBe('disk');
    expect(Array.from(b.weights.w)).toEqual(Array.from(a.weights.w));
    clearWeightMemory();
    expect((await regridField(field, flat(tgt), { cacheDir: dir, method: 'nearest' })).weightOrigin).toBe('built');
    expect(readdirSync(dir)).toHaveLength(2);
  });

  it('a damaged cache file is rebuilt, not trusted', async () => {
    clearWeightMemory();
    const dir = join(tmp, 'cache2');
    await regridField(field, flat(tgt), { cacheDir: dir, method: 'bilinear' });
    const [name] = readdirSync(dir);
    writeFileSync(join(dir, name), Buffer.from('not weights'));
    clearWeightMemory();
    expect((await regridField(field, flat(tgt), { cacheDir: dir, method: 'bilinear' })).weightOrigin).toBe('built');
  });

  it('conservative lat-lon pairs write no cache file; their full matrix is built on request only', async () => {
    clearWeightMemory();
    const dir = join(tmp, 'cache3');
    const r = await regridField(field, flat(tgt), { cacheDir: dir });
    expect(r.weightOrigin).toBe('separable');
    await r.readLevel(0, 0);
    expect(() => readdirSync(dir)).toThrow(/ENOENT/);
    expect(r.weights.col.length).toBe(r.weightEntries);
    expect(readdirSync(dir)).toHaveLength(1);
  });
});

describe('fields that share weights', () => {
  const v = makeVerticalAxis(Float64Array.of(0, 50, 200, 1000));
  const sources: [string, HorizontalGrid][] = [
    ['a curvilinear source (one sparse engine per weights)', distortedGrid(60, 30, -80, 80) as HorizontalGrid],
    ['a lat-lon source (one engine per pair of grids)', makeRegularGrid(3, 3)],
  ];
  for (const [name, h] of sources) {
    it(`read at once, level by level, give what each gives alone: ${name}`, async () => {
      const src: Grid = { horizontal: h, vertical: v };
      const tgt: Grid = { horizontal: makeRegularGrid(4, 4), vertical: makeVerticalAxis(Float64Array.of(0, 100, 1000)) };
      const fa = functionField(src, (lon, lat, z) => (lat > 60 ? NaN : 1 + Math.sin((lon * Math.PI) / 90) + z / 1000));
      const fb = functionField(src, (lon, lat, z) => (lon > 100 ? NaN : 5 - Math.cos((lat * Math.PI) / 45) - z / 500));
      const alone = async (f: typeof fa) => {
        clearWeightMemory();
        const r = await regridField(f, tgt, { cacheDir: null });
        return [await r.readLevel(0, 0), await r.readLevel(0, 1)];
      };
      const [a0, a1] = await alone(fa), [b0, b1] = await alone(fb);
      clearWeightMemory();
      const ra = await regridField(fa, tgt, { cacheDir: null }), rb = await regridField(fb, tgt, { cacheDir: null });
      const [x0, y0, x1, y1] = await Promise.all([ra.readLevel(0, 0), rb.readLevel(0, 0), ra.readLevel(0, 1), rb.readLevel(0, 1)]);
      expect(Array.from(x0)).toEqual(Array.from(a0));
      expect(Array.from(x1)).toEqual(Array.from(a1));
      expect(Array.from(y0)).toEqual(Array.from(b0));
      expect(Array.from(y1)).toEqual(Array.from(b1));
      expect(a0.some((x) => Number.isNaN(x)) && a0.some((x) => !Number.isNaN(x))).toBe(true);
      expect(Array.from(a0)).not.toEqual(Array.from(b0));
    });
  }
});

describe('bad input', () => {
  it('grids that do not overlap: one sentence naming the file and variable', async () => {
    const src = makeRectilinearGrid(edges(0, 10, 1), edges(0, 10, 1));
    const tgt = makeRectilinearGrid(edges(100, 110, 1), edges(0, 10, 1));
    await expect(regridField(functionField(flat(src), () => 1), flat(tgt), { cacheDir: null })).rejects.toThrow("analytic.nc, variable 'tracer': its grid and the target grid do not overlap.");
  });

  it('a target without usable bounds', async () => {
    const tgt = makeRegularGrid(10, 10);
    tgt.cornerLon.fill(NaN);
    tgt.area.fill(NaN);
    await expect(regridField(functionField(flat(makeRegularGrid(5, 5)), () => 1), flat(tgt), { cacheDir: null })).rejects.toThrow(/target grid has no usable cell bounds/);
  });

  it('depth ranges that do not overlap, and a coverage threshold outside 0..1', async () => {
    const h = makeRegularGrid(30, 30);
    const f = functionField({ horizontal: h, vertical: makeVerticalAxis(Float64Array.of(0, 100)) }, () => 1);
    await expect(regridField(f, { horizontal: h, vertical: makeVerticalAxis(Float64Array.of(200, 300)) }, { cacheDir: null })).rejects.toThrow(/depth range and the target depth range do not overlap/);
    await expect(regridField(f, flat(h), { cacheDir: null, coverage: 1.5 })).rejects.toThrow(/between 0 and 1/);
  });
});
