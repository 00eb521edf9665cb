import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openField } from '../../../app/cf/open-field.js';
import { decodeValues } from '../../../app/cf/decode.js';
import { decodedType } from '../../../app/cf/unpack.js';
import { openDataset } from '../../../app/io/open.js';
import { findVariable } from '../../../app/io/types.js';
import type { FieldSource } from '../../../app/cf/field-source.js';

const dir = join(__dirname, '../../fixtures/cf');
interface Point {
  lat: number;
  lon: number;
  value: number | null;
  t?: number;
  depth?: number;
}
interface Expected {
  file: string;
  variable: string;
  dtype: string;
  units: string;
  times: string[];
  points: Point[];
}
// Made by tests/fixtures/cf/make_fixtures.py: files written by netCDF4-python and the values that
// netCDF4-python itself decodes from them (masking and scale_factor/add_offset applied).
const expected = JSON.parse(readFileSync(join(dir, 'expected.json'), 'utf8')) as { fields: Expected[] };

const opened: FieldSource[] = [];
afterAll(async () => {
  for (const f of opened) await f.close?.();
});

function cellOf(field: FieldSource, p: Point): number {
  const h = field.grid.horizontal;
  for (let c = 0; c < h.nx * h.ny; c++) {
    const dLon = Math.abs(((h.lon[c] - p.lon + 540) % 360) - 180);
    if (Math.abs(h.lat[c] - p.lat) < 1e-9 && dLon < 1e-9) return c;
  }
  throw new Error(`no cell at ${p.lat}, ${p.lon}`);
}

function levelOf(field: FieldSource, p: Point): number {
  if (p.depth === undefined) return 0;
  const centres = field.grid.vertical!.centres;
  const k = centres.findIndex((z) => Math.abs(z - p.depth!) < 1e-4);
  if (k < 0) throw new Error(`no level at ${p.depth} m`);
  return k;
}

describe('decoded values equal netCDF4-python decoding of the same files', () => {
  for (const e of expected.fields) {
    it(`${e.file} ${e.variable}: every value, placed by its own coordinates`, async () => {
      const field = await openField(join(dir, e.file), e.variable);
      opened.push(field);
      expect(field.units.text).toBe(e.units);
      if (e.times.length) expect(field.time!.values.map((v) => v.iso)).toEqual(e.times);
      const levels = new Map<string, Float32Array>();
      let compared = 0;
      for (const p of e.points) {
        const key = `${p.t ?? 0}/${levelOf(field, p)}`;
        if (!levels.has(key)) levels.set(key, await field.readLevel(p.t ?? 0, levelOf(field, p)));
        const got = levels.get(key)![cellOf(field, p)];
        if (p.value === null) expect(got).toBeNaN();
        else expect(got).toBe(Math.fround(p.value)); // readLevel hands out single precision
        compared++;
      }
      expect(compared).toBe(e.points.length);
    });

    it(`${e.file} ${e.variable}: whole-variable decoding in netCDF4-python's precision (${e.dtype})`, async () => {
      const ds = await openDataset(join(dir, e.file));
      try {
        const v = findVariable(ds, e.variable)!;
        const values = decodeValues(v, await ds.read(v.name));
        // Known limit: our readers give attribute values without their stored type, so a double
        // scale_factor of 0.5 (exact in single precision) decodes to Float32 here while netCDF4-python
        // gives float64. The values are the same (checked below, exactly).
        const attrTypeUnknown = e.file === 'ncgen_packed.nc';
        if (e.dtype.startsWith('float') && !attrTypeUnknown) expect(decodedType(v)).toBe(e.dtype === 'float32' ? 'f4' : 'f8');
        e.points.forEach((p, i) => {
          if (p.value === null) expect(values[i]).toBeNaN();
          else expect(values[i]).toBe(e.dtype === 'float32' || attrTypeUnknown ? Math.fround(p.value) : p.value);
        });
      } finally {
        await ds.close();
      }
    });
  }
});

describe('grids of the fixture files', () => {
  it('descending latitude becomes increasing rows; depth in cm positive up becomes metres down with its bounds', async () => {
    const f = await openField(join(dir, 'packed_nc4.nc'), 'temp');
    opened.push(f);
    const h = f.grid.horizontal;
    expect(h.kind).toBe('rectilinear');
    expect(Array.from(h.axes!.lat)).toEqual([-67.5, -22.5, 22.5, 67.5]);
    expect(Array.from(h.axes!.lon)).toEqual([30, 90, 150, 210, 270, 330]);
    expect(h.boundsDerived).toBe(true);
    expect(Array.from(h.axes!.latEdges)).toEqual([-90, -45, 0, 45, 90]);
    expect(h.periodic).toBe(true);
    const z = f.grid.vertical!;
    expect(Array.from(z.centres)).toEqual([5, 15, 50]);
    expect(Array.from(z.edges)).toEqual([0, 10, 25, 100]);
    expect(z.boundsDerived).toBe(false);
    expect(f.nt).toBe(2);
    expect(f.time!.calendar).toBe('noleap');
    expect(f.units).toMatchObject({ kind: 'temperature', canonical: 'degC' });
    expect(f.standardName).toBe('sea_water_potential_temperature');
    expect(f.longName).toBe('potential temperature');
  });

  it('wrapped longitudes are rotated to increase; depth without bounds gets derived edges', async () => {
    const f = await openField(join(dir, 'wrapped_cdf2.nc'), 'no3');
    opened.push(f);
    const h = f.grid.horizontal;
    expect(Array.from(h.axes!.lon)).toEqual([0, 30, 60, 90, 120, 150, 180, 210, 240, 270, 300, 330]);
    expect(h.periodic).toBe(true);
    expect(f.grid.vertical!.boundsDerived).toBe(true);
    expect(Array.from(f.grid.vertical!.edges)).toEqual([0, 50, 150]);
    expect(f.units).toMatchObject({ kind: 'amount_per_volume', canonical: 'mmol m-3' });
  });

  it('curvilinear corners come from the CF (y, x, 4) bounds', async () => {
    const f = await openField(join(dir, 'curvilinear.nc'), 'po4');
    opened.push(f);
    const h = f.grid.horizontal;
    expect(h.kind).toBe('curvilinear');
    expect([h.nx, h.ny]).toEqual([8, 5]);
    expect(h.boundsDerived).toBe(false);
    expect(f.grid.vertical).toBeNull();
    const ds = await openDataset(join(dir, 'curvilinear.nc'));
    const blat = await ds.read('lat_bnds');
    await ds.close();
    expect(Array.from(h.cornerLat)).toEqual(Array.from(blat as Float64Array));
    for (let c = 0; c < h.nx * h.ny; c++) expect(h.area[c]).toBeGreaterThan(0);
  });

  it('opts.units overrides the file units', async () => {
    const f = await openField(join(dir, 'wrapped_cdf2.nc'), 'no3', { units: 'umol kg-1' });
    opened.push(f);
    expect(f.units.kind).toBe('amount_per_mass');
  });
});
