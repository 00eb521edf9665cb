/**
 * The comparison end to end on small NetCDF files written by netCDF4-python
 * (tests/fixtures/compare/make_netcdf.py), with expected statistics from numpy (np.average, np.cov with
 * aweights); identities from Taylor (2001) and Jolliff et al. (2009); our fields read back by netCDF4-python.
 */
import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runComparison, type ComparisonResult } from '../../app/compare/run.js';
import type { SkillRow } from '../../app/compare/rows.js';
import { validateRecipe } from '../../app/recipe/validate.js';

const fx = join(__dirname, '../fixtures/compare');
const root = join(__dirname, '../..');
const expected: Record<string, Record<string, number>> = JSON.parse(readFileSync(join(fx, 'expected.json'), 'utf8'));
let cache: string;

function recipe(extra: Record<string, unknown> = {}) {
  return {
    reference: { label: 'Climatology', variables: { PO4: { file: 'ref.nc', name: 'p_mean' } } },
    runs: [
      { label: 'Same grid', variables: { PO4: { file: 'run_same.nc' } } },
      { label: 'Coarse', variables: { PO4: { file: 'run_coarse.nc' } } },
    ],
    regions: ['global', { mask: 'mask.nc', variable: 'basin', flags: ['west'] }, 'atlantic', 'pacific', 'indian', 'southern', 'arctic'],
    layers: [[0, 100], [100, 1500], 'all', 'bottom'],
    ...extra,
  };
}

function row(rows: SkillRow[], run: string, region: string, layer: string): SkillRow {
  const r = rows.find((x) => x.run === run && x.region === region && x.layer === layer);
  if (!r) throw new Error(`no row ${run} ${region} ${layer}`);
  return r;
}

function close(got: number | null, want: number, rel: number, what: string) {
  expect(got, what).not.toBeNull();
  expect(Math.abs(got! - want), `${what}: ${got} vs ${want}`).toBeLessThanOrEqual(rel * Math.max(Math.abs(want), 1e-12));
}

let result: ComparisonResult;
beforeAll(async () => {
  cache = mkdtempSync(join(tmpdir(), 'sw-cache-'));
  result = await runComparison(validateRecipe(recipe(), fx), { cacheDir: cache });
});

