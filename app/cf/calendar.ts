/**
 * The CF calendars (CF 1.10 §4.4.1) as day counts. Each calendar maps a date (astronomical year
 * numbering: year 0 exists, year -1 is 2 BC) to a day number and back. For the real-world calendars the
 * day number is the Julian Day Number, so the mixed standard calendar can switch from Julian to Gregorian
 * between 1582-10-04 and 1582-10-15 (which follow each other).
 */
import { StillwaterError } from '../errors.js';

export interface Calendar {
  /** canonical CF name */
  name: string;
  /** whether the calendar's own year numbering has a year 0 (cftime's defaults, after CF 1.9) */
  hasYearZero: boolean;
  dayNumber(year: number, month: number, day: number): number;
  /** number of days in a month (1..12) of a year */
  monthLength(year: number, month: number): number;
}

const NOLEAP = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
const ALL_LEAP = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** March-based day count shared by the Julian and Gregorian rules. */
function marchBased(year: number, month: number, day: number, gregorian: boolean): number {
  const y = month <= 2 ? year - 1 : year;
  const mp = (month + 9) % 12; // March = 0
  const doy = Math.floor((153 * mp + 2) / 5) + day - 1;
  let n = 365 * y + Math.floor(y / 4) + doy;
  if (gregorian) n += -Math.floor(y / 100) + Math.floor(y / 400) + 1721120;
  else n += 1721118;
  return n;
}

const gregorianLeap = (y: number): boolean => (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
const julianLeap = (y: number): boolean => ((y % 4) + 4) % 4 === 0;

function fixedYear(name: string, lengths: number[]): Calendar {
  const cum = [0];
  for (const l of lengths) cum.push(cum[cum.length - 1] + l);
  const yearLength = cum[12];
  return {
    name,
    hasYearZero: true,
    dayNumber: (y, m, d) => y * yearLength + cum[m - 1] + d - 1,
    monthLength: (_y, m) => lengths[m - 1],
  };
}

const PROLEPTIC: Calendar = {
  name: 'proleptic_gregorian',
  hasYearZero: true,
  dayNumber: (y, m, d) => marchBased(y, m, d, true),
  monthLength: (y, m) => (m === 2 && gregorianLeap(y) ? 29 : NOLEAP[m - 1]),
};

const JULIAN: Calendar = {
  name: 'julian',
  hasYearZero: false,
  dayNumber: (y, m, d) => marchBased(y, m, d, false),
  monthLength: (y, m) => (m === 2 && julianLeap(y) ? 29 : NOLEAP[m - 1]),
};

const STANDARD: Calendar = {
  name: 'standard',
  hasYearZero: false,
  dayNumber(y, m, d) {
    if (y > 1582 || (y === 1582 && (m > 10 || (m === 10 && d >= 15)))) return marchBased(y, m, d, true);
    if (y === 1582 && m === 10 && d > 4) {
      throw new StillwaterError('E_INPUT', `the date 1582-10-${String(d).padStart(2, '0')} does not exist in the standard (mixed Julian/Gregorian) calendar.`);
    }
    return marchBased(y, m, d, false);
  },
  monthLength(y, m) {
    if (y === 1582 && m === 10) return 31; // day numbers skip 5..14; month still ends on the 31st
    return y > 1582 ? PROLEPTIC.monthLength(y, m) : JULIAN.monthLength(y, m);
  },
};

const NOLEAP_CAL = fixedYear('noleap', NOLEAP);
const ALL_LEAP_CAL = fixedYear('all_leap', ALL_LEAP);
const DAY360: Calendar = {
  name: '360_day',
  hasYearZero: true,
  dayNumber: (y, m, d) => y * 360 + (m - 1) * 30 + d - 1,
  monthLength: () => 30,
};

/** CF calendar names (case-insensitive) and their aliases. Absent attribute means "standard" (CF 1.10 §4.4.1). */
export function calendarByName(name: string | undefined): Calendar {
  const n = (name ?? 'standard').trim().toLowerCase();
  switch (n) {
    case '':
    case 'standard':
    case 'gregorian':
      return STANDARD;
    case 'proleptic_gregorian':
      return PROLEPTIC;
    case 'julian':
      return JULIAN;
    case 'noleap':
    case '365_day':
      return NOLEAP_CAL;
    case 'all_leap':
    case '366_day':
      return ALL_LEAP_CAL;
    case '360_day':
      return DAY360;
    default:
      throw new StillwaterError('E_INPUT', `unknown calendar '${name}' (CF calendars: standard, gregorian, proleptic_gregorian, julian, noleap, 365_day, all_leap, 366_day, 360_day).`);
  }
}

export interface CalendarDate {
  year: number;
  month: number;
  day: number;
}

/** The date of a day number in a calendar (inverse of dayNumber). */
export function dateOfDay(cal: Calendar, n: number): CalendarDate {
  // estimate the year from the mean year length, then correct
  let year = Math.floor((n - cal.dayNumber(0, 1, 1)) / yearLengthGuess(cal));
  while (cal.dayNumber(year, 1, 1) > n) year--;
  while (cal.dayNumber(year + 1, 1, 1) <= n) year++;
  let month = 1;
  while (month < 12 && cal.dayNumber(year, month + 1, 1) <= n) month++;
  const first = cal.dayNumber(year, month, 1);
  let day = n - first + 1;
  // the standard calendar's October 1582 skips the 5th to the 14th
  if (cal === STANDARD && year === 1582 && month === 10 && day > 4) day += 10;
  return { year, month, day };
}

function yearLengthGuess(cal: Calendar): number {
  return (cal.dayNumber(2000, 1, 1) - cal.dayNumber(0, 1, 1)) / 2000;
}

/** Days in a calendar year (355 for 1582 in the standard calendar). */
export function yearLength(cal: Calendar, year: number): number {
  return cal.dayNumber(year + 1, 1, 1) - cal.dayNumber(year, 1, 1);
}
