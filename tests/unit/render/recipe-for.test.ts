// The recipe the diagrams send for one variable keeps what that variable's rows depend on, and nothing else.
import { describe, expect, it } from 'vitest';
import { recipeFor } from '../../../renderer/data.js';

const recipe = {
  reference: { label: 'R', variables: { T: 't', S: 's', PO4: 'p', NO3: 'n', O2: 'o' } },
  runs: [{ label: 'A', variables: { T: 't', S: 's', PO4: 'p', NO3: 'n', O2: 'o' } }],
  options: { density: { fields: { temperature: 'T', salinity: 'S' } }, derived: { Nstar: { expression: '(NO3 - 16 * PO4 + 2.9) * 0.87', units: 'umol kg-1' } }, logStats: ['PO4', 'O2'] },
};

describe('recipe for one variable', () => {
  it('keeps the variable and the temperature and salinity the density needs', () => {
    const r = recipeFor(recipe, 'O2') as typeof recipe;
    expect(Object.keys(r.reference.variables).sort()).toEqual(['O2', 'S', 'T']);
    expect(Object.keys(r.runs[0].variables).sort()).toEqual(['O2', 'S', 'T']);
    expect(r.options.derived).toEqual({});
    expect(r.options.logStats).toEqual(['O2']);
  });
  it('keeps the inputs of a derived variable, and leaves the original recipe alone', () => {
    const r = recipeFor(recipe, 'Nstar') as typeof recipe;
    expect(Object.keys(r.reference.variables).sort()).toEqual(['NO3', 'PO4', 'S', 'T']);
    expect(Object.keys(r.options.derived)).toEqual(['Nstar']);
    expect(Object.keys(recipe.reference.variables).length).toBe(5);
  });
});
