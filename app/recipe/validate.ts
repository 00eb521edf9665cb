/**
 * Recipe validation: schema first (with the exact path of the first problem), then the things a schema
 * cannot see: files that must exist, variable keys that must match, derived names that must not clash.
 * Relative paths resolve against the recipe's folder.
 */
import { existsSync, statSync } from 'node:fs';
import { isAbsolute, resolve } from 'node:path';
import { StillwaterError } from '../errors.js';
import type { LayerSpec } from '../regions/layers.js';
import { parseUnits } from '../cf/units.js';
import { parseExpression } from '../ocean/expression.js';
import { formatPath } from './path-text.js';
import { recipeSchema, type LayerEntry, type ParsedRecipe, type RegionEntry } from './schema.js';
import type { Recipe, ResolvedRegion, SourceSpec, VariableSource } from './types.js';

/**
 * Most cells of a regular common grid: 0.1° over the globe (3600 x 1800). A finer spacing (or a damaged one such
 * as 1e-9) is refused before any grid is allocated. Documented in RECIPE.md.
 */
export const MAX_COMMON_GRID_CELLS = 3600 * 1800;

/** A table keyed by names from the recipe: no prototype, so a key such as `constructor` finds only itself. */
function table<T>(entries: Iterable<[string, T]>): Record<string, T> {
  const out = Object.create(null) as Record<string, T>;
  for (const [k, v] of entries) out[k] = v;
  return out;
}

/** Keys a JSON object may not use: `__proto__` would be dropped or change the object's prototype on the way in. */
function refuseProtoKeys(json: unknown): void {
  const check = (obj: unknown, path: string): void => {
    if (obj && typeof obj === 'object' && !Array.isArray(obj) && Object.prototype.hasOwnProperty.call(obj, '__proto__')) {
      throw recipeError(path, "'__proto__' cannot be used as a name.");
    }
  };
  const j = json as { reference?: { variables?: unknown }; runs?: { variables?: unknown }[]; options?: { derived?: unknown; units?: unknown } } | null;
  if (!j || typeof j !== 'object') return;
  check(j, 'recipe');
  check(j.reference?.variables, 'reference.variables');
  if (Array.isArray(j.runs)) j.runs.forEach((r, i) => check(r?.variables, `runs[${i}].variables`));
  check(j.options?.derived, 'options.derived');
  check(j.options?.units, 'options.units');
}

function recipeError(path: string, sentence: string): StillwaterError {
  return new StillwaterError('E_RECIPE', `${path}: ${sentence}`, { path });
}

function issueSentence(issue: { code: string; message: string; keys?: string[] }): string {
  if (issue.code === 'unrecognized_keys' && issue.keys) {
    return issue.keys.length === 1 ? `unknown key '${issue.keys[0]}'` : `unknown keys ${issue.keys.map((k) => `'${k}'`).join(', ')}`;
  }
  if (issue.code === 'invalid_type' && /received undefined/.test(issue.message)) return 'is required';
  return issue.message.replace(/^Invalid input: /, '').replace(/\.$/, '');
}

export interface ValidateOptions {
  /**
   * Called with every file the recipe names before anything looks at the disk; throws for a file that may
   * not be read (browser mode), so that whether a file outside the allowed folders exists is never told.
   */
  confine?: (file: string) => void;
}

/** Where the files are taken from, and who may refuse them. */
interface Place {
  baseDir: string;
  confine?: (file: string) => void;
}

function existingFile(place: Place, file: string, path: string): string {
  const abs = isAbsolute(file) ? file : resolve(place.baseDir, file);
  if (place.confine) {
    try {
      place.confine(abs);
    } catch (e) {
      if (e instanceof StillwaterError) throw new StillwaterError(e.code, `${path}: ${e.message}`, { ...e.subject, path });
      throw e;
    }
  }
  if (!existsSync(abs)) throw recipeError(path, `no such file '${abs}'.`);
  if (!statSync(abs).isFile()) throw recipeError(path, `'${abs}' is not a file.`);
  return abs;
}

function resolveSource(src: ParsedRecipe['reference'] | ParsedRecipe['runs'][number], path: string, place: Place): SourceSpec {
  const file = src.file ? existingFile(place, src.file, `${path}.file`) : undefined;
  const variables = table<VariableSource>([]);
  for (const [key, entry] of Object.entries(src.variables)) {
    const vpath = `${path}.variables${formatPath([key]).startsWith('[') ? '' : '.'}${formatPath([key])}`;
    const v = typeof entry === 'string' ? { name: entry } : entry;
    let vfile: string;
    if (v.file) vfile = existingFile(place, v.file, `${vpath}.file`);
    else if (file) vfile = file;
    else throw recipeError(`${vpath}.file`, `no file given (and ${path} has no file of its own).`);
    variables[key] = { file: vfile, name: v.name ?? key, units: v.units, time: v.time, path: vpath };
  }
  const snapshots = 'snapshots' in src && src.snapshots
    ? src.snapshots.map((s, i) => ({ file: existingFile(place, s.file, `${path}.snapshots[${i}].file`), year: s.year }))
    : undefined;
  return { label: src.label, file, variables, snapshots, path };
}

