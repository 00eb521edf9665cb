/**
 * Spin-up over thirty snapshots of a 1° x 1° x 33-level field with six regions and five layers:
 *   ours:  seriesSums (app/spinup/series.ts) reading every snapshot level by level through openSnapshot
 *   peer:  netCDF4-python + numpy reading each snapshot's whole 3-D field (tests/bench/peers/spinup_peer.py)
 * Reported: time per snapshot and peak live memory above the start (ours: V8 heap + array buffers after a
 * garbage collection at every level read, in a separate pass from the timing; peer: tracemalloc peak, which
 * numpy's arrays report to). The memory of the series (30 fields)
 * and of one level are printed beside them: ours must stay within a few levels, not the series.
 * The snapshots are written once into a temporary folder with the project's NetCDF writer; the means of
 * both sides must agree.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createNetcdf } from '../../app/io/netcdf-writer.js';
import { loadRegions } from '../../app/compare/load-regions.js';
import type { LayerSpec } from '../../app/regions/layers.js';
import { seriesSums, type SnapshotHandle } from '../../app/spinup/series.js';
import { openSnapshot } from '../../app/spinup/open-snapshot.js';

const PY = '/usr/bin/python3';
const PEER = join(process.cwd(), 'tests', 'bench', 'peers', 'spinup_peer.py');
const NSNAP = 30;
const NX = 360;
const NY = 180;
// 33 standard depth levels (0–5500 m), as climatologies carry them (common practice)
const LEVELS = [0, 10, 20, 30, 50, 75, 100, 125, 150, 200, 250, 300, 400, 500, 600, 700, 800, 900, 1000, 1100, 1200, 1300, 1400, 1500, 1750, 2000, 2500, 3000, 3500, 4000, 4500, 5000, 5500];
const REGIONS = ['global', 'atlantic', 'pacific', 'indian', 'southern', 'arctic'] as const;
const LAYERS: LayerSpec[] = [{ kind: 'interval', top: 0, bottom: 200 }, { kind: 'interval', top: 200, bottom: 1000 }, { kind: 'interval', top: 1000, bottom: 6000 }, { kind: 'all' }, { kind: 'bottom' }];

function depthEdges(): Float64Array {
  const e = new Float64Array(LEVELS.length + 1);
  for (let k = 1; k < LEVELS.length; k++) e[k] = 0.5 * (LEVELS[k - 1] + LEVELS[k]);
  e[LEVELS.length] = LEVELS[LEVELS.length - 1] + 250;
  return e;
}

/** An invented seafloor and a tracer approaching equilibrium at first order (τ = 1500 years). */
async function writeSnapshots(dir: string): Promise<void> {
  const edges = depthEdges();
  const nz = LEVELS.length;
  const floor = new Float64Array(NX * NY);
  for (let j = 0; j < NY; j++) {
    for (let i = 0; i < NX; i++) {
      const lat = -89.5 + j;
      const lon = -179.5 + i;
      const land = (lon > -20 && lon < 40 && lat > -30 && lat < 35) || (lat > 70) || (lon > 90 && lon < 140 && lat > 20 && lat < 60);
      floor[j * NX + i] = land ? 0 : 200 + 4800 * Math.abs(Math.sin((lon * Math.PI) / 90) * Math.cos((lat * Math.PI) / 120));
    }
  }
  for (let s = 1; s <= NSNAP; s++) {
    const year = s * 100;
    const w = await createNetcdf(join(dir, `year-${String(s).padStart(5, '0')}.nc`), {
      dimensions: [{ name: 'depth', size: nz }, { name: 'lat', size: NY }, { name: 'lon', size: NX }, { name: 'bnds', size: 2 }],
      attrs: { Conventions: 'CF-1.10' },
      variables: [
        { name: 'depth', dims: ['depth'], dtype: 'f8', attrs: { units: 'm', positive: 'down', axis: 'Z', bounds: 'depth_bnds' } },
        { name: 'depth_bnds', dims: ['depth', 'bnds'], dtype: 'f8' },
        { name: 'lat', dims: ['lat'], dtype: 'f8', attrs: { units: 'degrees_north', axis: 'Y', bounds: 'lat_bnds' } },
        { name: 'lat_bnds', dims: ['lat', 'bnds'], dtype: 'f8' },
        { name: 'lon', dims: ['lon'], dtype: 'f8', attrs: { units: 'degrees_east', axis: 'X', bounds: 'lon_bnds' } },
        { name: 'lon_bnds', dims: ['lon', 'bnds'], dtype: 'f8' },
        { name: 'po4', dims: ['depth', 'lat', 'lon'], dtype: 'f4', attrs: { units: 'mmol m-3', _FillValue: [1e20] } },
      ],
    });
    await w.write('depth', Float64Array.from(LEVELS));
    await w.write('depth_bnds', Float64Array.from(LEVELS.flatMap((_, k) => [edges[k], edges[k + 1]])));
    await w.write('lat', Float64Array.from({ length: NY }, (_, j) => -89.5 + j));
    await w.write('lat_bnds', Float64Array.from({ length: NY * 2 }, (_, q) => -90 + Math.floor(q / 2) + (q % 2)));
    await w.write('lon', Float64Array.from({ length: NX }, (_, i) => -179.5 + i));
    await w.write('lon_bnds', Float64Array.from({ length: NX * 2 }, (_, q) => -180 + Math.floor(q / 2) + (q % 2)));
    const level = new Float32Array(NX * NY);
    const approach = 1 - 0.3 * Math.exp(-year / 1500);
    for (let k = 0; k < nz; k++) {
      for (let c = 0; c < level.length; c++) level[c] = edges[k] < floor[c] ? (0.5 + (2 * LEVELS[k]) / 5500) * approach * (1 + 0.1 * Math.sin(c)) : 1e20;
      await w.write('po4', level, [k, 0, 0]);
    }
    await w.close();
  }
}

