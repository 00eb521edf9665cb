/** The recipe's `report` section: accepted as written, refused with its path when a key is wrong, kept on save. */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { recipeToJson, validateRecipe } from '../../../app/recipe/index.js';

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'sw-recipe-report-'));
  for (const f of ['ref.nc', 'runA.nc']) writeFileSync(join(dir, f), 'x');
});

const withReport = (report: unknown) => ({
  reference: { label: 'Climatology', variables: { PO4: { file: 'ref.nc' } } },
  runs: [{ label: 'Run A', variables: { PO4: { file: 'runA.nc' } } }],
  report,
});

describe('recipe report section', () => {
  it('is kept as written and survives a save', () => {
    const report = { mapLayers: ['bottom', [0, 100]], lines: ['atlantic', { name: 'Drake Passage', waypoints: [[-65, -55], [-62, -64]] }], figureWidth: 'single' };
    const r = validateRecipe(withReport(report), dir);
    expect(r.report).toEqual(report);
    expect(recipeToJson(r).report).toEqual(report);
  });

  it('is optional', () => {
    const r = validateRecipe({ ...withReport(undefined) }, dir);
    expect(r.report).toBeUndefined();
  });

  it.each([
    [{ colours: 'x' }, /^report: unknown key 'colours'/],
    [{ figureWidth: 'triple' }, /^report\.figureWidth: /],
    [{ mapLayers: [[100, 50]] }, /^report\.mapLayers\[0\]/],
    [{ differenceLimits: { PO4: -1 } }, /^report\.differenceLimits\.PO4: must be a positive number/],
    [{ lines: [{ name: 'x', waypoints: [[0, 0]] }] }, /^report\.lines\[0\]/],
  ])('refuses %j with its path', (report, message) => {
    expect(() => validateRecipe(withReport(report), dir)).toThrow(message);
  });
});
