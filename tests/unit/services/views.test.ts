// The view services on the demo scenario, held against the data layer read independently: the reference as
// openField reads it, each run through regridField onto the reference grid, and the unit conversion of
// common practice (umol kg-1 = mmol m-3 × 1000 / ρ) with the density the demo recipe asks for: its nominal value,
// or ρ from the reference's temperature and salinity checked against TEOS-10 by python3-gsw
// (tests/fixtures/render/gsw_density.py). Also the bad-input paths.
import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve, sep } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FieldSource } from '../../../app/cf/field-source.js';
import { openField } from '../../../app/cf/open-field.js';
import { StillwaterError } from '../../../app/errors.js';
import { loadRecipe } from '../../../app/recipe/index.js';
import { regridField } from '../../../app/regrid/regrid-field.js';
import type { LevelData, SectionData, SessionInfo, TableText } from '../../../contract/view-types.js';
import type { ServiceContext } from '../../../app/services/types.js';
import { viewsServices } from '../../../app/services/views.js';
import { ensureDemo } from '../../../sample-data/generator/generate.js';
import { gswDensity } from '../render/gsw.js';

const SAMPLE = resolve('sample-data');
const RECIPE = join(SAMPLE, 'demo-recipe.json');
const work = mkdtempSync(join(tmpdir(), 'sw-views-'));
const RUN = 'remin-short (L = 200 m)';

/** A context like browser mode's: only sample-data/ and the scratch folder may be read or written. */
const ctx: ServiceContext = {
  roots: [SAMPLE, work],
  cacheDir: join(work, 'cache'),
  signal: new AbortController().signal,
  progress: () => undefined,
  resolvePath(p) {
    const abs = resolve(p);
    if (![SAMPLE, work].some((r) => abs === r || abs.startsWith(r + sep))) throw new StillwaterError('E_FILE', `${p}: outside the folders this workbench may read.`, { file: p });
    return abs;
  },
};

function call<T>(name: string, input: unknown): Promise<T> {
  const e = viewsServices.find((x) => x.name === name);
  if (!e) throw new Error(`no service ${name}`);
  return e.run(e.input.parse(input), ctx) as Promise<T>;
}

let info: SessionInfo;
let ref: FieldSource;
let run: FieldSource;
let refT: FieldSource;
let refS: FieldSource;

beforeAll(async () => {
  await ensureDemo(SAMPLE);
  info = await call<SessionInfo>('view.open', { recipe: RECIPE });
  const recipe = await loadRecipe(RECIPE);
  nominal = recipe.options.density === 'nominal' ? recipe.options.nominalDensity : null;
  const r = recipe.reference.variables.PO4;
  const m = recipe.runs[0].variables.PO4;
  ref = await openField(r.file, r.name);
  refT = await openField(recipe.reference.variables.T.file, recipe.reference.variables.T.name);
  refS = await openField(recipe.reference.variables.S.file, recipe.reference.variables.S.name);
  run = await regridField(await openField(m.file, m.name), ref.grid, { method: recipe.options.method, coverage: recipe.options.coverage, cacheDir: join(work, 'cache') });
}, 240_000);
afterAll(() => rmSync(work, { recursive: true, force: true }));

/** Cells of the 1° grid in open ocean: (row, column) = (70, 30) is 19.5° S 149.5° W; (120, 330) is 30.5° N 149.5° E. */
const OCEAN = [70 * 360 + 30, 120 * 360 + 330, 50 * 360 + 160];

/** The density the recipe asks for: its nominal value, or TEOS-10 from the reference's temperature and salinity. */
let nominal: number | null = null;

async function density(k: number, cells: number[]): Promise<number[]> {
  if (nominal !== null) return cells.map(() => nominal!);
  const t = await refT.readLevel(0, k);
  const sal = await refS.readLevel(0, k);
  const h = ref.grid.horizontal;
  return gswDensity(cells.map((c) => [t[c], sal[c], ref.grid.vertical!.centres[k], h.lon[c], h.lat[c]]));
}

describe('view.open', () => {
  it('describes the sources, variables, regions, depth choices and the common grid', () => {
    expect(info.reference.label).toBe('Demo climatology');
    expect(info.runs.map((r) => r.label)).toContain(RUN);
    expect(info.variables.find((v) => v.key === 'PO4')?.units).toBe('umol kg-1');
    expect(info.runs[0].variables.find((v) => v.key === 'PO4')?.units).toBe('mmol m-3');
    const g = ref.grid;
    expect([info.grid.nx, info.grid.ny, info.grid.nz]).toEqual([g.horizontal.nx, g.horizontal.ny, g.vertical!.nz]);
    expect(info.layers.filter((l) => l.kind === 'level').length).toBe(g.vertical!.nz);
    expect(info.layers.map((l) => l.id)).toEqual(expect.arrayContaining(['bottom', 'layer:0-100', 'layer:100-1000']));
    expect(info.regions).toEqual(['global', 'atlantic', 'pacific', 'indian', 'southern', 'arctic']);
  });
});

