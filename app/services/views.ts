/**
 * What the workbench's views draw, as service entries: open a recipe as a session, then slices of its
 * fields on the common grid (levels, layer means, the bottom, sections, zonal means, profiles) and the
 * skill rows. Fields are opened and regridded once per session and their levels kept in a bounded cache,
 * so that a change of depth is fast.
 */
import { randomUUID } from 'node:crypto';
import { basename, dirname } from 'node:path';
import { z } from 'zod';
import { parseUnits, type ParsedUnits } from '../cf/units.js';
import { commonGridFor } from '../compare/common-grid.js';
import { PromiseCache } from '../promise-cache.js';
import { densityProvider, type DensityProvider } from '../compare/density.js';
import { derivedReader, openSpec, plainReader, referenceUnitsOf, type LevelReader, type ReaderContext } from '../compare/level-reader.js';
import { loadRegions, prefixed } from '../compare/load-regions.js';
import type { ComparisonResult } from '../compare/run.js';
import { skillCsv, skillJson, skillLatex, skillMarkdown, type Provenance } from '../report/index.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import { openDataset } from '../io/open.js';
import { attrString, findVariable, type RawDataset } from '../io/types.js';
import { loadRecipe, recipeToJson, validateRecipe } from '../recipe/index.js';
import { parseExpression } from '../ocean/expression.js';
import type { Recipe } from '../recipe/types.js';
import { layerLevelMetres, type LayerSpec } from '../regions/layers.js';
import type { Region } from '../regions/region.js';
import { areaMean, atLevels, bottomLevels, layerMeans, levelsOf, meridianSection, parallelSection, seafloorOf, zonalMeans } from '../render/slices.js';
import { findInterval } from '../render/pixel-lookup.js';
import type { LayerChoice, LevelData, ProfileData, SectionData, SessionInfo, SourceInfo, TableText, ViewGrid } from '../../contract/view-types.js';
import { checkOutputFile } from '../output/output-target.js';
import { writeOutputFile } from '../output/output-set.js';
import { recipeFiles } from '../recipe/recipe-files.js';
import { screenSectionSchema } from '../recipe/screen-schema.js';
import { guardRecipe } from './recipe-guard.js';
import { recipeProblems } from './recipe-problems.js';
import { entry, type ServiceContext, type ServiceEntry } from './types.js';

// ---------- sessions ----------

interface Pair {
  variable: string;
  units: string;
  reference: LevelReader;
  /** run readers, opened (and regridded) when first asked for */
  runs: Map<string, () => Promise<LevelReader>>;
  density: DensityProvider;
}

interface Session {
  id: string;
  recipePath: string;
  recipe: Recipe;
  grid: Grid;
  info: SessionInfo;
  pairs: Map<string, Promise<Pair>>;
  regions: Promise<Region[]> | null;
  /** levels kept per session: newest last, bounded by bytes */
  levels: PromiseCache<Float32Array>;
  cacheDir: string;
}

const LEVEL_CACHE_BYTES = 512 * 1024 * 1024;
const sessions = new Map<string, Session>();

function sessionOf(id: string): Session {
  const s = sessions.get(id);
  if (!s) throw new StillwaterError('E_INPUT', `The workbench session '${id}' is no longer open; open the recipe again.`);
  return s;
}

function tableUnits(u: ParsedUnits): string {
  return u.kind === 'other' ? u.text.trim() : u.canonical;
}

/**
 * Variables and units of a source as its files declare them (the recipe's units win). Only headers are read,
 * each file once: the fields themselves are opened when a view asks for them.
 */