interface OursResult {
  msPerSnapshot: number;
  peakBytes: number;
  /** peak over the first three snapshots: the series must not make it grow */
  earlyPeakBytes: number;
  means: number[][];
}

/**
 * One pass over the series. With `measure`, memory is sampled after every level read, after a full garbage
 * collection, so the figure is what is live (what the level-by-level design bounds), comparable with the
 * peer's tracemalloc peak (Python frees numpy arrays as soon as they are unreferenced). Timing comes from a
 * pass without sampling.
 */
async function runOurs(dir: string, measure: boolean): Promise<OursResult> {
  const gc = (globalThis as { gc?: () => void }).gc;
  if (measure && !gc) throw new Error('run with --expose-gc (npm run bench does)');
  const mem = () => {
    const m = process.memoryUsage();
    return m.heapUsed + m.arrayBuffers;
  };
  // full, synchronous collections, twice: array buffer memory is released by the second (a first one
  // only finds them unreferenced), so the figure is what is live, not what awaits the sweeper
  const collect = () => {
    gc!();
    gc!();
  };
  if (measure) {
    collect();
    await new Promise((r) => setTimeout(r, 100));
    collect();
  }
  const base = mem();
  let peak = 0;
  let earlyPeak = 0;
  let levelsRead = 0;
  const sample = () => {
    if (!measure) return;
    collect();
    peak = Math.max(peak, mem() - base);
    if (++levelsRead <= 3 * LEVELS.length) earlyPeak = peak; // levels are read in the data pass only
  };
  const open = async (file: string): Promise<SnapshotHandle> => {
    const h = await openSnapshot(file);
    return {
      async field(v, u) {
        const f = await h.field(v, u);
        const read = f.readLevel.bind(f);
        f.readLevel = async (t, k) => {
          const level = await read(t, k);
          sample();
          return level;
        };
        return f;
      },
      close: h.close,
    };
  };
  const snapshots = Array.from({ length: NSNAP }, (_, s) => ({ file: join(dir, `year-${String(s + 1).padStart(5, '0')}.nc`), year: (s + 1) * 100 }));
  const t0 = performance.now();
  const series = await seriesSums({
    snapshots,
    listName: 'bench',
    tracers: [{ name: 'PO4', variable: 'po4' }],
    layers: LAYERS,
    regions: (g) => loadRegions(REGIONS.map((name) => ({ kind: 'built-in' as const, name })), g),
    open,
  });
  const ms = performance.now() - t0;
  sample();
  const means = series.sums.map((snap) => snap[0].flatMap((byLayer) => byLayer.map((a) => a.sumCV / a.volume)));
  return { msPerSnapshot: ms / NSNAP, peakBytes: peak, earlyPeakBytes: earlyPeak, means };
}

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'sw-spinup-bench-'));
  try {
    await writeSnapshots(dir);
    await runOurs(dir, false); // warm-up: file cache, JIT
    const timed = await runOurs(dir, false);
    const measured = await runOurs(dir, true);
    const ours = { ...timed, peakBytes: measured.peakBytes, earlyPeakBytes: measured.earlyPeakBytes };
    // the same region cells for the peer, as one 0/1 byte mask per region
    const probe = await openSnapshot(join(dir, 'year-00001.nc'));
    const grid = (await probe.field('po4')).grid.horizontal;
    await probe.close();
    const regions = await loadRegions(REGIONS.map((name) => ({ kind: 'built-in' as const, name })), grid);
    const masks = new Uint8Array(REGIONS.length * NX * NY);
    regions.forEach((r, q) => r.cells.forEach((c) => (masks[q * NX * NY + c] = 1)));
    const maskFile = join(dir, 'regions.u8');
    writeFileSync(maskFile, masks);
    const p = spawnSync(PY, [PEER, dir, String(NSNAP), maskFile, String(REGIONS.length)], { encoding: 'utf8', maxBuffer: 1 << 26 });
    if (p.status !== 0) throw new Error(`peer failed: ${p.stderr}`);
    const peer = JSON.parse(p.stdout) as { seconds: number[]; peak_bytes: number; means: number[][] };
    const peerMs = (peer.seconds.reduce((a, b) => a + b, 0) / peer.seconds.length) * 1000;
    let worst = 0;
    ours.means.forEach((row, s) => row.forEach((m, q) => (worst = Math.max(worst, Math.abs(m / peer.means[s][q] - 1)))));
    const levelBytes = NX * NY * 4;
    const seriesBytes = levelBytes * LEVELS.length * NSNAP;
    const MB = (b: number) => (b / 2 ** 20).toFixed(1);
    console.log(`${NSNAP} snapshots of a ${NX}x${NY}x${LEVELS.length} field, ${REGIONS.length} regions x ${LAYERS.length} layers`);
    console.log(`one level = ${MB(levelBytes)} MB, one 3-D field = ${MB(levelBytes * LEVELS.length)} MB, the series = ${MB(seriesBytes)} MB`);
    const rows = [
      ['', 'ours', 'netCDF4-python + numpy', 'ratio'],
      ['ms per snapshot', ours.msPerSnapshot.toFixed(1), peerMs.toFixed(1), `${(ours.msPerSnapshot / peerMs).toFixed(2)}x`],
      ['peak memory MB', MB(ours.peakBytes), MB(peer.peak_bytes), `${(ours.peakBytes / peer.peak_bytes).toFixed(2)}x`],
      ['peak memory in levels', (ours.peakBytes / levelBytes).toFixed(1), (peer.peak_bytes / levelBytes).toFixed(1), ''],
    ];
    const widths = rows[0].map((_, i) => Math.max(...rows.map((r) => r[i].length)));
    for (const r of rows) console.log(r.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  '));
    // bounded: the peak after all thirty snapshots is the peak after the first three (within one level)
    const growth = ours.peakBytes - ours.earlyPeakBytes;
    const boundedOk = growth <= levelBytes && ours.peakBytes < seriesBytes / 4;
    console.log(`ours: peak after 3 snapshots ${MB(ours.earlyPeakBytes)} MB, after ${NSNAP}: ${MB(ours.peakBytes)} MB (growth ${MB(growth)} MB; bar: at most one level)`);
    console.log('ours holds a few grid-sized arrays (a 1° grid with cell corners is 5.6 MB) and a few levels, never the series');
    console.log(`memory bounded, not growing with the series: ${boundedOk ? 'ok' : 'MISSED'}`);
    console.log(`means agree with the peer: ${worst < 1e-9 ? 'yes' : 'NO'} (largest relative difference ${worst.toExponential(2)})`);
    if (!boundedOk || !(worst < 1e-9)) process.exitCode = 1;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
