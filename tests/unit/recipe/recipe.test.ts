/** Recipe validation: the minimal form, defaults, and one sentence with the exact path for each problem. */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadRecipe, recipeToJson, validateRecipe } from '../../../app/recipe/index.js';
import { StillwaterError } from '../../../app/errors.js';

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'sw-recipe-'));
  for (const f of ['ref.nc', 'runA.nc', 'runB.nc', 'mask.nc', 'y100.nc']) writeFileSync(join(dir, f), 'x');
});

const minimal = () => ({
  reference: { label: 'Climatology', variables: { PO4: { file: 'ref.nc', name: 'p_mean', units: 'umol kg-1' } } },
  runs: [{ label: 'Run A', variables: { PO4: { file: 'runA.nc', name: 'PO4' } } }],
  regions: ['global', 'atlantic', 'pacific', 'indian', 'southern', 'arctic'],
  layers: [[0, 100], [100, 1000], [1000, 6000], 'bottom'],
});

function fails(json: unknown, message: RegExp, path?: string): void {
  try {
    validateRecipe(json, dir);
  } catch (e) {
    expect(e).toBeInstanceOf(StillwaterError);
    const err = e as StillwaterError;
    expect(err.code).toBe('E_RECIPE');
    expect(err.message).toMatch(message);
    if (path) expect(err.subject.path).toBe(path);
    // one sentence
    expect(err.message.trim().split(/(?<=[.])\s+(?=[A-Z])/).length).toBe(1);
    return;
  }
  throw new Error('expected the recipe to be refused');
}

describe('recipe', () => {
  it("accepts the issue's minimal form, resolving paths against the recipe's folder and filling defaults", () => {
    const r = validateRecipe(minimal(), dir);
    expect(r.reference.variables.PO4).toMatchObject({ file: join(dir, 'ref.nc'), name: 'p_mean', units: 'umol kg-1', path: 'reference.variables.PO4' });
    expect(r.runs[0].variables.PO4).toMatchObject({ file: join(dir, 'runA.nc'), name: 'PO4' });
    expect(r.layers).toEqual([
      { kind: 'interval', top: 0, bottom: 100 },
      { kind: 'interval', top: 100, bottom: 1000 },
      { kind: 'interval', top: 1000, bottom: 6000 },
      { kind: 'bottom' },
    ]);
    expect(r.options).toMatchObject({ commonGrid: 'reference', coverage: 0.5, density: 'nominal', nominalDensity: 1025, bottomTolerance: null, method: 'conservative' });
    expect(r.variables).toEqual(['PO4']);
  });

  it('takes a source-level file, bare variable names, snapshots and options', () => {
    const j = minimal() as Record<string, unknown>;
    j.runs = [{ label: 'B', file: 'runB.nc', variables: { PO4: 'po4' }, snapshots: [{ file: 'y100.nc', year: 100 }] }];
    j.options = { commonGrid: { regular: { dlon: 2, dlat: 2 }, depthEdges: [0, 50, 200] }, bottomTolerance: 100, logStats: ['PO4'] };
    const r = validateRecipe(j, dir);
    expect(r.runs[0].variables.PO4).toMatchObject({ file: join(dir, 'runB.nc'), name: 'po4' });
    expect(r.runs[0].snapshots).toEqual([{ file: join(dir, 'y100.nc'), year: 100 }]);
    expect(r.options.bottomTolerance).toBe(100);
  });

  it('refuses unknown keys with their path', () => {
    const j = minimal() as Record<string, unknown>;
    (j.runs as Record<string, unknown>[])[0].colour = 'red';
    fails(j, /^runs\[0\]: unknown key 'colour'\.$/, 'runs[0]');
    const k = minimal();
    (k.reference.variables.PO4 as Record<string, unknown>).unit = 'x';
    fails(k, /^reference\.variables\.PO4: unknown key 'unit'\.$/);
  });

  it('names a missing file with the exact path', () => {
    const j = minimal();
    j.runs.push({ label: 'Run B', variables: { PO4: { file: 'nothere.nc', name: 'PO4' } } });
    fails(j, new RegExp(`^runs\\[1\\]\\.variables\\.PO4\\.file: no such file '${join(dir, 'nothere.nc').replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}'\\.$`), 'runs[1].variables.PO4.file');
  });

  it('refuses wrong types, bad layers, bad regions, a run variable the reference lacks, bad density fields', () => {
    fails({ ...minimal(), runs: [] }, /^runs: needs at least one run\.$/);
    fails({ ...minimal(), layers: [[100, 50]] }, /^layers\[0\]: /);
    fails({ ...minimal(), layers: ['deep'] }, /^layers\[0\]: must be \[top, bottom\] in metres, "surface", "bottom" or "all"\.$/);
    fails({ ...minimal(), regions: ['atlantis'] }, /^regions\[0\]: must be a built-in region name/);
    const j = minimal();
    (j.runs[0].variables as Record<string, unknown>).NO3 = { file: 'runA.nc' };
    fails(j, /^runs\[0\]\.variables\.NO3: the reference has no variable 'NO3' to compare with\.$/);
    fails({ ...minimal(), options: { density: { fields: { temperature: 'T', salinity: 'S' } } } }, /^options\.density\.fields\.temperature: the reference has no variable 'T'\.$/);
    fails({ ...minimal(), options: { coverage: 2 } }, /^options\.coverage: /);
    fails({ ...minimal(), reference: { label: 'C', variables: { PO4: { name: 'p' } } } }, /^reference\.variables\.PO4\.file: no file given/);
    fails({ reference: minimal().reference }, /^runs: is required\.$/);
    fails({ ...minimal(), options: { derived: { X: { expression: 'PO4 * ', units: '1' } } } }, /^options\.derived\.X\.expression: expression 'PO4 \* ': /);
    fails({ ...minimal(), options: { derived: { X: { expression: '16 * NO3', units: '1' } } } }, /^options\.derived\.X\.expression: the reference has no variable 'NO3'\.$/);
    fails({ ...minimal(), options: { derived: { X: { expression: 'PO4', units: 'furlongs' } } } }, /^options\.derived\.X\.units: /);
    fails({ ...minimal(), options: { derived: { PO4: { expression: 'PO4', units: '1' } } } }, /^options\.derived\.PO4: clashes with the reference variable 'PO4'\.$/);
  });

  it('loadRecipe: not JSON and no such file are one sentence each naming the file', async () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, '{"reference": ');
    await expect(loadRecipe(bad)).rejects.toThrow(/bad\.json: the recipe is not valid JSON/);
    await expect(loadRecipe(join(dir, 'none.json'))).rejects.toThrow(/none\.json: cannot read the recipe/);
    const good = join(dir, 'good.json');
    writeFileSync(good, JSON.stringify(minimal()));
    expect((await loadRecipe(good)).runs[0].label).toBe('Run A');
    const wrong = join(dir, 'wrong.json');
    writeFileSync(wrong, JSON.stringify({ ...minimal(), extra: 1 }));
    await expect(loadRecipe(wrong)).rejects.toThrow(/wrong\.json: recipe: unknown key 'extra'\./);
  });

  it('recipeToJson gives back a recipe that validates to the same thing (the saved workbench session)', () => {
    const j = minimal() as Record<string, unknown>;
    j.regions = ['global', { mask: 'mask.nc', variable: 'basin', flags: ['north'] }];
    const r = validateRecipe(j, dir);
    const json = recipeToJson(r);
    expect((json.reference.variables.PO4 as { file: string }).file).toBe('ref.nc');
    const again = validateRecipe(JSON.parse(JSON.stringify(json)), dir);
    expect(again).toEqual(r);
  });
});

