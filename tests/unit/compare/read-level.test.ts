/** Time steps of a field (hand values) and cancelling a comparison. */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { FieldSource } from '../../../app/cf/field.js';
import { parseUnits } from '../../../app/cf/units.js';
import { runComparison } from '../../../app/compare/run.js';
import { readLevelAt, timeIndex } from '../../../app/compare/read-level.js';
import { makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { validateRecipe } from '../../../app/recipe/validate.js';

function fakeField(steps: number[][]): FieldSource {
  return {
    file: 'fake.nc',
    variable: 'x',
    units: parseUnits('1'),
    grid: { horizontal: makeRegularGrid(180, 180), vertical: null },
    nt: steps.length,
    time: null,
    readLevel: async (t) => Float32Array.from(steps[t]),
  };
}

describe('time steps', () => {
  const f = fakeField([
    [1, NaN],
    [3, NaN],
    [5, 7],
  ]);
  it('default: the only step, else the mean; "last"; negative indices count from the end', () => {
    expect(timeIndex(fakeField([[1, 2]]), undefined)).toBe(0);
    expect(timeIndex(f, undefined)).toBe('mean');
    expect(timeIndex(f, 'last')).toBe(2);
    expect(timeIndex(f, -2)).toBe(1);
  });
  it('the mean skips missing steps of a cell: (1 + 3 + 5)/3 = 3 and 7/1 = 7', async () => {
    expect(Array.from(await readLevelAt(f, 'mean', 0))).toEqual([3, 7]);
    expect(Array.from(await readLevelAt(f, 1, 0))).toEqual([3, NaN]);
  });
});

describe('cancelling', () => {
  it('an aborted signal stops the comparison with E_CANCELLED', async () => {
    const fx = join(__dirname, '../../fixtures/compare');
    const recipe = validateRecipe(
      { reference: { label: 'C', variables: { PO4: { file: 'ref.nc', name: 'p_mean' } } }, runs: [{ label: 'A', variables: { PO4: { file: 'run_same.nc' } } }] },
      fx,
    );
    const ac = new AbortController();
    ac.abort();
    await expect(runComparison(recipe, { signal: ac.signal })).rejects.toMatchObject({ code: 'E_CANCELLED' });
  });
});
