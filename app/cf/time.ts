/**
 * CF time coordinates (CF 1.10 §4.4): "<unit> since <reference date>" in one of the CF calendars.
 * Decoding follows cftime.num2date: the offset is counted in seconds from the reference instant,
 * rounded to the microsecond, and laid out on the calendar's days.
 *
 * Units: microseconds, milliseconds, seconds, minutes, hours, days (and their abbreviations) in every
 * calendar; "months" in the 360_day calendar (30 days, as cftime); "common_years" in noleap (365 days, as
 * cftime). "years" and "months" in other calendars are not accepted by cftime; CF 1.10 §4.4 defines them
 * by UDUNITS: a year of 365.242198781 days and a month of a twelfth of that. We follow UDUNITS there.
 */
import { StillwaterError } from '../errors.js';
import type { DecodedTime, TimeAxis } from './field-source.js';
import { calendarByName, dateOfDay, yearLength, type Calendar } from './calendar.js';

const UDUNITS_YEAR_DAYS = 365.242198781;

export interface TimeUnits {
  /** seconds per unit */
  unitSeconds: number;
  unit: string;
  calendar: Calendar;
  /** reference instant: day number in the calendar plus seconds into that day (UTC) */
  refDay: number;
  refSeconds: number;
}

const UNIT_SECONDS: Record<string, number> = {
  microseconds: 1e-6, microsecond: 1e-6, us: 1e-6, usec: 1e-6, usecs: 1e-6,
  milliseconds: 1e-3, millisecond: 1e-3, ms: 1e-3, msec: 1e-3, msecs: 1e-3,
  seconds: 1, second: 1, sec: 1, secs: 1, s: 1,
  minutes: 60, minute: 60, min: 60, mins: 60,
  hours: 3600, hour: 3600, hr: 3600, hrs: 3600, h: 3600,
  days: 86400, day: 86400, d: 86400,
};

function timeError(text: string, why: string): StillwaterError {
  return new StillwaterError('E_UNITS', `time units '${text}' ${why}`);
}

/** Parse "days since 1850-01-01 00:00:00" with its calendar. */
export function parseTimeUnits(text: string, calendarName?: string): TimeUnits {
  const calendar = calendarByName(calendarName);
  const m = /^\s*([A-Za-z_]+)\s+(?:since|after|from)\s+(.+?)\s*$/i.exec(text);
  if (!m) throw timeError(text, "are not of the form '<unit> since <date>'.");
  const unit = m[1].toLowerCase();
  let unitSeconds = UNIT_SECONDS[unit];
  if (unitSeconds === undefined) {
    if (unit === 'months' || unit === 'month') {
      unitSeconds = calendar.name === '360_day' ? 30 * 86400 : (UDUNITS_YEAR_DAYS / 12) * 86400;
    } else if (unit === 'common_years' || unit === 'common_year') {
      if (calendar.name !== 'noleap') throw timeError(text, "use 'common_years', which only the noleap/365_day calendar defines.");
      unitSeconds = 365 * 86400;
    } else if (['years', 'year', 'yr', 'yrs', 'a'].includes(unit)) {
      unitSeconds = calendar.name === '360_day' ? 360 * 86400 : UDUNITS_YEAR_DAYS * 86400;
    } else {
      throw timeError(text, `have an unknown time unit '${m[1]}'.`);
    }
  }
  const ref = parseReferenceDate(m[2], calendar, text);
  return { unitSeconds, unit, calendar, ...ref };
}

function parseReferenceDate(s: string, calendar: Calendar, text: string): { refDay: number; refSeconds: number } {
  const re = /^([+-]?\d{1,})-(\d{1,2})(?:-(\d{1,2}))?(?:[T\s]+(\d{1,2})(?::(\d{1,2}))?(?::(\d{1,2}(?:\.\d*)?))?)?\s*(Z|UTC|GMT|[+-]\d{1,2}(?::?\d{2})?)?$/i;
  const m = re.exec(s.trim());
  if (!m) throw timeError(text, `have a reference date '${s}' that is not a date.`);
  let year = Number(m[1]);
  const month = Number(m[2]);
  const day = m[3] !== undefined ? Number(m[3]) : 1;
  // historical numbering (no year 0): year -1 is astronomical year 0
  if (!calendar.hasYearZero && year < 0) year += 1;
  if (month < 1 || month > 12 || day < 1 || day > calendar.monthLength(year, month)) {
    throw timeError(text, `have a reference date '${s}' that does not exist in the ${calendar.name} calendar.`);
  }
  let seconds = Number(m[4] ?? 0) * 3600 + Number(m[5] ?? 0) * 60 + Number(m[6] ?? 0);
  const tz = m[7];
  if (tz && /^[+-]/.test(tz)) {
    const t = /^([+-])(\d{1,2}):?(\d{2})?$/.exec(tz);
    if (t) seconds -= (t[1] === '-' ? -1 : 1) * (Number(t[2]) * 3600 + Number(t[3] ?? 0) * 60);
  }
  return { refDay: calendar.dayNumber(year, month, day), refSeconds: seconds };
}

