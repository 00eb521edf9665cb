/**
 * Lines and stations benchmark: a 5 000 km transect sampled every 10 km through every level of a
 * 1°×1°×102 field, and 100 000 stations sampled (trilinear) from the same field, beside a scipy
 * RegularGridInterpolator script doing the same sampling (tests/bench/peers/lines_peer.py).
 * Each workload runs in a fresh process on each side, so the peak memory figures are its own.
 * Both sides hold the field in memory as float32; times are the best of REPEATS runs in each of ROUNDS
 * alternating processes, sampling only (for us: locating the points and streaming the levels). The
 * ratio uses CPU time, which a machine busy with other work disturbs far less than elapsed time.
 *
 *   npm run bench -- lines
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import type { FieldSource } from '../../app/cf/field-source.js';
import { parseUnits } from '../../app/cf/units.js';
import { makeRegularGrid } from '../../app/grid/rectilinear.js';
import { makeVerticalAxis } from '../../app/grid/vertical.js';
import { destination } from '../../app/lines/great-circle.js';
import { pointWeights } from '../../app/lines/location-weights.js';
import { sampleGreatCircles } from '../../app/lines/sample-path.js';
import { sampleSection } from '../../app/lines/section.js';
import { sampleStations } from '../../app/points/sample-stations.js';

const NX = 360, NY = 180, NZ = 102;
/** enough repeats for the JIT to settle: the first one (cold) is reported too */
const REPEATS = 12;
/** ours and the peer take turns this many times (fresh processes), so that a busy machine hits both alike */
const ROUNDS = 2;
const N_STATIONS = 100_000;
const PEER = join(process.cwd(), 'tests', 'bench', 'peers', 'lines_peer.py');

/** 102 layers to 6000 m, thin at the top (the peer uses the same rule). */
function depthEdges(): Float64Array {
  return Float64Array.from({ length: NZ + 1 }, (_, k) => 6000 * (k / NZ) ** 1.8);
}

/** The same smooth field as the peer, level-major float32. */
function makeField(): FieldSource {
  const horizontal = makeRegularGrid(1, 1);
  const vertical = makeVerticalAxis(depthEdges());
  const n = NX * NY;
  const values = new Float32Array(n * NZ);
  for (let k = 0; k < NZ; k++) {
    const z = vertical.centres[k];
    for (let j = 0; j < NY; j++) {
      const phi = ((-89.5 + j) * Math.PI) / 180;
      for (let i = 0; i < NX; i++) {
        const lam = ((-179.5 + i) * Math.PI) / 180;
        values[k * n + j * NX + i] = Math.sin(2 * lam) * Math.cos(phi) + 0.3 * Math.cos(3 * phi) + z / 2000 + 0.05 * Math.sin(lam * 5 + z / 500);
      }
    }
  }
  return {
    file: 'bench',
    variable: 'tracer',
    units: parseUnits('mmol m-3'),
    grid: { horizontal, vertical },
    nt: 1,
    time: null,
    // a view per level: the field is held in memory, as on the peer side
    readLevel: async (_t, k) => values.subarray(k * n, (k + 1) * n),
  };
}

/** Points of each workload: lon, lat, depth (the transect's depths are its level centres). */
function points(mode: string): { lon: Float64Array; lat: Float64Array; depth: Float64Array } {
  if (mode === 'transect') {
    const start = { lon: 150, lat: -20 };
    const end = destination(start, 50, 5_000_000);
    const line = sampleGreatCircles([start, end], 10);
    return { lon: line.lon, lat: line.lat, depth: new Float64Array(line.lon.length) };
  }
  // a fixed pseudo-random sequence (linear congruential), inside the grid's centres
  let s = 20261201;
  const rand = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
  const e = depthEdges();
  const top = 0.5 * (e[0] + e[1]), bottom = 0.5 * (e[NZ - 1] + e[NZ]);
  const lon = new Float64Array(N_STATIONS), lat = new Float64Array(N_STATIONS), depth = new Float64Array(N_STATIONS);
  for (let i = 0; i < N_STATIONS; i++) {
    lon[i] = -180 + 360 * rand();
    lat[i] = -89.5 + 179 * rand();
    depth[i] = top + (bottom - top) * rand();
  }
  return { lon, lat, depth };
}

async function child(mode: string, outFile: string): Promise<void> {
  const field = makeField();
  const p = points(mode);
  let best = Infinity;
  let bestWall = Infinity;
  let cold = NaN;
  let result: Float64Array = new Float64Array(0);
  for (let r = 0; r < REPEATS; r++) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    if (mode === 'transect') {
      const start = { lon: 150, lat: -20 };
      const line = sampleGreatCircles([start, destination(start, 50, 5_000_000)], 10);
      const w = pointWeights(field.grid.horizontal, line.lon, line.lat, 'bilinear');
      result = Float64Array.from(await sampleSection(field, w));
    } else {
      const s = await sampleStations(field, { lon: p.lon, lat: p.lat, depth: p.depth, seafloor: new Uint8Array(N_STATIONS) });
      result = s.model;
    }
    const c = process.cpuUsage(c0);
    if (r === 0) cold = (c.user + c.system) / 1000;
    best = Math.min(best, (c.user + c.system) / 1000);
    bestWall = Math.min(bestWall, performance.now() - t0);
  }
  writeFileSync(outFile, Buffer.from(result.buffer));
  process.stdout.write(JSON.stringify({ ms: best, cold_ms: cold, wall_ms: bestWall, peak_mb: process.resourceUsage().maxRSS / 1024, n: result.length }) + '\n');
}