describe('view.level', () => {
  it('one level: the reference as read, the run regridded and converted, their difference', async () => {
    const k = 12;
    const d = await call<LevelData>('view.level', { session: info.session, variable: 'PO4', run: RUN, layer: `k:${k}` });
    const r = await ref.readLevel(0, k);
    const m = await run.readLevel(0, k);
    let compared = 0;
    for (let c = 0; c < r.length; c++) {
      if (Number.isNaN(r[c])) expect(d.reference[c]).toBeNaN();
      else expect(d.reference[c]).toBe(r[c]);
      if (Number.isNaN(r[c]) || Number.isNaN(m[c])) continue;
      compared++;
      // mmol m-3 to umol kg-1 divides by ρ/1000, with ρ of sea water: between 1020 and 1060 kg m-3 (common practice)
      const rho = (1000 * m[c]) / d.model[c];
      if (m[c] > 0.05) {
        expect(rho).toBeGreaterThan(1020);
        expect(rho).toBeLessThan(1060);
      }
      expect(Math.abs(d.difference[c] - (d.model[c] - d.reference[c]))).toBeLessThan(1e-6);
    }
    expect(compared).toBeGreaterThan(10_000);
    // and at chosen cells ρ is TEOS-10's, from the reference's temperature and salinity at the level's depth
    const rhos = await density(k, OCEAN);
    OCEAN.forEach((c, q) => {
      expect(Number.isFinite(m[c])).toBe(true);
      expect(d.model[c] / ((m[c] * 1000) / rhos[q])).toBeCloseTo(1, 3);
    });
  });

  it('a depth layer: the thickness-weighted mean of the levels it overlaps, where both have values', async () => {
    const d = await call<LevelData>('view.level', { session: info.session, variable: 'PO4', run: RUN, layer: 'layer:0-100' });
    const v = ref.grid.vertical!;
    const c = OCEAN[0];
    const rows: { w: number; m: number; r: number; gsw: number[] }[] = [];
    for (let k = 0; k < v.nz; k++) {
      const w = Math.max(0, Math.min(v.edges[k + 1], 100) - Math.max(v.edges[k], 0));
      if (w <= 0) continue;
      const tk = (await refT.readLevel(0, k))[c];
      const sk = (await refS.readLevel(0, k))[c];
      rows.push({ w, m: (await run.readLevel(0, k))[c], r: (await ref.readLevel(0, k))[c], gsw: [tk, sk, v.centres[k], ref.grid.horizontal.lon[c], ref.grid.horizontal.lat[c]] });
    }
    const rhos = nominal !== null ? rows.map(() => nominal!) : gswDensity(rows.map((x) => x.gsw));
    let sm = 0;
    let sr = 0;
    let sw = 0;
    rows.forEach((x, q) => {
      if (Number.isNaN(x.m) || Number.isNaN(x.r)) return;
      sm += (x.w * x.m * 1000) / rhos[q];
      sr += x.w * x.r;
      sw += x.w;
    });
    expect(sw).toBeGreaterThan(0);
    expect(d.model[c] / (sm / sw)).toBeCloseTo(1, 3);
    expect(d.reference[c]).toBeCloseTo(sr / sw, 4);
    expect(d.thickness[c]).toBeCloseTo(sw, 6);
  });

  it('the bottom: the deepest level where both have values, column by column', async () => {
    const d = await call<LevelData>('view.level', { session: info.session, variable: 'PO4', run: RUN, layer: 'bottom' });
    const c = OCEAN[0];
    let deepest = -1;
    for (let k = 0; k < ref.grid.vertical!.nz; k++) {
      const a = (await run.readLevel(0, k))[c];
      const b = (await ref.readLevel(0, k))[c];
      if (!Number.isNaN(a) && !Number.isNaN(b)) deepest = k;
    }
    expect(deepest).toBeGreaterThan(0);
    expect(d.bottomLevel![c]).toBe(deepest);
    expect(d.reference[c]).toBe((await ref.readLevel(0, deepest))[c]);
  });
});