async function describeSource(spec: Recipe['reference'], headers: Map<string, Promise<RawDataset | Error>>): Promise<SourceInfo> {
  const header = (file: string): Promise<RawDataset | Error> => {
    let h = headers.get(file);
    if (!h) {
      h = openDataset(file).catch((e: unknown) => (e instanceof Error ? e : new Error(String(e))));
      headers.set(file, h);
    }
    return h;
  };
  const variables: SourceInfo['variables'] = [];
  for (const [key, v] of Object.entries(spec.variables)) {
    const ds = await header(v.file);
    if (ds instanceof Error) {
      variables.push({ key, file: v.file, name: v.name, units: '?', longName: ds.message, problem: ds.message });
      continue;
    }
    const raw = findVariable(ds, v.name);
    if (!raw) {
      variables.push({ key, file: v.file, name: v.name, units: '?', longName: `${v.file} has no variable '${v.name}'.`, problem: `${v.file} has no variable '${v.name}'.` });
      continue;
    }
    const longName = attrString(raw.attrs, 'long_name') ?? attrString(raw.attrs, 'standard_name');
    variables.push({ key, file: v.file, name: v.name, units: v.units ?? attrString(raw.attrs, 'units') ?? '', ...(longName ? { longName } : {}) });
  }
  return { label: spec.label, variables, snapshots: spec.snapshots };
}

function layerChoices(recipe: Recipe, grid: Grid): LayerChoice[] {
  const v = grid.vertical;
  if (!v) return [{ id: 'k:0', label: 'surface (2-D field)', kind: 'level', top: null, bottom: null, k: 0 }];
  const out: LayerChoice[] = [];
  for (let k = 0; k < v.nz; k++) {
    out.push({ id: `k:${k}`, label: `${round(v.centres[k])} m`, kind: 'level', top: v.edges[k], bottom: v.edges[k + 1], k });
  }
  const seen = new Set<string>();
  for (const l of [...recipe.layers, { kind: 'bottom' } as LayerSpec]) {
    const c = choiceOf(l);
    if (c.kind === 'surface' || seen.has(c.id)) continue;
    if (c.kind === 'bottom') c.bottomTolerance = recipe.options.bottomTolerance;
    seen.add(c.id);
    out.push(c);
  }
  return out;
}

function round(x: number): number {
  return Math.round(x * 10) / 10;
}

function choiceOf(l: LayerSpec): LayerChoice {
  switch (l.kind) {
    case 'interval':
      return { id: `layer:${l.top}-${l.bottom}`, label: `${l.top}–${l.bottom} m (mean)`, kind: 'interval', top: l.top, bottom: l.bottom };
    case 'bottom':
      return { id: 'bottom', label: 'bottom (deepest wet cell)', kind: 'bottom', top: null, bottom: null };
    case 'all':
      return { id: 'all', label: 'full depth (mean)', kind: 'all', top: null, bottom: null };
    default:
      return { id: 'surface', label: 'surface', kind: 'surface', top: null, bottom: null };
  }
}

function viewGrid(grid: Grid): ViewGrid {
  const h = grid.horizontal;
  if (h.kind !== 'rectilinear' || !h.axes) {
    throw new StillwaterError('E_GRID', 'The common grid of the views must be a latitude-longitude grid; set options.commonGrid to {"regular": {...}} in the recipe.');
  }
  const v = grid.vertical;
  return {
    nx: h.nx,
    ny: h.ny,
    nz: v?.nz ?? 1,
    lonEdges: h.axes.lonEdges,
    latEdges: h.axes.latEdges,
    depthEdges: v ? v.edges : Float64Array.from([0, 1]),
    depthCentres: v ? v.centres : Float64Array.from([0]),
    area: h.area,
  };
}