interface Figures {
  /** CPU time (user + system), the best repeat */
  ms: number;
  wall_ms: number;
  /** CPU time of the first repeat (ours: before the JIT has compiled the hot loops) */
  cold_ms?: number;
  peak_mb: number;
  n: number;
}

/** The fastest time and the largest peak memory over the rounds. */
function best(runs: Figures[]): Figures {
  return { ms: Math.min(...runs.map((r) => r.ms)), wall_ms: Math.min(...runs.map((r) => r.wall_ms)), cold_ms: Math.min(...runs.map((r) => r.cold_ms ?? NaN)), peak_mb: Math.max(...runs.map((r) => r.peak_mb)), n: runs[0].n };
}

function runJson(cmd: string, args: string[]): Figures {
  const r = spawnSync(cmd, args, { encoding: 'utf8', maxBuffer: 1 << 24 });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed:\n${r.stderr}`);
  return JSON.parse(r.stdout.trim().split('\n').pop()!) as Figures;
}

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'sw-bench-lines-'));
  const rows: string[] = [];
  let failed = false;
  try {
    for (const [mode, label] of [
      ['transect', '5 000 km transect, 10 km, 102 levels'],
      ['stations', '100 000 stations, trilinear'],
    ] as const) {
      const p = points(mode);
      const pointsFile = join(dir, `${mode}-points.f64`);
      writeFileSync(pointsFile, Buffer.concat([Buffer.from(p.lon.buffer), Buffer.from(p.lat.buffer), Buffer.from(p.depth.buffer)]));
      const oursOut = join(dir, `${mode}-ours.f64`);
      const peerOut = join(dir, `${mode}-peer.f64`);
      const oursRuns: Figures[] = [];
      const peerRuns: Figures[] = [];
      for (let round = 0; round < ROUNDS; round++) {
        oursRuns.push(runJson(process.execPath, [process.argv[1], 'child', mode, oursOut]));
        peerRuns.push(runJson('/usr/bin/python3', [PEER, mode, pointsFile, peerOut, String(REPEATS)]));
      }
      const ours = best(oursRuns);
      const peer = best(peerRuns);
      // the same numbers on both sides (the peer's transect is level-major too)
      const a = new Float64Array(readFileSync(oursOut).buffer.slice(0));
      const b = new Float64Array(readFileSync(peerOut).buffer.slice(0));
      let maxDiff = 0;
      for (let i = 0; i < a.length; i++) maxDiff = Math.max(maxDiff, Math.abs(a[i] - b[i]));
      if (a.length !== b.length || !(maxDiff < 1e-5)) failed = true;
      rows.push(
        [
          label.padEnd(40),
          ours.ms.toFixed(1).padStart(9),
          peer.ms.toFixed(1).padStart(9),
          (ours.ms / peer.ms).toFixed(2).padStart(7),
          (ours.cold_ms ?? NaN).toFixed(1).padStart(9),
          ours.wall_ms.toFixed(1).padStart(9),
          peer.wall_ms.toFixed(1).padStart(9),
          ours.peak_mb.toFixed(0).padStart(9),
          peer.peak_mb.toFixed(0).padStart(9),
          maxDiff.toExponential(1).padStart(9),
        ].join('  '),
      );
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  console.log(`sampling a 1°×1°×102 float32 field held in memory; best of ${REPEATS} × ${ROUNDS} alternating rounds, milliseconds`);
  console.log('cpu = CPU time of the sampling (user + system; steady on a busy machine), best repeat; cold = our first repeat,');
  console.log('which includes compiling the hot loops; wall = elapsed; MB = peak RSS of a fresh process per workload');
  console.log(['workload'.padEnd(40), 'ours cpu'.padStart(9), 'peer cpu'.padStart(9), 'ratio'.padStart(7), 'ours cold'.padStart(9), 'ours wall'.padStart(9), 'peer wall'.padStart(9), 'ours MB'.padStart(9), 'peer MB'.padStart(9), 'max diff'.padStart(9)].join('  '));
  for (const r of rows) console.log(r);
  console.log('peer: scipy.interpolate.RegularGridInterpolator (tests/bench/peers/lines_peer.py); ratio = ours / peer CPU time (below 1: faster)');
  if (failed) {
    console.log('FAILED: our values and the peer\'s differ by more than 1e-5');
    process.exitCode = 1;
  }
}

if (process.argv[2] === 'child') await child(process.argv[3], process.argv[4]);
else await main();