describe('runComparison against numpy', () => {
  it.each([
    ['global', '0-100 m'],
    ['global', '100-1500 m'],
    ['global', 'all'],
    ['global', 'bottom'],
    ['west', '0-100 m'],
    ['west', 'all'],
    ['west', 'bottom'],
  ])('%s, %s: n, weight, means, bias, RMSE, std, r and compared share equal numpy', (region, layer) => {
    const e = expected[`${region}|${layer === 'all' ? 'all' : layer}`];
    const r = row(result.rows, 'Same grid', region, layer);
    expect(r.n).toBe(e.n);
    // the model is converted to umol kg-1 in float32, so agreement is to float32 precision
    for (const k of ['weight', 'model_mean', 'ref_mean', 'bias', 'rmse', 'model_std', 'ref_std', 'corr', 'compared_fraction'] as const) {
      close(r[k] as number, e[k], k === 'weight' || k === 'compared_fraction' ? 1e-10 : 2e-6, k);
    }
    expect(r.units).toBe('umol kg-1');
  });

  it("every row with data obeys Taylor (2001) E'² = σm² + σr² − 2σmσrR and Jolliff et al. (2009) RMSE² = bias² + E'²", () => {
    let checked = 0;
    for (const r of result.rows) {
      if (r.n < 2 || r.corr === null) continue;
      const scale = r.model_std! ** 2 + r.ref_std! ** 2;
      expect(Math.abs(r.crmse! ** 2 - (scale - 2 * r.model_std! * r.ref_std! * r.corr))).toBeLessThan(1e-10 * scale);
      expect(Math.abs(r.rmse! ** 2 - (r.bias! ** 2 + r.crmse! ** 2))).toBeLessThan(1e-12 * r.rmse! ** 2);
      checked++;
    }
    expect(checked).toBeGreaterThan(40);
  });

  it('regrids the coarse run onto the reference grid and converts it with the nominal density (flagged)', () => {
    const info = result.variables[0];
    expect(info.regridded).toEqual(['Coarse']);
    expect(info.conversions.map((c) => c.source)).toEqual(['Same grid', 'Coarse']);
    expect(info.conversions[0].note).toMatch(/nominal density of 1025 kg m-3/);
    const r = row(result.rows, 'Coarse', 'global', 'all');
    expect(r.n).toBeGreaterThan(100);
    expect(r.bias).not.toBeNull();
  });

  it('rows for every run × region × layer; no NaN anywhere; the multi-tracer cost is RMSE/|ref mean| of the global full depth', () => {
    expect(result.rows.length).toBe(2 * 7 * 4);
    for (const r of result.rows) for (const v of Object.values(r)) expect(Number.isNaN(v)).toBe(false);
    const g = row(result.rows, 'Same grid', 'global', 'all');
    // layers here span the full depth 0-1500 m, so "all" is the cost's comparison
    expect(result.costs[0].cost).toBeCloseTo(g.rmse! / Math.abs(g.ref_mean!), 12);
  });

  it('every basin row together holds exactly the global cells (basins partition the grid)', () => {
    const basins = ['atlantic', 'pacific', 'indian', 'southern', 'arctic'];
    const n = basins.map((b) => row(result.rows, 'Same grid', b, 'all').n).reduce((a, b) => a + b, 0);
    expect(n).toBe(row(result.rows, 'Same grid', 'global', 'all').n);
  });

  it('bottom with a tolerance of 100 m keeps only columns whose seafloors are close (numpy)', async () => {
    const res = await runComparison(validateRecipe(recipe({ runs: [recipe().runs[0]], layers: ['bottom'], options: { bottomTolerance: 100 } }), fx), { cacheDir: cache });
    for (const region of ['global', 'west']) {
      const e = expected[`${region}|bottom|tol100`];
      const r = row(res.rows, 'Same grid', region, 'bottom');
      expect(r.n).toBe(e.n);
      close(r.bias, e.bias, 2e-6, 'bias');
      close(r.compared_fraction, e.compared_fraction, 1e-10, 'compared_fraction');
      expect(r.n).toBeLessThan(row(result.rows, 'Same grid', region, 'bottom').n);
    }
  });

  it('density from temperature and salinity: TEOS-10 conversion equals numpy with gsw.rho (python3-gsw)', async () => {
    const res = await runComparison(
      validateRecipe(
        {
          ...recipe(),
          reference: { label: 'Climatology', variables: { PO4: { file: 'ref.nc', name: 'p_mean' }, T: { file: 'ts.nc', name: 'theta' }, S: { file: 'ts.nc', name: 'salt' } } },
          runs: [recipe().runs[0]],
          regions: ['global'],
          layers: ['all'],
          options: { density: { fields: { temperature: 'T', salinity: 'S' } } },
        },
        fx,
      ),
      { cacheDir: cache },
    );
    const e = expected['global|all|teos10'];
    const r = row(res.rows.filter((x) => x.variable === 'PO4'), 'Same grid', 'global', 'all');
    expect(r.n).toBe(e.n);
    // our pressure comes from a low-order depth relation, gsw's from p_from_z: densities agree to ~1e-6
    for (const k of ['model_mean', 'bias', 'rmse', 'corr'] as const) close(r[k] as number, e[k], 2e-5, k);
    expect(res.variables.find((v) => v.variable === 'PO4')!.conversions[0].note).toMatch(/TEOS-10 density from the reference's T and S/);
    // and it differs from the nominal-density result by more than that tolerance
    expect(Math.abs(r.model_mean! - row(result.rows, 'Same grid', 'global', 'all').model_mean!)).toBeGreaterThan(1e-4);
  });

  it('a derived variable 16·PO4 + 2.9: bias and RMSE scale by 16, correlation unchanged (linear algebra)', async () => {
    const res = await runComparison(
      validateRecipe({ ...recipe(), runs: [recipe().runs[0]], regions: ['global'], layers: ['all', [0, 100]], options: { derived: { N16: { expression: '16 * PO4 + 2.9', units: 'umol kg-1' } }, logStats: ['PO4'] } }, fx),
      { cacheDir: cache },
    );
    for (const layer of ['all', '0-100 m']) {
      const p = row(res.rows.filter((x) => x.variable === 'PO4'), 'Same grid', 'global', layer);
      const d = row(res.rows.filter((x) => x.variable === 'N16'), 'Same grid', 'global', layer);
      expect(d.n).toBe(p.n);
      expect(d.bias! / p.bias!).toBeCloseTo(16, 4);
      expect(d.rmse! / p.rmse!).toBeCloseTo(16, 4);
      expect(d.corr!).toBeCloseTo(p.corr!, 6);
      expect(d.ref_mean!).toBeCloseTo(16 * p.ref_mean! + 2.9, 4);
      // log10 statistics were asked for PO4 only
      expect(p.log10_n).toBe(p.n);
      expect(d.log10_n).toBeUndefined();
    }
    expect(res.variables.map((v) => v.variable)).toEqual(['PO4', 'N16']);
    expect(res.costs[0].terms.map((t) => t.variable)).toEqual(['PO4', 'N16']);
  });

  it('a regular common grid with its own depth edges: reference and runs are all regridded onto it', async () => {
    const res = await runComparison(
      validateRecipe({ ...recipe(), regions: ['global', 'southern'], layers: ['all'], options: { commonGrid: { regular: { dlon: 20, dlat: 20 }, depthEdges: [0, 100, 1500] } } }, fx),
      { cacheDir: cache },
    );
    const info = res.variables[0];
    expect(info.grid).toEqual({ nx: 18, ny: 9, nz: 2, kind: 'rectilinear' });
    expect(info.regridded).toEqual(['Climatology', 'Same grid', 'Coarse']);
    const r = row(res.rows, 'Same grid', 'global', 'all');
    expect(r.n).toBeGreaterThan(100);
    expect(r.n).toBeLessThanOrEqual(18 * 9 * 2);
    // a sanity check only (conservation itself is the regridding's own test): the seafloor, masks and the
    // 50 % coverage rule change which volume is compared, so the means move by some per cent, not by factors
    const fine = row(result.rows, 'Same grid', 'global', 'all');
    expect(Math.abs(r.ref_mean! - fine.ref_mean!) / fine.ref_mean!).toBeLessThan(0.15);
    expect(Math.sign(r.bias!)).toBe(Math.sign(fine.bias!));
    expect(row(res.rows, 'Same grid', 'southern', 'all').n).toBeLessThan(r.n);
  });

  it('a mask variable without CF flags, or an unknown flag: one sentence naming the recipe path and the file', async () => {
    const base = { ...recipe(), runs: [recipe().runs[0]], layers: ['all'] };
    await expect(runComparison(validateRecipe({ ...base, regions: [{ mask: 'ref.nc', variable: 'p_mean' }] }, fx), { cacheDir: cache })).rejects.toThrow(
      /^regions\[0\]: .*ref\.nc, variable 'p_mean': a region mask needs the attributes flag_values and flag_meanings\.$/,
    );
    await expect(runComparison(validateRecipe({ ...base, regions: [{ mask: 'mask.nc', variable: 'basin', flags: ['north'] }] }, fx), { cacheDir: cache })).rejects.toThrow(
      /^regions\[0\]: .*mask\.nc: no flag meaning 'north' \(it has west, east\)\.$/,
    );
  });

  it('a region with no compared cells is a row with n = 0 and a note, not a crash', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sw-empty-'));
    for (const f of ['ref.nc', 'run_same.nc']) writeFileSync(join(dir, f), readFileSync(join(fx, f)));
    // a polygon smaller than a cell, away from every cell centre
    writeFileSync(join(dir, 'tiny.geojson'), JSON.stringify({ type: 'Feature', properties: { name: 'speck' }, geometry: { type: 'Polygon', coordinates: [[[1, 1], [2, 1], [2, 2], [1, 1]]] } }));
    const res = await runComparison(validateRecipe({ ...recipe(), runs: [recipe().runs[0]], regions: [{ geojson: 'tiny.geojson' }], layers: ['all'] }, dir), { cacheDir: cache });
    expect(res.rows).toHaveLength(1);
    expect(res.rows[0]).toMatchObject({ region: 'speck', n: 0, bias: null, rmse: null, corr: null });
    expect(res.rows[0].note).toMatch(/no compared cells/);
  });
});

