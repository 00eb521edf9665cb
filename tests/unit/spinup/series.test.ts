import { describe, expect, it } from 'vitest';
import { seriesSums } from '../../../app/spinup/series.js';
import { buildResult } from '../../../app/spinup/build-result.js';
import { DEFAULT_SETTINGS, type LayerSpec, type SnapshotSpec } from '../../../app/spinup/types.js';
import { StillwaterError } from '../../../app/errors.js';
import type { FieldSource } from '../../../app/cf/field-source.js';
import { gridFromEdges, memoryField, UMOL_KG } from '../memory-field.js';
import { memoryOpener } from './memory-opener.js';

const grid = gridFromEdges([0, 10, 20, 30], [-10, 0, 10], [0, 50, 150, 400]);
const layers: LayerSpec[] = [
  { kind: 'all' },
  { kind: 'interval', top: 0, bottom: 150 },
];

/** Every wet cell follows the same first-order approach c(t) = 2 + 1·e^(−t/τ), τ = 600 years; one land column. */
function snapshotField(file: string, year: number, variable = 'PO4', g = grid): FieldSource {
  const nz = g.vertical!.nz;
  const n = g.horizontal.nx * g.horizontal.ny;
  const d = new Float32Array(nz * n);
  for (let k = 0; k < nz; k++) for (let c = 0; c < n; c++) d[k * n + c] = c === 5 ? NaN : (2 + Math.exp(-year / 600)) * (1 + 0.1 * k);
  return memoryField(g, d, { file, variable });
}

function demoFiles(years: number[]): { specs: SnapshotSpec[]; files: Record<string, Record<string, FieldSource>> } {
  const files: Record<string, Record<string, FieldSource>> = {};
  const specs = years.map((y, i) => {
    const file = `year-${y}.nc`;
    files[file] = { PO4: snapshotField(file, y) };
    return { file, year: y, origin: `runs[0].snapshots[${i}]` };
  });
  return { specs, files };
}

async function refusal(p: Promise<unknown>): Promise<StillwaterError> {
  try {
    await p;
  } catch (e) {
    if (e instanceof StillwaterError) return e;
    throw e;
  }
  throw new Error('expected a refusal');
}

const tracers = [{ name: 'phosphate', variable: 'PO4' }];

