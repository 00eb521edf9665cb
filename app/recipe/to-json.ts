/**
 * A recipe back to JSON (the workbench saves a session this way): paths relative to the folder the
 * recipe will be saved in where they lie below it, absolute otherwise.
 */
import { isAbsolute, relative, sep } from 'node:path';
import type { LayerSpec } from '../regions/layers.js';
import type { RecipeInput } from './schema.js';
import type { Recipe, SourceSpec, VariableSource } from './types.js';

function rel(file: string, dir: string): string {
  const r = relative(dir, file);
  return r && !r.startsWith('..') && !isAbsolute(r) ? r.split(sep).join('/') : file;
}

function sourceJson(s: SourceSpec, dir: string) {
  const variables: Record<string, { file: string; name: string; units?: string; time?: VariableSource['time'] }> = {};
  for (const [key, v] of Object.entries(s.variables)) {
    variables[key] = { file: rel(v.file, dir), name: v.name };
    if (v.units) variables[key].units = v.units;
    if (v.time !== undefined) variables[key].time = v.time;
  }
  return { label: s.label, ...(s.file ? { file: rel(s.file, dir) } : {}), variables };
}

function layerJson(l: LayerSpec): [number, number] | 'surface' | 'bottom' | 'all' {
  return l.kind === 'interval' ? [l.top, l.bottom] : l.kind;
}

export function recipeToJson(recipe: Recipe, dir: string = recipe.baseDir): RecipeInput {
  return {
    ...(recipe.title ? { title: recipe.title } : {}),
    reference: sourceJson(recipe.reference, dir),
    runs: recipe.runs.map((r) => ({
      ...sourceJson(r, dir),
      ...(r.snapshots ? { snapshots: r.snapshots.map((s) => ({ file: rel(s.file, dir), ...(s.year !== undefined ? { year: s.year } : {}) })) } : {}),
    })),
    regions: recipe.regions.map((r) => {
      if (r.kind === 'built-in') return r.name as 'global';
      if (r.kind === 'mask') return { mask: rel(r.file, dir), variable: r.variable, ...(r.flags ? { flags: r.flags } : {}) };
      return { geojson: rel(r.file, dir), property: r.property, ...(r.features ? { features: r.features } : {}) };
    }),
    layers: recipe.layers.map(layerJson),
    options: recipe.options,
    ...(recipe.report ? { report: recipe.report } : {}),
    ...(recipe.screen ? { screen: recipe.screen } : {}),
  };
}
