/**
 * The one way to open a variable's reference and runs on the common grid: the level readers (regridding,
 * time step, units, density for per-mass/per-volume conversions, derived variables), the units they all
 * deliver, the notes for the outputs, and one close. Comparisons, lines, points and the workbench's
 * sessions all open their pairs here, so every view sees the fields the skill tables see.
 */
import { parseUnits, type ParsedUnits } from '../cf/units.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import { parseExpression } from '../ocean/expression.js';
import type { Recipe, SourceSpec } from '../recipe/types.js';
import { commonGridFor } from './common-grid.js';
import { densityProvider, type DensityProvider } from './density-provider.js';
import { derivedReader, openSpec, plainReader, referenceUnitsOf, type LevelReader, type ReaderContext } from './level-reader.js';
import { prefixed } from './load-regions.js';
import { periodLevel } from '../time/periods.js';

/** One source (the reference or a run) of a pair, level by level. */
export interface SourceLevels {
  label: string;
  /** the variable's file; for a derived variable, the source's recipe path */
  file: string;
  /** the grid its levels come on: the common grid, or the run's own grid when opened natively */
  grid: Grid;
  /** regridded onto the common grid */
  regridded: boolean;
  /** how it was brought into the pair's units */
  conversions: string[];
  /** how the time steps were reduced (null: the only step) */
  timeNote: string | null;
  /** total days of each month when the source gives 12 months (options.periods), else null */
  monthWeights: Float64Array | null;
  /** one level in the pair's units (density fetched when the conversion needs it); a monthly source's year */
  level(k: number): Promise<Float32Array>;
  /** the level's 12 months (January first), when monthWeights is set */
  months(k: number): Promise<Float32Array[]>;
}

/** A run of the recipe that has the variable (or every input of a derived one), opened on first use. */
export interface RunSlot {
  /** index in recipe.runs */
  index: number;
  label: string;
  open(): Promise<SourceLevels>;
}

export interface OpenedPair {
  variable: string;
  /** the units every source is delivered in */
  units: ParsedUnits;
  /** the same as the tables print them */
  unitsText: string;
  grid: Grid;
  /** the expression of a derived variable */
  expression?: string;
  reference: SourceLevels;
  runs: RunSlot[];
  density: DensityProvider;
  /** what was regridded or converted, one line a source and note, in the order sources were opened */
  notes: string[];
  /** every run opened, in recipe order */
  openRuns(): Promise<SourceLevels[]>;
  close(): Promise<void>;
}

export interface OpenPairOptions {
  cacheDir?: string;
  /** the common grid to use; absent: the recipe's choice, following the reference field */
  grid?: Grid;
  /** deliver in these units instead of the recipe's table units */
  units?: ParsedUnits;
  /**
   * leave plain (not derived) run variables on their own grids (station sampling) instead of regridding
   * them; where a conversion needs density from temperature and salinity fields, they are regridded anyway
   */
  native?: boolean;
  /** every file opened, for provenance */
  noteFile?: (path: string) => void;
  /** every source gives 12 months (the recipe's options.periods asks for monthly rows) */
  monthlyRows?: boolean;
}

export function unitsText(u: ParsedUnits): string {
  return u.kind === 'other' ? u.text.trim() : u.canonical;
}

/** The recipe has this variable to compare: a reference variable or a derived one. */
export function hasVariable(recipe: Recipe, variable: string): boolean {
  return Object.hasOwn(recipe.reference.variables, variable) || Object.hasOwn(recipe.options.derived, variable);
}

