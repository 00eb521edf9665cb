/**
 * Seawater density input for unit conversion between per-mass and per-volume concentrations: a nominal
 * value (default 1025 kg m-3, flagged in the output), or the reference's potential temperature and practical
 * salinity on the common grid, level by level, with the sea pressure of the level's centre depth (TEOS-10
 * density in app/ocean; pressure at 45° latitude for every cell: the latitude changes it by well under 1 %).
 *
 * A comparison by month (options.periods) converts each month with that month's own temperature and salinity
 * when the reference's T and S give 12 months; otherwise every month takes the year's, and `monthsNote` says
 * which was used.
 */
import type { FieldSource } from '../cf/field-source.js';
import { parseUnits } from '../cf/units.js';
import type { Grid } from '../grid/types.js';
import { pressureFromDepth } from '../ocean/teos10.js';
import type { Recipe, VariableSource } from '../recipe/types.js';
import type { TimeChoice } from '../time/select.js';
import { makeLevelConverter, type DensityInput, type LevelConverter } from './level-units.js';
import { annualLevel } from '../time/reduce.js';
import { onGrid, openSpec } from './level-reader.js';
import { timedField } from './read-level.js';

export interface DensityProvider {
  /** for notes: "a nominal density of 1025 kg m-3" */
  note: string;
  /** the year's density input at level k */
  level(k: number): Promise<DensityInput>;
  /** month m (0 = January) at level k: that month's own T and S when they have months, else the year's */
  month(k: number, m: number): Promise<DensityInput>;
  /** for notes: which temperature and salinity the months are converted with (opens T and S) */
  monthsNote(): Promise<string>;
  close(): Promise<void>;
}

/** A reference variable reduced in time and on the common grid, with its month weights if it has 12 months. */
type Opened = { field: FieldSource; monthWeights: Float64Array | null; close(): Promise<void> };

/** A time choice that gives one value however the recipe compares (a step, a mean, a choice of months). */
function givesOneValue(choice: TimeChoice | undefined): boolean {
  return typeof choice === 'number' || choice === 'last' || choice === 'mean' || (typeof choice === 'object' && choice.months !== undefined);
}

async function openOnGrid(recipe: Recipe, grid: Grid, cacheDir: string | undefined, spec: VariableSource, monthlyRows: boolean): Promise<Opened> {
  const raw = await openSpec(spec);
  try {
    // by month when the comparison is, unless the file or the recipe gives this variable one value only: the
    // year's T and S then serve every month (as before periods existed), rather than refusing the recipe
    const months = monthlyRows && raw.time !== null && raw.nt > 1 && !givesOneValue(spec.time);
    const timed = timedField(raw, spec, { monthlyRows: months });
    const field = await onGrid(timed, spec, { grid, options: recipe.options, cacheDir });
    return { field, monthWeights: timed.monthWeights, close: async () => raw.close?.() };
  } catch (e) {
    await raw.close?.().catch(() => undefined);
    throw e;
  }
}

/**
 * @param monthlyRows the pair is compared by month (options.periods): T and S are then read as 12 months
 * where they can be
 */
export function densityProvider(recipe: Recipe, grid: Grid, cacheDir: string | undefined, monthlyRows = false): DensityProvider {
  const d = recipe.options.density;
  if (d === 'nominal') {
    const rho = recipe.options.nominalDensity;
    const input = async (): Promise<DensityInput> => ({ density: rho });
    return { note: `a nominal density of ${rho} kg m-3`, level: input, month: input, monthsNote: async () => `a nominal density of ${rho} kg m-3 for every month`, close: async () => undefined };
  }
  const tSpec = recipe.reference.variables[d.fields.temperature];
  const sSpec = recipe.reference.variables[d.fields.salinity];
  type Fields = { t: Opened; s: Opened; toC: LevelConverter | null; byMonth: boolean };
  let fields: Promise<Fields> | null = null;
  const opened: Opened[] = [];
  const degC = parseUnits('degC');
  const open = (): Promise<Fields> =>
    (fields ??= (async () => {
      const t = await openOnGrid(recipe, grid, cacheDir, tSpec, monthlyRows);
      opened.push(t);
      const s = await openOnGrid(recipe, grid, cacheDir, sSpec, monthlyRows);
      opened.push(s);
      const toC = makeLevelConverter(t.field.units, degC, `${tSpec.path} (temperature for density)`, tSpec.name, false);
      const byMonth = monthlyRows && t.field.nt === 12 && t.monthWeights !== null && s.field.nt === 12 && s.monthWeights !== null;
      return { t, s, toC, byMonth };
    })());
  const pressureAt = (k: number): number => pressureFromDepth(Math.max(0, grid.vertical ? grid.vertical.centres[k] : 0));

  // the inputs of the last level asked for, shared by every source converted on it: the same temperature
  // array lets app/ocean/convert.ts compute each density once (one level's year and 12 months at most)
  let memo: { k: number; year?: Promise<DensityInput>; months: (Promise<DensityInput> | undefined)[] } = { k: -1, months: [] };
  const memoFor = (k: number) => (memo.k === k ? memo : (memo = { k, months: [] }));
  const remember = (p: Promise<DensityInput>, forget: () => void): Promise<DensityInput> => {
    p.catch(forget);
    return p;
  };

  const year = (k: number): Promise<DensityInput> => {
    const m = memoFor(k);
    return (m.year ??= remember(
      (async () => {
        const { t, s, toC } = await open();
        let temperature = await annualLevel(t.field, t.monthWeights, k);
        if (toC) temperature = toC.apply(temperature);
        const salinity = await annualLevel(s.field, s.monthWeights, k);
        return { temperature, salinity, pressure: pressureAt(k) };
      })(),
      () => (m.year = undefined),
    ));
  };

  return {
    note: `TEOS-10 density from the reference's ${d.fields.temperature} and ${d.fields.salinity}`,
    level: year,
    async month(k, mi) {
      const { t, s, toC, byMonth } = await open();
      if (!byMonth) return year(k);
      const m = memoFor(k);
      return (m.months[mi] ??= remember(
        (async () => {
          let temperature = await t.field.readLevel(mi, k);
          if (toC) temperature = toC.apply(temperature);
          const salinity = await s.field.readLevel(mi, k);
          return { temperature, salinity, pressure: pressureAt(k) };
        })(),
        () => (m.months[mi] = undefined),
      ));
    },
    async monthsNote() {
      const { byMonth } = await open();
      const ts = `${d.fields.temperature} and ${d.fields.salinity}`;
      return byMonth
        ? `each month converted with TEOS-10 density from that month's ${ts} of the reference`
        : `every month converted with TEOS-10 density from the year's ${ts} of the reference (they give no months)`;
    },
    async close() {
      for (const f of opened) await f.close().catch(() => undefined);
    },
  };
}
