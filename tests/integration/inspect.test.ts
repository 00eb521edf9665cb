import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import { beforeAll, describe, expect, it } from 'vitest';

// `stillwater inspect` end to end: a real process (the CLI bundled from main/cli.ts), real files written by netCDF4-python
// (tests/fixtures/cf/make_fixtures.py), expected values from netCDF4-python's own decoding.
const root = join(__dirname, '../..');
const fixtures = join(root, 'tests/fixtures/cf');
const expected = JSON.parse(readFileSync(join(fixtures, 'expected.json'), 'utf8')) as {
  fields: { file: string; variable: string; times: string[]; points: { lat: number; lon: number; value: number | null; depth?: number }[] }[];
};

// The command line bundled as main/build.mjs does, but into a private file: other test files rebuild
// dist/ while these run, and a half-written bundle must not be what a test spawns.
const cli = join(root, 'node_modules', '.cache', 'stillwater-inspect-test', 'cli.mjs');

function inspect(...args: string[]) {
  const r = spawnSync(process.execPath, [cli, 'inspect', ...args], { cwd: root, encoding: 'utf8', timeout: 60_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

beforeAll(async () => {
  await build({
    entryPoints: [join(root, 'main/cli.ts')],
    outfile: cli,
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'esm',
    packages: 'external',
    logLevel: 'error',
    banner: { js: "import { createRequire as __swRequire } from 'node:module'; const require = __swRequire(import.meta.url);" },
  });
});

describe('stillwater inspect --json --stats on netCDF4-python files', () => {
  for (const file of ['packed_nc4.nc', 'curvilinear.nc', 'wrapped_cdf2.nc']) {
    it(`${file}: stats, time axis and grid agree with netCDF4-python`, () => {
      const r = inspect(join(fixtures, file), '--json', '--stats');
      expect(r.stderr).toBe('');
      expect(r.code).toBe(0);
      const j = JSON.parse(r.stdout);
      expect(Object.keys(j)).toEqual(expect.arrayContaining(['file', 'format', 'dimensions', 'grid', 'time', 'variables']));
      for (const e of expected.fields.filter((f) => f.file === file)) {
        const v = j.variables.find((x: { name: string }) => x.name === e.variable);
        const valid = e.points.map((p) => p.value).filter((x): x is number => x !== null);
        expect(v.stats.count).toBe(valid.length);
        expect(v.stats.total).toBe(e.points.length);
        // values keep the precision netCDF4-python decodes them in (float64 data stay float64): exactly equal
        expect(v.stats.min).toBe(Math.min(...valid));
        expect(v.stats.max).toBe(Math.max(...valid));
        const mean = valid.reduce((a, b) => a + b, 0) / valid.length;
        expect(Math.abs(v.stats.mean / mean - 1)).toBeLessThan(1e-6);
        if (e.times.length) {
          expect(j.time.first).toBe(e.times[0]);
          expect(j.time.last).toBe(e.times[e.times.length - 1]);
          expect(j.time.count).toBe(e.times.length);
        }
        const lats = e.points.map((p) => p.lat);
        expect(j.grid.lat[0]).toBeCloseTo(Math.min(...lats), 9);
        expect(j.grid.lat[1]).toBeCloseTo(Math.max(...lats), 9);
        const depths = e.points.map((p) => p.depth).filter((d): d is number => d !== undefined);
        if (depths.length) expect(j.grid.depth).toEqual([Math.min(...depths), Math.max(...depths)]);
      }
    });
  }

  it('lists variables inside NetCDF-4 groups by path, with their groups (netCDF4-python file, tests/fixtures/groups)', () => {
    const file = join(root, 'tests/fixtures/groups/groups_nc4.nc');
    const r = inspect(file, '--json');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.groups).toEqual(['/', '/bgc', '/phys', '/bgc/deep']);
    expect(j.notes).toEqual([]);
    const names = (j.variables as { name: string }[]).map((v) => v.name);
    expect(names).toEqual(expect.arrayContaining(['sst', '/bgc/chl', '/bgc/deep/o2', '/bgc/deep/no3', '/phys/temp']));
    // make_groups.py: chl is on /bgc's own depth(2), which shadows the root's depth(3)
    expect(j.variables.find((v: { name: string }) => v.name === '/bgc/chl')).toMatchObject({ dims: ['/bgc/depth', 'lat', 'lon'], shape: [2, 4, 6], units: 'mg m-3' });
    const text = inspect(join(root, 'tests/fixtures/groups/deep_nc4.nc')).stdout;
    expect(text).toMatch(/\nNotes\n {2}groups nested deeper than 16 levels .* are not read: \/g1\/g2\/.*\/g17\./);
  });

  it('lists each variable with dims, shape, units, standard_name and long_name', () => {
    const j = JSON.parse(inspect(join(fixtures, 'packed_nc4.nc'), '--json').stdout);
    const temp = j.variables.find((v: { name: string }) => v.name === 'temp');
    expect(temp).toMatchObject({
      dims: ['time', 'depth', 'lat', 'lon'],
      shape: [2, 3, 4, 6],
      units: 'degC',
      standard_name: 'sea_water_potential_temperature',
      long_name: 'potential temperature',
      stats: null,
    });
    expect(j.format).toBe('netcdf4-hdf5');
    expect(j.grid).toMatchObject({ kind: 'rectilinear', nx: 6, ny: 4, nz: 3 });
    expect(j.time).toMatchObject({ calendar: 'noleap', units: 'days since 0001-01-01 00:00:00', count: 2 });
    expect(j.dimensions).toContainEqual({ name: 'time', size: 2, unlimited: true });
  });

  it('the text report names grid, time and variables', () => {
    const r = inspect(join(fixtures, 'curvilinear.nc'), '--stats');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Grid: curvilinear, 8 × 5 cells');
    expect(r.stdout).toContain('calendar 360_day');
    expect(r.stdout).toMatch(/po4 .*mmol m-3 .*phosphate/);
    expect(r.stdout).toMatch(/valid 78 of 80/);
  });
});

describe('bad input: one clear sentence naming the file (and variable), exit 2', () => {
  const dir = mkdtempSync(join(tmpdir(), 'sw-inspect-'));
  const classic = readFileSync(join(fixtures, 'wrapped_cdf2.nc'));
  const nc4 = readFileSync(join(fixtures, 'packed_nc4.nc'));
  const files: Record<string, Buffer> = {
    'empty.nc': Buffer.alloc(0),
    'truncated-header.nc': classic.subarray(0, 200),
    'truncated-data.nc': classic.subarray(0, classic.length - 300),
    'truncated-hdf5.nc': nc4.subarray(0, 600),
    'random.nc': Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 2654435761) % 251)),
  };
  for (const [name, bytes] of Object.entries(files)) writeFileSync(join(dir, name), bytes);

  const cases: [string, string, RegExp, string?][] = [
    ['empty file', join(dir, 'empty.nc'), /the file is empty/],
    ['truncated header', join(dir, 'truncated-header.nc'), /truncated|damaged/],
    ['truncated data', join(dir, 'truncated-data.nc'), /truncated|damaged|shorter/],
    ['truncated HDF5', join(dir, 'truncated-hdf5.nc'), /truncated|damaged/],
    ['random bytes', join(dir, 'random.nc'), /not a NetCDF, HDF5 or GeoTIFF file/],
    ['HDF5 that is not NetCDF', join(fixtures, 'bad_plain.h5'), /not a NetCDF-4 file|NetCDF/],
    ['variable without coordinates', join(fixtures, 'bad_no_coords.nc'), /has no longitude and latitude coordinates/, 'field'],
    ['non-monotonic coordinates', join(fixtures, 'bad_nonmonotonic.nc'), /latitude 'lat' is not monotonic/, 'sal'],
    ['unknown units', join(fixtures, 'bad_units.nc'), /unknown units 'furlongs per fortnight'/, 'si'],
    ['missing path', join(dir, 'does-not-exist.nc'), /no such file/],
  ];
  for (const [what, path, message, variable] of cases) {
    it(what, () => {
      const before = statSync(path, { throwIfNoEntry: false });
      const r = inspect(path, '--stats');
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      const lines = r.stderr.trim().split('\n');
      expect(lines).toHaveLength(1);
      expect(lines[0]).toContain(path);
      if (variable) expect(lines[0]).toContain(`variable '${variable}'`);
      expect(lines[0]).toMatch(message);
      expect(lines[0]).not.toMatch(/internal fault|\bat .*\.(ts|js|mjs):\d+/);
      // inputs are never modified
      if (before) expect(statSync(path).mtimeMs).toBe(before.mtimeMs);
    });
  }
  it('a wrong option is bad input too', () => {
    const r = inspect(join(fixtures, 'packed_nc4.nc'), '--colour');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--colour/);
  });
});
