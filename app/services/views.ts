/**
 * What the workbench's views draw, as service entries: open a recipe as a session, then slices of its
 * fields on the common grid (levels, layer means, the bottom, sections, zonal means, profiles) and the
 * skill rows. Fields are opened and regridded once per session and their levels kept in a bounded cache,
 * so that a change of depth is fast.
 */
import { randomUUID } from 'node:crypto';
import { rename, writeFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { z } from 'zod';
import type { FieldSource } from '../cf/field.js';
import { openField } from '../cf/open-field.js';
import { parseUnits, type ParsedUnits } from '../cf/units.js';
import { commonGridFor, sameGrid } from '../compare/common-grid.js';
import { densityProvider, type DensityProvider } from '../compare/density.js';
import { makeLevelConverter, type LevelConverter } from '../compare/level-units.js';
import { loadRegions, prefixed } from '../compare/load-regions.js';
import { readLevelAt, timeIndex } from '../compare/read-level.js';
import { runComparison } from '../compare/run.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import { loadRecipe, recipeToJson, validateRecipe } from '../recipe/index.js';
import type { Recipe, VariableSource } from '../recipe/types.js';
import { regridField } from '../regrid/field.js';
import { layerLevelMetres, type LayerSpec } from '../regions/layers.js';
import type { Region } from '../regions/region.js';
import { areaMean, atLevels, bottomLevels, layerMeans, levelsOf, meridianSection, parallelSection, seafloorOf, zonalMeans } from '../render/slices.js';
import { findInterval } from '../render/pixel-lookup.js';
import type { LayerChoice, LevelData, ProfileData, SectionData, SessionInfo, SkillData, SkillRowView, SourceInfo, TableText, ViewGrid } from '../render/view-types.js';
import { entry, type ServiceContext, type ServiceEntry } from './types.js';

// ---------- sessions ----------

interface Prepared {
  label: string;
  onGrid: FieldSource;
  t: number | 'mean';
  convert: LevelConverter | null;
}

interface Pair {
  variable: string;
  units: string;
  reference: Prepared;
  runs: Map<string, Prepared>;
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
  levels: LevelCache;
  cacheDir: string;
}

/** Levels kept per session: newest last, bounded by bytes. */
class LevelCache {
  private readonly map = new Map<string, Promise<Float32Array>>();
  private bytes = 0;
  private readonly sizes = new Map<string, number>();
  constructor(private readonly limit: number) {}
  get(key: string, make: () => Promise<Float32Array>): Promise<Float32Array> {
    const hit = this.map.get(key);
    if (hit) {
      this.map.delete(key);
      this.map.set(key, hit);
      return hit;
    }
    const p = make();
    this.map.set(key, p);
    p.then(
      (a) => {
        if (this.map.get(key) !== p) return;
        this.sizes.set(key, a.byteLength);
        this.bytes += a.byteLength;
        this.trim();
      },
      () => this.map.delete(key),
    );
    return p;
  }
  private trim(): void {
    while (this.bytes > this.limit && this.map.size > 1) {
      const oldest = this.map.keys().next().value as string;
      this.map.delete(oldest);
      this.bytes -= this.sizes.get(oldest) ?? 0;
      this.sizes.delete(oldest);
    }
  }
  clear(prefix: string): void {
    for (const k of [...this.map.keys()]) {
      if (!k.startsWith(prefix)) continue;
      this.map.delete(k);
      this.bytes -= this.sizes.get(k) ?? 0;
      this.sizes.delete(k);
    }
  }
}

const LEVEL_CACHE_BYTES = 512 * 1024 * 1024;
const sessions = new Map<string, Session>();

function sessionOf(id: string): Session {
  const s = sessions.get(id);
  if (!s) throw new StillwaterError('E_INPUT', `The workbench session '${id}' is no longer open; open the recipe again.`);
  return s;
}

/** Every file a recipe names must lie in the folders this workbench may read. */
function guardRecipe(recipe: Recipe, ctx: ServiceContext): void {
  const check = (file: string | undefined, path: string): void => {
    if (!file) return;
    try {
      ctx.resolvePath(file);
    } catch (e) {
      if (e instanceof StillwaterError) throw new StillwaterError(e.code, `${path}: ${e.message}`, { ...e.subject, path });
      throw e;
    }
  };
  const source = (s: Recipe['reference'], path: string): void => {
    check(s.file, `${path}.file`);
    for (const [k, v] of Object.entries(s.variables)) check(v.file, `${path}.variables.${k}.file`);
    s.snapshots?.forEach((x, i) => check(x.file, `${path}.snapshots[${i}].file`));
  };
  source(recipe.reference, 'reference');
  recipe.runs.forEach((r, i) => source(r, `runs[${i}]`));
  recipe.regions.forEach((r, i) => {
    if (r.kind !== 'built-in') check(r.file, `regions[${i}]`);
  });
}

function tableUnits(u: ParsedUnits): string {
  return u.kind === 'other' ? u.text.trim() : u.canonical;
}

async function describeSource(spec: Recipe['reference']): Promise<SourceInfo> {
  const variables: SourceInfo['variables'] = [];
  for (const [key, v] of Object.entries(spec.variables)) {
    try {
      const f = await openField(v.file, v.name, v.units ? { units: v.units } : undefined);
      variables.push({ key, file: v.file, name: v.name, units: f.units.text, longName: f.longName ?? f.standardName });
      await f.close?.();
    } catch (e) {
      variables.push({ key, file: v.file, name: v.name, units: '?', longName: e instanceof Error ? e.message : String(e) });
    }
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
  const refField = await prefixed(refSpec.path, () => openField(refSpec.file, refSpec.name, refSpec.units ? { units: refSpec.units } : undefined));
  const grid = commonGridFor(recipe.options.commonGrid, refField.grid);
  await refField.close?.();
  const reference = await describeSource(recipe.reference);
  const runs = await Promise.all(recipe.runs.map((r) => describeSource(r)));
  const variables = recipe.variables
    .filter((key) => recipe.reference.variables[key])
    .map((key) => {
      const refVar = reference.variables.find((v) => v.key === key);
      const wanted = recipe.options.units[key];
      let units = refVar?.units ?? '';
      try {
        units = tableUnits(parseUnits(wanted ?? units));
      } catch {
        /* units that do not parse are shown as written; opening the pair reports them */
      }
      return { key, units, longName: refVar?.longName ?? key, runs: recipe.runs.filter((r) => r.variables[key]).map((r) => r.label) };
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
    modified,
  };
  return { id, recipePath, recipe, grid, info, pairs: new Map(), regions: null, levels: new LevelCache(LEVEL_CACHE_BYTES), cacheDir: ctx.cacheDir };
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
  const refSpec = recipe.reference.variables[variable];
  if (!refSpec) throw new StillwaterError('E_INPUT', `The reference has no variable '${variable}'.`, { variable });
  const regrid = async (src: FieldSource, spec: VariableSource): Promise<FieldSource> => {
    if (sameGrid(src.grid, grid)) return src;
    if ((src.grid.vertical === null) !== (grid.vertical === null)) {
      throw new StillwaterError('E_GRID', `${spec.path}: '${spec.name}' in ${spec.file} is ${src.grid.vertical ? '3-D' : '2-D'} but the common grid is ${grid.vertical ? '3-D' : '2-D'}.`, { path: spec.path });
    }
    return prefixed(spec.path, () => regridField(src, grid, { method: recipe.options.method, coverage: recipe.options.coverage, cacheDir: s.cacheDir }));
  };
  const open = (spec: VariableSource): Promise<FieldSource> => prefixed(spec.path, () => openField(spec.file, spec.name, spec.units ? { units: spec.units } : undefined));
  const refField = await open(refSpec);
  const wanted = recipe.options.units[variable];
  const target = wanted ? await prefixed(`options.units.${variable}`, async () => parseUnits(wanted)) : refField.units;
  const prepare = async (label: string, spec: VariableSource, field: FieldSource): Promise<Prepared> => {
    const onGrid = await regrid(field, spec);
    const t = timeIndex(onGrid, spec.time);
    if (t !== 'mean' && (t < 0 || t >= onGrid.nt)) {
      throw new StillwaterError('E_RECIPE', `${spec.path}.time: step ${t} is outside the file's ${onGrid.nt} time steps.`, { path: `${spec.path}.time` });
    }
    const convert = makeLevelConverter(field.units, target, `${spec.path} ('${spec.name}' in ${spec.file})`);
    return { label, onGrid, t, convert };
  };
  const reference = await prepare(recipe.reference.label, refSpec, refField);
  const runs = new Map<string, Prepared>();
  for (const run of recipe.runs) {
    const spec = run.variables[variable];
    if (spec) runs.set(run.label, await prepare(run.label, spec, await open(spec)));
  }
  return { variable, units: tableUnits(target), reference, runs, density: densityProvider(recipe, grid, regrid) };
}

/** One level of one source on the common grid, in the comparison's units (cached). */
async function level(s: Session, pair: Pair, source: Prepared, k: number): Promise<Float32Array> {
  return s.levels.get(`${pair.variable}\u0000${source.label}\u0000${source === pair.reference ? 'ref' : 'run'}\u0000${k}`, async () => {
    const v = await readLevelAt(source.onGrid, source.t, k);
    if (source.convert) source.convert.apply(v, source.convert.needsDensity ? await pair.density.level(k) : undefined);
    return v;
  });
}

function runOf(pair: Pair, run: string): Prepared {
  const r = pair.runs.get(run);
  if (!r) throw new StillwaterError('E_INPUT', `The run '${run}' has no variable '${pair.variable}'.`, { variable: pair.variable });
  return r;
}

async function allLevels(s: Session, pair: Pair, source: Prepared, ctx: ServiceContext, what: string, share: [number, number] = [0, 1]): Promise<Float32Array[]> {
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
  const model = runOf(pair, run);
  const g = s.info.grid;
  const base = { variable, run, layer, units: pair.units };
  if (layer.kind === 'level') {
    const k = layer.k ?? 0;
    const [m, r] = await Promise.all([level(s, pair, model, k), level(s, pair, pair.reference, k)]);
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
  const rs = await allLevels(s, pair, pair.reference, ctx, `${variable}, ${s.recipe.reference.label}`, [0.5, 1]);
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
  const model = runOf(pair, input.run);
  const g = s.info.grid;
  const ms = await allLevels(s, pair, model, ctx, `${input.variable}, ${input.run}`, [0, 0.5]);
  const rs = await allLevels(s, pair, pair.reference, ctx, `${input.variable}, ${s.recipe.reference.label}`, [0.5, 1]);
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
  const sources = [pair.reference, ...pair.runs.values()];
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

// ---------- tables ----------

function cellText(v: unknown): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '';
  return String(v);
}

function csvCell(t: string): string {
  return /[",\n\r]/.test(t) ? `"${t.replace(/"/g, '""')}"` : t;
}

function num(v: unknown, digits = 4): string {
  if (typeof v !== 'number' || !Number.isFinite(v)) return '—';
  if (v === 0) return '0';
  const a = Math.abs(v);
  return a >= 1e5 || a < 1e-3 ? v.toExponential(digits - 1) : Number(v.toPrecision(digits)).toString();
}

const TEXT_COLUMNS = new Set(['run', 'variable', 'region', 'layer', 'units', 'weight_units', 'note']);

function latexEscape(t: string): string {
  return t.replace(/\\/g, '\\textbackslash{}').replace(/([&%$#_{}])/g, '\\$1').replace(/~/g, '\\textasciitilde{}').replace(/\^/g, '\\textasciicircum{}').replace(/µ/g, '\\textmu{}').replace(/−/g, '-').replace(/–/g, '--');
}

/** The skill table as text. CSV (RFC 4180), GitHub-style Markdown, a LaTeX booktabs tabular, JSON. */
export function skillTableText(rows: SkillRowView[], columns: string[], format: TableText['format']): TableText {
  switch (format) {
    case 'csv': {
      const lines = [columns.join(','), ...rows.map((r) => columns.map((c) => csvCell(cellText(r[c]))).join(','))];
      return { format, fileName: 'skill.csv', mime: 'text/csv', text: lines.join('\r\n') + '\r\n' };
    }
    case 'markdown': {
      const head = `| ${columns.join(' | ')} |`;
      const rule = `|${columns.map((c) => (TEXT_COLUMNS.has(c) ? ' --- ' : ' ---: ')).join('|')}|`;
      const body = rows.map((r) => `| ${columns.map((c) => (TEXT_COLUMNS.has(c) ? cellText(r[c]).replace(/\|/g, '\\|') : num(r[c]))).join(' | ')} |`);
      return { format, fileName: 'skill.md', mime: 'text/markdown', text: [head, rule, ...body].join('\n') + '\n' };
    }
    case 'latex': {
      const spec = columns.map((c) => (TEXT_COLUMNS.has(c) ? 'l' : 'r')).join('');
      const lines = [
        `\\begin{tabular}{${spec}}`,
        '\\toprule',
        columns.map((c) => latexEscape(c)).join(' & ') + ' \\\\',
        '\\midrule',
        ...rows.map((r) => columns.map((c) => (TEXT_COLUMNS.has(c) ? latexEscape(cellText(r[c])) : num(r[c]))).join(' & ') + ' \\\\'),
        '\\bottomrule',
        '\\end{tabular}',
      ];
      return { format, fileName: 'skill.tex', mime: 'application/x-tex', text: lines.join('\n') + '\n' };
    }
    case 'json':
      return {
        format,
        fileName: 'skill.json',
        mime: 'application/json',
        text: JSON.stringify(rows.map((r) => Object.fromEntries(columns.map((c) => [c, typeof r[c] === 'number' && !Number.isFinite(r[c] as number) ? null : (r[c] ?? null)]))), null, 1) + '\n',
      };
  }
}

const COLUMN_ORDER = ['run', 'variable', 'region', 'layer', 'units', 'n', 'weight', 'model_mean', 'ref_mean', 'bias', 'rmse', 'crmse', 'corr', 'model_std', 'ref_std', 'std_ratio'];

// ---------- entries ----------

const sessionInput = z.object({ session: z.string().min(1) });
const recipeJsonInput = z.object({ recipe: z.unknown(), baseDir: z.string().min(1) });

async function writeAtomically(path: string, text: string): Promise<void> {
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.${Date.now()}.tmp`);
  await writeFile(tmp, text, 'utf8');
  await rename(tmp, path);
}

export const viewsServices: ServiceEntry[] = [
  entry({
    name: 'view.open',
    summary: 'Open a recipe as a workbench session: sources, variables and units, regions, depth choices, the common grid.',
    input: z.object({ recipe: z.string().min(1) }),
    async run(input, ctx): Promise<SessionInfo> {
      const path = ctx.resolvePath(input.recipe);
      const recipe = await loadRecipe(path);
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
      const recipe = validateRecipe(json, s.recipe.baseDir);
      const next = await buildSession(recipe, s.recipePath, ctx, s.id, true);
      // the levels already read stay valid for the other variables
      s.levels.clear(`${input.variable}\u0000`);
      next.levels = s.levels;
      sessions.set(s.id, next);
      return next.info;
    },
  }),
  entry({
    name: 'view.save',
    summary: 'Save the session as a recipe file (written to a temporary file, then renamed into place).',
    input: z.object({ session: z.string().min(1), path: z.string().min(1) }),
    async run(input, ctx): Promise<{ path: string }> {
      const s = sessionOf(input.session);
      if (!/\.json$/i.test(input.path)) throw new StillwaterError('E_INPUT', `${input.path}: a recipe is saved as a .json file.`, { file: input.path });
      const path = ctx.resolvePath(input.path);
      await writeAtomically(path, JSON.stringify(recipeToJson(s.recipe, dirname(path)), null, 2) + '\n');
      s.recipePath = path;
      s.info = { ...s.info, recipePath: path, modified: false };
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
    name: 'view.skill',
    summary: 'Skill rows of the recipe: every run × variable × region × layer.',
    input: recipeJsonInput,
    heavy: true,
    async run(input, ctx): Promise<SkillData> {
      const recipe = validateRecipe(input.recipe, ctx.resolvePath(input.baseDir));
      guardRecipe(recipe, ctx);
      const result = await runComparison(recipe, { cacheDir: ctx.cacheDir, onProgress: (f, m) => ctx.progress(f, m), signal: ctx.signal });
      const rows = result.rows as unknown as SkillRowView[];
      const extra = new Set<string>();
      for (const r of rows) for (const k of Object.keys(r)) if (!COLUMN_ORDER.includes(k)) extra.add(k);
      return { rows, columns: [...COLUMN_ORDER, ...extra] };
    },
  }),
  entry({
    name: 'view.table',
    summary: 'The skill table as CSV, Markdown, LaTeX or JSON text.',
    input: z.object({
      rows: z.array(z.record(z.string(), z.union([z.string(), z.number(), z.null()]))),
      columns: z.array(z.string().min(1)).min(1),
      format: z.enum(['csv', 'markdown', 'latex', 'json']),
    }),
    async run(input): Promise<TableText> {
      return skillTableText(input.rows as SkillRowView[], input.columns, input.format);
    },
  }),
];

/** For tests: forget every session. */
export function closeAllViewSessions(): void {
  sessions.clear();
}
