import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

// `stillwater regrid` end to end: a real process, inputs written by netCDF4-python
// (tests/fixtures/regrid/make_cli_files.py), the output read back and integrated by netCDF4-python
// and numpy with the exact lat-lon cell area R²·Δλ·(sin φ2 − sin φ1).
const root = join(__dirname, '../..');
const dir = mkdtempSync(join(tmpdir(), 'sw-regrid-cli-'));
const cache = join(dir, 'cache');

function regrid(...args: string[]) {
  const r = spawnSync(process.execPath, [join(root, 'main/launch.mjs'), 'regrid', '--cache-dir', cache, ...args], { cwd: root, encoding: 'utf8', timeout: 120_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

function python(code: string, ...args: string[]): string {
  const r = spawnSync('/usr/bin/python3', ['-c', code, ...args], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(r.stderr);
  return r.stdout;
}

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'main/build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(b.stderr);
  const m = spawnSync('/usr/bin/python3', [join(root, 'tests/fixtures/regrid/make_cli_files.py'), dir], { encoding: 'utf8' });
  if (m.status !== 0) throw new Error(m.stderr);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const INTEGRALS = `
import json, sys
import numpy as np
from netCDF4 import Dataset
R = 6371008.8
def vol(path, name, cov=None):
    d = Dataset(path)
    lat_b, lon_b, dep_b = d['lat_bnds'][:], d['lon_bnds'][:], d['depth_bnds'][:]
    area = R**2 * np.radians(lon_b[:, 1] - lon_b[:, 0])[None, :] * (np.sin(np.radians(lat_b[:, 1])) - np.sin(np.radians(lat_b[:, 0])))[:, None]
    h = dep_b[:, 1] - dep_b[:, 0]
    v = d[name][:].astype('f8').filled(np.nan)
    w = area[None] * h[:, None, None]
    if cov: w = w * d[cov][:].astype('f8')
    ok = np.isfinite(v)
    return float(np.sum((w * np.where(ok, v, 0)))), int(ok.sum())
src = vol(sys.argv[1], 'po4')
out = vol(sys.argv[2], 'po4', 'po4_coverage')
d = Dataset(sys.argv[2])
print(json.dumps({'source': src, 'target': out, 'conventions': d.Conventions, 'units': d['po4'].units,
  'dims': list(d['po4'].dimensions), 'lon0': float(d['lon'][0]), 'cov_max': float(d['po4_coverage'][:].max())}))
`;

describe('stillwater regrid', () => {
  it('writes a CF NetCDF file on the target grid whose volume integral equals the source one (Jones 1999)', () => {
    const out = join(dir, 'po4-5deg.nc');
    const r = regrid('--source', join(dir, 'source.nc'), '--var', 'po4', '--target', join(dir, 'target.nc'), '--out', out, '--coverage', '0', '--json');
    expect(r.stderr).not.toMatch(/fault/);
    expect(r.code).toBe(0);
    const summary = JSON.parse(r.stdout);
    // two lat-lon grids: the weights are applied as their two per-axis factors, never cached
    expect(summary).toMatchObject({ variable: 'po4', method: 'conservative', vertical: 'overlap', levels: 4, weights: { origin: 'separable' } });
    expect(existsSync(cache)).toBe(false);
    const j = JSON.parse(python(INTEGRALS, join(dir, 'source.nc'), out));
    expect(j.conventions).toBe('CF-1.10');
    expect(j.units).toBe('mmol m-3');
    expect(j.dims).toEqual(['depth', 'lat', 'lon']);
    expect(j.lon0).toBe(2.5);
    expect(j.cov_max).toBeLessThanOrEqual(1);
    // single-precision values in the file: agreement to 1e-6 relative
    expect(Math.abs(j.target[0] / j.source[0] - 1)).toBeLessThan(1e-6);
  });

  it('reuses the cached weights for a second variable on the same grids, and converts units on request', () => {
    const first = regrid('--source', join(dir, 'source.nc'), '--var', 'po4', '--target', join(dir, 'target.nc'), '--out', join(dir, 'po4-bilinear-1.nc'), '--method', 'bilinear', '--json');
    expect(JSON.parse(first.stdout).weights.origin).toBe('built');
    const out = join(dir, 'po4-umolkg.nc');
    const r = regrid('--source', join(dir, 'source.nc'), '--var', 'po4', '--target', join(dir, 'target.nc'), '--target-var', 'mask', '--out', out, '--units', 'umol kg-1', '--method', 'bilinear', '--json');
    expect(r.code).toBe(0);
    const s = JSON.parse(r.stdout);
    expect(s.weights.origin).toBe('disk');
    expect(s.units).toBe('umol kg-1');
    expect(r.stderr).toMatch(/nominal seawater density of 1025 kg m-3/);
  });

  it('bilinear and nearest write files too', () => {
    for (const method of ['bilinear', 'nearest']) {
      const r = regrid('--source', join(dir, 'source.nc'), '--var', 'po4', '--target', join(dir, 'target.nc'), '--out', join(dir, `po4-${method}.nc`), '--method', method);
      expect(r.code).toBe(0);
      expect(r.stdout).toContain(`method ${method}`);
    }
  });
});

// tests/fixtures/groups/make_groups.py (netCDF4-python): nested groups, /bgc with its own depth axis
const GROUPS = join(root, 'tests/fixtures/groups/groups_nc4.nc');

describe('stillwater regrid names variables inside NetCDF-4 groups by path', () => {
  it('regrids /bgc/deep/o2 onto the grid of /bgc/chl (the same cells): the values netCDF4-python reads, in a flat file', () => {
    const out = join(dir, 'o2-groups.nc');
    const r = regrid('--source', GROUPS, '--var', '/bgc/deep/o2', '--target', GROUPS, '--target-var', '/bgc/chl', '--out', out);
    expect(r.code, r.stderr).toBe(0);
    const j = JSON.parse(python(`
import json, sys
import numpy as np
from netCDF4 import Dataset
src = Dataset(sys.argv[1])['bgc/deep/o2'][:].astype('f8')
d = Dataset(sys.argv[2])
print(json.dumps({'groups': list(d.groups), 'dims': list(d['o2'].dimensions), 'depth': d['depth'][:].tolist(),
  'max_rel': float(np.max(np.abs(d['o2'][:].astype('f8') / src - 1)))}))
`, GROUPS, out));
    expect(j.groups).toEqual([]);
    expect(j.dims).toEqual(['depth', 'lat', 'lon']);
    // the target's depth axis is /bgc/depth = [10, 100] (make_groups.py)
    expect(j.depth).toEqual([10, 100]);
    // the same cells: the output is the source (written in float32, so to its rounding)
    expect(j.max_rel).toBeLessThan(1e-7);
  });
});

describe('stillwater regrid: bad input gets one sentence, exit 2, and nothing at --out', () => {
  const cases: [string, string[], RegExp][] = [
    ['grids that do not overlap', ['--source', 'west.nc', '--var', 'no3', '--target', 'east.nc'], /west\.nc, variable 'no3': its grid and the target grid do not overlap\./],
    ['a target without usable bounds', ['--source', 'source.nc', '--var', 'po4', '--target', 'nobounds.nc'], /nobounds\.nc.*bounds/],
    ['a source with all values missing', ['--source', 'empty.nc', '--var', 'o2', '--target', 'target.nc'], /empty\.nc, variable 'o2': every value is missing/],
    ['units with no conversion path', ['--source', 'source.nc', '--var', 'thetao', '--target', 'target.nc', '--units', 'umol kg-1'], /variable 'thetao': there is no conversion from 'degC' to 'umol kg-1'/],
    ['a NetCDF-4 group the file lacks', ['--source', GROUPS, '--var', '/bgx/chl', '--target', GROUPS], /groups_nc4\.nc, variable '\/bgx\/chl': there is no group '\/bgx' in this file \(its groups: \/bgc, \/phys, \/bgc\/deep\)\.$/],
    ['an unknown method', ['--source', 'source.nc', '--var', 'po4', '--target', 'target.nc', '--method', 'spline'], /--method must be one of conservative, bilinear, nearest/],
    ['an output that is an input', ['--source', 'source.nc', '--var', 'po4', '--target', 'target.nc', '--out', 'source.nc'], /--out .*source\.nc: is an input of this run .*; outputs never replace inputs\./],
    ['a device as the output (checked before any work)', ['--source', 'source.nc', '--var', 'po4', '--target', 'target.nc', '--out', '/dev/null'], /^stillwater regrid: --out \/dev\/null: is not a regular file \(a device or other special file\)/],
    ['a folder as the output (checked before any work)', ['--source', 'source.nc', '--var', 'po4', '--target', 'target.nc', '--out', tmpdir()], /--out .*: is a folder; give a file name\./],
    ['a place in /proc as the output', ['--source', 'source.nc', '--var', 'po4', '--target', 'target.nc', '--out', '/proc/x'], /--out \/proc\/x: lies in a system pseudo file system/],
  ];
  it.each(cases)('%s', (_name, args, message) => {
    const named = args.map((a) => (a.endsWith('.nc') && !a.startsWith('/') ? join(dir, a) : a));
    const out = join(dir, 'bad', 'out.nc');
    rmSync(join(dir, 'bad'), { recursive: true, force: true });
    spawnSync('mkdir', ['-p', join(dir, 'bad')]);
    const r = regrid(...named, ...(named.includes('--out') ? [] : ['--out', out]));
    expect(r.code).toBe(2);
    const lines = r.stderr.split('\n').filter((l) => l.startsWith('stillwater regrid:'));
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(message);
    expect(existsSync(out)).toBe(false);
    expect(readdirSync(join(dir, 'bad'))).toEqual([]);
  });
});
