/**
 * A source variable reduced in time as its recipe entry asks (one step, a weighted mean, or 12 months:
 * app/time/select.ts), before any regridding, so that a run's many steps are regridded as one field or
 * twelve.
 */
import type { FieldSource } from '../cf/field-source.js';
import type { VariableSource } from '../recipe/types.js';
import { planTime } from '../time/select.js';
import { reduceTime, type TimedField } from '../time/reduce.js';

export interface TimeContext {
  /** the recipe asks for monthly or seasonal rows */
  monthlyRows: boolean;
}

export function timedField(field: FieldSource, spec: VariableSource, ctx: TimeContext): TimedField {
  // the reference's variables live under "reference.variables" (app/recipe/validate.ts)
  const reference = spec.path.startsWith('reference.');
  return reduceTime(field, planTime(field, spec.time, { path: spec.path, monthlyRows: ctx.monthlyRows, reference }));
}
