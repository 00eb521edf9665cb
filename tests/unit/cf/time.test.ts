import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { decodeTime, decodeTimeAxis, parseTimeUnits } from '../../../app/cf/time.js';
import { calendarByName, dateOfDay } from '../../../app/cf/calendar.js';

interface Case {
  calendar: string;
  units: string;
  values: number[];
  iso: string[];
  yearFraction?: number[];
  source: string;
}
// Expected dates made by tests/fixtures/cf/make_time_cases.py with cftime.num2date (python3-cftime).
const fixture = JSON.parse(readFileSync(join(__dirname, '../../fixtures/cf/time-cases.json'), 'utf8')) as { cases: Case[] };

describe('CF time decoding equals cftime.num2date for every calendar', () => {
  for (const c of fixture.cases) {
    it(`${c.calendar}: ${c.units} (${c.source})`, () => {
      const u = parseTimeUnits(c.units, c.calendar);
      const got = c.values.map((v) => decodeTime(v, u));
      expect(got.map((g) => g.iso)).toEqual(c.iso);
      if (c.yearFraction) {
        got.forEach((g, i) => expect(g.yearFraction).toBeCloseTo(c.yearFraction![i], 9));
      }
    });
  }
  it('covers all CF calendars and their aliases', () => {
    const cals = new Set(fixture.cases.map((c) => c.calendar));
    for (const n of ['standard', 'gregorian', 'proleptic_gregorian', 'julian', 'noleap', '365_day', 'all_leap', '366_day', '360_day']) {
      expect(cals.has(n)).toBe(true);
    }
  });
});

describe('calendar facts', () => {
  it('the standard calendar jumps from 1582-10-04 to 1582-10-15 (Gregorian reform; CF 1.10 §4.4.1)', () => {
    const cal = calendarByName('standard');
    expect(cal.dayNumber(1582, 10, 15) - cal.dayNumber(1582, 10, 4)).toBe(1);
    expect(dateOfDay(cal, cal.dayNumber(1582, 10, 4) + 1)).toEqual({ year: 1582, month: 10, day: 15 });
  });
  it('Julian Day Number of 2000-01-01 is 2451545 (Meeus, Astronomical Algorithms, ch. 7; from memory)', () => {
    expect(calendarByName('proleptic_gregorian').dayNumber(2000, 1, 1)).toBe(2451545);
  });
  it('a day number round-trips through the date in every calendar', () => {
    for (const name of ['standard', 'proleptic_gregorian', 'julian', 'noleap', 'all_leap', '360_day']) {
      const cal = calendarByName(name);
      for (let n = cal.dayNumber(1500, 1, 1); n < cal.dayNumber(1700, 1, 1); n += 7) {
        const d = dateOfDay(cal, n);
        expect(cal.dayNumber(d.year, d.month, d.day)).toBe(n);
      }
    }
  });
});

describe('time units that are not CF', () => {
  it('rejects text without since', () => expect(() => parseTimeUnits('days', 'standard')).toThrow(/not of the form/));
  it('rejects an unknown unit', () => expect(() => parseTimeUnits('fortnights since 1850-01-01')).toThrow(/unknown time unit/));
  it('rejects an unknown calendar', () => expect(() => parseTimeUnits('days since 1850-01-01', 'lunar')).toThrow(/unknown calendar 'lunar'/));
  it('rejects a date that the calendar lacks', () => {
    expect(() => parseTimeUnits('days since 2001-02-29', 'noleap')).toThrow(/does not exist/);
    expect(() => parseTimeUnits('days since 2001-02-30', '360_day')).not.toThrow();
  });
  it('a missing time value stays missing; an absurd one is refused instead of looping', () => {
    const u = parseTimeUnits('days since 1850-01-01', 'standard');
    expect(decodeTime(NaN, u).iso).toBe('missing');
    expect(() => decodeTime(1e300, u)).toThrow(/too far/);
    expect(() => decodeTime(Infinity, u)).toThrow(/too far/);
  });
  it('a time axis keeps the file calendar name', () => {
    const axis = decodeTimeAxis('time', [0, 31], 'days since 2000-01-01', 'gregorian');
    expect(axis.calendar).toBe('gregorian');
    expect(axis.values.map((v) => v.iso)).toEqual(['2000-01-01T00:00:00', '2000-02-01T00:00:00']);
  });
});
