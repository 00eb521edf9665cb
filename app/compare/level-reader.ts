/**
 * One source's values of one variable on the common grid and in the table's units, level by level.
 * Plain variables: open, regrid if the grid differs, pick the time step, convert. Derived variables:
 * each input read that way (in the reference's units of that input), then the expression.
 */
import type { FieldSource } from '../cf/field-source.js';
import { openField } from '../cf/open-field.js';
import { parseUnits, type ParsedUnits } from '../cf/units.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import { evaluateExpression, parseExpression } from '../ocean/expression.js';
import type { Recipe, SourceSpec, VariableSource } from '../recipe/types.js';
import { regridField } from '../regrid/regrid-field.js';
import type { RecipeOptions } from '../recipe/schema.js';
import { sameGrid, sameVertical } from './common-grid.js';
import { looksLikeOxygen, makeLevelConverter, type DensityInput } from './level-units.js';
import { prefixed } from './load-regions.js';
import { timedField } from './read-level.js';
import { annualLevel, type TimedField } from '../time/reduce.js';

export interface LevelReader {
  needsDensity: boolean;
  /** notes for the output: regridding, conversions */
  regridded: boolean;
  conversions: string[];
  /** how the time steps were reduced (null: the only step) */
  timeNote: string | null;
  /** total days of each month when the reader gives 12 months, else null */
  monthWeights: Float64Array | null;
  /** the level for the year (a monthly reader's months weighted by their lengths) */
  read(k: number, density: DensityInput | undefined): Promise<Float32Array>;
  /** the level's 12 months (January first), each converted with its month's density; only when monthWeights is set */
  readMonths(k: number, density: MonthDensity | undefined): Promise<Float32Array[]>;
  close(): Promise<void>;
}

/** The density input of month m (0 = January) of the level being read. */
export type MonthDensity = (m: number) => Promise<DensityInput>;

export interface ReaderContext {
  grid: Grid;
  options: RecipeOptions;
  cacheDir?: string;
  densityNote: string;
  /** the recipe asks for monthly or seasonal rows: every source must give 12 months */
  monthlyRows: boolean;
  /** every file opened, for provenance */
  noteFile(path: string): void;
}

/**
 * The units a reference variable is compared in: the recipe's choice (options.units), else the reference
 * file's own. Cached per recipe key, so each file is opened for its units once.
 */
export function referenceUnitsOf(recipe: Recipe): (key: string) => Promise<ParsedUnits> {
  const cache = new Map<string, Promise<ParsedUnits>>();
  return (key) => {
    let p = cache.get(key);
    if (!p) {
      const wanted = recipe.options.units[key];
      p = wanted
        ? prefixed(`options.units.${key}`, async () => parseUnits(wanted))
        : openSpec(recipe.reference.variables[key]).then(async (f) => {
            await f.close?.();
            return f.units;
          });
      cache.set(key, p);
      p.catch(() => cache.delete(key));
    }
    return p;
  };
}

export async function openSpec(spec: VariableSource): Promise<FieldSource> {
  return prefixed(spec.path, () => openField(spec.file, spec.name, spec.units ? { units: spec.units } : undefined));
}

/** The field on the common grid (the same object when it already is). */
export async function onGrid(field: FieldSource, spec: VariableSource, ctx: Pick<ReaderContext, 'grid' | 'options' | 'cacheDir'>): Promise<FieldSource> {
  const grid = ctx.grid;
  if (sameGrid(field.grid, grid)) return field;
  if ((field.grid.vertical === null) !== (grid.vertical === null)) {
    throw new StillwaterError('E_GRID', `${spec.path}: '${spec.name}' in ${spec.file} is ${field.grid.vertical ? '3-D' : '2-D'} but the common grid is ${grid.vertical ? '3-D' : '2-D'}.`, { path: spec.path });
  }
  // a vertical regridding reads the source levels under a target level month by month: a monthly
  // climatology keeps that many levels' months, so each is built once
  if ('keep' in field && typeof field.keep === 'function' && field.grid.vertical && grid.vertical && !sameVertical(field.grid.vertical, grid.vertical)) {
    (field as TimedField).keep(levelsUnderOneLevel(field.grid.vertical.edges, grid.vertical.edges));
  }
  return prefixed(spec.path, () => regridField(field, grid, { method: ctx.options.method, coverage: ctx.options.coverage, cacheDir: ctx.cacheDir }));
}

/** The most source layers that overlap one target layer (edges increasing downwards), at least 1. */
export function levelsUnderOneLevel(source: ArrayLike<number>, target: ArrayLike<number>): number {
  let most = 1;
  for (let k = 0; k + 1 < target.length; k++) {
    const top = Math.min(target[k], target[k + 1]);
    const bottom = Math.max(target[k], target[k + 1]);
    let n = 0;
    for (let p = 0; p + 1 < source.length; p++) {
      if (Math.min(bottom, Math.max(source[p], source[p + 1])) > Math.max(top, Math.min(source[p], source[p + 1]))) n++;
    }
    most = Math.max(most, n);
  }
  return most;
}