async function buildSession(recipe: Recipe, recipePath: string, ctx: ServiceContext, id: string = randomUUID(), modified = false): Promise<Session> {
  guardRecipe(recipe, ctx);
  const first = recipe.variables.find((v) => recipe.reference.variables[v]);
  if (!first) throw new StillwaterError('E_RECIPE', `${recipePath}: reference.variables: the reference has no variables to compare.`, { path: 'reference.variables' });
  const refSpec = recipe.reference.variables[first];
  const refField = await openSpec(refSpec);
  const grid = commonGridFor(recipe.options.commonGrid, refField.grid);
  await refField.close?.();
  const headers = new Map<string, Promise<RawDataset | Error>>();
  let reference: SourceInfo;
  let runs: SourceInfo[];
  try {
    reference = await describeSource(recipe.reference, headers);
    runs = [];
    for (const r of recipe.runs) runs.push(await describeSource(r, headers));
  } finally {
    for (const h of headers.values()) {
      const ds = await h;
      if (!(ds instanceof Error)) await ds.close().catch(() => undefined);
    }
  }
  const variables = recipe.variables
    .filter((key) => recipe.reference.variables[key] || recipe.options.derived[key])
    .map((key) => {
      const derived = recipe.options.derived[key];
      const refVar = reference.variables.find((v) => v.key === key);
      const wanted = recipe.options.units[key] ?? derived?.units;
      let units = wanted ?? refVar?.units ?? '';
      try {
        units = tableUnits(parseUnits(units));
      } catch {
        /* units that do not parse are shown as written; opening the pair reports them */
      }
      const needs = derived ? parseExpression(derived.expression).variables : [key];
      return {
        key,
        units,
        longName: derived ? `${key} = ${derived.expression}` : (refVar?.longName ?? key),
        runs: recipe.runs.filter((r) => needs.every((k) => r.variables[k])).map((r) => r.label),
      };
    });
  const info: SessionInfo = {
    session: id,
    recipePath,
    title: recipe.title ?? basename(recipePath).replace(/\.json$/i, ''),
    reference,
    runs,
    variables,
    regions: recipe.regions.map((r) => (r.kind === 'built-in' ? r.name : r.kind === 'mask' ? r.variable : basename(r.file))),
    layers: layerChoices(recipe, grid),
    grid: viewGrid(grid),
    ...(recipe.screen ? { screen: recipe.screen } : {}),
    problems: recipeProblems(recipe, reference, runs),
    modified,
  };
  return { id, recipePath, recipe, grid, info, pairs: new Map(), regions: null, levels: new PromiseCache<Float32Array>(LEVEL_CACHE_BYTES, (a) => a.byteLength), cacheDir: ctx.cacheDir };
}

async function pairOf(s: Session, variable: string): Promise<Pair> {
  let p = s.pairs.get(variable);
  if (!p) {
    p = openPair(s, variable);
    s.pairs.set(variable, p);
    p.catch(() => s.pairs.delete(variable));
  }
  return p;
}

async function openPair(s: Session, variable: string): Promise<Pair> {
  const { recipe, grid } = s;
  const derived = recipe.options.derived[variable];
  const refSpec = recipe.reference.variables[variable];
  if (!refSpec && !derived) throw new StillwaterError('E_INPUT', `The reference has no variable '${variable}'.`, { variable });
  const density = densityProvider(recipe, grid, s.cacheDir);
  const ctx: ReaderContext = { grid, options: recipe.options, cacheDir: s.cacheDir, densityNote: density.note, monthlyRows: false, noteFile: () => undefined };
  const unitsOf = referenceUnitsOf(recipe);
  let target: ParsedUnits;
  let reference: LevelReader;
  const runs = new Map<string, () => Promise<LevelReader>>();
  const lazy = (open: () => Promise<LevelReader>): (() => Promise<LevelReader>) => {
    let p: Promise<LevelReader> | null = null;
    return () => {
      if (!p) {
        p = open();
        p.catch(() => (p = null));
      }
      return p;
    };
  };
  if (derived) {
    target = await prefixed(`options.derived.${variable}.units`, async () => parseUnits(derived.units));
    reference = await derivedReader(variable, derived.expression, recipe.reference, unitsOf, ctx);
    const needs = parseExpression(derived.expression).variables;
    for (const run of recipe.runs) {
      if (needs.every((k) => run.variables[k])) runs.set(run.label, lazy(() => derivedReader(variable, derived.expression, run, unitsOf, ctx)));
    }
  } else {
    const refField = await openSpec(refSpec);
    target = recipe.options.units[variable] ? await unitsOf(variable) : refField.units;
    reference = await plainReader(variable, refSpec, target, ctx, refField);
    for (const run of recipe.runs) {
      const spec = run.variables[variable];
      if (spec) runs.set(run.label, lazy(() => plainReader(variable, spec, target, ctx)));
    }
  }
  return { variable, units: tableUnits(target), reference, runs, density };
}

/** One level of one source on the common grid, in the comparison's units (cached). */
async function level(s: Session, pair: Pair, source: Source, k: number): Promise<Float32Array> {
  return s.levels.get(`${pair.variable}\u0000${source.label}\u0000${source.role}\u0000${k}`, async () =>
    source.reader.read(k, source.reader.needsDensity ? await pair.density.level(k) : undefined),
  );
}