describe('stillwater compare (command line)', () => {
  function cli(args: string[]) {
    return spawnSync(process.execPath, [join(root, 'main/launch.mjs'), 'compare', ...args], { encoding: 'utf8', env: { ...process.env, XDG_CACHE_HOME: cache } });
  }
  let dir: string;
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'sw-cli-'));
    for (const f of ['ref.nc', 'run_same.nc', 'run_coarse.nc', 'mask.nc']) writeFileSync(join(dir, f), readFileSync(join(fx, f)));
    writeFileSync(join(dir, 'recipe.json'), JSON.stringify(recipe()));
  });

  it('writes skill.json, .csv, .md, .tex and with --fields CF NetCDF that netCDF4-python reads back', () => {
    const out = join(dir, 'out');
    const p = cli(['--recipe', join(dir, 'recipe.json'), '--out', out, '--fields']);
    expect(p.stderr).not.toMatch(/internal fault/);
    expect(p.status).toBe(0);
    expect(p.stdout).toMatch(/Same grid\s+PO4\s+global\s+0-100 m/);
    expect(readdirSync(out).sort()).toEqual(['fields_Coarse_PO4.nc', 'fields_Same_grid_PO4.nc', 'skill.csv', 'skill.json', 'skill.md', 'skill.tex']);
    const json = JSON.parse(readFileSync(join(out, 'skill.json'), 'utf8'));
    expect(json.rows).toHaveLength(56);
    expect(json.provenance.inputs.map((i: { path: string }) => i.path)).toContain(join(dir, 'ref.nc'));
    expect(json.provenance.inputs[0]).toHaveProperty('size');
    expect(json.provenance.version).toBe(JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).version);
    const csv = readFileSync(join(out, 'skill.csv'), 'utf8').split('\r\n');
    expect(csv[0].startsWith('run,variable,region,layer,units,n,weight,model_mean,ref_mean,bias,rmse,crmse,corr,model_std,ref_std,std_ratio')).toBe(true);
    const tex = readFileSync(join(out, 'skill.tex'), 'utf8');
    expect(tex).toMatch(/\\toprule[\s\S]*\\midrule[\s\S]*\\bottomrule/);
    expect(tex).toMatch(/\$\\mu\$mol\\,kg\$\^\{-1\}\$/);
    expect(readFileSync(join(out, 'skill.md'), 'utf8')).toMatch(/\| Same grid \| global \| 0-100 m \|/);
    // netCDF4-python: the difference variable equals model minus reference where both exist
    const py = spawnSync('/usr/bin/python3', ['-c', `
import netCDF4, numpy as np, json
f = netCDF4.Dataset(${JSON.stringify(join(out, 'fields_Same_grid_PO4.nc'))})
r = netCDF4.Dataset(${JSON.stringify(join(dir, 'ref.nc'))})
m = f['PO4'][:].filled(np.nan); d = f['PO4_minus_reference'][:].filled(np.nan); ref = r['p_mean'][:].filled(np.nan)
ok = np.isfinite(m) & np.isfinite(ref)
print(json.dumps({"units": f['PO4'].units, "shape": list(m.shape), "maxerr": float(np.nanmax(np.abs(d[ok] - (m[ok] - ref[ok])))), "nd": int(np.isfinite(d).sum()), "nok": int(ok.sum())}))
`], { encoding: 'utf8' });
    expect(py.stderr).toBe('');
    const got = JSON.parse(py.stdout);
    expect(got.units).toBe('umol kg-1');
    expect(got.shape).toEqual([5, 18, 36]);
    expect(got.maxerr).toBeLessThan(1e-6);
    expect(got.nd).toBe(got.nok);
  });

  it('--json prints the rows, costs and written files as JSON on stdout', () => {
    const out = join(dir, 'out-json');
    const p = cli(['--recipe', join(dir, 'recipe.json'), '--out', out, '--json']);
    expect(p.status).toBe(0);
    const j = JSON.parse(p.stdout);
    expect(j.rows).toHaveLength(56);
    expect(j.costs.map((c: { run: string }) => c.run)).toEqual(['Same grid', 'Coarse']);
    expect(j.outputs).toContain(join(out, 'skill.json'));
  });

  it.each([
    ['a recipe that is not JSON', (d: string) => writeFileSync(join(d, 'r.json'), '{"runs": ['), /r\.json: the recipe is not valid JSON/],
    ['an unknown key', (d: string) => writeFileSync(join(d, 'r.json'), JSON.stringify({ ...recipe(), colour: 'blue' })), /recipe: unknown key 'colour'\./],
    ['a missing file', (d: string) => writeFileSync(join(d, 'r.json'), JSON.stringify({ ...recipe(), runs: [{ label: 'X', variables: { PO4: { file: 'gone.nc' } } }] })), /runs\[0\]\.variables\.PO4\.file: no such file '.*gone\.nc'\./],
    ['a variable the file lacks', (d: string) => writeFileSync(join(d, 'r.json'), JSON.stringify({ ...recipe(), runs: [{ label: 'X', variables: { PO4: { file: 'run_same.nc', name: 'NO3' } } }] })), /runs\[0\]\.variables\.PO4: .*run_same\.nc.*there is no variable 'NO3'/],
    ['units that cannot be converted', (d: string) => writeFileSync(join(d, 'r.json'), JSON.stringify({ ...recipe(), runs: [{ label: 'X', variables: { PO4: { file: 'run_same.nc', units: 'degC' } } }] })), /runs\[0\]\.variables\.PO4.*cannot convert 'degC' to 'umol kg-1'/],
  ])('%s: one sentence, exit 2, nothing written', (_what, make, message) => {
    make(dir);
    const out = join(dir, `bad-${Math.random().toString(36).slice(2)}`);
    const p = cli(['--recipe', join(dir, 'r.json'), '--out', out]);
    expect(p.status).toBe(2);
    expect(p.stderr).toMatch(message);
    expect(p.stderr.trim().split('\n')).toHaveLength(1);
    expect(existsSync(out) ? readdirSync(out) : []).toEqual([]);
  });

  it('outputs checked before any work: /proc/x, and a skill table that would replace the recipe, are refused in one sentence', () => {
    const p = cli(['--recipe', join(dir, 'recipe.json'), '--out', '/proc/x']);
    expect(p.status).toBe(2);
    expect(p.stderr.trim()).toMatch(/^stillwater compare: --out \/proc\/x: lies in a system pseudo file system \(\/proc or \/sys\), not a place for outputs\.$/);
    // a recipe named skill.json in the output folder: the table would replace it
    writeFileSync(join(dir, 'skill.json'), readFileSync(join(dir, 'recipe.json')));
    const q = cli(['--recipe', join(dir, 'skill.json'), '--out', dir]);
    expect(q.status).toBe(2);
    expect(q.stderr).toMatch(/skill\.json: is an input of this run/);
  });

  it('an output folder that cannot be written: one sentence, exit 2', () => {
    const blocked = join(dir, 'blocked');
    writeFileSync(blocked, 'a file, not a folder');
    const p = cli(['--recipe', join(dir, 'recipe.json'), '--out', join(blocked, 'out')]);
    expect(p.status).toBe(2);
    expect(p.stderr).toMatch(/--out .*blocked\/out: '.*blocked' is not a folder, so nothing can be written there\./);
    if (process.getuid?.() !== 0) {
      const ro = join(dir, 'readonly');
      spawnSync('mkdir', [ro]);
      chmodSync(ro, 0o500);
      const q = cli(['--recipe', join(dir, 'recipe.json'), '--out', ro]);
      expect(q.status).toBe(2);
      expect(readdirSync(ro)).toEqual([]);
    }
  });
});
