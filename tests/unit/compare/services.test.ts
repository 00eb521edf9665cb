/** The workbench's recipe and comparison services: thin over app/, and no file outside the allowed folders. */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { StillwaterError } from '../../../app/errors.js';
import { findService } from '../../../app/service.js';
import type { ServiceContext } from '../../../app/services/types.js';

const fx = resolve(__dirname, '../../fixtures/compare');

function ctx(roots: string[]): ServiceContext {
  return {
    roots,
    cacheDir: mkdtempSync(join(tmpdir(), 'sw-svc-cache-')),
    signal: new AbortController().signal,
    progress: () => undefined,
    resolvePath(p: string) {
      const abs = resolve(p);
      if (!roots.some((r) => abs === r || abs.startsWith(r + '/'))) throw new StillwaterError('E_FILE', `${abs}: outside the allowed folders.`, { file: abs });
      return abs;
    },
  };
}

const recipe = {
  reference: { label: 'Clim', variables: { PO4: { file: 'ref.nc', name: 'p_mean' } } },
  runs: [{ label: 'A', variables: { PO4: { file: 'run_same.nc' } } }],
  regions: ['global'],
  layers: ['all'],
};

async function call(name: string, input: unknown, c: ServiceContext) {
  const s = findService(name);
  if (!s) throw new Error(`no service ${name}`);
  return s.run(s.input.parse(input), c);
}

describe('compare services', () => {
  it('recipe.validate: ok, or the sentence and path of the first problem', async () => {
    const c = ctx([fx]);
    expect(await call('recipe.validate', { recipe, baseDir: fx }, c)).toEqual({ ok: true, variables: ['PO4'] });
    const bad = await call('recipe.validate', { recipe: { ...recipe, layers: ['middle'] }, baseDir: fx }, c);
    expect(bad).toMatchObject({ ok: false, path: 'layers[0]' });
  });

  it('refuses a recipe naming files outside the allowed folders', async () => {
    const c = ctx([join(fx, 'nothing-here')]);
    expect(await call('recipe.validate', { recipe, baseDir: fx }, c)).toMatchObject({ ok: false, message: expect.stringMatching(/outside the allowed folders/) });
    await expect(call('compare.run', { recipe, baseDir: fx }, c)).rejects.toThrow(/outside the allowed folders/);
    // the base folder allowed, but the recipe names files elsewhere by absolute path
    const allowed = mkdtempSync(join(tmpdir(), 'sw-svc-allowed-'));
    const c2 = ctx([allowed]);
    const outside = { ...recipe, reference: { label: 'Clim', variables: { PO4: { file: join(fx, 'ref.nc'), name: 'p_mean' } } }, runs: [{ label: 'A', variables: { PO4: { file: join(fx, 'run_same.nc') } } }] };
    await expect(call('compare.run', { recipe: outside, baseDir: allowed }, c2)).rejects.toThrow(/ref\.nc: outside the allowed folders/);
  });

  it('compare.run is heavy and returns the rows; recipe.save writes a recipe that loads back', async () => {
    const c = ctx([fx, tmpdir()]);
    expect(findService('compare.run')!.heavy).toBe(true);
    const res = (await call('compare.run', { recipe, baseDir: fx }, c)) as { rows: { n: number; run: string }[] };
    expect(res.rows).toHaveLength(1);
    expect(res.rows[0].n).toBeGreaterThan(1000);
    const dir = mkdtempSync(join(tmpdir(), 'sw-svc-'));
    const path = join(dir, 'saved.json');
    await call('recipe.save', { path, recipe, baseDir: fx }, c);
    const saved = JSON.parse(readFileSync(path, 'utf8'));
    expect(saved.reference.variables.PO4.file).toBe(join(fx, 'ref.nc'));
    const loaded = (await call('recipe.load', { path }, c)) as { variables: string[] };
    expect(loaded.variables).toEqual(['PO4']);
  });

  it('regions.list gives the six built-in regions and their lines', async () => {
    const r = (await call('regions.list', {}, ctx([fx]))) as { regions: string[] };
    expect(r.regions).toEqual(['global', 'atlantic', 'pacific', 'indian', 'southern', 'arctic']);
  });
});