/** A reader with the label the cache and the messages use. */
interface Source {
  label: string;
  role: 'ref' | 'run';
  reader: LevelReader;
}

function refOf(s: Session, pair: Pair): Source {
  return { label: s.recipe.reference.label, role: 'ref', reader: pair.reference };
}

async function runOf(pair: Pair, run: string): Promise<Source> {
  const open = pair.runs.get(run);
  if (!open) throw new StillwaterError('E_INPUT', `The run '${run}' has no variable '${pair.variable}'.`, { variable: pair.variable });
  return { label: run, role: 'run', reader: await open() };
}

async function allLevels(s: Session, pair: Pair, source: Source, ctx: ServiceContext, what: string, share: [number, number] = [0, 1]): Promise<Float32Array[]> {
  const nz = s.info.grid.nz;
  const out: Float32Array[] = [];
  for (let k = 0; k < nz; k++) {
    if (ctx.signal.aborted) throw new StillwaterError('E_CANCELLED', 'The work was cancelled.');
    out.push(await level(s, pair, source, k));
    ctx.progress(share[0] + ((k + 1) / nz) * (share[1] - share[0]), `${what}: level ${k + 1} of ${nz}`);
  }
  return out;
}

async function regionsOf(s: Session): Promise<Region[]> {
  if (!s.regions) {
    s.regions = loadRegions(s.recipe.regions, s.grid.horizontal);
    s.regions.catch(() => (s.regions = null));
  }
  return s.regions;
}

async function regionNamed(s: Session, name: string): Promise<Region> {
  const regions = await regionsOf(s);
  const r = regions.find((x) => x.name === name);
  if (!r) throw new StillwaterError('E_INPUT', `There is no region '${name}' in this recipe; it has ${regions.map((x) => x.name).join(', ')}.`);
  return r;
}

// ---------- computations behind the entries ----------

async function levelData(s: Session, variable: string, run: string, layerId: string, ctx: ServiceContext): Promise<LevelData> {
  const layer = s.info.layers.find((l) => l.id === layerId);
  if (!layer) throw new StillwaterError('E_INPUT', `There is no depth choice '${layerId}' in this session.`);
  const pair = await pairOf(s, variable);
  const model = await runOf(pair, run);
  const g = s.info.grid;
  const base = { variable, run, layer, units: pair.units };
  if (layer.kind === 'level') {
    const k = layer.k ?? 0;
    const [m, r] = await Promise.all([level(s, pair, model, k), level(s, pair, refOf(s, pair), k)]);
    const difference = new Float32Array(m.length);
    const thickness = new Float32Array(m.length);
    const dz = g.depthEdges[k + 1] - g.depthEdges[k];
    for (let c = 0; c < m.length; c++) {
      difference[c] = m[c] - r[c];
      thickness[c] = m[c] === m[c] && r[c] === r[c] ? dz : 0;
    }
    return { ...base, model: m, reference: r, difference, thickness };
  }
  const ms = await allLevels(s, pair, model, ctx, `${variable}, ${run}`, [0, 0.5]);
  const rs = await allLevels(s, pair, refOf(s, pair), ctx, `${variable}, ${s.recipe.reference.label}`, [0.5, 1]);
  if (layer.kind === 'bottom') {
    const k = bottomLevels(ms, rs);
    const mb = atLevels(ms, k);
    const rb = atLevels(rs, k);
    const difference = new Float32Array(mb.length);
    const thickness = new Float32Array(mb.length);
    for (let c = 0; c < mb.length; c++) {
      difference[c] = mb[c] - rb[c];
      thickness[c] = k[c] >= 0 ? g.depthEdges[k[c] + 1] - g.depthEdges[k[c]] : 0;
    }
    return { ...base, model: mb, reference: rb, difference, thickness, bottomLevel: k };
  }
  const spec: LayerSpec = layer.kind === 'interval' ? { kind: 'interval', top: layer.top!, bottom: layer.bottom! } : { kind: layer.kind };
  const metres = s.grid.vertical ? layerLevelMetres(spec, s.grid.vertical) : Float64Array.from([1]);
  const mean = layerMeans(ms, rs, metres);
  return { ...base, ...mean };
}

