/**
 * GeoTIFF scale/offset/nodata and projections against GDAL (gdal-bin, Debian): the fixtures in
 * tests/fixtures/geotiff were written by GDAL and expected.json holds what GDAL reads from them
 * (tests/fixtures/geotiff/make_geotiff.py): physical values from `gdal_translate -unscale`, GDAL's mask
 * band, and pixel centres and corners turned into longitude/latitude by GDAL's own coordinate transformation.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openField } from '../../../app/cf/open-field.js';
import { StillwaterError } from '../../../app/errors.js';
import { openDataset } from '../../../app/io/open.js';

const DIR = join(__dirname, '..', '..', 'fixtures', 'geotiff');
const fixture = (name: string): string => join(DIR, name);
type Num = number | 'NaN';
interface Projected {
  width: number;
  height: number;
  centres: [number, number][];
  corners: [number, number][][];
  data: Num[];
}
const expected = JSON.parse(readFileSync(join(DIR, 'expected.json'), 'utf8')) as {
  scaled_int16: { scale: number; offset: number; nodata: number; raw: number[]; values: Num[]; mean: number };
  int16_no_nodata: { nodata: null; values: number[]; mask: number[] };
} & Record<string, Projected>;

const toNumber = (x: Num): number => (x === 'NaN' ? NaN : x);
/** Longitude difference modulo a whole turn. */
const lonDiff = (a: number, b: number): number => Math.abs(((a - b + 540) % 360) - 180);

describe('GDAL scale, offset and nodata', () => {
  const exp = expected.scaled_int16;

  it('reads the int16 counts as stored and carries GDAL scale 0.01 / offset 1.5 / nodata as CF packing attributes', async () => {
    const ds = await openDataset(fixture('scaled_int16.tif'));
    const raster = ds.variables.find((v) => v.name === 'raster')!;
    expect(raster.dtype).toBe('i2');
    expect(raster.attrs.scale_factor).toEqual([exp.scale]);
    expect(raster.attrs.add_offset).toEqual([exp.offset]);
    expect(raster.attrs._FillValue).toEqual([exp.nodata]);
    expect(Array.from(await ds.read('raster') as Int16Array)).toEqual(exp.raw);
    await ds.close();
  });

  it('decodes to the physical values gdal_translate -unscale gives, nodata masked as GDAL masks it', async () => {
    const f = await openField(fixture('scaled_int16.tif'), 'raster');
    expect(f.dtype).toBe('f8');
    const level = (await f.readLevelExact!(0, 0)) as Float64Array;
    expect(level).toBeInstanceOf(Float64Array);
    // the raster is stored north-up; the field's rows run south to north
    const nx = 6;
    const ny = 4;
    let sum = 0;
    let n = 0;
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        const want = toNumber(exp.values[(ny - 1 - j) * nx + i]);
        const got = level[j * nx + i];
        if (Number.isNaN(want)) expect(got).toBeNaN();
        else {
          // GDAL unscales in double precision as raw · scale + offset, and so do we: exactly equal
          expect(got).toBe(want);
          sum += got;
          n++;
        }
      }
    }
    expect(n).toBe(23);
    // the symptom: the mean of raw counts (14424.8-like) instead of the physical mean
    expect(Math.abs(sum / n - exp.mean)).toBeLessThan(1e-9);
    await f.close?.();
  });

  it('masks nothing in a raster without nodata, as GDAL (its mask band is all valid), even NetCDF\'s default fill -32767', async () => {
    const exp2 = expected.int16_no_nodata;
    expect(exp2.mask.every((m) => m === 255)).toBe(true);
    const f = await openField(fixture('int16_no_nodata.tif'), 'raster');
    const level = await f.readLevel(0, 0);
    const flipped = [...exp2.values.slice(3), ...exp2.values.slice(0, 3)];
    expect(Array.from(level)).toEqual(flipped);
    await f.close?.();
  });
});

describe('projected GeoTIFFs become curvilinear grids with GDAL\'s longitudes and latitudes', () => {
  // proj4 and PROJ (behind GDAL) implement the same published formulas (Snyder 1987); 1e-9° is about 0.1 mm
  const TOL = 1e-9;
  for (const name of ['polar_3413', 'polar_3031', 'utm_32719', 'lambert_custom', 'albers_custom']) {
    it(`${name}: cell centres and corners match GDAL's transformation of the same pixels`, async () => {
      const exp = expected[name];
      const f = await openField(fixture(`${name}.tif`), 'raster');
      const h = f.grid.horizontal;
      expect(h.kind).toBe('curvilinear');
      expect([h.nx, h.ny]).toEqual([exp.width, exp.height]);
      expect(h.boundsDerived).toBe(false);
      for (let c = 0; c < h.nx * h.ny; c++) {
        expect(lonDiff(h.lon[c], exp.centres[c][0])).toBeLessThan(TOL);
        expect(Math.abs(h.lat[c] - exp.centres[c][1])).toBeLessThan(TOL);
        // the same four corners (each matched to GDAL's nearest), whatever vertex the list starts from
        for (let q = 0; q < 4; q++) {
          const lon = h.cornerLon[c * 4 + q];
          const lat = h.cornerLat[c * 4 + q];
          const best = Math.min(...exp.corners[c].map(([elon, elat]) => Math.max(lonDiff(lon, elon), Math.abs(lat - elat))));
          expect(best).toBeLessThan(TOL);
        }
      }
      // values in the raster's order, as GDAL reads them
      const level = await f.readLevel(0, 0);
      expect(Array.from(level)).toEqual(exp.data.map(toNumber));
      // cell areas are positive and close to the nominal projected cell (conformal/equal-area at these sizes)
      for (const a of h.area) expect(a).toBeGreaterThan(0);
      await f.close?.();
    });
  }

  it('orders each cell\'s corners counter-clockwise seen from above (CF 1.10 §7.1)', async () => {
    const f = await openField(fixture('polar_3413.tif'), 'raster');
    const h = f.grid.horizontal;
    for (let c = 0; c < h.nx * h.ny; c++) {
      // signed area of the corner polygon in a local east/north frame around the centre
      const k = Math.cos((h.lat[c] * Math.PI) / 180);
      let twice = 0;
      for (let q = 0; q < 4; q++) {
        const x1 = ((h.cornerLon[c * 4 + q] - h.lon[c] + 540) % 360 - 180) * k;
        const y1 = h.cornerLat[c * 4 + q] - h.lat[c];
        const r = (q + 1) % 4;
        const x2 = ((h.cornerLon[c * 4 + r] - h.lon[c] + 540) % 360 - 180) * k;
        const y2 = h.cornerLat[c * 4 + r] - h.lat[c];
        twice += x1 * y2 - x2 * y1;
      }
      expect(twice).toBeGreaterThan(0);
    }
    await f.close?.();
  });

  it('refuses a projection it does not know in one sentence naming the file and the EPSG code', async () => {
    const err = await openDataset(fixture('unknown_27700.tif')).then(
      () => null,
      (e: unknown) => e,
    );
    expect(err).toBeInstanceOf(StillwaterError);
    const e = err as StillwaterError;
    expect(e.code).toBe('E_COORDS');
    expect(e.message).toContain('unknown_27700.tif');
    expect(e.message).toContain('EPSG:27700');
    expect(e.message.trim().split(/[.!?]\s/).length).toBe(1);
  });
});
