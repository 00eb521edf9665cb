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
  const [head, ...rows] = readFileSync(path, 'utf8').trim().split(/\r?\n/);
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