async function sectionData(
  s: Session,
  input: { variable: string; run: string; kind: 'meridian' | 'parallel' | 'zonal'; at: number | null; region: string | null },
  ctx: ServiceContext,
): Promise<SectionData> {
  const pair = await pairOf(s, input.variable);
  const model = await runOf(pair, input.run);
  const g = s.info.grid;
  const ms = await allLevels(s, pair, model, ctx, `${input.variable}, ${input.run}`, [0, 0.5]);
  const rs = await allLevels(s, pair, refOf(s, pair), ctx, `${input.variable}, ${s.recipe.reference.label}`, [0.5, 1]);
  const nz = g.nz;
  let mSec: Float32Array, rSec: Float32Array, dSec: Float32Array, n: number, edges: Float64Array, atGrid: number | null = null;
  let axis: SectionData['axis'];
  if (input.kind === 'zonal') {
    const region = await regionNamed(s, input.region ?? 'global');
    const mask = new Uint8Array(g.nx * g.ny);
    for (const c of region.cells) mask[c] = 1;
    const z = zonalMeans(ms, rs, g.area, mask, g.nx, g.ny);
    mSec = z.model;
    rSec = z.reference;
    dSec = z.difference;
    n = g.ny;
    edges = g.latEdges;
    axis = 'latitude';
  } else {
    const at = input.at ?? 0;
    if (input.kind === 'meridian') {
      const west = g.lonEdges[0];
      const lon = Math.abs(g.lonEdges[g.nx] - west - 360) < 1e-6 ? west + ((((at - west) % 360) + 360) % 360) : at;
      const i = findInterval(g.lonEdges, lon);
      if (i < 0) throw new StillwaterError('E_INPUT', `Longitude ${at} lies outside the common grid (${g.lonEdges[0]} to ${g.lonEdges[g.nx]}).`);
      mSec = meridianSection(ms, g.nx, g.ny, i);
      rSec = meridianSection(rs, g.nx, g.ny, i);
      n = g.ny;
      edges = g.latEdges;
      axis = 'latitude';
      atGrid = 0.5 * (g.lonEdges[i] + g.lonEdges[i + 1]);
    } else {
      if (!(at >= -90 && at <= 90)) throw new StillwaterError('E_INPUT', `Latitude ${at} must lie between -90 and 90.`);
      const j = findInterval(g.latEdges, at);
      if (j < 0) throw new StillwaterError('E_INPUT', `Latitude ${at} lies outside the common grid (${g.latEdges[0]} to ${g.latEdges[g.ny]}).`);
      mSec = parallelSection(ms, g.nx, j);
      rSec = parallelSection(rs, g.nx, j);
      n = g.nx;
      edges = g.lonEdges;
      axis = 'longitude';
      atGrid = 0.5 * (g.latEdges[j] + g.latEdges[j + 1]);
    }
    dSec = new Float32Array(mSec.length);
    for (let q = 0; q < dSec.length; q++) dSec[q] = mSec[q] - rSec[q];
  }
  // the seafloor: below the deepest level where the model or the reference has water
  const either = new Float32Array(mSec.length);
  for (let q = 0; q < either.length; q++) either[q] = mSec[q] === mSec[q] ? mSec[q] : rSec[q];
  const seafloor = seafloorOf(levelsOf(either, nz, n), n, g.depthEdges);
  return {
    variable: input.variable,
    run: input.run,
    kind: input.kind,
    at: input.kind === 'zonal' ? null : input.at,
    atGrid,
    region: input.kind === 'zonal' ? (input.region ?? 'global') : null,
    units: pair.units,
    axis,
    edges,
    depthEdges: g.depthEdges,
    model: mSec,
    reference: rSec,
    difference: dSec,
    seafloor,
  };
}

