/**
 * What the workbench shows of a recipe before any field is read: the sources with their variables and units
 * (from the files' headers), the variables to compare with the runs that have them, the regions, the depth
 * choices and the common grid as the views draw it.
 */
import { basename } from 'node:path';
import { parseUnits } from '../cf/units.js';
import { unitsText } from '../compare/open-pair.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import { openDataset } from '../io/open.js';
import { attrString, findVariable, type RawDataset } from '../io/types.js';
import { parseExpression } from '../ocean/expression.js';
import type { Recipe } from '../recipe/types.js';
import type { LayerSpec } from '../regions/layers.js';
import { recipeProblems } from '../services/recipe-problems.js';
import { sessionPeriods } from './periods.js';
import type { LayerChoice, SessionInfo, SourceInfo, ViewGrid } from '../../contract/view-types.js';

/**
 * Variables and units of a source as its files declare them (the recipe's units win). Only headers are read,
 * each file once: the fields themselves are opened when a view asks for them.
 */
async function describeSource(spec: Recipe['reference'], header: (file: string) => Promise<RawDataset | Error>): Promise<SourceInfo> {
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

export function viewGrid(grid: Grid): ViewGrid {
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

export async function sessionInfo(recipe: Recipe, recipePath: string, grid: Grid, id: string, modified: boolean): Promise<SessionInfo> {
  const headers = new Map<string, Promise<RawDataset | Error>>();
  const header = (file: string): Promise<RawDataset | Error> => {
    let h = headers.get(file);
    if (!h) {
      h = openDataset(file).catch((e: unknown) => (e instanceof Error ? e : new Error(String(e))));
      headers.set(file, h);
    }
    return h;
  };
  let reference: SourceInfo;
  const runs: SourceInfo[] = [];
  try {
    reference = await describeSource(recipe.reference, header);
    for (const r of recipe.runs) runs.push(await describeSource(r, header));
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
      let units = recipe.options.units[key] ?? derived?.units ?? refVar?.units ?? '';
      try {
        units = unitsText(parseUnits(units));
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
  return {
    session: id,
    recipePath,
    title: recipe.title ?? basename(recipePath).replace(/\.json$/i, ''),
    reference,
    runs,
    variables,
    regions: recipe.regions.map((r) => (r.kind === 'built-in' ? r.name : r.kind === 'mask' ? r.variable : basename(r.file))),
    layers: layerChoices(recipe, grid),
    grid: viewGrid(grid),
    ...sessionPeriods(recipe),
    ...(recipe.screen ? { screen: recipe.screen } : {}),
    problems: recipeProblems(recipe, reference, runs),
    modified,
  };
}
