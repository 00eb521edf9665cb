/**
 * A field reduced in time by a plan (app/time/select.ts), still read one level at a time: one step, a
 * weighted mean over steps (nt = 1), or a monthly climatology (nt = 12, step m is month m + 1). A level of
 * the climatology is built in one pass over the file's steps of that level; the 12 months of the last few
 * levels are kept, so that a regridding that reads neighbouring source levels month by month reads each
 * file level once. Memory: those few levels × 12 months, plus one level's sums while building.
 *
 * Missing values take no part: a cell's mean is over the steps where it has a value, with their weights
 * (as xarray's weighted mean skips NaN).
 */
import type { FieldSource } from '../cf/field-source.js';
import { StillwaterError } from '../errors.js';
import { periodLevel } from './periods.js';
import type { StepWeights, TimePlan } from './select.js';

export interface TimedField extends FieldSource {
  /** total days of each month when the field is a monthly climatology (nt = 12), else null */
  monthWeights: Float64Array | null;
  /** how the steps were reduced, for the output's notes (null: the only step) */
  timeNote: string | null;
}

export function reduceTime(field: FieldSource, plan: TimePlan, keepLevels = 4): TimedField {
  const base = {
    file: field.file,
    variable: field.variable,
    units: field.units,
    standardName: field.standardName,
    longName: field.longName,
    grid: field.grid,
    time: null,
    close: field.close ? () => field.close!() : undefined,
  };
  if (plan.kind === 'step') {
    return { ...base, nt: 1, monthWeights: null, timeNote: plan.note, readLevel: (_t, k) => field.readLevel(plan.t, k) };
  }
  if (plan.kind === 'mean') {
    return { ...base, nt: 1, monthWeights: null, timeNote: plan.note, readLevel: async (_t, k) => (await weightedMeans(field, [plan], k))[0] };
  }
  const cache = new Map<number, Promise<Float32Array[]>>();
  const monthsOf = (k: number): Promise<Float32Array[]> => {
    let p = cache.get(k);
    if (p) {
      cache.delete(k);
    } else {
      p = weightedMeans(field, plan.months, k);
      p.catch(() => cache.delete(k));
      if (cache.size >= keepLevels) cache.delete(cache.keys().next().value as number);
    }
    cache.set(k, p);
    return p;
  };
  return {
    ...base,
    nt: 12,
    monthWeights: plan.monthWeights,
    timeNote: plan.note,
    async readLevel(t, k) {
      if (!Number.isInteger(t) || t < 0 || t >= 12) throw new StillwaterError('E_INTERNAL', `a monthly climatology has no month ${t + 1}.`);
      return (await monthsOf(k))[t];
    },
  };
}

/** The year of a field with 12 months (given their weights): their mean weighted by month length; else its one step. */
export async function annualLevel(field: FieldSource, monthWeights: Float64Array | null, k: number): Promise<Float32Array> {
  if (field.nt === 12 && monthWeights) {
    const months: Float32Array[] = [];
    for (let m = 0; m < 12; m++) months.push(await field.readLevel(m, k));
    return periodLevel(months, monthWeights, 'annual', new Float32Array(months[0].length));
  }
  return field.readLevel(0, k);
}

/**
 * Weighted means of level k over several groups of steps in one pass over the steps (in file order):
 * Σ w·x / Σ w per cell over the steps where the cell has a value.
 */
async function weightedMeans(field: FieldSource, groups: StepWeights[], k: number): Promise<Float32Array[]> {
  const order: { t: number; g: number; w: number }[] = [];
  groups.forEach((grp, g) => grp.steps.forEach((t, i) => order.push({ t, g, w: grp.weights[i] })));
  order.sort((a, b) => a.t - b.t);
  let n = -1;
  let sum: Float64Array[] = [];
  let wsum: Float64Array[] = [];
  for (const { t, g, w } of order) {
    const v = await field.readLevel(t, k);
    if (n < 0) {
      n = v.length;
      sum = groups.map(() => new Float64Array(n));
      wsum = groups.map(() => new Float64Array(n));
    }
    const s = sum[g];
    const ws = wsum[g];
    for (let c = 0; c < n; c++) {
      const x = v[c];
      if (x - x === 0) {
        s[c] += w * x;
        ws[c] += w;
      }
    }
  }
  return groups.map((_, g) => {
    const out = new Float32Array(Math.max(n, 0));
    const s = sum[g];
    const ws = wsum[g];
    for (let c = 0; c < out.length; c++) out[c] = ws[c] > 0 ? s[c] / ws[c] : NaN;
    return out;
  });
}
