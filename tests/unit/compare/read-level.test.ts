/** Time steps of a field (hand values) and cancelling a comparison. */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { FieldSource } from '../../../app/cf/field-source.js';
import { runComparison } from '../../../app/compare/run.js';
import { planTime } from '../../../app/time/select.js';
import { reduceTime } from '../../../app/time/reduce.js';
import { makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { validateRecipe } from '../../../app/recipe/validate.js';
import { memoryField } from '../memory-field.js';

function fakeField(steps: number[][]): FieldSource {
  return memoryField({ horizontal: makeRegularGrid(180, 180), vertical: null }, steps.map((v) => Float32Array.from(v)), { file: 'fake.nc', variable: 'x', units: '1', nt: steps.length });
}

describe('time steps', () => {
  const f = fakeField([
    [1, NaN],
    [3, NaN],
    [5, 7],
  ]);
  const ctx = { path: 'runs[0].variables.x', monthlyRows: false, reference: false };
  const level = (field: FieldSource, choice: Parameters<typeof planTime>[1]) => reduceTime(field, planTime(field, choice, ctx)).readLevel(0, 0);
  it('default: the only step, else the mean; "last"; negative indices count from the end', async () => {
    expect(planTime(fakeField([[1, 2]]), undefined, ctx)).toMatchObject({ kind: 'step', t: 0 });
    expect(planTime(f, undefined, ctx).kind).toBe('mean');
    expect(planTime(f, 'last', ctx)).toMatchObject({ kind: 'step', t: 2 });
    expect(planTime(f, -2, ctx)).toMatchObject({ kind: 'step', t: 1 });
    expect(() => planTime(f, 3, ctx)).toThrow(/runs\[0\]\.variables\.x\.time: 'x' in fake\.nc has no time step 3 \(it has 3\)\./);
  });
  it('the mean skips missing steps of a cell: (1 + 3 + 5)/3 = 3 and 7/1 = 7', async () => {
    expect(Array.from(await level(f, 'mean'))).toEqual([3, 7]);
    expect(Array.from(await level(f, 1))).toEqual([3, NaN]);
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
