// The writer's files must be read back by the reference tools: Unidata's ncdump (netcdf-bin) and
// netCDF4-python (python3-netcdf4). Both are outside oracles for the classic format specification.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createNetcdf } from '../../../app/io/netcdf-writer.js';

const PY = '/usr/bin/python3';

async function writeSample(path: string): Promise<void> {
  const w = await createNetcdf(path, {
    dimensions: [
      { name: 'depth', size: 2 },
      { name: 'lat', size: 3 },
      { name: 'lon', size: 4 },
    ],
    attrs: { Conventions: 'CF-1.10', title: 'writer check' },
    variables: [
      { name: 'depth', dims: ['depth'], dtype: 'f8', attrs: { units: 'm', positive: 'down', axis: 'Z' } },
      { name: 'lat', dims: ['lat'], dtype: 'f4', attrs: { units: 'degrees_north' } },
      { name: 'lon', dims: ['lon'], dtype: 'f4', attrs: { units: 'degrees_east' } },
      { name: 'po4', dims: ['depth', 'lat', 'lon'], dtype: 'f4', attrs: { units: 'mmol m-3', _FillValue: [-999] } },
      { name: 'mask', dims: ['lat', 'lon'], dtype: 'i2', attrs: { flag_values: [0, 1], flag_meanings: 'land sea' } },
    ],
  });
  await w.write('depth', new Float64Array([5, 50]));
  await w.write('lat', new Float32Array([-10, 0, 10]));
  await w.write('lon', new Float32Array([0, 90, 180, 270]));
  for (let k = 0; k < 2; k++) {
    const level = new Float32Array(12).map((_, i) => k * 100 + i + 0.5);
    level[3] = -999;
    await w.write('po4', level, [k, 0, 0]);
  }
  await w.write('mask', new Int16Array([0, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 0]));
  await w.close();
}

describe('NetCDF classic (64-bit offset) writer', () => {
  it('writes a file that ncdump reads, with the header as declared (Unidata classic format)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sw-writer-'));
    const path = join(dir, 'out.nc');
    await writeSample(path);
    const cdl = execFileSync('ncdump', [path], { encoding: 'utf8' });
    expect(execFileSync('ncdump', ['-k', path], { encoding: 'utf8' }).trim()).toBe('64-bit offset');
    expect(cdl).toMatch(/float po4\(depth, lat, lon\)/);
    expect(cdl).toMatch(/po4:_FillValue = -999\.f/);
    expect(cdl).toMatch(/mask:flag_values = 0s, 1s/);
    expect(cdl).toMatch(/:Conventions = "CF-1.10"/);
    expect(readdirSync(dir)).toEqual(['out.nc']);
  });

  it('values read back by netCDF4-python equal those written, fill values masked', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sw-writer-'));
    const path = join(dir, 'out.nc');
    await writeSample(path);
    const script = join(dir, 'read.py');
    writeFileSync(
      script,
      [
        'import json, sys, netCDF4',
        'ds = netCDF4.Dataset(sys.argv[1])',
        'v = ds["po4"][:]',
        'print(json.dumps({"mask": ds["mask"][:].tolist(), "po4": [None if m else float(x) for x, m in zip(v.data.ravel(), v.mask.ravel())], "depth": ds["depth"][:].tolist()}))',
      ].join('\n'),
    );
    const got = JSON.parse(execFileSync(PY, [script, path], { encoding: 'utf8' }));
    expect(got.depth).toEqual([5, 50]);
    expect(got.mask[0]).toEqual([0, 1, 1, 1]);
    expect(got.po4[0]).toBe(0.5);
    expect(got.po4[3]).toBeNull();
    expect(got.po4[12 + 11]).toBe(111.5);
  });

  it('abort leaves nothing behind, and a folder that cannot be written gives one sentence naming the file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sw-writer-'));
    const w = await createNetcdf(join(dir, 'x.nc'), { dimensions: [{ name: 'n', size: 2 }], variables: [{ name: 'v', dims: ['n'], dtype: 'f4' }] });
    await w.abort();
    expect(readdirSync(dir)).toEqual([]);
    const missing = join(dir, 'no-such-folder', 'y.nc');
    await expect(createNetcdf(missing, { dimensions: [], variables: [] })).rejects.toThrow(/y\.nc: cannot write in folder/);
    expect(existsSync(missing)).toBe(false);
  });
});
