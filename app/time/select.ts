/**
 * What a recipe's `time` asks of one source variable, turned into a plan over the file's steps:
 * one step; a mean over steps weighted by their lengths; or a monthly climatology (12 groups of steps,
 * each step weighted by its length in days of the file's own calendar).
 *
 * A window {from, to} holds the steps whose time value lies in [from 00:00, the day after `to` 00:00):
 * both dates count in full. A step whose bounds reach over an edge of the window counts, with its whole
 * length, when its time value lies inside, and not at all otherwise.
 */
import type { FieldSource } from '../cf/field-source.js';
import type { Calendar } from '../cf/calendar.js';
import { StillwaterError } from '../errors.js';
import { MONTH_NAMES } from './periods.js';
import { timeSteps, type TimeSteps } from './steps.js';

export interface TimeWindow {
  from?: string;
  to?: string;
  months?: number[];
  monthly?: true;
}

export type TimeChoice = number | 'mean' | 'last' | 'monthly' | TimeWindow | undefined;

export interface StepWeights {
  steps: Int32Array;
  /** days */
  weights: Float64Array;
}

export type TimePlan =
  | { kind: 'step'; t: number; note: string | null }
  | ({ kind: 'mean'; note: string } & StepWeights)
  | { kind: 'monthly'; months: StepWeights[]; /** total days of each month */ monthWeights: Float64Array; note: string };

export interface PlanContext {
  /** recipe path of the variable, e.g. runs[0].variables.PO4 */
  path: string;
  /** the recipe asks for monthly or seasonal rows */
  monthlyRows: boolean;
  /** the source is the reference (a 12-step reference must say what its steps are) */
  reference: boolean;
}

function refuse(ctx: PlanContext, field: FieldSource, sentence: string): StillwaterError {
  const path = `${ctx.path}.time`;
  return new StillwaterError('E_RECIPE', `${path}: '${field.variable}' in ${field.file} ${sentence}`, { path, file: field.file, variable: field.variable });
}

function describeChoice(choice: TimeChoice): string {
  return typeof choice === 'object' ? JSON.stringify(choice) : JSON.stringify(choice);
}

export function planTime(field: FieldSource, choice: TimeChoice, ctx: PlanContext): TimePlan {
  const nt = field.nt;
  if (typeof choice === 'number' || choice === 'last') {
    if (ctx.monthlyRows) throw refuse(ctx, field, `gives one time step (${describeChoice(choice)}), but the recipe asks for monthly rows (options.periods): leave "time" out or say "monthly".`);
    const t = choice === 'last' ? nt - 1 : choice < 0 ? nt + choice : choice;
    if (t < 0 || t >= nt) throw refuse(ctx, field, `has no time step ${choice} (it has ${nt}).`);
    return { kind: 'step', t, note: nt > 1 ? `time step ${t + 1} of ${nt}${field.time ? ` (${field.time.values[t].iso})` : ''}` : null };
  }
  const axis = field.time;
  if (!axis || nt <= 1) {
    if (typeof choice === 'object' || choice === 'monthly') {
      const what = typeof choice === 'object' && choice.months ? '"months"' : typeof choice === 'object' && (choice.from || choice.to) ? 'a time window' : '"monthly"';
      throw refuse(ctx, field, `has no time axis${axis ? ' with more than one step' : ''}, so ${what} cannot apply.`);
    }
    if (ctx.monthlyRows) throw refuse(ctx, field, `has no time axis with months, but the recipe asks for monthly rows (options.periods).`);
    // steps without a decoded axis (a field built in memory) each count once
    if (nt > 1) return { kind: 'mean', steps: Int32Array.from({ length: nt }, (_, t) => t), weights: new Float64Array(nt).fill(1), note: `time: the mean of all ${nt} steps` };
    return { kind: 'step', t: 0, note: null };
  }
  const steps = timeSteps(axis);
  const all = Int32Array.from({ length: nt }, (_, t) => t);

  if (choice === undefined) {
    if (nt === 12 && axis.climatology) return monthlyPlan(field, steps, all, ctx, 'a monthly climatology (12 steps with CF climatology bounds)');
    if (nt === 12 && ctx.reference) {
      throw refuse(ctx, field, 'has 12 time steps without CF climatology bounds: say "time": "monthly" if they are the months of a climatology, or "mean" or a step.');
    }
    if (ctx.monthlyRows) return monthlyPlan(field, steps, all, ctx, `a monthly climatology of all ${nt} steps`);
    return meanPlan(field, steps, all, `the mean of all ${nt} steps`);
  }
  if (choice === 'mean') {
    if (ctx.monthlyRows) throw refuse(ctx, field, 'gives one mean ("mean"), but the recipe asks for monthly rows (options.periods): leave "time" out or say "monthly".');
    return meanPlan(field, steps, all, `the mean of all ${nt} steps`);
  }
  if (choice === 'monthly') return monthlyPlan(field, steps, all, ctx, nt === 12 ? 'the 12 months of a climatology' : `a monthly climatology of all ${nt} steps`);

  // a window and/or a choice of months
  let chosen = all;
  let what = '';
  if (choice.from !== undefined || choice.to !== undefined) {
    const from = choice.from !== undefined ? dateDay(choice.from, steps.calendar, field, ctx) : -Infinity;
    const to = choice.to !== undefined ? dateDay(choice.to, steps.calendar, field, ctx) + 1 : Infinity;
    const range = `${choice.from ?? 'the start'} to ${choice.to ?? 'the end'}`;
    if (!(to > from)) throw refuse(ctx, field, `cannot take the window ${range}: it ends before it starts.`);
    chosen = chosen.filter((t) => steps.at[t] >= from && steps.at[t] < to);
    if (chosen.length === 0) {
      throw refuse(ctx, field, `has no time step inside the window ${range}: its time axis runs from ${axis.values[0].iso} to ${axis.values[nt - 1].iso}.`);
    }
    what = `${chosen.length} steps from ${axis.values[chosen[0]].iso} to ${axis.values[chosen[chosen.length - 1]].iso}`;
  }
  if (choice.months) {
    const set = new Set(choice.months);
    const inWindow = chosen.length;
    chosen = chosen.filter((t) => set.has(steps.month[t]));
    const names = choice.months.map((m) => MONTH_NAMES[m - 1]).join(', ');
    if (chosen.length === 0) throw refuse(ctx, field, `has no time step in ${names}${what ? ` among its ${inWindow} steps in the window` : ''}.`);
    if (ctx.monthlyRows) throw refuse(ctx, field, `gives one mean over ${names} ("months"), but the recipe asks for monthly rows (options.periods).`);
    return meanPlan(field, steps, chosen, `the mean of ${chosen.length} steps in ${names}${what ? `, out of ${what}` : ''}`);
  }
  if (choice.monthly || ctx.monthlyRows) return monthlyPlan(field, steps, chosen, ctx, `a monthly climatology of ${what}`);
  return meanPlan(field, steps, chosen, `the mean of ${what}`);
}

