import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { makeLineScenario, stillwater, truth } from './lines-fixture.js';

// The reference is linear in latitude and depth (tests/integration/lines-fixture.ts), so along any line
// the whole-column mean is exact: the thickness-weighted mean of c = a + b·z over [top, bottom] is
// a + b·(top + bottom)/2 (mean of a linear function = its value at the midpoint), and bilinear
// interpolation is exact for a field linear in latitude.

let dir = '';
beforeAll(() => {
  dir = makeLineScenario();
});

function csv(path: string): Record<string, string>[] {
  const [head, ...rows] = readFileSync(path, 'utf8').trim().split(/\r?\n/).filter((l) => !l.startsWith('# '));
  const names = head.split(',');
  return rows.map((r) => Object.fromEntries(r.split(',').map((v, i) => [names[i], v])));
}

describe('stillwater line', () => {
  it('a meridian section: column means equal the analytic mean, the run is 0.5 above, the seafloor is at 1000 m', () => {
    const out = join(dir, 'meridian');
    const r = stillwater(['line', '--recipe', join(dir, 'recipe.json'), '--var', 'PO4', '--meridian', '-30', '--lat-range', '-60,60', '--spacing-km', '500', '--out', out]);
    expect(r.stderr).not.toMatch(/internal fault/);
    expect(r.code).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['column-means.csv', 'column-means.json', 'section.csv', 'section.json']);
    const rows = csv(join(out, 'column-means.csv'));
    expect(rows.length).toBeGreaterThan(20);
    for (const row of rows) {
      const lat = Number(row.lat);
      expect(Number(row.climatology)).toBeCloseTo(truth(lat, 500), 5);
      expect(Number(row['plus-half'])).toBeCloseTo(truth(lat, 500) + 0.5, 5);
      expect(Number(row['plus-half minus reference'])).toBeCloseTo(0.5, 5);
      expect(Number(row.seafloor_m)).toBe(1000);
      expect(Number(row.wet_thickness_m)).toBe(1000);
    }
    // every level at every sample: the reference value at the level centre
    const sec = JSON.parse(readFileSync(join(out, 'section.json'), 'utf8'));
    expect(sec.fields.map((f: { role: string }) => f.role)).toEqual(['reference', 'run', 'difference']);
    expect(sec.depth_m).toEqual([50, 200, 450, 800]);
    expect(sec.fields[0].values[2][0]).toBeCloseTo(truth(-60, 450), 5);
    expect(sec.distance_km[sec.distance_km.length - 1]).toBeCloseTo((120 * Math.PI * 6371008.8) / 180 / 1000, 3);
  });

  it('a depth range for the column means: the mean over 100..600 m is the value at 350 m', () => {
    const out = join(dir, 'range');
    const r = stillwater(['line', '--recipe', join(dir, 'recipe.json'), '--var', 'PO4', '--path', '-40,-30;-20,30', '--depth-range', '100,600', '--out', out, '--json']);
    expect(r.code).toBe(0);
    const summary = JSON.parse(r.stdout);
    expect(summary.depth_range_m).toEqual([100, 600]);
    expect(summary.skill[0].bias).toBeCloseTo(0.5, 5);
    expect(summary.skill[0].crmse).toBeCloseTo(0, 5);
    for (const row of csv(join(out, 'column-means.csv'))) {
      expect(Number(row.climatology)).toBeCloseTo(truth(Number(row.lat), 350), 4);
      expect(Number(row.wet_thickness_m)).toBe(500);
    }
  });

  it('a transect over land: the seafloor outline is 0 there, and those samples have no values', () => {
    const out = join(dir, 'land');
    const r = stillwater(['line', '--recipe', join(dir, 'recipe.json'), '--var', 'PO4', '--path', '-30,0;30,0', '--spacing-km', '100', '--out', out]);
    expect(r.code).toBe(0);
    const rows = csv(join(out, 'column-means.csv'));
    const mid = rows.find((row) => Math.abs(Number(row.lon)) < 0.5)!;
    expect(Number(mid.seafloor_m)).toBe(0);
    expect(mid.climatology).toBe('');
    expect(Number(rows[0].seafloor_m)).toBe(1000);
  });

  it('a transect across the antimeridian is sampled on both sides of it', () => {
    const out = join(dir, 'dateline');
    const r = stillwater(['line', '--recipe', join(dir, 'recipe.json'), '--var', 'PO4', '--path', '170,-10;-170,10', '--spacing-km', '200', '--out', out]);
    expect(r.code).toBe(0);
    const rows = csv(join(out, 'column-means.csv'));
    expect(rows.some((row) => Number(row.lon) > 170) && rows.some((row) => Number(row.lon) < -170)).toBe(true);
    for (const row of rows) expect(Number(row.climatology)).toBeCloseTo(truth(Number(row.lat), 500), 4);
  });

  it('a transect over the pole', () => {
    const out = join(dir, 'pole');
    const r = stillwater(['line', '--recipe', join(dir, 'recipe.json'), '--var', 'PO4', '--path', '0,70;180,75', '--spacing-km', '100', '--out', out]);
    expect(r.code).toBe(0);
    const rows = csv(join(out, 'column-means.csv'));
    expect(Math.max(...rows.map((row) => Number(row.lat)))).toBeGreaterThan(89);
    // beyond the last latitude centre (85°N) the nearest row holds: the value at 85°N
    for (const row of rows) expect(Number(row.climatology)).toBeCloseTo(truth(Math.min(85, Number(row.lat)), 500), 4);
  });
});

