/**
 * Oxygen saturation, AOU and N* used from a recipe through `stillwater compare`, against gsw's
 * O2sol_SP_pt and numpy's weighted means (tests/fixtures/compare/make_ocean_functions.py).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';

const fx = join(__dirname, '../fixtures/compare');
const root = join(__dirname, '../..');
const expected = JSON.parse(readFileSync(join(fx, 'ocean_expected.json'), 'utf8')) as Record<string, Record<string, number>>;

const vars = { O2: 'O2', T: 'theta', S: 'salt', NO3: 'NO3', PO4: 'PO4' };
function recipe(sUnits?: string) {
  return {
    reference: { label: 'Climatology', file: join(fx, 'ocean_ref.nc'), variables: { ...vars, ...(sUnits ? { S: { name: 'salt', units: sUnits } } : {}) } },
    runs: [{ label: 'Run', file: join(fx, 'ocean_run.nc'), variables: vars }],
    regions: ['global'],
    layers: ['all'],
    options: {
      derived: {
        AOU: { expression: 'aou(O2, T, S)', units: 'umol kg-1' },
        Nstar: { expression: 'nstar(NO3, PO4)', units: 'umol kg-1' },
      },
    },
  };
}

describe('ocean functions from a recipe, end to end (stillwater compare)', () => {
  let dir: string;
  const cli = (args: string[]) => spawnSync(process.execPath, [join(root, 'main/launch.mjs'), 'compare', ...args], { encoding: 'utf8', env: { ...process.env, XDG_CACHE_HOME: dir } });
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'sw-ocean-'));
  });

  it('aou(O2, T, S) and nstar(NO3, PO4) give the means gsw and numpy give, the run\'s kelvin read as °C', () => {
    writeFileSync(join(dir, 'recipe.json'), JSON.stringify(recipe()));
    const p = cli(['--recipe', join(dir, 'recipe.json'), '--out', join(dir, 'out'), '--json']);
    expect(p.stderr).not.toMatch(/internal fault/);
    expect(p.status).toBe(0);
    const rows = JSON.parse(p.stdout).rows as Record<string, number | string>[];
    for (const variable of ['AOU', 'Nstar']) {
      const r = rows.find((x) => x.variable === variable && x.run === 'Run')!;
      expect(r.units).toBe('umol kg-1');
      // our Garcia & Gordon saturation is within 0.01 µmol/kg of gsw's everywhere (seawater.test.ts)
      for (const k of ['ref_mean', 'model_mean', 'bias', 'rmse']) expect(Math.abs((r[k] as number) - expected[variable][k]), `${variable} ${k}`).toBeLessThan(variable === 'AOU' ? 0.01 : 1e-4);
    }
  });

  it('a salinity in g/kg is refused with one sentence naming the recipe path, exit 2, nothing written', () => {
    writeFileSync(join(dir, 'recipe-sa.json'), JSON.stringify(recipe('g kg-1')));
    const out = join(dir, 'out-sa');
    const p = cli(['--recipe', join(dir, 'recipe-sa.json'), '--out', out]);
    expect(p.status).toBe(2);
    expect(p.stderr).toMatch(/options\.derived\.AOU\.expression: 'S' is in 'g kg-1', an absolute salinity; the ocean functions take practical salinity/);
    expect(existsSync(join(out, 'skill.json'))).toBe(false);
  });
});
