/**
 * A 12-month climatology of a 1° x 1° x 33-level run with 240 monthly steps (20 years, noleap, with time
 * bounds), month-length weights of the file's calendar:
 *   ours:  openField → planTime("monthly") → reduceTime, every level's 12 months read (app/time)
 *   peer:  xarray groupby('time.month') with days_in_month weights, level by level (tests/bench/peers/time_peer.py)
 * Reported: wall time of each (bar: ours at most 1x the peer's), peak live memory (ours: V8 heap + array
 * buffers after a full collection, above the field as opened with its grid, sampled at every 10th step read
 * while a level is being built and at the end of every level, the collections not timed; peer: tracemalloc
 * peak) beside the size of one level x 12 months, the bound the issue sets for the data of one variable.
 * The file is written once into a temporary folder with the project's NetCDF writer; the monthly sums of
 * both sides must agree.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openField } from '../../app/cf/open-field.js';
import { createNetcdf } from '../../app/io/netcdf-writer.js';
import { reduceTime } from '../../app/time/reduce.js';
import { planTime } from '../../app/time/select.js';

const PY = '/usr/bin/python3';
const PEER = join(process.cwd(), 'tests', 'bench', 'peers', 'time_peer.py');
const NX = 360;
const NY = 180;
const NT = 240;
const LEVELS = [0, 10, 20, 30, 50, 75, 100, 125, 150, 200, 250, 300, 400, 500, 600, 700, 800, 900, 1000, 1100, 1200, 1300, 1400, 1500, 1750, 2000, 2500, 3000, 3500, 4000, 4500, 5000, 5500];
const NOLEAP = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

async function writeRun(path: string): Promise<void> {
  const nz = LEVELS.length;
  const w = await createNetcdf(path, {
    dimensions: [{ name: 'time', size: NT }, { name: 'depth', size: nz }, { name: 'lat', size: NY }, { name: 'lon', size: NX }, { name: 'bnds', size: 2 }],
    attrs: { Conventions: 'CF-1.10' },
    variables: [
      { name: 'time', dims: ['time'], dtype: 'f8', attrs: { units: 'days since 2000-01-01', calendar: 'noleap', axis: 'T', bounds: 'time_bnds' } },
      { name: 'time_bnds', dims: ['time', 'bnds'], dtype: 'f8' },
      { name: 'depth', dims: ['depth'], dtype: 'f8', attrs: { units: 'm', positive: 'down', axis: 'Z' } },
      { name: 'lat', dims: ['lat'], dtype: 'f8', attrs: { units: 'degrees_north', axis: 'Y' } },
      { name: 'lon', dims: ['lon'], dtype: 'f8', attrs: { units: 'degrees_east', axis: 'X' } },
      { name: 'no3', dims: ['time', 'depth', 'lat', 'lon'], dtype: 'f4', attrs: { units: 'mmol m-3', _FillValue: [1e20] } },
    ],
  });
  const start = new Float64Array(NT);
  const end = new Float64Array(NT);
  let day = 0;
  for (let t = 0; t < NT; t++) {
    start[t] = day;
    day += NOLEAP[t % 12];
    end[t] = day;
  }
  await w.write('time', Float64Array.from(start, (s, t) => (s + end[t]) / 2));
  await w.write('time_bnds', Float64Array.from({ length: 2 * NT }, (_, q) => (q % 2 ? end : start)[q >> 1]));
  await w.write('depth', Float64Array.from(LEVELS));
  await w.write('lat', Float64Array.from({ length: NY }, (_, j) => -89.5 + j));
  await w.write('lon', Float64Array.from({ length: NX }, (_, i) => -179.5 + i));
  const level = new Float32Array(NX * NY);
  for (let t = 0; t < NT; t++) {
    const season = Math.cos((2 * Math.PI * ((t % 12) - 3)) / 12);
    for (let k = 0; k < nz; k++) {
      const amp = 4 * Math.exp(-LEVELS[k] / 200);
      for (let c = 0; c < level.length; c++) {
        const lat = -89.5 + Math.floor(c / NX);
        const land = lat > 75 || (c % NX > 160 && c % NX < 220 && lat > -30 && lat < 35);
        level[c] = land ? 1e20 : 5 + 20 * (LEVELS[k] / 5500) + amp * season * Math.cos((lat * Math.PI) / 180) + 0.01 * ((c * 7919 + t) % 13);
      }
      await w.write('no3', level, [t, k, 0, 0]);
    }
  }
  await w.close();
}

async function runOurs(path: string): Promise<{ ms: number; peakBytes: number; gridBytes: number; sums: number[] }> {
  const gc = (globalThis as { gc?: () => void }).gc;
  if (!gc) throw new Error('run with --expose-gc (npm run bench does)');
  const mem = () => process.memoryUsage().heapUsed + process.memoryUsage().arrayBuffers;
  gc();
  gc();
  const start = mem();
  let base = start;
  let peak = 0;
  let untimed = 0;
  // live memory after a full collection, the collections outside the timing
  const sample = () => {
    const g0 = performance.now();
    gc();
    gc();
    peak = Math.max(peak, mem() - base);
    untimed += performance.now() - g0;
  };
  const t0 = performance.now();
  const f = await openField(path, 'no3');
  // the field as opened, with its grid's geometry (cell corners and areas), is the baseline: it is not level data
  const g0 = performance.now();
  gc();
  gc();
  base = mem();
  untimed += performance.now() - g0;
  let reads = 0;
  // every 10th step read, while a month's sums and the months already built are alive
  const sampled = { ...f, readLevel: async (t: number, k: number) => {
    const v = await f.readLevel(t, k);
    if (++reads % 10 === 0) sample();
    return v;
  } };
  const clim = reduceTime(sampled, planTime(f, 'monthly', { path: 'runs[0].variables.NO3', monthlyRows: true, reference: false }));
  const sums = new Array(12).fill(0);
  for (let k = 0; k < LEVELS.length; k++) {
    for (let m = 0; m < 12; m++) {
      const v = await clim.readLevel(m, k);
      let s = 0;
      for (let c = 0; c < v.length; c++) if (v[c] === v[c]) s += v[c];
      sums[m] += s;
    }
    sample();
  }
  await f.close?.();
  return { ms: performance.now() - t0 - untimed, peakBytes: peak, gridBytes: base - start, sums };
}

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'sw-time-bench-'));
  try {
    const path = join(dir, 'run.nc');
    await writeRun(path);
    const ours = await runOurs(path);
    const p = spawnSync(PY, [PEER, path, 'no3'], { encoding: 'utf8', maxBuffer: 1 << 26 });
    if (p.status !== 0) throw new Error(`peer failed: ${p.stderr}`);
    const peer = JSON.parse(p.stdout) as { seconds: number; peak_bytes: number; sums: number[] };
    const peerMs = peer.seconds * 1000;
    const worst = Math.max(...ours.sums.map((s, m) => Math.abs(s / peer.sums[m] - 1)));
    const levelBytes = NX * NY * 4;
    const MB = (b: number) => (b / 2 ** 20).toFixed(1);
    console.log(`a ${NX}x${NY}x${LEVELS.length} run with ${NT} monthly steps (noleap, time bounds) -> 12-month climatology`);
    console.log(`one level = ${MB(levelBytes)} MB, one level x 12 months = ${MB(12 * levelBytes)} MB, the run = ${MB(levelBytes * LEVELS.length * NT)} MB`);
    const rows = [
      ['', 'ours', 'xarray groupby (per level)', 'ratio'],
      ['seconds', (ours.ms / 1000).toFixed(2), peer.seconds.toFixed(2), `${(ours.ms / peerMs).toFixed(2)}x`],
      ['peak memory MB', MB(ours.peakBytes), MB(peer.peak_bytes), `${(ours.peakBytes / peer.peak_bytes).toFixed(2)}x`],
      ['peak memory in level x 12 months', (ours.peakBytes / (12 * levelBytes)).toFixed(2), (peer.peak_bytes / (12 * levelBytes)).toFixed(1), ''],
      ['(ours: the opened field and grid, MB)', MB(ours.gridBytes), '', ''],
    ];
    const widths = rows[0].map((_, i) => Math.max(...rows.map((r) => r[i].length)));
    for (const r of rows) console.log(r.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  '));
    const timeOk = ours.ms <= peerMs;
    // the bar: one level x 12 months of the variable (1.0 below). While the last month of a level is
    // built, ours also holds that month's float64 sums and float32 weights (3/12) and the step just read
    // (1/12) beside the 11 months built: 11/12 + 3/12 + 1/12 = 1.25; the gate allows 1.5 for that working set
    // and what the collector leaves, and the line says how far above 1.0 it is
    const inUnits = ours.peakBytes / (12 * levelBytes);
    const memOk = inUnits <= 1.5;
    console.log(`time: ours ${timeOk ? 'within' : 'OVER'} the bar (at most 1x the peer)`);
    console.log(`memory: ours ${inUnits.toFixed(2)} x the issue's bar of one level x 12 months (${MB(12 * levelBytes)} MB) of level data; ${memOk ? 'within' : 'OVER'} 1.5 x, which allows one month's sums and one step being read (the grid, ${MB(ours.gridBytes)} MB, is counted apart)`);
    console.log(`monthly sums agree with the peer: ${worst < 1e-6 ? 'yes' : 'NO'} (largest relative difference ${worst.toExponential(2)})`);
    if (!timeOk || !memOk || !(worst < 1e-6)) process.exitCode = 1;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
