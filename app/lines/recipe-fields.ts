/**
 * The reference and the runs of a recipe for one variable, ready to sample: on the comparison's common
 * grid (or each on its own grid, for stations), at the recipe's time step, in one set of units.
 * Built from the compare machinery's pieces (common grid, regridding, unit and density handling),
 * so lines and points see exactly the fields that the skill tables see.
 */
import type { FieldSource } from '../cf/field.js';
import { openField } from '../cf/open-field.js';
import { parseUnits, type ParsedUnits } from '../cf/units.js';
import { commonGridFor, sameGrid } from '../compare/common-grid.js';
import { densityProvider, type DensityProvider } from '../compare/density.js';
import { makeLevelConverter } from '../compare/level-units.js';
import { prefixed } from '../compare/load-regions.js';
import { readLevelAt, timeIndex } from '../compare/read-level.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import type { Recipe, VariableSource } from '../recipe/types.js';
import { regridField } from '../regrid/field.js';
import type { NamedField } from './line-report.js';

export interface PreparedFields {
  variable: string;
  /** the units every field is delivered in */
  units: ParsedUnits;
  /** the common grid (also for `native` preparation, where only the reference is on it) */
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
  /** leave the runs on their own grids (station sampling) instead of regridding them */
  native?: boolean;
}

/** A field that reads at a fixed time step and converts each level into the wanted units. */
function delivered(src: FieldSource, t: number | 'mean', units: ParsedUnits, spec: VariableSource, density: DensityProvider, notes: string[], label: string): FieldSource {
  const convert = makeLevelConverter(src.units, units, `${spec.path} ('${spec.name}' in ${spec.file})`);
  if (convert) notes.push(`${label}: ${convert.describe(density.note)}`);
  return {
    file: src.file,
    variable: src.variable,
    units,
    standardName: src.standardName,
    longName: src.longName,
    grid: src.grid,
    nt: 1,
    time: null,
    async readLevel(_t: number, k: number): Promise<Float32Array> {
      const v = await readLevelAt(src, t, k);
      if (convert) convert.apply(v, convert.needsDensity ? await density.level(k) : undefined);
      return v;
    },
    close: src.close?.bind(src),
  };
}

export async function prepareFields(recipe: Recipe, variable: string, opts: PrepareOptions = {}): Promise<PreparedFields> {
  const refSpec = recipe.reference.variables[variable];
  if (!refSpec) {
    const known = Object.keys(recipe.reference.variables).join(', ') || 'none';
    throw new StillwaterError('E_INPUT', `--var ${variable}: the recipe's reference has no variable '${variable}' (it has: ${known}).`, { variable });
  }
  const opened: FieldSource[] = [];
  const open = async (spec: VariableSource): Promise<FieldSource> => {
    const f = await prefixed(spec.path, () => openField(spec.file, spec.name, spec.units ? { units: spec.units } : undefined));
    opened.push(f);
    return f;
  };
  const close = async () => {
    for (const f of opened) await f.close?.().catch(() => undefined);
  };
  try {
    const refField = await open(refSpec);
    const grid = commonGridFor(recipe.options.commonGrid, refField.grid);
    const wanted = recipe.options.units[variable];
    const units = opts.units ?? (wanted ? await prefixed(`options.units.${variable}`, async () => parseUnits(wanted)) : refField.units);
    const notes: string[] = [];
    const regrid = async (src: FieldSource, spec: VariableSource): Promise<FieldSource> => {
      if (sameGrid(src.grid, grid)) return src;
      if ((src.grid.vertical === null) !== (grid.vertical === null)) {
        throw new StillwaterError('E_GRID', `${spec.path}: '${spec.name}' in ${spec.file} is ${src.grid.vertical ? '3-D' : '2-D'} but the common grid is ${grid.vertical ? '3-D' : '2-D'}.`, { path: spec.path });
      }
      return prefixed(spec.path, () => regridField(src, grid, { method: recipe.options.method, coverage: recipe.options.coverage, cacheDir: opts.cacheDir }));
    };
    const density = densityProvider(recipe, grid, regrid);
    const prepare = async (label: string, spec: VariableSource, field: FieldSource, onCommon: boolean): Promise<NamedField> => {
      const placed = onCommon ? await regrid(field, spec) : field;
      if (placed !== field) notes.push(`${label}: regridded onto the common grid (${recipe.options.method})`);
      const t = timeIndex(placed, spec.time);
      if (t !== 'mean' && (t < 0 || t >= placed.nt)) {
        throw new StillwaterError('E_RECIPE', `${spec.path}.time: step ${t} is outside the file's ${placed.nt} time steps.`, { path: `${spec.path}.time` });
      }
      return { label, field: delivered(placed, t, units, spec, density, notes, label) };
    };
    const reference = await prepare(recipe.reference.label, refSpec, refField, true);
    const runs: NamedField[] = [];
    for (const run of recipe.runs) {
      const spec = run.variables[variable];
      if (!spec) continue;
      runs.push(await prepare(run.label, spec, await open(spec), !opts.native));
    }
    return { variable, units, grid, reference, runs, notes, close };
  } catch (e) {
    await close();
    throw e;
  }
}
