/**
 * Time windows, month choices and monthly climatologies against outside sources: cftime's calendar
 * arithmetic, xarray's time grouping with day-count weights, numpy's FFT (values in
 * tests/fixtures/time/expected.json, written by make_time_fixtures.py from Debian's python3 packages).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { FieldSource } from '../../../app/cf/field-source.js';
import { calendarByName } from '../../../app/cf/calendar.js';
import { openField } from '../../../app/cf/open-field.js';
import { decodeTimeAxis } from '../../../app/cf/time.js';
import { parseUnits } from '../../../app/cf/units.js';
import { makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { harmonicPeak, wrapMonths } from '../../../app/stats/seasonal-cycle.js';
import { periodLevel } from '../../../app/time/periods.js';
import { reduceTime } from '../../../app/time/reduce.js';
import { planTime, type TimeChoice } from '../../../app/time/select.js';
import { monthDays, timeSteps } from '../../../app/time/steps.js';

const FX = join(__dirname, '../../fixtures/time');
const expected = JSON.parse(readFileSync(join(FX, 'expected.json'), 'utf8'));
const runCtx = { path: 'runs[0].variables.x', monthlyRows: false, reference: false };

function axisField(values: number[], units: string, calendar: string): FieldSource {
  return {
    file: 'axis.nc',
    variable: 'x',
    units: parseUnits('1'),
    grid: { horizontal: makeRegularGrid(180, 180), vertical: null },
    nt: values.length,
    time: decodeTimeAxis('time', values, units, calendar),
    readLevel: async (t) => Float32Array.of(t),
  };
}

/** Expected (xarray) value lists have null for NaN. */
function expectClose(got: Float32Array, want: (number | null)[], skip: number[] = []): void {
  expect(got.length).toBe(want.length);
  want.forEach((w, i) => {
    if (skip.includes(i)) return;
    if (w === null) expect(got[i]).toBeNaN();
    else expect(got[i]).toBeCloseTo(w, 4);
  });
}

