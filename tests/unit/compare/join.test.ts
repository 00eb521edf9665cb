/**
 * The whole recipe's comparison joined from its variables' comparisons (app/compare/join.ts) is the very
 * comparison runComparison gives for the whole recipe: rows, costs (the multi-tracer sum, Σ RMSE/|mean|, common
 * practice), notes and inputs, to the last bit. Files: the numpy-checked fixtures of tests/fixtures/compare
 * (make_netcdf.py); a derived variable makes a second one, which only one run has.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { joinComparisons } from '../../../app/compare/join.js';
import { runComparison } from '../../../app/compare/run.js';
import { validateRecipe } from '../../../app/recipe/validate.js';

const fx = join(__dirname, '../../fixtures/compare');
const cache = mkdtempSync(join(tmpdir(), 'sw-join-'));
afterAll(() => rmSync(cache, { recursive: true, force: true }));

const recipe = validateRecipe(
  {
    reference: { label: 'Climatology', variables: { PO4: { file: 'ref.nc', name: 'p_mean' }, P2: { file: 'ref.nc', name: 'p_mean' } } },
    runs: [
      { label: 'Same grid', variables: { PO4: { file: 'run_same.nc' }, P2: { file: 'run_same.nc', name: 'PO4' } } },
      { label: 'Coarse', variables: { PO4: { file: 'run_coarse.nc' } } },
    ],
    regions: ['global', { mask: 'mask.nc', variable: 'basin', flags: ['west'] }, 'atlantic'],
    layers: [[0, 100], 'all', 'bottom'],
    options: { derived: { Twice: { expression: '2 * PO4 + 0.1', units: 'umol kg-1' } } },
  },
  fx,
);

describe('joinComparisons', () => {
  it('gives what runComparison gives for the whole recipe, from its variables one by one', async () => {
    expect(recipe.variables.length).toBeGreaterThanOrEqual(3);
    const whole = await runComparison(recipe, { cacheDir: cache });
    const parts = [];
    for (const v of recipe.variables) parts.push(await runComparison({ ...recipe, variables: [v] }, { cacheDir: cache }));
    const joined = joinComparisons(recipe.runs.map((r) => r.label), parts);
    // a run without a variable has no rows for it, and its cost has fewer terms: the case that could differ
    expect(whole.costs[1].terms.length).toBeLessThan(whole.costs[0].terms.length);
    expect(joined).toEqual(whole);
    expect(joined.costs.map((c) => c.cost)).toStrictEqual(whole.costs.map((c) => c.cost));
  });
});
