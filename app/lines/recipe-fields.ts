/**
 * The reference and the runs of a recipe for one variable, ready to sample: on the comparison's common
 * grid (or each run on its own grid, for stations), at the recipe's time step, in one set of units.
 * Built on the compare machinery's level readers (regridding, time step, unit and density handling,
 * derived variables), so lines and points see exactly the fields that the skill tables see.
 */
import type { FieldSource } from '../cf/field.js';
import { parseUnits, type ParsedUnits } from '../cf/units.js';
import { commonGridFor } from '../compare/common-grid.js';
import { densityProvider, type DensityProvider } from '../compare/density.js';
import { derivedReader, onGrid, openSpec, plainReader, referenceUnitsOf, type LevelReader, type ReaderContext } from '../compare/level-reader.js';
import { prefixed } from '../compare/load-regions.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import { parseExpression } from '../ocean/expression.js';
import type { Recipe, SourceSpec } from '../recipe/types.js';
import type { NamedField } from './line-report.js';

export interface PreparedFields {
  variable: string;
  /** the units every field is delivered in */
  units: ParsedUnits;
  /** the common grid (runs prepared `native` may be on their own grids) */
  grid: Grid;
  reference: NamedField;
  runs: NamedField[];
  /** how sources were converted or regridded, for the output */
  notes: string[];
  close(): Promise<void>;
}

export interface PrepareOptions {
  cacheDir?: string;
  /** deliver in these units instead of the recipe's table units */
  units?: ParsedUnits;
  /**
   * leave plain (not derived) run variables on their own grids (station sampling) instead of regridding
   * them; where a conversion needs density from temperature and salinity fields, they are regridded anyway
   */
  native?: boolean;
}

/** A level reader seen as a field with one time step (the reader already picked it). */
function readerField(reader: LevelReader, grid: Grid, units: ParsedUnits, variable: string, file: string, density: DensityProvider): FieldSource {
  return {
    file,
    variable,
    units,
    grid,
    nt: 1,
    time: null,
    async readLevel(_t: number, k: number): Promise<Float32Array> {
      return reader.read(k, reader.needsDensity ? await density.level(k) : undefined);
    },
    close: () => reader.close(),
  };
}

export async function prepareFields(recipe: Recipe, variable: string, opts: PrepareOptions = {}): Promise<PreparedFields> {
  const derived = recipe.options.derived[variable];
  if (!recipe.reference.variables[variable] && !derived) {
    const known = [...Object.keys(recipe.reference.variables), ...Object.keys(recipe.options.derived)].join(', ') || 'none';
    throw new StillwaterError('E_INPUT', `--var ${variable}: the recipe's reference has no variable '${variable}' (it has: ${known}).`, { variable });
  }
  const closers: (() => Promise<void>)[] = [];
  const close = async () => {
    for (const c of closers.reverse()) await c().catch(() => undefined);
  };
  try {
    // the common grid follows the reference field (of the first input, for a derived variable)
    const gridKey = derived ? (await prefixed(`options.derived.${variable}.expression`, async () => parseExpression(derived.expression))).variables[0] : variable;
    const gridSpec = recipe.reference.variables[gridKey];
    const refField = await openSpec(gridSpec);
    const grid = commonGridFor(recipe.options.commonGrid, refField.grid);
    const density = densityProvider(recipe, grid, async (spec) => onGrid(await openSpec(spec), spec, { grid, options: recipe.options, cacheDir: opts.cacheDir }));
    closers.push(() => density.close());
    const notes: string[] = [];
    const ctx: ReaderContext = { grid, options: recipe.options, cacheDir: opts.cacheDir, densityNote: density.note, noteFile: () => undefined };
    const unitsOf = referenceUnitsOf(recipe);
    let units: ParsedUnits;
    if (opts.units) units = opts.units;
    else if (derived) units = await prefixed(`options.derived.${variable}.units`, async () => parseUnits(derived.units));
    else units = recipe.options.units[variable] ? await unitsOf(variable) : refField.units;

    const prepare = async (source: SourceSpec, native: boolean): Promise<NamedField | null> => {
      let reader: LevelReader;
      let onGridOf = grid;
      if (derived) {
        if (!parseExpression(derived.expression).variables.every((k) => source.variables[k])) return null;
        reader = await derivedReader(variable, derived.expression, source, unitsOf, ctx);
      } else {
        const spec = source.variables[variable];
        if (!spec) return null;
        const field = source === recipe.reference ? refField : await openSpec(spec);
        let readerCtx = ctx;
        if (native) {
          readerCtx = { ...ctx, grid: field.grid };
          onGridOf = field.grid;
        }
        reader = await plainReader(variable, spec, units, readerCtx, field);
        if (native && reader.needsDensity && recipe.options.density !== 'nominal') {
          // the density fields live on the common grid: sample this run there instead
          await reader.close();
          onGridOf = grid;
          reader = await plainReader(variable, spec, units, ctx);
          notes.push(`${source.label}: sampled on the common grid, where the density for its unit conversion is known`);
        }
      }
      closers.push(() => reader.close());
      if (reader.regridded) notes.push(`${source.label}: regridded onto the common grid (${recipe.options.method})`);
      for (const c of reader.conversions) notes.push(`${source.label}: ${c}`);
      const file = derived ? source.path : source.variables[variable].file;
      return { label: source.label, field: readerField(reader, onGridOf, units, variable, file, density) };
    };
    const reference = await prepare(recipe.reference, false);
    if (!reference) throw new StillwaterError('E_RECIPE', `options.derived.${variable}.expression: the reference lacks one of its inputs.`, { path: `options.derived.${variable}.expression` });
    if (derived) await refField.close?.();
    const runs: NamedField[] = [];
    for (const run of recipe.runs) {
      const f = await prepare(run, opts.native === true);
      if (f) runs.push(f);
    }
    return { variable, units, grid, reference, runs, notes, close };
  } catch (e) {
    await close();
    throw e;
  }
}
