/**
 * Every file a validated recipe names, each with its recipe path: the sources' own files, every variable's
 * file (so the inputs of derived variables and the temperature and salinity used for density are among
 * them: they are reference variables), spin-up snapshots, mask and GeoJSON regions, and the report section's
 * stations files (kept as written there, so resolved against the recipe's folder here). The path guard
 * (app/services/guard.ts) and the output-target checks walk this one list.
 */
import { isAbsolute, resolve } from 'node:path';
import type { Recipe, SourceSpec } from './types.js';

export interface NamedFile {
  /** absolute path */
  file: string;
  /** recipe path, e.g. runs[1].variables.O2.file */
  path: string;
}

function sourceFiles(s: SourceSpec): NamedFile[] {
  return [
    ...(s.file ? [{ file: s.file, path: `${s.path}.file` }] : []),
    ...Object.values(s.variables).map((v) => ({ file: v.file, path: `${v.path}.file` })),
    ...(s.snapshots ?? []).map((x, i) => ({ file: x.file, path: `${s.path}.snapshots[${i}].file` })),
  ];
}

export function recipeFiles(recipe: Recipe): NamedFile[] {
  return [
    ...sourceFiles(recipe.reference),
    ...recipe.runs.flatMap(sourceFiles),
    ...recipe.regions.flatMap((r) => (r.kind === 'built-in' ? [] : [{ file: r.file, path: `${r.path}.${r.kind === 'mask' ? 'mask' : 'geojson'}` }])),
    ...(recipe.report?.stations ?? []).map((s, i) => ({ file: isAbsolute(s.file) ? s.file : resolve(recipe.baseDir, s.file), path: `report.stations[${i}].file` })),
  ];
}
