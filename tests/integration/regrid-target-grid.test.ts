import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

// `stillwater regrid` onto a target stored the other way round (descending latitude, longitudes −180…180,
// `latitude`/`longitude` names, float32 coordinates, bounds on `bnds`, a vertical stored deepest first):
// tests/fixtures/regrid-target/make_target_grid.py (netCDF4-python). netCDF4-python reads the output back and
// differences it cell by cell against the value numpy computes from the target's own coordinates (every
// target cell lies inside one source cell, so conservative regridding gives that cell's value: Jones 1999).
const root = join(__dirname, '../..');
const fixtures = join(root, 'tests/fixtures/regrid-target');
const dir = mkdtempSync(join(tmpdir(), 'sw-regrid-target-'));

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'main/build.mjs'), '--if-stale'], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(b.stderr);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const CHECK = `
import json, sys
import numpy as np
from netCDF4 import Dataset
out, tgt = Dataset(sys.argv[1]), Dataset(sys.argv[2])
res = {'dims': list(out['po4'].dimensions), 'coverage_dims': list(out['po4_coverage'].dimensions)}
same = {}
for name in ['latitude', 'longitude', 'latitude_bnds', 'longitude_bnds', 'z', 'z_bnds']:
    a, b = out[name], tgt[name]
    same[name] = {
        'dims': list(a.dimensions) == list(b.dimensions),
        'dtype': str(a.dtype) == str(b.dtype),
        'values': bool(np.array_equal(a[:], b[:])),
        'attrs': sorted(a.ncattrs()) == sorted(b.ncattrs()) and all(
            np.array_equal(np.asarray(a.getncattr(k)), np.asarray(b.getncattr(k))) and
            np.asarray(a.getncattr(k)).dtype == np.asarray(b.getncattr(k)).dtype for k in a.ncattrs()),
    }
res['same'] = same
lat, lon, z = tgt['latitude'][:].astype('f8'), tgt['longitude'][:].astype('f8'), tgt['z'][:].astype('f8')
j = np.floor((lat + 90) / 10).astype(int)
i = np.floor((lon % 360) / 10).astype(int)
k = np.floor(z / 10).astype(int)
expected = 1000 * k[:, None, None] + 10 * j[None, :, None] + i[None, None, :]
got = out['po4'][:].astype('f8')
res['max_abs_diff'] = float(np.max(np.abs(got - expected)))
res['masked'] = int(np.ma.count_masked(got))
print(json.dumps(res))
`;

describe('stillwater regrid onto a target grid as the target stores it', () => {
  it('keeps the target\'s coordinate order, names, values, bounds, types and attributes; values differ by 0 cell by cell', () => {
    const out = join(dir, 'po4_on_target.nc');
    const r = spawnSync(
      process.execPath,
      [join(root, 'main/launch.mjs'), 'regrid', '--cache-dir', join(dir, 'cache'), '--source', join(fixtures, 'source.nc'), '--var', 'po4',
        '--target', join(fixtures, 'target.nc'), '--out', out],
      { cwd: root, encoding: 'utf8', timeout: 120_000 },
    );
    expect(r.stderr).not.toMatch(/fault|Error/);
    expect(r.status).toBe(0);
    const py = spawnSync('/usr/bin/python3', ['-c', CHECK, out, join(fixtures, 'target.nc')], { encoding: 'utf8' });
    if (py.status !== 0) throw new Error(py.stderr);
    const res = JSON.parse(py.stdout);
    expect(res.dims).toEqual(['z', 'latitude', 'longitude']);
    expect(res.coverage_dims).toEqual(['z', 'latitude', 'longitude']);
    for (const [name, s] of Object.entries(res.same)) expect({ name, ...(s as object) }).toEqual({ name, dims: true, dtype: true, values: true, attrs: true });
    expect(res.masked).toBe(0);
    expect(res.max_abs_diff).toBe(0);
  });
});
