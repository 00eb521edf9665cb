/**
 * Monthly and seasonal comparison end to end through the command line: a period on every row, seasonal-cycle
 * rows, merge carrying both, and the bad-input sentences (exit 2, nothing written). The monthly values
 * themselves are held against xarray in tests/unit/time/time.test.ts; here the checks are properties that a
 * wrong pipeline would break: a source compared with itself has no bias in any period, a cycle ratio of 1,
 * no phase difference and cells whose cycles correlate perfectly; a run against the reference has the
 * seasonal-cycle numbers that xarray and numpy give (tests/fixtures/time/make_cycle_numbers.py).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ALL_PERIODS } from '../../app/time/periods.js';

const root = join(__dirname, '../..');
const fx = join(__dirname, '../fixtures/time');

function stillwater(args: string[]) {
  return spawnSync(process.execPath, [join(root, 'main', 'launch.mjs'), ...args], { encoding: 'utf8' });
}

function recipe(dir: string, name: string, body: Record<string, unknown>): string {
  const path = join(dir, name);
  writeFileSync(path, JSON.stringify(body));
  return path;
}

const monthlyRecipe = (runs: { label: string; file: string; time?: unknown }[], periods: string[]) => ({
  reference: { label: 'Ref', variables: { X: { file: join(fx, 'monthly_noleap.nc'), name: 'tracer', time: 'monthly' } } },
  runs: runs.map((r) => ({ label: r.label, variables: { X: { file: r.file, name: 'tracer', ...(r.time ? { time: r.time } : {}) } } })),
  regions: ['global'],
  layers: ['all', [0, 20]],
  options: { periods },
});

describe('stillwater compare with options.periods', () => {
  const dir = mkdtempSync(join(tmpdir(), 'sw-time-'));
  const cache = join(dir, 'cache');

  it('rows per period, seasonal-cycle rows, and a source against itself agrees in every period', () => {
    const path = recipe(dir, 'self.json', monthlyRecipe([{ label: 'Self', file: join(fx, 'monthly_noleap.nc') }, { label: 'Std', file: join(fx, 'monthly_standard.nc') }], ['months', 'seasons']));
    const out = join(dir, 'self');
    const r = stillwater(['compare', '--recipe', path, '--out', out, '--cache', cache]);
    expect(r.stderr).not.toMatch(/Error/);
    expect(r.status).toBe(0);
    const doc = JSON.parse(readFileSync(join(out, 'skill.json'), 'utf8'));
    const self = doc.rows.filter((x: { run: string }) => x.run === 'Self');
    // 2 layers × (annual + 12 months + 4 seasons)
    expect(self.length).toBe(2 * 17);
    expect(self.slice(0, 17).map((x: { period: string }) => x.period)).toEqual([...ALL_PERIODS]);
    for (const row of self) {
      expect(row.bias).toBeCloseTo(0, 6);
      expect(row.corr).toBeCloseTo(1, 6);
    }
    // the fixture's months follow a cosine of amplitude 2 peaking in April: the monthly means span about 4
    const monthMeans = self.slice(1, 13).map((x: { ref_mean: number }) => x.ref_mean);
    expect(Math.max(...monthMeans) - Math.min(...monthMeans)).toBeGreaterThan(3);
    expect(monthMeans.indexOf(Math.max(...monthMeans))).toBe(3);
    const cycles = doc.cycles.filter((c: { run: string }) => c.run === 'Self');
    expect(cycles.length).toBe(2);
    for (const c of cycles) {
      expect(c.range_ratio).toBeCloseTo(1, 6);
      expect(c.max_phase_months).toBe(0);
      expect(c.harmonic_phase_months).toBeCloseTo(0, 6);
      expect(c.cell_corr_mean).toBeCloseTo(1, 6);
      expect(c.cell_corr_cells).toBeGreaterThan(0);
    }
    // the standard-calendar run against the noleap reference: every number as xarray's monthly grouping and
    // numpy (range, FFT phase, corrcoef) give it (tests/fixtures/time/make_cycle_numbers.py)
    const want = JSON.parse(readFileSync(join(fx, 'cycle_expected.json'), 'utf8')) as Record<string, Record<string, number>>;
    const std = doc.cycles.filter((c: { run: string }) => c.run === 'Std');
    expect(std.length).toBe(2);
    std.forEach((c: Record<string, number>, i: number) => {
      const w = want[i === 0 ? 'all' : '0-20 m'];
      for (const key of ['model_range', 'ref_range', 'range_ratio', 'cell_corr_mean']) expect(Math.abs(c[key] / w[key] - 1), key).toBeLessThan(1e-5);
      expect(c.max_phase_months).toBe(w.max_phase_months);
      expect(Math.abs(c.harmonic_phase_months - w.harmonic_phase_months)).toBeLessThan(1e-4);
    });
    const csv = readFileSync(join(out, 'skill.csv'), 'utf8').split('\r\n');
    expect(csv[0].split(',')).toContain('period');
    expect(readFileSync(join(out, 'seasonal-cycle.csv'), 'utf8').split('\r\n')[0]).toMatch(/^run,variable,region,layer,units,model_range,ref_range,range_ratio/);
    expect(readFileSync(join(out, 'skill.md'), 'utf8')).toMatch(/\| run \| region \| layer \| period \|/);
    const tex = readFileSync(join(out, 'skill.tex'), 'utf8');
    expect(tex).toMatch(/Run & Region & Layer & Period &/);
    expect(tex).toMatch(/Std & global & [^&]+ & JAN &/);
    expect(r.stdout).toMatch(/period/);

    // merge carries the periods and the cycle rows; one job per run gives the rows of one job over both
    for (const [name, label, file] of [['a', 'Self', 'monthly_noleap.nc'], ['b', 'Std', 'monthly_standard.nc']] as const) {
      const p = recipe(dir, `${name}.json`, monthlyRecipe([{ label, file: join(fx, file) }], ['months', 'seasons']));
      expect(stillwater(['compare', '--recipe', p, '--out', join(dir, name), '--cache', cache]).status).toBe(0);
    }
    const m = stillwater(['merge', '--out', join(dir, 'merged'), join(dir, 'a', 'skill.json'), join(dir, 'b', 'skill.json')]);
    expect(m.status).toBe(0);
    const merged = JSON.parse(readFileSync(join(dir, 'merged', 'skill.json'), 'utf8'));
    expect(merged.rows.length).toBe(doc.rows.length);
    expect(merged.rows.map((x: { period: string }) => x.period)).toEqual(doc.rows.map((x: { period: string }) => x.period));
    expect(merged.cycles.length).toBe(doc.cycles.length);
  });

  it('--fields keeps every period asked: the run per month and season on the common grid and minus the reference, as xarray groups them', () => {
    const path = recipe(dir, 'fields.json', monthlyRecipe([{ label: 'Std', file: join(fx, 'monthly_standard.nc'), time: 'monthly' }], ['months', 'seasons']));
    const out = join(dir, 'fields');
    const r = stillwater(['compare', '--recipe', path, '--out', out, '--cache', cache, '--fields']);
    expect(r.status, r.stderr).toBe(0);
    // netCDF4-python reads the kept file back (masked values as null)
    const read = spawnSync('/usr/bin/python3', ['-c', `
import json, sys
import numpy as np
from netCDF4 import Dataset, chartostring
d = Dataset(sys.argv[1])
names = [str(x) for x in chartostring(d['period_name'][:])]
def plain(a):
    a = np.ma.masked_invalid(np.ma.asarray(a, dtype='f8'))
    return [None if m else float(v) for v, m in zip(a.ravel().data, np.ma.getmaskarray(a).ravel())]
print(json.dumps({'names': names, 'dims': list(d['X'].dimensions), 'x': [plain(d['X'][p]) for p in range(len(names))],
  'diff': [plain(d['X_minus_reference'][p]) for p in range(len(names))]}))
`, join(out, 'fields_Std_X.nc')], { encoding: 'utf8' });
    expect(read.status, read.stderr).toBe(0);
    const got = JSON.parse(read.stdout) as { names: string[]; dims: string[]; x: (number | null)[][]; diff: (number | null)[][] };
    expect(got.names).toEqual(['annual', ...ALL_PERIODS.filter((p) => p !== 'annual')]);
    expect(got.dims).toEqual(['period', 'depth', 'lat', 'lon']);
    // tests/fixtures/time/make_time_fixtures.py: xarray's groupby('time.month' / 'time.season') with day-count weights
    const xa = (file: string) => (JSON.parse(readFileSync(join(fx, 'expected.json'), 'utf8')) as { xarray: Record<string, { months: (number | null)[][]; seasons: Record<string, (number | null)[]> }> }).xarray[file];
    const run = xa('monthly_standard.nc');
    const ref = xa('monthly_noleap.nc');
    const want = (e: { months: (number | null)[][]; seasons: Record<string, (number | null)[]> }, name: string) => (name.length === 3 && name in e.seasons ? e.seasons[name] : e.months[ALL_PERIODS.indexOf(name as never) - 1]);
    // the one cell missing at one step (depth 1, lat 2, lon 3): our seasons weigh a month by its full length
    // where xarray's weigh the valid steps (tests/unit/time/time.test.ts says the same), so it is left out there
    const partial = 1 * 12 + 2 * 4 + 3;
    got.names.forEach((name, p) => {
      if (name === 'annual') return;
      const w = want(run, name);
      const wr = want(ref, name);
      got.x[p].forEach((v, c) => {
        if (c === partial && name in run.seasons) return;
        if (w[c] === null) expect(v, `${name} cell ${c}`).toBeNull();
        else expect(Math.abs(v! - w[c]!), `${name} cell ${c}`).toBeLessThan(1e-5 * Math.abs(w[c]!));
        if (w[c] !== null && wr[c] !== null) expect(Math.abs(got.diff[p][c]! - (w[c]! - wr[c]!)), `${name} difference cell ${c}`).toBeLessThan(1e-4);
      });
    });
  });

  it('seasons alone: annual and season rows only', () => {
    const path = recipe(dir, 'seasons.json', monthlyRecipe([{ label: 'Std', file: join(fx, 'monthly_standard.nc') }], ['seasons']));
    const out = join(dir, 'seasons');
    expect(stillwater(['compare', '--recipe', path, '--out', out, '--cache', cache]).status).toBe(0);
    const doc = JSON.parse(readFileSync(join(out, 'skill.json'), 'utf8'));
    expect([...new Set(doc.rows.map((x: { period: string }) => x.period))]).toEqual(['annual', 'DJF', 'MAM', 'JJA', 'SON']);
  });

  const refuses = (name: string, body: Record<string, unknown>, sentence: RegExp) => {
    const path = recipe(dir, `${name}.json`, body);
    const out = join(dir, name);
    const r = stillwater(['compare', '--recipe', path, '--out', out, '--cache', cache]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n').length).toBe(1);
    expect(r.stderr).toMatch(sentence);
    expect(existsSync(join(out, 'skill.json'))).toBe(false);
  };

  it('bad input: exit 2, one sentence naming the file and variable, nothing written', () => {
    refuses(
      'twelve',
      { reference: { label: 'R', variables: { SST: { file: join(fx, 'twelve_plain.nc'), name: 'sst' } } }, runs: [{ label: 'A', variables: { SST: { file: join(fx, 'clim_noleap.nc'), name: 'sst' } } }], regions: ['global'] },
      /reference\.variables\.SST\.time: 'sst' in .*twelve_plain\.nc has 12 time steps without CF climatology bounds/,
    );
    refuses(
      'window',
      monthlyRecipe([{ label: 'A', file: join(fx, 'monthly_standard.nc'), time: { from: '1950-01-01', to: '1959-12-31' } }], []),
      /runs\[0\]\.variables\.X\.time: 'tracer' in .*monthly_standard\.nc has no time step inside the window 1950-01-01 to 1959-12-31: its time axis runs from 1999-01-16/,
    );
    refuses(
      'calendar',
      { reference: { label: 'R', variables: { SST: { file: join(fx, 'bad_calendar.nc'), name: 'sst' } } }, runs: [{ label: 'A', variables: { SST: { file: join(fx, 'clim_noleap.nc'), name: 'sst' } } }], regions: ['global'] },
      /bad_calendar\.nc, variable 'sst': its time coordinate 'time': unknown calendar 'lunar'/,
    );
    refuses(
      'months-without-time',
      {
        reference: { label: 'R', variables: { P: { file: join(fx, '../compare/ref.nc'), name: 'p_mean' } } },
        runs: [{ label: 'A', variables: { P: { file: join(fx, '../compare/run_same.nc'), name: 'PO4', time: { months: [12, 1, 2] } } } }],
        regions: ['global'],
      },
      /runs\[0\]\.variables\.P\.time: 'PO4' in .*run_same\.nc has no time axis, so "months" cannot apply\./,
    );
    refuses(
      'step-with-months',
      monthlyRecipe([{ label: 'A', file: join(fx, 'monthly_standard.nc'), time: 'last' }], ['months']),
      /runs\[0\]\.variables\.X\.time: 'tracer' in .*monthly_standard\.nc gives one time step \("last"\), but the recipe asks for monthly rows/,
    );
  });
});
