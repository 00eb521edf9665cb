/**
 * Seawater density for unit conversion between per-mass and per-volume concentrations: a nominal value
 * (default 1025 kg m-3, flagged in the output), or computed from the reference's temperature and salinity
 * on the common grid, level by level.
 */
import type { FieldSource } from '../cf/field.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import type { Recipe, VariableSource } from '../recipe/types.js';

export interface DensityProvider {
  /** for notes: "a nominal density of 1025 kg m-3" */
  note: string;
  level(k: number): Promise<ArrayLike<number> | number>;
}

export function densityProvider(
  recipe: Recipe,
  _grid: Grid,
  _regrid: (src: FieldSource, spec: VariableSource) => Promise<FieldSource>,
): DensityProvider {
  const d = recipe.options.density;
  if (d === 'nominal') {
    const rho = recipe.options.nominalDensity;
    return { note: `a nominal density of ${rho} kg m-3`, level: async () => rho };
  }
  return {
    note: 'density from the reference temperature and salinity',
    level: async () => {
      throw new StillwaterError('E_RECIPE', 'options.density: density from temperature and salinity fields needs app/ocean, which this build lacks; use "nominal".', { path: 'options.density' });
    },
  };
}