export async function openPair(recipe: Recipe, variable: string, opts: OpenPairOptions = {}): Promise<OpenedPair> {
  if (!hasVariable(recipe, variable)) {
    throw new StillwaterError('E_INPUT', `The recipe's reference has no variable '${variable}'.`, { variable });
  }
  const derived = Object.hasOwn(recipe.options.derived, variable) ? recipe.options.derived[variable] : undefined;
  const closers: (() => Promise<void>)[] = [];
  const close = async (): Promise<void> => {
    for (const c of closers.splice(0).reverse()) await c().catch(() => undefined);
  };
  try {
    const needs = derived ? (await prefixed(`options.derived.${variable}.expression`, async () => parseExpression(derived.expression))).variables : [variable];
    // the common grid follows the reference field (of the first input, for a derived variable)
    const gridSpec = recipe.reference.variables[needs[0]];
    const refField = await openSpec(gridSpec);
    let refFieldOwned = true;
    closers.push(async () => {
      if (refFieldOwned) await refField.close?.();
    });
    const grid = opts.grid ?? commonGridFor(recipe.options.commonGrid, refField.grid);
    const density = densityProvider(recipe, grid, opts.cacheDir, opts.monthlyRows ?? false);
    closers.push(() => density.close());
    const ctx: ReaderContext = { grid, options: recipe.options, cacheDir: opts.cacheDir, densityNote: density.note, monthlyRows: opts.monthlyRows ?? false, noteFile: opts.noteFile ?? (() => undefined) };
    const unitsOf = referenceUnitsOf(recipe);
    let units: ParsedUnits;
    if (opts.units) units = opts.units;
    else if (derived) units = await prefixed(`options.derived.${variable}.units`, async () => parseUnits(derived.units));
    else units = recipe.options.units[variable] ? await unitsOf(variable) : refField.units;
    const notes: string[] = [];

    const openSource = async (source: SourceSpec, native: boolean): Promise<SourceLevels> => {
      let reader: LevelReader;
      let levelsGrid = grid;
      if (derived) {
        reader = await derivedReader(variable, derived.expression, source, unitsOf, ctx);
      } else {
        const spec = source.variables[variable];
        let field;
        if (source === recipe.reference) {
          field = refField;
          refFieldOwned = false; // the reader closes it from now on
        } else {
          field = await openSpec(spec);
        }
        const readerCtx = native ? { ...ctx, grid: field.grid } : ctx;
        if (native) levelsGrid = field.grid;
        reader = await plainReader(variable, spec, units, readerCtx, field);
        if (native && reader.needsDensity && recipe.options.density !== 'nominal') {
          // the density fields live on the common grid: sample this run there instead
          await reader.close();
          levelsGrid = grid;
          reader = await plainReader(variable, spec, units, ctx);
          notes.push(`${source.label}: sampled on the common grid, where the density for its unit conversion is known`);
        }
      }
      closers.push(() => reader.close());
      // by month, a conversion by density takes each month's own (when the reference's T and S have months),
      // and the conversions say which; the year is then the mean of the converted months, as the annual rows
      // of a monthly comparison are
      const monthly = ctx.monthlyRows && reader.monthWeights !== null && reader.needsDensity;
      const conversions = monthly ? [...reader.conversions, await density.monthsNote()] : reader.conversions;
      if (reader.regridded) notes.push(`${source.label}: regridded onto the common grid (${recipe.options.method})`);
      for (const c of conversions) notes.push(`${source.label}: ${c}`);
      if (reader.timeNote) notes.push(`${source.label}: ${reader.timeNote}`);
      const months = (k: number): Promise<Float32Array[]> => reader.readMonths(k, reader.needsDensity ? (m) => density.month(k, m) : undefined);
      return {
        label: source.label,
        file: derived ? source.path : source.variables[variable].file,
        grid: levelsGrid,
        regridded: reader.regridded,
        conversions,
        timeNote: reader.timeNote,
        monthWeights: reader.monthWeights,
        level: async (k) => (monthly ? periodLevel(await months(k), reader.monthWeights!, 'annual') : reader.read(k, reader.needsDensity ? await density.level(k) : undefined)),
        months,
      };
    };

    const reference = await openSource(recipe.reference, false);
    if (derived && refFieldOwned) {
      // a derived reference opened its inputs itself: the field that chose the grid is no longer needed
      refFieldOwned = false;
      await refField.close?.();
    }
    const runs: RunSlot[] = [];
    recipe.runs.forEach((run, index) => {
      if (!needs.every((k) => Object.hasOwn(run.variables, k))) return;
      let opened: Promise<SourceLevels> | null = null;
      runs.push({
        index,
        label: run.label,
        open: () => {
          if (!opened) {
            opened = openSource(run, opts.native === true);
            opened.catch(() => (opened = null));
          }
          return opened;
        },
      });
    });
    return {
      variable,
      units,
      unitsText: unitsText(units),
      grid,
      ...(derived ? { expression: derived.expression } : {}),
      reference,
      runs,
      density,
      notes,
      async openRuns() {
        const out: SourceLevels[] = [];
        for (const r of runs) out.push(await r.open());
        return out;
      },
      close,
    };
  } catch (e) {
    await close();
    throw e;
  }
}