export interface CalendarInstant {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
  microsecond: number;
  /** day number in the calendar */
  dayNumber: number;
  /** seconds into the day */
  secondsOfDay: number;
}

/** The calendar instant of one time value. */
export function instantOf(value: number, u: TimeUnits): CalendarInstant {
  const offset = value * u.unitSeconds + u.refSeconds;
  let days = Math.floor(offset / 86400);
  // seconds into the day, rounded to the microsecond (cftime's resolution)
  let micro = Math.round((offset - days * 86400) * 1e6);
  if (micro >= 86400e6) {
    days += 1;
    micro -= 86400e6;
  }
  const dayNumber = u.refDay + days;
  const { year, month, day } = dateOfDay(u.calendar, dayNumber);
  const secondsWhole = Math.floor(micro / 1e6);
  return {
    year,
    month,
    day,
    hour: Math.floor(secondsWhole / 3600),
    minute: Math.floor((secondsWhole % 3600) / 60),
    second: secondsWhole % 60,
    microsecond: micro - secondsWhole * 1e6,
    dayNumber,
    secondsOfDay: micro / 1e6,
  };
}

const pad = (n: number, w = 2): string => String(n).padStart(w, '0');

/** ISO-like text "YYYY-MM-DDTHH:MM:SS[.ffffff]" in the calendar's own year numbering. */
export function formatInstant(t: CalendarInstant, cal: Calendar): string {
  const y = !cal.hasYearZero && t.year <= 0 ? t.year - 1 : t.year;
  const year = y < 0 ? `-${pad(-y, 4)}` : pad(y, 4);
  let s = `${year}-${pad(t.month)}-${pad(t.day)}T${pad(t.hour)}:${pad(t.minute)}:${pad(t.second)}`;
  if (t.microsecond) s += '.' + pad(t.microsecond, 6).replace(/0+$/, '');
  return s;
}

/** About 27 million years either side of the reference: beyond, a value is damage, not a date. */
const MAX_OFFSET_SECONDS = 1e10 * 86400;

/** Decode one value: its text date and its fractional year in the file's calendar. Missing (NaN) stays missing. */
export function decodeTime(value: number, u: TimeUnits): DecodedTime {
  if (Number.isNaN(value)) return { value, iso: 'missing', yearFraction: NaN };
  if (!(Math.abs(value * u.unitSeconds) <= MAX_OFFSET_SECONDS)) {
    throw new StillwaterError('E_INPUT', `the time value ${value} (${u.unit}) lies too far from the reference date to be a date.`);
  }
  const t = instantOf(value, u);
  const start = u.calendar.dayNumber(t.year, 1, 1);
  const yearFraction = t.year + (t.dayNumber - start + t.secondsOfDay / 86400) / yearLength(u.calendar, t.year);
  return { value, iso: formatInstant(t, u.calendar), yearFraction };
}

/** Decode a whole time coordinate. */
export function decodeTimeAxis(name: string, values: ArrayLike<number>, units: string, calendar?: string): TimeAxis {
  const u = parseTimeUnits(units, calendar);
  const out: DecodedTime[] = [];
  for (let i = 0; i < values.length; i++) out.push(decodeTime(values[i], u));
  return { name, units, calendar: u.calendar.name === 'standard' ? (calendar ?? 'standard') : (calendar ?? u.calendar.name), values: out };
}

/** Whether units text looks like a CF time coordinate's. */
export function isTimeUnits(units: string | undefined): boolean {
  return !!units && /^\s*[A-Za-z_]+\s+since\s+[+-]?\d/i.test(units);
}