async function levels(f: FieldSource, t: number): Promise<Float32Array> {
  const nz = f.grid.vertical?.nz ?? 1;
  const parts: Float32Array[] = [];
  for (let k = 0; k < nz; k++) parts.push(await f.readLevel(t, k));
  const out = new Float32Array(parts.reduce((s, p) => s + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

describe('month lengths of every CF calendar (cftime: days from the first of a month to the first of the next)', () => {
  it.each(['standard', 'gregorian', 'proleptic_gregorian', 'julian', 'noleap', 'all_leap', '360_day'])('%s', (cal) => {
    const cases = expected.monthLengths.filter((c: { calendar: string }) => c.calendar === cal);
    expect(cases.length).toBe(96);
    const c = calendarByName(cal);
    for (const x of cases) expect(monthDays(c, x.year, x.month), `${cal} ${x.year}-${x.month}`).toBe(x.days);
  });
});

describe('window membership (cftime: from <= date < the day after `to`)', () => {
  it('every calendar and window in the fixture', () => {
    expect(expected.windows.length).toBeGreaterThan(20);
    for (const w of expected.windows) {
      const f = axisField(w.values, w.units, w.calendar);
      const choice: TimeChoice = { from: w.from, to: w.to };
      if (w.inside.length === 0) {
        expect(() => planTime(f, choice, runCtx), `${w.calendar} ${w.from}..${w.to}`).toThrow(/has no time step inside the window/);
        continue;
      }
      const plan = planTime(f, choice, runCtx);
      expect(plan.kind).toBe('mean');
      if (plan.kind === 'mean') expect(Array.from(plan.steps), `${w.calendar} ${w.from}..${w.to}`).toEqual(w.inside);
    }
  });
  it('a window that cuts a step counts the step in full when its time value lies inside (as documented in app/time/select.ts)', () => {
    // monthly steps stamped mid-month with bounds over the whole month (noleap): a window from Jan 10 to Feb 10
    const f = axisField([15.5, 45], 'days since 2000-01-01', 'noleap');
    f.time!.bounds = Float64Array.of(0, 31, 31, 59);
    const plan = planTime(f, { from: '2000-01-10', to: '2000-02-10' }, runCtx);
    expect(plan).toMatchObject({ kind: 'mean' });
    if (plan.kind === 'mean') {
      expect(Array.from(plan.steps)).toEqual([0]);
      expect(Array.from(plan.weights)).toEqual([31]);
    }
  });
  it('months pick steps by the month of their time value, within a window or not', () => {
    const f = axisField(expected.windows[0].values, 'days since 1990-01-01 00:00:00', 'noleap');
    const plan = planTime(f, { months: [12, 1, 2] }, runCtx);
    if (plan.kind !== 'mean') throw new Error('expected a mean');
    expect(Array.from(plan.steps)).toEqual([0, 1, 11, 12, 13, 23, 24, 25, 35]);
    const inWindow = planTime(f, { from: '1991-01-01', to: '1991-12-31', months: [12, 1, 2] }, runCtx);
    if (inWindow.kind !== 'mean') throw new Error('expected a mean');
    expect(Array.from(inWindow.steps)).toEqual([12, 13, 23]);
  });
});

describe('monthly climatologies, seasons and means against xarray (groupby with days_in_month weights)', () => {
  it.each(['monthly_noleap.nc', 'monthly_360day.nc', 'monthly_standard.nc'])('%s', async (name) => {
    const want = expected.xarray[name];
    const f = await openField(join(FX, name), 'tracer');
    try {
      const plan = planTime(f, 'monthly', runCtx);
      expect(plan.kind).toBe('monthly');
      const clim = reduceTime(f, plan);
      const months: Float32Array[] = [];
      for (let m = 0; m < 12; m++) {
        months.push(await levels(clim, m));
        expectClose(months[m], want.months[m]);
      }
      // the one cell missing at one step (depth 1, lat 2, lon 3): seasons here weigh a month by its full length
      const partial = 1 * 12 + 2 * 4 + 3;
      for (const s of ['DJF', 'MAM', 'JJA', 'SON'] as const) expectClose(periodLevel(months, clim.monthWeights!, s), want.seasons[s], [partial]);
      const mean = reduceTime(f, planTime(f, 'mean', runCtx));
      expectClose(await levels(mean, 0), want.mean);
    } finally {
      await f.close?.();
    }
  });
  it('a window mean (1991 of monthly_noleap.nc)', async () => {
    const want = expected.xarray['monthly_noleap.nc window 1991-01-01..1991-12-31'];
    const f = await openField(join(FX, 'monthly_noleap.nc'), 'tracer');
    const plan = planTime(f, { from: '1991-01-01', to: '1991-12-31' }, runCtx);
    if (plan.kind !== 'mean') throw new Error('expected a mean');
    expect(plan.steps.length).toBe(want.steps);
    expectClose(await levels(reduceTime(f, plan), 0), want.mean);
    await f.close?.();
  });
  it('lengths from bounds, or from the calendar when there are none', async () => {
    const noleap = await openField(join(FX, 'monthly_noleap.nc'), 'tracer');
    const day360 = await openField(join(FX, 'monthly_360day.nc'), 'tracer');
    const std = await openField(join(FX, 'monthly_standard.nc'), 'tracer');
    expect(timeSteps(noleap.time!).lengthsFrom).toBe('bounds');
    expect(timeSteps(day360.time!).lengthsFrom).toBe('calendar months');
    expect(new Set(timeSteps(day360.time!).length)).toEqual(new Set([30]));
    // February 2000 in the standard calendar (cftime: 29 days)
    expect(timeSteps(std.time!).length[13]).toBe(29);
    for (const f of [noleap, day360, std]) await f.close?.();
  });
});

describe('12-step references', () => {
  const refCtx = { path: 'reference.variables.SST', monthlyRows: false, reference: true };
  it('with CF climatology bounds: the 12 months of a climatology, weighted by their noleap lengths (cftime)', async () => {
    const f = await openField(join(FX, 'clim_noleap.nc'), 'sst');
    expect(f.time?.climatology).toBe(true);
    const plan = planTime(f, undefined, refCtx);
    if (plan.kind !== 'monthly') throw new Error('expected months');
    expect(Array.from(plan.monthWeights)).toEqual(expected.climatologyMonthDays);
    await f.close?.();
  });
  it('without them: refused unless the recipe says "monthly"', async () => {
    const f = await openField(join(FX, 'twelve_plain.nc'), 'sst');
    expect(() => planTime(f, undefined, refCtx)).toThrow(
      /^reference\.variables\.SST\.time: 'sst' in .*twelve_plain\.nc has 12 time steps without CF climatology bounds: say "time": "monthly" if they are the months of a climatology, or "mean" or a step\.$/,
    );
    expect(planTime(f, 'monthly', refCtx).kind).toBe('monthly');
    await f.close?.();
  });
});

describe('bad input: one sentence naming the file and variable', () => {
  it('"months" on a source with no time axis', () => {
    const f = { ...axisField([0], 'days since 2000-01-01', 'noleap'), time: null, nt: 1 };
    expect(() => planTime(f, { months: [1] }, runCtx)).toThrow(/^runs\[0\]\.variables\.x\.time: 'x' in axis\.nc has no time axis, so "months" cannot apply\.$/);
  });
  it('a window outside the time axis names the axis\'s first and last dates', () => {
    const f = axisField([15, 45, 74], 'days since 2000-01-01', 'noleap');
    expect(() => planTime(f, { from: '1990-01-01', to: '1999-12-31' }, runCtx)).toThrow(
      /^runs\[0\]\.variables\.x\.time: 'x' in axis\.nc has no time step inside the window 1990-01-01 to 1999-12-31: its time axis runs from 2000-01-16T00:00:00 to 2000-03-16T00:00:00\.$/,
    );
  });
  it('a date the calendar does not have', () => {
    const f = axisField([15, 45, 74], 'days since 2000-01-01', 'noleap');
    expect(() => planTime(f, { from: '2000-02-29' }, runCtx)).toThrow(/in the noleap calendar|does not exist/);
  });
  it('an unknown calendar', async () => {
    await expect(openField(join(FX, 'bad_calendar.nc'), 'sst')).rejects.toThrow(/bad_calendar\.nc, variable 'sst': its time coordinate 'time': unknown calendar 'lunar'/);
  });
});

describe('first harmonic (numpy.fft.fft; the harmonic rebuilt on a 1e-4-month grid)', () => {
  it('peaks where numpy says', () => {
    for (const h of expected.harmonics) {
      const got = harmonicPeak(h.values)!;
      expect(Math.abs(wrapMonths(got - h.peak))).toBeLessThan(2e-4);
    }
  });
  it('phase differences wrap onto the year: 11.5 − 0.5 is −1 month', () => {
    expect(wrapMonths(11.5 - 0.5)).toBe(-1);
    expect(wrapMonths(0.5 - 11.5)).toBe(1);
  });
});