function resolveRegion(r: RegionEntry, i: number, place: Place): ResolvedRegion {
  const path = `regions[${i}]`;
  if (typeof r === 'string') return { kind: 'built-in', name: r };
  if ('mask' in r) return { kind: 'mask', file: existingFile(place, r.mask, `${path}.mask`), variable: r.variable, flags: r.flags, path };
  return { kind: 'geojson', file: existingFile(place, r.geojson, `${path}.geojson`), property: r.property ?? 'name', features: r.features, path };
}

function lowerFirst(s: string): string {
  return s.charAt(0).toLowerCase() + s.slice(1);
}

export function layerFromEntry(l: LayerEntry): LayerSpec {
  if (Array.isArray(l)) return { kind: 'interval', top: l[0], bottom: l[1] };
  return { kind: l };
}

/** Validate parsed JSON as a recipe; `baseDir` is the folder relative paths are taken from. */
export function validateRecipe(json: unknown, baseDir: string, opts: ValidateOptions = {}): Recipe {
  const place: Place = { baseDir, confine: opts.confine };
  refuseProtoKeys(json);
  const parsed = recipeSchema.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw recipeError(formatPath(issue.path), `${issueSentence(issue as { code: string; message: string; keys?: string[] })}.`);
  }
  const p = parsed.data;
  const reference = resolveSource(p.reference, 'reference', place);
  const runs = p.runs.map((r, i) => resolveSource(r, `runs[${i}]`, place));
  const refKeys = Object.keys(reference.variables);
  if (refKeys.length === 0) throw recipeError('reference.variables', 'names no variable.');
  const derivedKeys = Object.keys(p.options.derived);
  for (const d of derivedKeys) {
    const path = `options.derived.${d}`;
    if (refKeys.includes(d)) throw recipeError(path, `clashes with the reference variable '${d}'.`);
    const def = p.options.derived[d];
    let used: string[];
    try {
      used = parseExpression(def.expression).variables;
    } catch (e) {
      throw recipeError(`${path}.expression`, lowerFirst((e as Error).message));
    }
    if (used.length === 0) throw recipeError(`${path}.expression`, 'uses no variable.');
    for (const u of used) if (!refKeys.includes(u)) throw recipeError(`${path}.expression`, `the reference has no variable '${u}'.`);
    try {
      parseUnits(def.units);
    } catch (e) {
      throw recipeError(`${path}.units`, lowerFirst((e as Error).message));
    }
  }
  runs.forEach((run) => {
    for (const key of Object.keys(run.variables)) {
      if (!refKeys.includes(key)) throw recipeError(run.variables[key].path, `the reference has no variable '${key}' to compare with.`);
    }
  });
  const known = [...refKeys, ...derivedKeys];
  for (const key of Object.keys(p.options.units)) if (!known.includes(key)) throw recipeError(`options.units.${key}`, `no such variable in the recipe.`);
  p.options.logStats.forEach((key, i) => {
    if (!known.includes(key)) throw recipeError(`options.logStats[${i}]`, `no such variable '${key}' in the recipe.`);
  });
  if (typeof p.options.density === 'object') {
    for (const which of ['temperature', 'salinity'] as const) {
      const key = p.options.density.fields[which];
      if (!refKeys.includes(key)) throw recipeError(`options.density.fields.${which}`, `the reference has no variable '${key}'.`);
    }
  }
  if (typeof p.options.commonGrid === 'object') {
    const { dlon, dlat } = p.options.commonGrid.regular;
    const cells = Math.ceil(360 / dlon) * Math.ceil(180 / dlat);
    if (!(cells <= MAX_COMMON_GRID_CELLS)) {
      throw recipeError(
        'options.commonGrid.regular',
        `a ${dlon}° x ${dlat}° grid has ${Number.isFinite(cells) ? cells.toExponential(2) : 'too many'} cells, more than the ${MAX_COMMON_GRID_CELLS} (0.1° over the globe) a common grid may have.`,
      );
    }
  }
  if (typeof p.options.commonGrid === 'object' && p.options.commonGrid.depthEdges) {
    const e = p.options.commonGrid.depthEdges;
    for (let k = 1; k < e.length; k++) {
      if (!(e[k] > e[k - 1])) throw recipeError(`options.commonGrid.depthEdges[${k}]`, 'depth edges must increase downwards.');
    }
  }
  return {
    title: p.title,
    baseDir,
    reference,
    runs,
    regions: p.regions.map((r, i) => resolveRegion(r, i, place)),
    layers: p.layers.map(layerFromEntry),
    options: { ...p.options, derived: table(Object.entries(p.options.derived)), units: table(Object.entries(p.options.units)) },
    variables: known,
    ...(p.report ? { report: p.report } : {}),
    ...(p.screen ? { screen: p.screen } : {}),
  };
}
