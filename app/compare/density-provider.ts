/**
 * Seawater density input for unit conversion between per-mass and per-volume concentrations: a nominal
 * value (default 1025 kg m-3, flagged in the output), or the reference's potential temperature and practical
 * salinity on the common grid, level by level, with the sea pressure of the level's centre depth (TEOS-10
 * density in app/ocean; pressure at 45° latitude for every cell: the latitude changes it by well under 1 %).
 */
import type { FieldSource } from '../cf/field-source.js';
import { parseUnits } from '../cf/units.js';
import type { Grid } from '../grid/types.js';
import { pressureFromDepth } from '../ocean/teos10.js';
import type { Recipe, VariableSource } from '../recipe/types.js';
import { makeLevelConverter, type DensityInput } from './level-units.js';
import { annualLevel } from '../time/reduce.js';
import { onGrid, openSpec } from './level-reader.js';
import { timedField } from './read-level.js';

export interface DensityProvider {
  /** for notes: "a nominal density of 1025 kg m-3" */
  note: string;
  level(k: number): Promise<DensityInput>;
  close(): Promise<void>;
}

/** A reference variable reduced in time and on the common grid, with its month weights if it has 12 months. */
type Opened = { field: FieldSource; monthWeights: Float64Array | null; close(): Promise<void> };

async function openOnGrid(recipe: Recipe, grid: Grid, cacheDir: string | undefined, spec: VariableSource): Promise<Opened> {
  const raw = await openSpec(spec);
  try {
    const timed = timedField(raw, spec, { monthlyRows: false });
    const field = await onGrid(timed, spec, { grid, options: recipe.options, cacheDir });
    return { field, monthWeights: timed.monthWeights, close: async () => raw.close?.() };
  } catch (e) {
    await raw.close?.().catch(() => undefined);
    throw e;
  }
}

export function densityProvider(recipe: Recipe, grid: Grid, cacheDir: string | undefined): DensityProvider {
  const d = recipe.options.density;
  if (d === 'nominal') {
    const rho = recipe.options.nominalDensity;
    return { note: `a nominal density of ${rho} kg m-3`, level: async () => ({ density: rho }), close: async () => undefined };
  }
  const tSpec = recipe.reference.variables[d.fields.temperature];
  const sSpec = recipe.reference.variables[d.fields.salinity];
  let fields: Promise<[Opened, Opened]> | null = null;
  const opened: Opened[] = [];
  const degC = parseUnits('degC');
  const open = (): Promise<[Opened, Opened]> =>
    (fields ??= (async () => {
      const t = await openOnGrid(recipe, grid, cacheDir, tSpec);
      opened.push(t);
      const s = await openOnGrid(recipe, grid, cacheDir, sSpec);
      opened.push(s);
      return [t, s];
    })());
  return {
    note: `TEOS-10 density from the reference's ${d.fields.temperature} and ${d.fields.salinity}`,
    async level(k) {
      const [t, s] = await open();
      // the year's density serves every month
      let temperature = await annualLevel(t.field, t.monthWeights, k);
      const toC = makeLevelConverter(t.field.units, degC, `${tSpec.path} (temperature for density)`, tSpec.name, false);
      if (toC) temperature = toC.apply(temperature);
      const salinity = await annualLevel(s.field, s.monthWeights, k);
      const depth = grid.vertical ? grid.vertical.centres[k] : 0;
      return { temperature, salinity, pressure: pressureFromDepth(Math.max(0, depth)) };
    },
    async close() {
      for (const f of opened) await f.close().catch(() => undefined);
    },
  };
}
