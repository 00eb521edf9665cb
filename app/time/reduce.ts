/**
 * A field reduced in time by a plan (app/time/select.ts), still read one level at a time: one step, a
 * weighted mean over steps (nt = 1), or a monthly climatology (nt = 12, step m is month m + 1). A level of
 * the climatology is built month after month, each from its own steps in file order, so that only one
 * month's sums live while building. The 12 months of the last level are kept (of the last few when a
 * vertical regridding reads several source levels month by month: `keep`), so each file level is read once.
 * Memory: one level × 12 months (times the levels kept), plus one month's sums (float64) and weights
 * (float32) while building.
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
  /** keep the 12 months of this many levels (default 1), for a reader of several levels at a time */
  keep(levels: number): void;
}

export function reduceTime(field: FieldSource, plan: TimePlan, keepLevels = 1): TimedField {
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
    return { ...base, nt: 1, monthWeights: null, timeNote: plan.note, keep: () => undefined, readLevel: (_t, k) => field.readLevel(plan.t, k) };
  }
  if (plan.kind === 'mean') {
    return { ...base, nt: 1, monthWeights: null, timeNote: plan.note, keep: () => undefined, readLevel: async (_t, k) => weightedMean(field, plan, k) };
  }
  const cache = new Map<number, Promise<Float32Array[]>>();
  const monthsOf = (k: number): Promise<Float32Array[]> => {
    let p = cache.get(k);
    if (p) {
      cache.delete(k);
    } else {
      // the oldest level goes before the new one is built, so at most `keepLevels` are held
      if (cache.size >= keepLevels) cache.delete(cache.keys().next().value as number);
      p = monthlyMeans(field, plan.months, k);
      p.catch(() => cache.delete(k));
    }
    cache.set(k, p);
    return p;
  };
  return {
    ...base,
    nt: 12,
    monthWeights: plan.monthWeights,
    timeNote: plan.note,
    keep(levels) {
      keepLevels = Math.max(1, Math.floor(levels));
      while (cache.size > keepLevels) cache.delete(cache.keys().next().value as number);
    },
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

/** The 12 months of level k, one after another (one month's sums alive at a time). */
async function monthlyMeans(field: FieldSource, months: StepWeights[], k: number): Promise<Float32Array[]> {
  const out: Float32Array[] = [];
  for (const m of months) out.push(await weightedMean(field, m, k));
  return out;
}

/**
 * The weighted mean of level k over a group of steps, read in file order: Σ w·x / Σ w per cell over the
 * steps where the cell has a value.
 */
async function weightedMean(field: FieldSource, group: StepWeights, k: number): Promise<Float32Array> {
  const order = Array.from(group.steps, (t, i) => ({ t, w: group.weights[i] })).sort((a, b) => a.t - b.t);
  let sum: Float64Array | null = null;
  // step lengths are whole or half days in practice: their float32 sums are exact up to 2^23 days
  let wsum: Float32Array | null = null;
  for (const { t, w } of order) {
    const v = await field.readLevel(t, k);
    sum ??= new Float64Array(v.length);
    wsum ??= new Float32Array(v.length);
    for (let c = 0; c < v.length; c++) {
      const x = v[c];
      if (x - x === 0) {
        sum[c] += w * x;
        wsum[c] += w;
      }
    }
  }
  if (!sum || !wsum) return new Float32Array(0);
  // the weights' array becomes the means: no other array of the level is made
  for (let c = 0; c < wsum.length; c++) wsum[c] = wsum[c] > 0 ? sum[c] / wsum[c] : NaN;
  return wsum;
}
