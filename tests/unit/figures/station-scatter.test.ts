// The station scatter (issue 11, station comparisons): the statistics printed in each panel are numpy's
// (tests/fixtures/stations/make_scatter_pairs.py: mean, sqrt, corrcoef over the pairs with a model value, and
// of log10 values over the positive pairs), the figure passes every figure's rules, and a source without a
// single station in its water says so instead of drawing an empty frame.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { stationScatterFigure, type ScatterPanel } from '../../../app/figures/station-scatter.js';
import { shortNumber } from '../../../app/figures/typeset.js';
import { stationSkill } from '../../../app/points/station-stats.js';
import { checkFigure, parsesAsXml } from './figure-checks.js';

interface Stats { n: number; bias: number; rmse: number; corr: number }
const fx = JSON.parse(readFileSync(join(__dirname, '..', '..', 'fixtures', 'stations', 'scatter-pairs.json'), 'utf8')) as {
  observed: number[];
  runs: { label: string; model: (number | null)[]; stats: Stats; log10: Stats; not_positive: number }[];
};
const observed = Float64Array.from(fx.observed);
const runs = fx.runs.map((r) => ({ ...r, values: Float64Array.from(r.model, (v) => v ?? NaN) }));

function panels(): ScatterPanel[] {
  return runs.map((r) => {
    const status = Array.from(r.values, (v) => (Number.isNaN(v) ? ('on_land' as const) : ('ok' as const)));
    const s = stationSkill(r.label, r.values, observed, status);
    return { label: r.label, model: r.values, stats: s.stats, log10: s.log10 };
  });
}

function figure(log: boolean, ps = panels(), width: 'single' | 'double' = 'double') {
  return stationScatterFigure({ name: 'po4-stations', title: 'PO4 at stations', width, quantity: 'PO4', units: 'umol kg-1', observed, panels: ps, log });
}

describe('the station scatter', () => {
  it('has the statistics of numpy in each panel: n, bias, RMSE, r (and log10 ones on log axes)', () => {
    const ps = panels();
    ps.forEach((p, i) => {
      const want = runs[i];
      // the numbers themselves, to round-off
      expect(p.stats.n).toBe(want.stats.n);
      expect(p.stats.bias).toBeCloseTo(want.stats.bias, 12);
      expect(p.stats.rmse).toBeCloseTo(want.stats.rmse, 12);
      expect(p.stats.corr).toBeCloseTo(want.stats.corr, 12);
      // log10 values are kept in single precision (app/stats/log-space.ts): those agree to about 1e-7
      expect(p.log10!.n).toBe(want.log10.n);
      expect(p.log10!.bias).toBeCloseTo(want.log10.bias, 6);
      expect(p.log10!.rmse).toBeCloseTo(want.log10.rmse, 6);
      expect(p.log10!.corr).toBeCloseTo(want.log10.corr, 6);
    });
    const c = checkFigure(figure(true, ps));
    expect(c.panelStats).toHaveLength(2);
    c.panelStats.forEach((text, i) => {
      const w = runs[i];
      expect(text).toContain(`n ${w.stats.n} of ${observed.length} stations`);
      expect(text).toContain(`bias ${shortNumber(w.stats.bias)} µmol kg⁻¹`);
      expect(text).toContain(`RMSE ${shortNumber(w.stats.rmse)} µmol kg⁻¹`);
      expect(text).toContain(`r ${shortNumber(w.stats.corr)}`);
      expect(text).toContain(`log₁₀ bias ${shortNumber(w.log10.bias)}`);
      expect(text).toContain(`log₁₀ RMSE ${shortNumber(w.log10.rmse)}`);
      expect(text).toContain(`log₁₀ r ${shortNumber(w.log10.corr)}`);
    });
    // run B's negative model values cannot sit on a log axis: counted (numpy's count), not dropped silently
    expect(runs[1].not_positive).toBeGreaterThan(0);
    expect(c.panelStats[1]).toContain(`${runs[1].not_positive} pairs ≤ 0 not on the log axes`);
    expect(c.panelStats[0]).not.toContain('not on the log axes');
    // linear axes: no log10 lines
    expect(checkFigure(figure(false, ps)).panelStats[0]).not.toContain('log₁₀');
  });

  it('passes every figure rule at 180 and 90 mm: XML, a title, units on every axis, no text below 7 pt', () => {
    const figs = [figure(true), figure(false), figure(false, panels(), 'single')];
    expect(parsesAsXml(figs)).toEqual([true, true, true]);
    for (const f of figs) {
      const c = checkFigure(f);
      expect(c.problems).toEqual([]);
      expect(c.axisLabels.length).toBeGreaterThanOrEqual(4);
      expect(c.panelTitles).toEqual(['Run A', 'Run B']);
    }
    // log axes: the decades of the data (1e-2 .. 1e1 and beyond) as tick labels
    const svg = JSON.stringify(checkFigure(figure(true)).axisLabels);
    expect(svg).toContain('log scale');
  });

  it('a source with no station in its water says so instead of an empty frame', () => {
    const ps = panels();
    const empty = new Float64Array(observed.length).fill(NaN);
    const s = stationSkill('Run C', empty, observed, Array.from(empty, () => 'on_land' as const));
    const c = checkFigure(figure(false, [...ps, { label: 'Run C', model: empty, stats: s.stats, log10: s.log10 }]));
    expect(c.noDataNotes.join(' ')).toMatch(/No station lies in the water of Run C/);
    expect(c.panelStats).toHaveLength(2);
  });
});
