/**
 * `stillwater spinup` end to end: a real process on snapshot files written by netCDF4-python
 * (tests/fixtures/spinup/make_snapshots.py, run into a temporary folder). Expected means, inventories and
 * bottom values come from numpy on exact spherical cell areas; expected fits from scipy.optimize.curve_fit.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { isAbsolute, join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import type { SpinupResult, SpinupSummary, SpinupTrack } from '../../app/spinup/types.js';
import { spinupServices } from '../../app/services/spinup.js';
import { cacheKey } from '../../app/spinup/result-cache.js';
import { spinupFromJson } from '../../app/spinup/write-output.js';
import { StillwaterError } from '../../app/errors.js';

const root = join(__dirname, '../..');
let dir: string;
let expected: {
  years: number[];
  tau: number;
  po4: { mean: number; inventory_mol: number; volume: number }[];
  o2: { mean: number; inventory_mol: number; volume: number }[];
  po4_upper: { mean: number }[];
  po4_bottom_last: number;
  scipy_fit: Record<string, Record<string, { x_inf: number; x0: number; tau: number }>>;
};

function stillwater(...args: string[]) {
  const r = spawnSync(process.execPath, [join(root, 'main/launch.mjs'), 'spinup', ...args], { cwd: dir, encoding: 'utf8', timeout: 120_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

const snapshotList = (years: number[]) => years.map((y) => ({ file: `year-${String(y).padStart(4, '0')}.nc`, year: y }));

function writeRecipe(name: string, snapshots: { file: string; year?: number }[]): string {
  const recipe = {
    reference: { label: 'Climatology', variables: { PO4: { file: 'ref.nc', name: 'po4_clim' } } },
    runs: [{ label: 'spin', variables: { PO4: { file: 'year-2000.nc', name: 'po4' } }, snapshots }],
    regions: ['global'],
    layers: [[0, 500], 'bottom'],
  };
  const path = join(dir, name);
  writeFileSync(path, JSON.stringify(recipe));
  return path;
}

function track(r: SpinupResult, tracer: string, layer = 'all', region = 'global'): SpinupTrack {
  const t = r.tracks.find((x) => x.tracer === tracer && x.layer === layer && x.region === region);
  if (!t) throw new Error(`no track ${tracer} ${region} ${layer}`);
  return t;
}

const rel = (a: number, b: number) => Math.abs(a / b - 1);

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'main/build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(b.stderr);
  dir = mkdtempSync(join(tmpdir(), 'sw-spinup-'));
  const p = spawnSync('/usr/bin/python3', [join(root, 'tests/fixtures/spinup/make_snapshots.py'), dir], { encoding: 'utf8' });
  if (p.status !== 0) throw new Error(p.stderr);
  expected = JSON.parse(readFileSync(join(dir, 'expected.json'), 'utf8'));
});

describe('stillwater spinup on a recipe', () => {
  let r: SpinupResult;
  let run: ReturnType<typeof stillwater>;
  beforeAll(() => {
    writeRecipe('recipe.json', snapshotList(expected.years));
    run = stillwater('--recipe', 'recipe.json', '--variables', 'PO4,o2', '--out', 'out');
    r = spinupFromJson(JSON.parse(readFileSync(join(dir, 'out/spinup.json'), 'utf8'))) as SpinupResult;
  });

  it('exits 0, prints the verdict table and writes spinup.json, spinup.csv and spinup-skill.csv', () => {
    expect(run.code, run.stderr).toBe(0);
    // compact: tracer x layer rows, region columns, drift marked settled (.) or drifting (*)
    expect(run.stdout).toMatch(/tracer\s+layer\s+global\n/);
    expect(run.stdout).toMatch(/\nPO4\s+all\s+[-+]?[\d.]+ [.*][~!]*\n/);
    expect(readdirSync(join(dir, 'out')).sort()).toEqual(['spinup-skill.csv', 'spinup.csv', 'spinup.json']);
    const csv = readFileSync(join(dir, 'out/spinup.csv'), 'utf8').trim().split('\n');
    expect(csv).toHaveLength(r.tracks.length + 1);
    expect(csv[0]).toContain('mean_y100');
    expect(csv[0]).toContain('inventory_y2000');
  });

  it('volume-weighted means and inventories (mol) equal numpy on exact cell areas, every snapshot', () => {
    const po4 = track(r, 'PO4');
    const o2 = track(r, 'o2');
    expect(r.years).toEqual(expected.years);
    expected.years.forEach((_, i) => {
      expect(rel(po4.mean[i], expected.po4[i].mean)).toBeLessThan(1e-9);
      expect(rel(po4.inventory[i], expected.po4[i].inventory_mol)).toBeLessThan(1e-9);
      // µmol/kg becomes mol through a nominal density of 1025 kg m-3 (common practice)
      expect(rel(o2.inventory[i], expected.o2[i].inventory_mol)).toBeLessThan(1e-9);
      expect(rel(track(r, 'PO4', '0-500 m').mean[i], expected.po4_upper[i].mean)).toBeLessThan(1e-9);
    });
    expect(rel(po4.volume, expected.po4[0].volume)).toBeLessThan(1e-12);
    expect(po4.inventoryDeviation[5]).toBeCloseTo(po4.inventory[5] - po4.inventory[0], 3);
    expect(rel(track(r, 'PO4', 'bottom').mean.at(-1)!, expected.po4_bottom_last)).toBeLessThan(1e-9);
    expect(r.notes.join(' ')).toMatch(/nominal seawater density of 1025/);
  });

  it('recovers τ of the first-order tracer within 1 % and matches scipy curve_fit on the same window', () => {
    const f = track(r, 'PO4').fit!;
    expect(rel(f.tau, expected.tau)).toBeLessThan(0.01);
    const ref = expected.scipy_fit.po4[String(f.t0)];
    expect(rel(f.tau, ref.tau)).toBeLessThan(1e-4);
    expect(rel(f.xInf, ref.x_inf)).toBeLessThan(1e-6);
    expect(f.t90).toBe(f.tau * Math.LN10);
  });

  it('flags the overshooting tracer as non-monotonic and fits after its turning point, like scipy', () => {
    const o2 = track(r, 'o2');
    expect(o2.monotonic).toBe(false);
    expect(o2.turningYears).toHaveLength(1);
    expect(o2.fit!.t0).toBeGreaterThanOrEqual(o2.turningYears[0]);
    const ref = expected.scipy_fit.o2[String(o2.fit!.t0)];
    expect(rel(o2.fit!.tau, ref.tau)).toBeLessThan(1e-3);
    expect(o2.verdict.sentence).toMatch(/not monotonic/);
    expect(track(r, 'PO4').monotonic).toBe(true);
  });

  it('says a 2000-year run has not settled in the deep ocean (England 1995), not for the upper layer', () => {
    expect(track(r, 'PO4').verdict.deepCaution).toBe(true);
    expect(track(r, 'PO4', '0-500 m').verdict.deepCaution).toBe(false);
    expect(r.summary.shortForDeep).toBe(true);
    expect(r.summary.settled).toBe(false);
    expect(r.summary.sentence).toMatch(/England 1995/);
  });

  it('scores every snapshot against the reference with the compare statistics', () => {
    const rows = r.skill.filter((s) => s.region === 'global' && s.layer === 'all');
    expect(rows.map((s) => s.year)).toEqual(expected.years);
    const po4 = track(r, 'PO4');
    rows.forEach((s, i) => {
      // same grid and mask: the compared model mean is the spin-up mean, the bias model minus reference
      expect(rel(s.model_mean!, po4.mean[i])).toBeLessThan(1e-9);
      expect(s.bias!).toBeCloseTo(s.model_mean! - s.ref_mean!, 9);
    });
    // the model approaches 2·shape from 1.4·shape, the reference is 1.9·shape: the RMSE falls, then rises
    const rmse = rows.map((s) => s.rmse!);
    const best = rmse.indexOf(Math.min(...rmse));
    expect(best).toBeGreaterThan(0);
    expect(best).toBeLessThan(rmse.length - 1);
  });

  it('prints the summary and verdicts with --json', () => {
    const j = stillwater('--recipe', 'recipe.json', '--variables', 'PO4', '--out', 'out-json', '--json', '--no-skill', '--threshold', '0.5', '--tail-years', '500');
    expect(j.code, j.stderr).toBe(0);
    const o = JSON.parse(j.stdout);
    expect(o.summary.tracks).toBe(3);
    expect(o.verdicts[0]).toMatchObject({ tracer: 'PO4', region: 'global', layer: 'all' });
    const saved: SpinupResult = spinupFromJson(JSON.parse(readFileSync(join(dir, 'out-json/spinup.json'), 'utf8'))) as SpinupResult;
    expect(saved.settings.thresholdPercentPerKyr).toBe(0.5);
    expect(saved.tracks[0].drift!.fromYear).toBe(1500);
    expect(saved.skill).toEqual([]);
    const full = stillwater('--recipe', 'recipe.json', '--variables', 'PO4', '--out', 'out-json', '--no-skill', '--full-table');
    expect(full.stdout).toMatch(/tracer\s+region\s+layer\s+verdict/);
    expect(full.stdout.trim().split('\n').filter((l) => l.startsWith('PO4 '))).toHaveLength(3);
  });
});

describe('stillwater spinup with --snapshots', () => {
  it('takes model years from a CF time axis (noleap, days since 0001-01-01) when the file is given alone', () => {
    const j = stillwater('--snapshots', 'series.nc', '--variables', 'po4', '--out', 'out-series', '--json');
    expect(j.code, j.stderr).toBe(0);
    const o = JSON.parse(j.stdout);
    expect(o.years).toEqual([100, 200, 300]);
  });

  it('replaces the recipe run’s snapshots and still scores them against the reference', () => {
    const j = stillwater('--recipe', 'recipe.json', '--snapshots', 'year-0500.nc:500,year-1000.nc:1000,year-1500.nc:1500', '--out', 'out-override');
    expect(j.code, j.stderr).toBe(0);
    const saved: SpinupResult = spinupFromJson(JSON.parse(readFileSync(join(dir, 'out-override/spinup.json'), 'utf8'))) as SpinupResult;
    expect(saved.years).toEqual([500, 1000, 1500]);
    expect([...new Set(saved.skill.map((p) => p.year))]).toEqual([500, 1000, 1500]);
  });

  it('reads file:year lists', () => {
    const j = stillwater('--snapshots', 'year-0100.nc:100,year-0200.nc:200,year-0300.nc:300', '--variables', 'po4', '--out', 'out-list', '--json');
    expect(j.code, j.stderr).toBe(0);
    expect(JSON.parse(j.stdout).years).toEqual([100, 200, 300]);
  });
});

describe('bad input: one sentence naming the file, exit 2, nothing written', () => {
  const cases: [string, () => string[], RegExp][] = [
    ['a single snapshot', () => ['--snapshots', 'year-0100.nc:100', '--variables', 'po4'], /only one is listed \(.*year-0100\.nc, model year 100\)/],
    ['snapshots out of order', () => ['--recipe', writeRecipe('swapped.json', snapshotList([100, 300, 200])), '--variables', 'PO4'], /runs\[0\]\.snapshots\[2\] \(.*year-0200\.nc\): model year 200 comes before model year 300/],
    ['a missing model year', () => ['--snapshots', 'year-0100.nc,year-0200.nc:200', '--variables', 'po4'], /year-0100\.nc\): the snapshot has no model year/],
    ['snapshots on different grids', () => ['--snapshots', 'year-0100.nc:100,other-grid.nc:200', '--variables', 'po4'], /other-grid\.nc: .*another grid than .*year-0100\.nc \(5 depth levels instead of 4\)/],
    ['a variable missing from one snapshot', () => ['--snapshots', 'year-0100.nc:100,no-o2.nc:200,year-0300.nc:300', '--variables', 'po4,o2'], /no-o2\.nc: the snapshot at model year 200 .*has no variable 'o2'/],
    ['a recipe snapshot without a year', () => ['--recipe', writeRecipe('noyear.json', [{ file: 'year-0100.nc', year: 100 }, { file: 'year-0200.nc' }]), '--variables', 'PO4'], /year-0200\.nc\): the snapshot has no model year/],
  ];
  for (const [what, args, message] of cases) {
    it(what, () => {
      const out = `bad-${what.replace(/\W+/g, '-')}`;
      const r = stillwater(...args(), '--out', out);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      const lines = r.stderr.trim().split('\n');
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(message);
      expect(existsSync(join(dir, out)) ? readdirSync(join(dir, out)) : []).toEqual([]);
    });
  }
});

describe('spin-up services for the workbench', () => {
  const ctx = () => ({
    resolvePath: (p: string) => {
      const abs = isAbsolute(p) ? p : join(dir, p);
      if (!abs.startsWith(dir)) throw new StillwaterError('E_FILE', `${abs}: outside the allowed folders.`, { file: abs });
      return abs;
    },
    roots: [dir],
    cacheDir: join(dir, 'cache'),
    progress: () => undefined,
    signal: new AbortController().signal,
  });
  const service = (name: string) => spinupServices.find((e) => e.name === name)!;
  const recipeJson = () => JSON.parse(readFileSync(join(dir, 'recipe.json'), 'utf8'));

  it('spinup.verdict gives the banner summary of the run, the same as the command line', async () => {
    const v = (await service('spinup.verdict').run({ recipe: recipeJson(), baseDir: dir }, ctx())) as SpinupSummary;
    const cli: SpinupResult = spinupFromJson(JSON.parse(readFileSync(join(dir, 'out/spinup.json'), 'utf8'))) as SpinupResult;
    expect(v.run).toBe('spin');
    expect(v.lastYear).toBe(2000);
    expect(v.shortForDeep).toBe(true);
    expect(v.sentence).toMatch(/has not settled|England 1995/);
    // PO4 and o2 were followed on the command line; the service follows the run's own variables (PO4)
    expect(v.tracks).toBe(cli.tracks.filter((t) => t.tracer === 'PO4').length);
    // kept on disk for the next worker thread that asks
    expect(readdirSync(join(dir, 'cache', 'spinup')).filter((f) => f.endsWith('.json')).length).toBeGreaterThanOrEqual(1);
  });

  it('the cache key changes when a snapshot file changes', async () => {
    const file = join(dir, 'year-0100.nc');
    const before = await cacheKey({ a: 1 }, [file]);
    expect(await cacheKey({ a: 1 }, [file])).toBe(before);
    utimesSync(file, new Date(), new Date(Date.now() + 5000));
    expect(await cacheKey({ a: 1 }, [file])).not.toBe(before);
    expect(await cacheKey({ a: 2 }, [file])).not.toBe(await cacheKey({ a: 1 }, [file]));
  });

  it('spinup.verdict is null for a run without snapshots (no banner)', async () => {
    const recipe = recipeJson();
    delete recipe.runs[0].snapshots;
    expect(await service('spinup.verdict').run({ recipe, baseDir: dir }, ctx())).toBeNull();
  });

  it('spinup.run refuses snapshot files outside the allowed folders', async () => {
    const recipe = recipeJson();
    recipe.runs[0].snapshots[0].file = '/etc/hostname';
    await expect(service('spinup.run').run({ recipe, baseDir: dir, skill: false }, ctx())).rejects.toThrow(/outside the allowed folders/);
  });

  it('spinup.open reads a spinup.json back with NaN for missing values', async () => {
    const r = (await service('spinup.open').run({ path: 'out/spinup.json' }, ctx())) as SpinupResult;
    expect(r.years).toEqual(expected.years);
    expect(r.tracks[0].mean.every((m) => typeof m === 'number')).toBe(true);
    await expect(service('spinup.open').run({ path: 'expected.json' }, ctx())).rejects.toThrow(/not a spinup\.json/);
  });

  it('spinup.json keys are snake_case like skill.json, and a file from before (camelCase) still opens', async () => {
    const raw = readFileSync(join(dir, 'out/spinup.json'), 'utf8');
    const keys = [...raw.matchAll(/"([^"\\]+)":/g)].map((m) => m[1]);
    expect(keys).toContain('threshold_percent_per_kyr');
    expect(keys.filter((k) => /[A-Z]/.test(k) && !/^[A-Z][\w]*$/.test(k))).toEqual([]);
    const current = (await service('spinup.open').run({ path: 'out/spinup.json' }, ctx())) as SpinupResult;
    writeFileSync(join(dir, 'old-style.json'), JSON.stringify(current));
    const older = (await service('spinup.open').run({ path: 'old-style.json' }, ctx())) as SpinupResult;
    expect(older.settings.thresholdPercentPerKyr).toBe(current.settings.thresholdPercentPerKyr);
    expect(older.tracks[0].fit?.yearsTo90).toBe(current.tracks[0].fit?.yearsTo90);
    expect(older.skill[0]?.model_mean).toBe(current.skill[0]?.model_mean);
  });
});