describe('spin-up series over snapshot files', () => {
  it('follows the volume-weighted mean through the snapshots and recovers τ of the first-order approach', async () => {
    const years = Array.from({ length: 15 }, (_, i) => (i + 1) * 200);
    const { specs, files } = demoFiles(years);
    const open = memoryOpener(files);
    const series = await seriesSums({ snapshots: specs, listName: 'runs[0].snapshots', tracers, layers, open });
    expect(open.openCount()).toBe(0);
    const r = buildResult('demo', series, DEFAULT_SETTINGS);
    expect(r.years).toEqual(years);
    expect(r.tracks).toHaveLength(2);
    const all = r.tracks[0];
    expect(all.meanDeviation[0]).toBe(0);
    // means are Float32 level values: compare the shape of the approach, not single-precision digits
    expect(Math.abs(all.fit!.tau / 600 - 1)).toBeLessThan(1e-3);
    expect(all.inventoryUnits).toBe('mol');
    expect(all.inventory[3] / (all.mean[3] * all.volume * 1e-3) - 1).toBeCloseTo(0, 12);
    expect(r.summary.tracks).toBe(2);
  });

  it('refuses a single snapshot, naming the file', async () => {
    const { specs, files } = demoFiles([100]);
    const e = await refusal(seriesSums({ snapshots: specs, listName: 'runs[0].snapshots', tracers, layers, open: memoryOpener(files) }));
    expect(e.message).toMatch(/at least two snapshots; only one.*year-100\.nc/);
    expect(e.isBadInput).toBe(true);
  });

  it('refuses snapshots out of order, naming the file', async () => {
    const { specs, files } = demoFiles([100, 300, 200]);
    const e = await refusal(seriesSums({ snapshots: specs, listName: 'runs[0].snapshots', tracers, layers, open: memoryOpener(files) }));
    expect(e.message).toMatch(/^runs\[0\]\.snapshots\[2\] \(year-200\.nc\): model year 200 comes before model year 300/);
  });

  it('refuses a snapshot without a model year when the file has no time axis, naming the file', async () => {
    const { specs, files } = demoFiles([100, 200, 300]);
    specs[1] = { ...specs[1], year: NaN };
    const e = await refusal(seriesSums({ snapshots: specs, listName: 'runs[0].snapshots', tracers, layers, open: memoryOpener(files) }));
    expect(e.message).toMatch(/year-200\.nc\): the snapshot has no model year/);
  });

  it('refuses a snapshot on another grid, naming the file and the difference', async () => {
    const { specs, files } = demoFiles([100, 200, 300]);
    files['year-300.nc'] = { PO4: snapshotField('year-300.nc', 300, 'PO4', gridFromEdges([0, 10, 20, 30], [-10, 0, 10], [0, 50, 150, 500])) };
    const e = await refusal(seriesSums({ snapshots: specs, listName: 'runs[0].snapshots', tracers, layers, open: memoryOpener(files) }));
    expect(e.code).toBe('E_GRID');
    expect(e.message).toMatch(/^year-300\.nc: .*another grid than year-100\.nc \(other depth levels\)/);
  });

  it('refuses a snapshot that lacks a variable, naming the file and the variable, before reading any data', async () => {
    const { specs, files } = demoFiles([100, 200, 300]);
    let levelsRead = 0;
    for (const f of Object.values(files)) {
      const read = f.PO4.readLevel.bind(f.PO4);
      f.PO4.readLevel = async (t, k) => {
        levelsRead++;
        return read(t, k);
      };
    }
    files['year-200.nc'] = { NO3: snapshotField('year-200.nc', 200, 'NO3') };
    const open = memoryOpener(files);
    const e = await refusal(seriesSums({ snapshots: specs, listName: 'runs[0].snapshots', tracers, layers, open }));
    expect(e.code).toBe('E_VARIABLE');
    expect(e.message).toMatch(/^year-200\.nc: the snapshot at model year 200 .*has no variable 'PO4'/);
    expect(levelsRead).toBe(0);
    expect(open.openCount()).toBe(0);
  });

  it('refuses a second tracer in other units in a later snapshot, naming the file (checked while reading, before any result)', async () => {
    const { specs, files } = demoFiles([100, 200, 300]);
    for (const [name, vars] of Object.entries(files)) vars.NO3 = snapshotField(name, 1, 'NO3');
    const f = files['year-300.nc'].NO3;
    files['year-300.nc'].NO3 = memoryField(f.grid, new Float32Array(6 * 3), { file: 'year-300.nc', variable: 'NO3', units: UMOL_KG });
    const e = await refusal(seriesSums({ snapshots: specs, listName: 'runs[0].snapshots', tracers: [...tracers, { name: 'nitrate', variable: 'NO3' }], layers, open: memoryOpener(files) }));
    expect(e.code).toBe('E_UNITS');
    expect(e.message).toMatch(/^year-300\.nc: variable 'NO3' .* is in 'umol kg-1' but in 'mmol m-3' in year-100\.nc/);
  });

  it('takes model years from a CF time axis when the list gives none (one file, several time steps)', async () => {
    const base = snapshotField('all.nc', 0);
    const multi: FieldSource = {
      ...base,
      nt: 3,
      time: { name: 'time', units: 'days since 0001-01-01', calendar: '365_day', values: [100, 200, 300].map((y) => ({ value: y * 365, iso: '', yearFraction: y })) },
      readLevel: (t, k) => snapshotField('all.nc', [100, 200, 300][t]).readLevel(0, k),
    };
    const series = await seriesSums({ snapshots: [{ file: 'all.nc', year: NaN }], listName: '--snapshots', tracers, layers, open: memoryOpener({ 'all.nc': { PO4: multi } }) });
    expect(series.snapshots.map((s) => s.year)).toEqual([100, 200, 300]);
    expect(series.snapshots.map((s) => s.timeIndex)).toEqual([0, 1, 2]);
    const m = series.sums.map((s) => s[0][0][0].sumCV / s[0][0][0].volume);
    expect(m[0]).toBeGreaterThan(m[1]);
  });
});