async function profileData(s: Session, variable: string, regionName: string, ctx: ServiceContext): Promise<ProfileData> {
  const pair = await pairOf(s, variable);
  const region = await regionNamed(s, regionName);
  const g = s.info.grid;
  const sources: Source[] = [refOf(s, pair)];
  for (const label of pair.runs.keys()) sources.push(await runOf(pair, label));
  const levels: Float32Array[][] = [];
  for (let q = 0; q < sources.length; q++) {
    levels.push(await allLevels(s, pair, sources[q], ctx, `${variable}, ${sources[q].label}`, [q / sources.length, (q + 1) / sources.length]));
  }
  const ref = levels[0];
  const reference = new Float64Array(g.nz);
  for (let k = 0; k < g.nz; k++) reference[k] = areaMean(ref[k], g.area, region.cells);
  const runs = sources.slice(1).map((src, q) => {
    const values = new Float64Array(g.nz);
    // each run over the cells where it and the reference both have water, as in the skill rows
    for (let k = 0; k < g.nz; k++) values[k] = areaMean(levels[q + 1][k], g.area, region.cells, ref[k]);
    return { label: src.label, values };
  });
  return { variable, region: regionName, units: pair.units, depthCentres: g.depthCentres, depthEdges: g.depthEdges, reference, runs };
}

// ---------- entries ----------

const sessionInput = z.object({ session: z.string().min(1) });