describe('view.section', () => {
  it('a meridian section is the grid column under the longitude, level by level', async () => {
    const s = await call<SectionData>('view.section', { session: info.session, variable: 'PO4', run: RUN, kind: 'meridian', at: -25.2 });
    const axes = ref.grid.horizontal.axes!;
    const i = axes.lonEdges.findIndex((e, q) => -25.2 >= e && -25.2 < axes.lonEdges[q + 1]);
    expect(s.atGrid).toBeCloseTo(axes.lon[i], 9);
    const ny = ref.grid.horizontal.ny;
    for (const k of [0, 10, 20]) {
      const r = await ref.readLevel(0, k);
      for (const j of [30, 90, 150]) {
        const want = r[j * ref.grid.horizontal.nx + i];
        if (Number.isNaN(want)) expect(s.reference[k * ny + j]).toBeNaN();
        else expect(s.reference[k * ny + j]).toBe(want);
      }
    }
    // the seafloor lies at a layer edge, below every valued cell of its column
    for (let j = 0; j < ny; j++) {
      const f = s.seafloor[j];
      if (Number.isNaN(f)) continue;
      expect(Array.from(ref.grid.vertical!.edges)).toContain(f);
    }
  });
});

describe('bad input gets one clear sentence', () => {
  it('an unknown session, depth choice, run or region', async () => {
    await expect(call('view.level', { session: 'nope', variable: 'PO4', run: RUN, layer: 'k:0' })).rejects.toThrow(/session 'nope' is no longer open/);
    await expect(call('view.level', { session: info.session, variable: 'PO4', run: RUN, layer: 'k:999' })).rejects.toThrow(/no depth choice 'k:999'/);
    await expect(call('view.level', { session: info.session, variable: 'PO4', run: 'Run Z', layer: 'k:0' })).rejects.toThrow(/run 'Run Z' has no variable 'PO4'/);
    await expect(call('view.profile', { session: info.session, variable: 'PO4', region: 'baltic' })).rejects.toThrow(/no region 'baltic'/);
  });
  it('a recipe outside the allowed folders is refused', async () => {
    await expect(call('view.open', { recipe: '/etc/passwd' })).rejects.toMatchObject({ code: 'E_FILE' });
  });
  it('a recipe whose files lie outside the allowed folders is refused with the recipe path', async () => {
    const outside = mkdtempSync(join(tmpdir(), 'sw-outside-'));
    try {
      const p = join(work, 'sneaky.json');
      writeFileSync(join(outside, 'x.nc'), 'CDF');
      writeFileSync(p, JSON.stringify({ reference: { label: 'R', variables: { PO4: { file: join(outside, 'x.nc'), name: 'po4' } } }, runs: [{ label: 'A', variables: {} }] }));
      await expect(call('view.open', { recipe: p })).rejects.toThrow(/reference\.variables\.PO4\.file/);
    } finally {
      rmSync(outside, { recursive: true, force: true });
    }
  });
});

describe('saving the session as a recipe', () => {
  it('writes through a temporary file and reads back as the same comparison', async () => {
    const out = join(work, 'saved', 'session.json');
    await expect(call('view.save', { session: info.session, path: join(work, 'saved.txt') })).rejects.toThrow(/\.json/);
    (await import('node:fs')).mkdirSync(join(work, 'saved'));
    const r = await call<{ path: string }>('view.save', { session: info.session, path: out });
    expect(r.path).toBe(out);
    expect(readdirSync(join(work, 'saved'))).toEqual(['session.json']); // no temporary file left
    const back = await loadRecipe(out);
    expect(back.runs.map((x) => x.label)).toEqual(info.runs.map((x) => x.label));
    expect(back.reference.variables.PO4.file).toBe(join(SAMPLE, 'generated', 'ref.nc'));
    expect(existsSync(out)).toBe(true);
  });
});

describe('view.table', () => {
  it('writes the rows it is given through the report writers', async () => {
    const row = { run: 'A', variable: 'PO4', region: 'global', layer: 'all', units: 'umol kg-1', n: 3, weight: 1, model_mean: 1, ref_mean: 1, bias: 0, rmse: 0, crmse: 0, corr: 1, model_std: 1, ref_std: 1, std_ratio: 1, taylor_skill: 1, nse: 1, target_bias: 0, target_urmsd: 0, compared_fraction: 1, weight_units: 'm3' };
    const result = { rows: [row, { ...row, run: 'B' }], costs: [], variables: [], inputs: [] };
    const csv = await call<TableText>('view.table', { result, format: 'csv' });
    const lines = csv.text.trim().split(/\r\n/);
    expect(lines.length).toBe(3);
    expect(lines[1].startsWith('A,PO4,global,all,')).toBe(true);
    expect(JSON.parse((await call<TableText>('view.table', { result, format: 'json' })).text).rows.length).toBe(2);
  });
});
