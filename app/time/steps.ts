/**
 * The time steps of a CF time axis on one continuous day count of the file's own calendar: where each step
 * starts and ends, how long it is, and which calendar month its time value falls in.
 *
 * Lengths come from the time bounds when the file has them. Without bounds they come from the calendar:
 * steps in consecutive calendar months span their whole months, steps in consecutive years their whole
 * years; any other spacing spans half-way to each neighbour. A climatological axis (CF 1.10 §7.4) has
 * bounds over many years; a step's length is then the time of year it covers in one year (31 days for a
 * January), so that months of a climatology weigh by their lengths.
 */
import type { TimeAxis } from '../cf/field-source.js';
import { dateOfDay, type Calendar } from '../cf/calendar.js';
import { parseTimeUnits, type TimeUnits } from '../cf/time.js';

export interface TimeSteps {
  calendar: Calendar;
  units: TimeUnits;
  /** time value of each step, in days of the calendar's day count (fractional) */
  at: Float64Array;
  start: Float64Array;
  end: Float64Array;
  /** days */
  length: Float64Array;
  /** calendar month (1..12) of each step's time value */
  month: Uint8Array;
  /** where the lengths came from, for the output's notes */
  lengthsFrom: 'bounds' | 'climatology bounds' | 'calendar months' | 'calendar years' | 'neighbours' | 'single step';
}

/** Days (fractional) of the calendar's day count at a value in the axis's units. */
export function dayOf(value: number, u: TimeUnits): number {
  return u.refDay + (value * u.unitSeconds + u.refSeconds) / 86400;
}

/** Days from the first of a month to the first of the next (21 for October 1582 in the standard calendar). */
export function monthDays(cal: Calendar, year: number, month: number): number {
  return (month === 12 ? cal.dayNumber(year + 1, 1, 1) : cal.dayNumber(year, month + 1, 1)) - cal.dayNumber(year, month, 1);
}

export function timeSteps(axis: TimeAxis): TimeSteps {
  const units = parseTimeUnits(axis.units, axis.calendar);
  const cal = units.calendar;
  const nt = axis.values.length;
  const at = Float64Array.from(axis.values, (v) => dayOf(v.value, units));
  const month = Uint8Array.from(at, (d) => (Number.isFinite(d) ? dateOfDay(cal, Math.floor(d)).month : 0));
  const start = new Float64Array(nt);
  const end = new Float64Array(nt);
  let lengthsFrom: TimeSteps['lengthsFrom'];
  if (axis.bounds && axis.bounds.length === 2 * nt) {
    for (let t = 0; t < nt; t++) {
      const a = dayOf(axis.bounds[2 * t], units);
      const b = dayOf(axis.bounds[2 * t + 1], units);
      start[t] = Math.min(a, b);
      end[t] = Math.max(a, b);
    }
    if (axis.climatology) {
      lengthsFrom = 'climatology bounds';
      for (let t = 0; t < nt; t++) {
        const len = timeOfYearLength(cal, start[t], end[t]);
        end[t] = start[t] + len;
      }
    } else {
      lengthsFrom = 'bounds';
    }
  } else if (nt === 1) {
    lengthsFrom = 'single step';
    start[0] = at[0];
    end[0] = at[0] + 1;
  } else {
    const ym = Array.from(at, (d) => {
      const x = dateOfDay(cal, Math.floor(d));
      return { y: x.year, m: x.month };
    });
    const consecutive = (step: (i: number) => number) => ym.every((_, i) => i === 0 || step(i) === step(i - 1) + 1);
    if (at.every(Number.isFinite) && consecutive((i) => ym[i].y * 12 + ym[i].m - 1)) {
      lengthsFrom = 'calendar months';
      ym.forEach(({ y, m }, t) => {
        start[t] = cal.dayNumber(y, m, 1);
        end[t] = start[t] + monthDays(cal, y, m);
      });
    } else if (at.every(Number.isFinite) && consecutive((i) => ym[i].y)) {
      lengthsFrom = 'calendar years';
      ym.forEach(({ y }, t) => {
        start[t] = cal.dayNumber(y, 1, 1);
        end[t] = cal.dayNumber(y + 1, 1, 1);
      });
    } else {
      lengthsFrom = 'neighbours';
      for (let t = 0; t < nt; t++) {
        const prev = t > 0 ? at[t - 1] : at[t] - (at[t + 1] - at[t]);
        const next = t < nt - 1 ? at[t + 1] : at[t] + (at[t] - at[t - 1]);
        start[t] = (prev + at[t]) / 2;
        end[t] = (at[t] + next) / 2;
      }
    }
  }
  const length = new Float64Array(nt);
  for (let t = 0; t < nt; t++) length[t] = end[t] - start[t];
  return { calendar: cal, units, at, start, end, length, month, lengthsFrom };
}

/**
 * The span of one year covered by climatology bounds [start, end): from the start's date to the end's
 * date of year, in the start's year (a year later when the end's date of year comes first, as for December).
 */
function timeOfYearLength(cal: Calendar, start: number, end: number): number {
  if (!Number.isFinite(start) || !Number.isFinite(end)) return NaN;
  const s = dateOfDay(cal, Math.floor(start));
  const e = dateOfDay(cal, Math.floor(end));
  const fracS = start - Math.floor(start);
  const fracE = end - Math.floor(end);
  const sameYear = (year: number) => cal.dayNumber(year, e.month, Math.min(e.day, cal.monthLength(year, e.month))) + fracE;
  let stop = sameYear(s.year);
  const from = cal.dayNumber(s.year, s.month, s.day) + fracS;
  if (stop <= from) stop = sameYear(s.year + 1);
  return stop - from;
}