/** Day number of a recipe date (YYYY-MM-DD, in the calendar's own year numbering) in the file's calendar. */
function dateDay(text: string, cal: Calendar, field: FieldSource, ctx: PlanContext): number {
  const m = /^([+-]?\d{1,6})-(\d{1,2})-(\d{1,2})$/.exec(text.trim());
  if (!m) throw refuse(ctx, field, `cannot read the date '${text}' (write YYYY-MM-DD).`);
  let year = Number(m[1]);
  const month = Number(m[2]);
  const day = Number(m[3]);
  if (!cal.hasYearZero && year < 0) year += 1;
  if (year === 0 && !cal.hasYearZero) throw refuse(ctx, field, `has a ${cal.name} calendar, which has no year 0 (date '${text}').`);
  if (month < 1 || month > 12 || day < 1 || day > cal.monthLength(year, month)) {
    throw refuse(ctx, field, `has a ${cal.name} calendar, in which the date '${text}' does not exist.`);
  }
  return cal.dayNumber(year, month, day);
}

function usableWeights(steps: TimeSteps, chosen: Int32Array): Float64Array {
  const w = Float64Array.from(chosen, (t) => steps.length[t]);
  // a damaged axis (missing values, reversed bounds) gives no lengths: every step then counts once
  if (!w.every((x) => Number.isFinite(x) && x > 0)) w.fill(1);
  return w;
}

function meanPlan(_field: FieldSource, steps: TimeSteps, chosen: Int32Array, what: string): TimePlan {
  const weights = usableWeights(steps, chosen);
  const equal = weights.every((x) => x === weights[0]);
  return { kind: 'mean', steps: chosen, weights, note: `time: ${what}${equal ? '' : `, each weighted by its length from the ${steps.lengthsFrom}`}` };
}

function monthlyPlan(field: FieldSource, steps: TimeSteps, chosen: Int32Array, ctx: PlanContext, what: string): TimePlan {
  const weights = usableWeights(steps, chosen);
  const months: StepWeights[] = [];
  const monthWeights = new Float64Array(12);
  for (let m = 1; m <= 12; m++) {
    const idx: number[] = [];
    const w: number[] = [];
    chosen.forEach((t, i) => {
      if (steps.month[t] === m) {
        idx.push(t);
        w.push(weights[i]);
      }
    });
    if (idx.length === 0) throw refuse(ctx, field, `has no step in ${MONTH_NAMES[m - 1]} among the ${chosen.length} steps chosen, so it gives no monthly climatology.`);
    months.push({ steps: Int32Array.from(idx), weights: Float64Array.from(w) });
    monthWeights[m - 1] = w.reduce((a, b) => a + b, 0);
  }
  return { kind: 'monthly', months, monthWeights, note: `time: ${what}, months weighted by their lengths in the ${steps.calendar.name} calendar (from the ${steps.lengthsFrom})` };
}
