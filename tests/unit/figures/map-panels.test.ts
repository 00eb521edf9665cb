import { describe, expect, it } from 'vitest';
import { mapPanelsFigure } from '../../../app/figures/map-panels.js';
import { makeProjection } from '../../../app/render/projections.js';
import { checkFigure, parsesAsXml } from './figure-checks.js';

// a small synthetic grid: the checks below are about the figure's structure, not about any field's values
const nx = 36;
const ny = 18;
const lonEdges = Float64Array.from({ length: nx + 1 }, (_, i) => -180 + 10 * i);
const latEdges = Float64Array.from({ length: ny + 1 }, (_, j) => -90 + 10 * j);
const area = Float64Array.from({ length: nx * ny }, (_, c) => Math.cos(((-85 + 10 * Math.floor(c / nx)) * Math.PI) / 180));
const ref = Float32Array.from({ length: nx * ny }, (_, c) => (c % 5 === 0 ? NaN : 100 + (c % 17)));
const runA = ref.map((v, c) => v + (c % 3) - 1);
const runB = ref.map((v, c) => v + 2 * ((c % 7) - 3));
const diff = (m: Float32Array) => m.map((v, c) => v - ref[c]);

function figure(width: 'single' | 'double', runs = [{ label: 'Run A', values: runA }, { label: 'Run B', values: runB }]) {
  return mapPanelsFigure({
    name: 'o2-bottom',
    title: 'Oxygen, bottom layer',
    quantity: 'Oxygen',
    units: 'umol kg-1',
    width,
    projection: makeProjection('plate'),
    grid: { lonEdges, latEdges },
    area,
    reference: { label: 'Climatology', values: ref },
    runs: runs.map((r) => ({ ...r, difference: diff(r.values), stats: { bias: 1.25, rmse: 3.5, corr: 0.875, n: 100 } })),
    coast: [],
    statsScope: 'global, bottom',
  });
}

describe('the multi-panel map', () => {
  it('at 180 mm: SVG that parses as XML, a title, units on both colour bars, no text below 7 pt', () => {
    const f = figure('double');
    expect(f.svg.getAttribute('width')).toBe('180mm');
    const c = checkFigure(f);
    expect(c.problems).toEqual([]);
    expect(c.colourBarLabels).toEqual(['Oxygen (µmol kg⁻¹)', 'Run minus reference (µmol kg⁻¹)']);
    expect(parsesAsXml([f])).toEqual([true]);
  });

  it('at 90 mm the same rules hold', () => {
    const f = figure('single');
    expect(f.svg.getAttribute('width')).toBe('90mm');
    expect(checkFigure(f).problems).toEqual([]);
  });

  it('names what each panel shows: reference, each run, each run minus reference', () => {
    const titles = checkFigure(figure('double')).panelTitles;
    expect(titles).toEqual(['Climatology (reference)', 'Run A', 'Run A minus reference', 'Run B', 'Run B minus reference']);
  });

  it('prints the statistics in each difference panel', () => {
    const c = checkFigure(figure('double'));
    expect(c.panelStats).toHaveLength(2);
    expect(c.panelStats[0]).toContain('bias 1.25 µmol kg⁻¹');
    expect(c.panelStats[0]).toContain('RMSE 3.5 µmol kg⁻¹');
    expect(c.panelStats[0]).toContain('r 0.875');
  });

  it('a panel without compared cells says so instead of an empty frame', () => {
    const empty = new Float32Array(nx * ny).fill(NaN);
    const c = checkFigure(figure('double', [{ label: 'Run A', values: runA }, { label: 'Dry run', values: empty }]));
    expect(c.noDataNotes.length).toBeGreaterThanOrEqual(2);
  });
});
