// The spin-up figure of app/figures (the Spin-up view shows it and exports the same one): a first-order approach
// c(t) = 2 + e^(−t/600) in two tracers, through app/spinup's series and result; checks of the figure's structure,
// units typeset, and the logarithmic year axis (equal length per decade: the definition of a log axis).
import { describe, expect, it } from 'vitest';
import type { FieldSource } from '../../../app/cf/field-source.js';
import { spinupFigure } from '../../../app/figures/spinup-figure.js';
import { buildResult } from '../../../app/spinup/build-result.js';
import { seriesSums } from '../../../app/spinup/series.js';
import { DEFAULT_SETTINGS, type LayerSpec } from '../../../app/spinup/types.js';
import { gridFromEdges, memoryField } from '../memory-field.js';
import { memoryOpener } from '../spinup/memory-opener.js';
import { checkFigure, parsesAsXml } from './figure-checks.js';

const grid = gridFromEdges([0, 10, 20, 30], [-10, 0, 10], [0, 50, 150, 400]);
const layers: LayerSpec[] = [{ kind: 'all' }];
const years = [10, 20, 50, 100, 200, 500, 1000, 2000, 5000];

function field(file: string, year: number, variable: string, units: string): FieldSource {
  const nz = grid.vertical!.nz;
  const n = grid.horizontal.nx * grid.horizontal.ny;
  const d = new Float32Array(nz * n);
  for (let k = 0; k < nz; k++) for (let c = 0; c < n; c++) d[k * n + c] = (2 + Math.exp(-year / 600)) * (1 + 0.1 * k);
  return memoryField(grid, d, { file, variable, units });
}

async function result() {
  const files: Record<string, Record<string, FieldSource>> = {};
  const specs = years.map((y, i) => {
    const file = `year-${y}.nc`;
    files[file] = { PO4: field(file, y, 'PO4', 'umol kg-1'), T: field(file, y, 'T', 'degC') };
    return { file, year: y, origin: `runs[0].snapshots[${i}]` };
  });
  const series = await seriesSums({ snapshots: specs, listName: 'runs[0].snapshots', tracers: [{ name: 'PO4', variable: 'PO4' }, { name: 'T', variable: 'T' }], layers, open: memoryOpener(files) });
  return buildResult('spin', series, DEFAULT_SETTINGS);
}

describe('the spin-up figure', () => {
  it('at 180 mm: parses as XML, a title, no text below 7 pt, units typeset on every deviation axis', async () => {
    const r = await result();
    const c = { run: 'spin', quantity: 'mean' as const, relative: false, layer: r.layers[0], tracers: ['PO4', 'T'], regions: [r.regions[0]], skillTracer: '' };
    const f = spinupFigure(r, c);
    expect(f.svg.getAttribute('width')).toBe('180mm');
    const check = checkFigure(f);
    expect(check.problems).toEqual([]);
    expect(check.axisLabels).toEqual(expect.arrayContaining(['Mean deviation (µmol kg⁻¹)', 'Mean deviation (°C)', 'Model year (log scale)']));
    expect(parsesAsXml([f])).toEqual([true]);
    const inv = checkFigure(spinupFigure(r, { ...c, quantity: 'inventory' }));
    expect(inv.axisLabels).toEqual(expect.arrayContaining(['Inventory deviation (mol)', 'Inventory deviation (J)']));
    // the notes say the nominal density in typeset units, as the figures print them
    expect(r.notes.join(' ')).toContain('kg m⁻³');
    expect(r.notes.join(' ')).not.toContain('kg m-3');
  });

  it('puts the decades at equal distances and each snapshot at its year', async () => {
    const r = await result();
    const f = spinupFigure(r, { run: 'spin', quantity: 'mean', relative: false, layer: r.layers[0], tracers: ['PO4'], regions: [r.regions[0]], skillTracer: '' });
    const axis = [...f.svg.walk()].find((n) => n.getAttribute('class') === 'log-axis')!;
    const x: Record<string, number> = {};
    for (const t of axis.walk()) if (t.getAttribute('class') === 'tick-label') x[t.textContent()] = Number(t.getAttribute('x'));
    expect(Object.keys(x)).toEqual(['10', '100', '1000', '10000']);
    expect(x['100'] - x['10']).toBeCloseTo(x['1000'] - x['100'], 1);
    expect(x['10000'] - x['1000']).toBeCloseTo(x['1000'] - x['100'], 1);
    // year 500 lies log10(5) of a decade past 100
    const dots = [...f.svg.walk()].filter((n) => n.tag === 'circle').map((n) => Number(n.getAttribute('cx')));
    expect(dots).toHaveLength(years.length);
    expect(dots[5]).toBeCloseTo(x['100'] + Math.log10(5) * (x['1000'] - x['100']), 1);
    const line = [...f.svg.walk()].find((n) => n.getAttribute('class') === 'series-line')!;
    expect(line.getAttribute('data-label')).toBe(`PO4, ${r.regions[0]}`);
  });
});