// Issue 16, item 9: keys are looked up in tables without a prototype; grids are refused before allocating.
describe('recipe keys and grid sizes from hostile recipes', () => {
  it('a variable key named constructor is an ordinary key; toString is not a variable of the reference', () => {
    const j = JSON.parse(JSON.stringify(minimal())) as { reference: { variables: unknown }; runs: { variables: unknown }[] };
    j.reference.variables = JSON.parse('{"constructor": {"file": "ref.nc", "name": "p"}}');
    j.runs[0].variables = JSON.parse('{"constructor": {"file": "runA.nc", "name": "p"}}');
    const r = validateRecipe(j, dir);
    expect(r.variables).toEqual(['constructor']);
    expect(r.reference.variables.constructor.name).toBe('p');
    expect(r.reference.variables.toString).toBeUndefined();
    expect(r.options.derived.constructor).toBeUndefined();
    expect(r.options.units.valueOf).toBeUndefined();
  });
  it("a '__proto__' key is refused with its path", () => {
    const j = JSON.parse('{"reference": {"variables": {"__proto__": {"file": "ref.nc"}}}, "runs": []}');
    fails(j, /'__proto__' cannot be used as a name/, 'reference.variables');
  });
  for (const d of [1e-9, 5e-324, 0.05]) {
    it(`a common grid spacing of ${d}° is refused before any grid is made`, () => {
      const j = { ...minimal(), options: { commonGrid: { regular: { dlon: d, dlat: d } } } };
      fails(j, /more than the 6480000 \(0\.1° over the globe\) a common grid may have/, 'options.commonGrid.regular');
    });
  }
  it('0.1° over the globe, the documented limit, is accepted', () => {
    const j = { ...minimal(), options: { commonGrid: { regular: { dlon: 0.1, dlat: 0.1 } } } };
    expect(validateRecipe(j, dir).options.commonGrid).toMatchObject({ regular: { dlon: 0.1 } });
  });
});