describe('stillwater line: compared column means over a seamount', () => {
  // tests/fixtures/lines/make_seamount.py (netCDF4-python files, numpy means): along 15°E the run's seamount
  // is dry below 300 m at 5°S where the reference is wet to 1000 m, and at 15°N the run has water below
  // 600 m that the reference lacks. By hand at 5°S: both wet in 0-100 and 100-300 m, the reference
  // 1 - 0.05 + 0.002·z gives (100·1.05 + 200·1.35)/300 = 1.25 (over its own cells it would be 1.95).
  const fixtures = join(__dirname, '..', 'fixtures', 'lines');
  const expected = JSON.parse(readFileSync(join(fixtures, 'expected_seamount.json'), 'utf8')) as {
    rows: { lat: number; reference: number; run: number; difference: number; thickness_m: number; reference_own_cells: number; run_own_cells: number }[];
  };

  it('the reference, the run and their difference use only the cells where both have values (numpy reference)', () => {
    const out = join(dir, 'seamount');
    // one sample at each cell centre on 15°E: 10° of arc on the sphere of radius 6 371 008.8 m (Moritz 2000)
    const spacing = (10 * Math.PI * 6371008.8) / 180 / 1000;
    const r = stillwater(['line', '--recipe', join(fixtures, 'seamount_recipe.json'), '--var', 'PO4', '--meridian', '15', '--lat-range', '-25,25', '--spacing-km', String(spacing), '--out', out]);
    expect(r.code, r.stderr).toBe(0);
    const rows = csv(join(out, 'column-means.csv'));
    expect(rows.map((row) => Math.round(Number(row.lat)))).toEqual(expected.rows.map((e) => e.lat));
    rows.forEach((row, i) => {
      const e = expected.rows[i];
      expect(Number(row.reference), `lat ${e.lat}`).toBeCloseTo(e.reference, 5);
      expect(Number(row.run), `lat ${e.lat}`).toBeCloseTo(e.run, 5);
      expect(Number(row['run minus reference']), `lat ${e.lat}`).toBeCloseTo(e.difference, 5);
      expect(Number(row.wet_thickness_m), `lat ${e.lat}`).toBeCloseTo(e.thickness_m, 6);
    });
    // the fixture has columns where each source's own wet cells give another mean: the check can fail
    expect(expected.rows.filter((e) => Math.abs(e.reference_own_cells - e.reference) > 0.1).map((e) => e.lat)).toEqual([-5, 5]);
    expect(expected.rows.filter((e) => Math.abs(e.run_own_cells - e.run) > 0.1).map((e) => e.lat)).toEqual([15]);
    // the outputs say which cells the means use
    expect(readFileSync(join(out, 'column-means.csv'), 'utf8').split('\r\n')[0]).toMatch(/^# column means use only the cells where the reference and every run have values/);
    const json = JSON.parse(readFileSync(join(out, 'column-means.json'), 'utf8'));
    expect(json.cells).toMatch(/^Column means use only the cells where the reference and every run have values/);
    expect(json.fields[0].values[2]).toBeCloseTo(1.25, 5);
  });
});

describe('stillwater line --zonal-mean', () => {
  it('the zonal mean of a field that does not vary along longitude is the field itself, land left out', () => {
    const out = join(dir, 'zonal');
    const r = stillwater(['line', '--recipe', join(dir, 'recipe.json'), '--var', 'PO4', '--zonal-mean', 'global', '--out', out, '--json']);
    expect(r.stderr).not.toMatch(/internal fault/);
    expect(r.code).toBe(0);
    const rows = csv(join(out, 'zonal.csv'));
    expect(rows).toHaveLength(18 * 4);
    for (const row of rows) {
      expect(Number(row.climatology)).toBeCloseTo(truth(Number(row.lat), Number(row.depth_m)), 5);
      expect(Number(row['plus-half minus reference'])).toBeCloseTo(0.5, 5);
    }
  });
  it('an unknown basin', () => {
    const r = stillwater(['line', '--recipe', join(dir, 'recipe.json'), '--var', 'PO4', '--zonal-mean', 'mediterranean', '--out', join(dir, 'zonal-bad')]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--zonal-mean mediterranean: no basin or recipe region has that name/);
  });
});

describe('stillwater line refuses bad input with one sentence and exit 2, writing nothing', () => {
  const cases: [string, string[], RegExp][] = [
    ['a path with one point', ['--path', '10,0'], /a line needs at least two waypoints, got 1\./],
    ['a waypoint out of range', ['--path', '10,0;20,95'], /--path waypoint 2: latitude 95 lies outside -90\.\.90/],
    ['a depth range outside the grid', ['--path', '10,0;20,0', '--depth-range', '2000,3000'], /--depth-range 2000\.\.3000 m lies outside the grid, whose layers span 0\.\.1000 m\./],
    ['an unknown variable', ['--var', 'O2', '--path', '10,0;20,0'], /--var O2: the recipe's reference has no variable 'O2'/],
  ];
  for (const [name, extra, message] of cases) {
    it(name, () => {
      const out = join(dir, `bad-${name.replace(/\W+/g, '-')}`);
      const args = ['line', '--recipe', join(dir, 'recipe.json'), ...(extra.includes('--var') ? [] : ['--var', 'PO4']), ...extra, '--out', out];
      const r = stillwater(args);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(existsSync(out)).toBe(false);
    });
  }
});