export const viewsServices: ServiceEntry[] = [
  entry({
    name: 'view.open',
    summary: 'Open a recipe as a workbench session: sources, variables and units, regions, depth choices, the common grid.',
    input: z.object({ recipe: z.string().min(1) }),
    async run(input, ctx): Promise<SessionInfo> {
      const path = ctx.resolvePath(input.recipe);
      const recipe = await loadRecipe(path, { confine: ctx.resolvePath });
      const s = await buildSession(recipe, path, ctx);
      sessions.set(s.id, s);
      return s.info;
    },
  }),
  entry({
    name: 'view.recipe',
    summary: "The session's recipe as JSON (what Save writes), with its folder.",
    input: sessionInput,
    async run(input): Promise<{ recipe: unknown; baseDir: string }> {
      const s = sessionOf(input.session);
      return { recipe: recipeToJson(s.recipe), baseDir: s.recipe.baseDir };
    },
  }),
  entry({
    name: 'view.pair',
    summary: 'Pair a variable of a run (a file and a variable in it) with a reference variable; adds the run when it is new.',
    input: z.object({
      session: z.string().min(1),
      run: z.string().min(1),
      variable: z.string().min(1),
      file: z.string().min(1),
      name: z.string().min(1),
      units: z.string().min(1).optional(),
    }),
    async run(input, ctx): Promise<SessionInfo> {
      const s = sessionOf(input.session);
      const file = ctx.resolvePath(input.file);
      if (!s.recipe.reference.variables[input.variable]) {
        throw new StillwaterError('E_INPUT', `The reference has no variable '${input.variable}' to pair with.`, { variable: input.variable });
      }
      const json = recipeToJson(s.recipe) as { runs: { label: string; variables: Record<string, unknown> }[] };
      let run = json.runs.find((r) => r.label === input.run);
      if (!run) {
        run = { label: input.run, variables: {} };
        json.runs.push(run);
      }
      run.variables[input.variable] = { file, name: input.name, ...(input.units ? { units: input.units } : {}) };
      const recipe = validateRecipe(json, s.recipe.baseDir, { confine: ctx.resolvePath });
      const next = await buildSession(recipe, s.recipePath, ctx, s.id, true);
      // the levels already read stay valid for the other variables
      s.levels.clear(`${input.variable}\u0000`);
      next.levels = s.levels;
      sessions.set(s.id, next);
      return next.info;
    },
  }),
  entry({
    name: 'view.variables',
    summary: 'The data variables of a file (two or more dimensions), with their units and long names, for pairing.',
    input: z.object({ file: z.string().min(1) }),
    async run(input, ctx): Promise<{ name: string; units: string; longName: string; dims: string[] }[]> {
      const ds = await openDataset(ctx.resolvePath(input.file));
      try {
        const coords = new Set(ds.dimensions.map((d) => d.name));
        return ds.variables
          .filter((v) => v.dims.length >= 2 && !coords.has(v.name) && v.dtype !== 'char')
          .map((v) => ({ name: v.name, units: attrString(v.attrs, 'units') ?? '', longName: attrString(v.attrs, 'long_name') ?? attrString(v.attrs, 'standard_name') ?? '', dims: v.dims }));
      } finally {
        await ds.close();
      }
    },
  }),
  entry({
    name: 'view.save',
    summary: 'Save the session as a recipe .json file (app/output: complete or unchanged), never over a file it reads.',
    input: z.object({ session: z.string().min(1), path: z.string().min(1), screen: screenSectionSchema.optional() }),
    async run(input, ctx): Promise<{ path: string }> {
      const s = sessionOf(input.session);
      if (input.screen) s.recipe = { ...s.recipe, screen: input.screen };
      const path = ctx.resolvePath(input.path);
      checkOutputFile(path, { extension: '.json', inputs: recipeFiles(s.recipe).map((f) => f.file) });
      await writeOutputFile(path, JSON.stringify(recipeToJson(s.recipe, dirname(path)), null, 2) + '\n');
      s.recipePath = path;
      s.info = { ...s.info, recipePath: path, modified: false, ...(input.screen ? { screen: input.screen } : {}) };
      return { path };
    },
  }),
  entry({
    name: 'view.level',
    summary: 'Model, reference and difference on the common grid for one level, layer mean, or the bottom.',
    input: z.object({ session: z.string().min(1), variable: z.string().min(1), run: z.string().min(1), layer: z.string().min(1) }),
    async run(input, ctx): Promise<LevelData> {
      return levelData(sessionOf(input.session), input.variable, input.run, input.layer, ctx);
    },
  }),
  entry({
    name: 'view.region',
    summary: "The cells of the common grid (j * nx + i) that belong to one of the session's regions.",
    input: z.object({ session: z.string().min(1), region: z.string().min(1) }),
    async run(input): Promise<{ region: string; cells: Int32Array }> {
      const r = await regionNamed(sessionOf(input.session), input.region);
      return { region: r.name, cells: Int32Array.from(r.cells) };
    },
  }),
  entry({
    name: 'view.section',
    summary: 'A section along a meridian or a parallel, or the zonal mean of a region, with the seafloor.',
    input: z.object({
      session: z.string().min(1),
      variable: z.string().min(1),
      run: z.string().min(1),
      kind: z.enum(['meridian', 'parallel', 'zonal']),
      at: z.number().finite().nullable().default(null),
      region: z.string().min(1).nullable().default(null),
    }),
    async run(input, ctx): Promise<SectionData> {
      return sectionData(sessionOf(input.session), input, ctx);
    },
  }),
  entry({
    name: 'view.profile',
    summary: 'Area-weighted mean profile of a region: the reference and every run.',
    input: z.object({ session: z.string().min(1), variable: z.string().min(1), region: z.string().min(1) }),
    async run(input, ctx): Promise<ProfileData> {
      return profileData(sessionOf(input.session), input.variable, input.region, ctx);
    },
  }),
  entry({
    name: 'view.table',
    summary: 'Skill rows (a comparison result, perhaps filtered) as CSV, Markdown, LaTeX or JSON text, by the report writers.',
    input: z.object({
      result: z.object({ rows: z.array(z.record(z.string(), z.unknown())), costs: z.array(z.unknown()), variables: z.array(z.unknown()), inputs: z.array(z.unknown()) }),
      recipePath: z.string().nullable().default(null),
      format: z.enum(['csv', 'markdown', 'latex', 'json']),
    }),
    async run(input): Promise<TableText> {
      const result = input.result as unknown as ComparisonResult;
      const prov: Provenance = {
        tool: 'Stillwater workbench',
        version: 'session',
        date: new Date().toISOString(),
        recipe: input.recipePath,
        inputs: result.inputs,
        options: null,
        regions: [...new Set(result.rows.map((r) => r.region))],
        layers: [...new Set(result.rows.map((r) => r.layer))],
        variables: result.variables,
      };
      switch (input.format) {
        case 'csv':
          return { format: 'csv', fileName: 'skill.csv', mime: 'text/csv', text: skillCsv(result.rows) };
        case 'markdown':
          return { format: 'markdown', fileName: 'skill.md', mime: 'text/markdown', text: skillMarkdown(result, prov) };
        case 'latex':
          return { format: 'latex', fileName: 'skill.tex', mime: 'application/x-tex', text: skillLatex(result) };
        default:
          return { format: 'json', fileName: 'skill.json', mime: 'application/json', text: skillJson(result, prov) };
      }
    },
  }),
];

/** For tests: forget every session. */
export function closeAllViewSessions(): void {
  sessions.clear();
}
