/**
 * The reference and the runs of a recipe for one variable as fields with one time step, ready to sample:
 * the pair opened by app/compare/open-pair.ts (on the common grid, or each run on its own grid for stations,
 * at the recipe's time step, in one set of units), so lines and points see exactly the fields that the skill
 * tables see.
 */
import type { FieldSource } from '../cf/field-source.js';
import type { ParsedUnits } from '../cf/units.js';
import { hasVariable, openPair, type OpenPairOptions, type SourceLevels } from '../compare/open-pair.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import type { Recipe } from '../recipe/types.js';
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

export type PrepareOptions = Pick<OpenPairOptions, 'cacheDir' | 'units' | 'native'>;

/** A source's levels seen as a field with one time step (the pair already picked it); `read` may serve them from a cache. */
export function levelsField(src: SourceLevels, units: ParsedUnits, variable: string, read: (k: number) => Promise<Float32Array> = (k) => src.level(k)): FieldSource {
  return {
    file: src.file,
    variable,
    units,
    grid: src.grid,
    nt: 1,
    time: null,
    readLevel: (_t: number, k: number) => read(k),
    // the pair closes every reader at once
    close: async () => undefined,
  };
}

export async function prepareFields(recipe: Recipe, variable: string, opts: PrepareOptions = {}): Promise<PreparedFields> {
  if (!hasVariable(recipe, variable)) {
    const known = [...Object.keys(recipe.reference.variables), ...Object.keys(recipe.options.derived)].join(', ') || 'none';
    throw new StillwaterError('E_INPUT', `--var ${variable}: the recipe's reference has no variable '${variable}' (it has: ${known}).`, { variable });
  }
  const pair = await openPair(recipe, variable, opts);
  try {
    const runs = await pair.openRuns();
    const field = (src: SourceLevels): NamedField => ({ label: src.label, field: levelsField(src, pair.units, variable) });
    return { variable, units: pair.units, grid: pair.grid, reference: field(pair.reference), runs: runs.map(field), notes: pair.notes, close: pair.close };
  } catch (e) {
    await pair.close();
    throw e;
  }
}