export async function plainReader(key: string, spec: VariableSource, target: ParsedUnits, ctx: ReaderContext, opened?: FieldSource, oxygen?: boolean): Promise<LevelReader> {
  const field = opened ?? (await openSpec(spec));
  ctx.noteFile(spec.file);
  try {
    const timed = timedField(field, spec, ctx);
    const src = await onGrid(timed, spec, ctx);
    const weights = timed.monthWeights;
    const convert = makeLevelConverter(field.units, target, `${spec.path} ('${spec.name}' in ${spec.file})`, spec.name, oxygen ?? looksLikeOxygen(key, field.standardName));
    const converted = (v: Float32Array, density: DensityInput | undefined) => (convert ? convert.apply(v, density) : v);
    return {
      needsDensity: convert?.needsDensity ?? false,
      regridded: src !== timed,
      conversions: convert ? [convert.describe(ctx.densityNote)] : [],
      timeNote: timed.timeNote,
      monthWeights: weights,
      async read(k, density) {
        return converted(await annualLevel(src, weights, k), density);
      },
      async readMonths(k, density) {
        if (!weights) throw new StillwaterError('E_INTERNAL', `${spec.path}: months were asked of a field without months.`);
        const out: Float32Array[] = [];
        for (let m = 0; m < 12; m++) out.push(converted(await src.readLevel(m, k), density ? await density(m) : undefined));
        return out;
      },
      close: async () => {
        await field.close?.().catch(() => undefined);
      },
    };
  } catch (e) {
    await field.close?.().catch(() => undefined);
    throw e;
  }
}

/**
 * A derived variable of one source: its inputs (other variables of the same source) each brought into the
 * reference's units for that input, then the expression; the result is in the units the recipe declares.
 */
export async function derivedReader(
  name: string,
  expression: string,
  source: SourceSpec,
  inputUnits: (key: string) => Promise<ParsedUnits>,
  ctx: ReaderContext,
): Promise<LevelReader> {
  const parsed = await prefixed(`options.derived.${name}.expression`, async () => parseExpression(expression));
  const readers: { key: string; reader: LevelReader }[] = [];
  const path = `options.derived.${name}.expression`;
  try {
    for (const input of parsed.inputs) {
      const spec = source.variables[input.name];
      if (!spec) throw new StillwaterError('E_RECIPE', `${path}: ${source.path} has no variable '${input.name}'.`, { path });
      const need = input.need;
      const target = need && 'units' in need ? parseUnits(need.units) : await inputUnits(input.name);
      if (need && 'salinity' in need) checkPracticalSalinity(target, input.name, path);
      const oxygen = need && 'units' in need ? need.oxygen : undefined;
      readers.push({ key: input.key, reader: await plainReader(input.name, spec, target, ctx, undefined, oxygen) });
    }
  } catch (e) {
    for (const r of readers) await r.reader.close();
    throw e;
  }
  const n = ctx.grid.horizontal.nx * ctx.grid.horizontal.ny;
  // with monthly rows every input gives 12 months (planTime refuses one that does not); their month
  // weights are the first input's
  const weights = ctx.monthlyRows ? readers[0].reader.monthWeights : null;
  const notes = [...new Set(readers.map((r) => r.reader.timeNote).filter((x): x is string => !!x))];
  return {
    needsDensity: readers.some((r) => r.reader.needsDensity),
    regridded: readers.some((r) => r.reader.regridded),
    conversions: readers.flatMap((r) => r.reader.conversions.map((c) => `${r.key}: ${c}`)),
    timeNote: notes.length ? notes.join('; ') : null,
    monthWeights: weights,
    async read(k, density) {
      const inputs: Record<string, Float32Array> = {};
      for (const r of readers) inputs[r.key] = await r.reader.read(k, density);
      return evaluateExpression(parsed, inputs, n);
    },
    async readMonths(k, density) {
      const months: Record<string, Float32Array[]> = {};
      for (const r of readers) months[r.key] = await r.reader.readMonths(k, density);
      return Array.from({ length: 12 }, (_, m) => {
        const inputs: Record<string, Float32Array> = {};
        for (const r of readers) inputs[r.key] = months[r.key][m];
        return evaluateExpression(parsed, inputs, n);
      });
    },
    async close() {
      for (const r of readers) await r.reader.close();
    },
  };
}

/** The ocean functions take practical salinity: a salinity in PSS-78 units or a plain number, not g/kg. */
function checkPracticalSalinity(units: ParsedUnits, variable: string, path: string): void {
  const practical = (units.kind === 'salinity' && units.canonical === '1e-3') || (units.kind === 'dimensionless' && units.factor === 1);
  if (!practical) {
    const what = units.kind === 'salinity' ? 'an absolute salinity' : `not a salinity (${units.kind})`;
    throw new StillwaterError('E_UNITS', `${path}: '${variable}' is in '${units.text}', ${what}; the ocean functions take practical salinity (PSS-78).`, { path });
  }
}
