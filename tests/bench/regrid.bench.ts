/**
 * Regridding cost, weights and application timed separately, with peak memory while applying.
 *   (a) a 2° curvilinear source (sheared quadrilaterals, great-circle edges), 20 levels, onto 1° x 1° x 102 levels
 *   (b) regular 1° onto regular 1° shifted by half a cell in longitude and latitude, 102 levels on both sides
 *   (c) regular 1° onto regular 0.25° (1440 x 720), 57 levels
 * ours: regridField (CSR weights, vertical overlap then horizontal, NaN-aware with coverage) read level by level.
 * peer for (b): tests/bench/peers/regrid_peer.py — the same separable conservative remap written with numpy and
 * scipy.sparse (overlap matrices per axis, kron to CSR, W @ (h·v) and W @ h per level), on the same synthetic
 * data; the checksums of both outputs must agree. Fastest of REPEATS passes after one untimed pass on both sides;
 * weights built (no cache) in every pass. Run with --expose-gc (tests/bench/run.mjs passes it).
 */
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import type { FieldSource } from '../../app/cf/field-source.js';
import { makeRectilinearGrid, makeRegularGrid } from '../../app/grid/rectilinear.js';
import type { Grid, HorizontalGrid, VerticalAxis } from '../../app/grid/types.js';
import { makeVerticalAxis } from '../../app/grid/vertical.js';
import { regridField } from '../../app/regrid/regrid-field.js';
import { clearWeightMemory } from '../../app/regrid/weights.js';
import { distortedGrid } from '../unit/regrid/helpers.js';

const PY = '/usr/bin/python3';
const PEER = join(process.cwd(), 'tests', 'bench', 'peers', 'regrid_peer.py');
const REPEATS = 9;
const MB = 1024 * 1024;
const gc = (globalThis as { gc?: () => void }).gc ?? (() => undefined);

/** Layer edges 0..5500 m, thin at the top (the same formula in the peer). */
function depthAxis(nz: number): VerticalAxis {
  const e = new Float64Array(nz + 1);
  for (let k = 0; k <= nz; k++) e[k] = 5500 * (k / nz) ** 1.8;
  return makeVerticalAxis(e);
}

/**
 * Synthetic tracer (the same formula in the peer): a smooth pattern, missing below a seafloor
 * that depends on position, plus 0.01 per level. Levels are made on demand: nothing is held.
 */
function syntheticField(grid: Grid): FieldSource {
  const h = grid.horizontal;
  const n = h.nx * h.ny;
  const base = new Float32Array(n), floor = new Float64Array(n);
  for (let c = 0; c < n; c++) {
    const lo = (h.lon[c] * Math.PI) / 180, la = (h.lat[c] * Math.PI) / 180;
    base[c] = 1 + 0.5 * Math.sin(la) + 0.25 * Math.cos(la) * Math.cos(2 * lo);
    floor[c] = 3000 + 2600 * Math.cos(la) * Math.sin(lo) - 1500 * Math.sin(la) ** 2;
  }
  const v = grid.vertical!;
  return {
    file: 'synthetic',
    variable: 'tracer',
    units: { text: 'mmol m-3', kind: 'amount_per_volume', canonical: 'mmol m-3', factor: 1e-3, offset: 0 },
    grid,
    nt: 1,
    time: null,
    async readLevel(_t: number, k: number) {
      const out = new Float32Array(n);
      const top = v.edges[k], add = 0.01 * k;
      // a NaN held in a local: with the literal in the select this loop ran 3-4x slower in Node 20 (measured)
      const missing = NaN;
      for (let c = 0; c < n; c++) out[c] = top < floor[c] ? base[c] + add : missing;
      return out;
    },
  };
}

interface Result {
  buildMs: number;
  applyMs: number;
  buildCpuMs: number;
  applyCpuMs: number;
  /** largest live memory (heap + array buffers, after a collection) while applying, above what it was once the weights were built */
  liveMb: number;
  /** size of the CSR weights */
  weightsMb: number;
  /** per-level work buffers of the regridded field (sums per source cell, pass rows; WebAssembly memory for lat-lon pairs) */
  workMb: number;
  /** largest resident set size while applying */
  rssMb: number;
  /** making the synthetic source levels alone (part of apply on both sides): fastest of REPEATS */
  sourceMs: number;
  levelMb: number;
  nnz: number;
  checksum: number;
}

const cpuMs = (): number => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

async function runOurs(src: Grid, tgt: Grid): Promise<Result> {
  const field = syntheticField(src);
  const nz = tgt.vertical!.nz;
  let best: Omit<Result, 'liveMb' | 'rssMb' | 'weightsMb' | 'workMb' | 'sourceMs'> | null = null;
  let bestCpu = { build: Infinity, apply: Infinity };
  // one untimed pass first: the JIT, and the allocator's reuse of freed level-sized blocks, settle in it
  for (let r = -1; r < REPEATS; r++) {
    clearWeightMemory();
    gc();
    let t0 = performance.now(), c0 = cpuMs();
    const out = await regridField(field, tgt, { cacheDir: null });
    const buildMs = performance.now() - t0, buildCpu = cpuMs() - c0;
    gc();
    let checksum = 0;
    t0 = performance.now();
    c0 = cpuMs();
    for (let k = 0; k < nz; k++) {
      const level = await out.readLevel(0, k);
      for (let i = 0; i < level.length; i += 97) if (level[i] === level[i]) checksum += level[i];
    }
    const applyMs = performance.now() - t0, applyCpu = cpuMs() - c0;
    const levelMb = (tgt.horizontal.nx * tgt.horizontal.ny * 4) / MB;
    const res = { buildMs, applyMs, buildCpuMs: buildCpu, applyCpuMs: applyCpu, levelMb, nnz: out.weightEntries, checksum };
    if (r < 0) continue;
    if (!best || res.applyMs + res.buildMs < best.applyMs + best.buildMs) best = res;
    bestCpu = { build: Math.min(bestCpu.build, buildCpu), apply: Math.min(bestCpu.apply, applyCpu) };
  }
  // memory in a pass of its own (a collection before each sample shows what is really held)
  clearWeightMemory();
  const out = await regridField(field, tgt, { cacheDir: null });
  gc();
  const m0 = process.memoryUsage();
  const base = m0.heapUsed + m0.arrayBuffers;
  let live = -Infinity, rss = 0;
  for (let k = 0; k < nz; k++) {
    const level = await out.readLevel(0, k);
    gc();
    const m = process.memoryUsage();
    live = Math.max(live, m.heapUsed + m.arrayBuffers - base);
    rss = Math.max(rss, m.rss);
    if (level.length === 0) break;
  }
  const weightsMb = out.heldBytes.weights / MB, workMb = out.heldBytes.work / MB;
  let sourceMs = Infinity;
  for (let r = 0; r < REPEATS; r++) {
    const t0 = performance.now();
    for (let k = 0; k < field.grid.vertical!.nz; k++) await field.readLevel(0, k);
    sourceMs = Math.min(sourceMs, performance.now() - t0);
  }
  return { ...best!, buildCpuMs: bestCpu.build, applyCpuMs: bestCpu.apply, liveMb: live / MB, rssMb: rss / MB, weightsMb, workMb, sourceMs };
}

function runPeer(): { buildMs: number; applyMs: number; buildCpuMs: number; applyCpuMs: number; sourceMs: number; nnz: number; checksum: number } {
  const r = spawnSync(PY, [PEER, String(REPEATS)], { encoding: 'utf8', maxBuffer: 1 << 24 });
  if (r.status !== 0) throw new Error(`peer failed: ${r.stderr}`);
  const o = JSON.parse(r.stdout) as { build: number[]; apply: number[]; buildCpu: number[]; applyCpu: number[]; source: number[]; nnz: number; checksum: number };
  const best = o.build.map((b, i) => b + o.apply[i]).reduce((bi, x, i, a) => (x < a[bi] ? i : bi), 0);
  return {
    buildMs: o.build[best] * 1000,
    applyMs: o.apply[best] * 1000,
    buildCpuMs: Math.min(...o.buildCpu) * 1000,
    applyCpuMs: Math.min(...o.applyCpu) * 1000,
    sourceMs: Math.min(...o.source) * 1000,
    nnz: o.nnz,
    checksum: o.checksum,
  };
}

/** Latitude edges shifted by half a degree: a half-width row at each pole. */
function shiftedLatEdges(): Float64Array {
  const e = [-90];
  for (let x = -89.5; x < 90; x += 1) e.push(x);
  e.push(90);
  return Float64Array.from(e);
}

const fmt = (x: number, d = 0): string => x.toFixed(d);

async function main(): Promise<void> {
  const cases: { name: string; src: Grid; tgt: Grid }[] = [
    { name: '(a) 2° curvilinear x20 -> 1° x102', src: { horizontal: distortedGrid(180, 90, -90, 90) as HorizontalGrid, vertical: depthAxis(20) }, tgt: { horizontal: makeRegularGrid(1, 1), vertical: depthAxis(102) } },
    {
      name: '(b) 1° -> 1° shifted half a cell, x102',
      src: { horizontal: makeRegularGrid(1, 1, -180), vertical: depthAxis(102) },
      tgt: { horizontal: makeRectilinearGrid(Float64Array.from({ length: 361 }, (_, i) => -179.5 + i), shiftedLatEdges()), vertical: depthAxis(102) },
    },
    { name: '(c) 1° -> 0.25° (1440x720), x57', src: { horizontal: makeRegularGrid(1, 1), vertical: depthAxis(57) }, tgt: { horizontal: makeRegularGrid(0.25, 0.25), vertical: depthAxis(57) } },
  ];
  console.log(`conservative regridding, fastest of ${REPEATS} passes (wall clock; CPU time of the process beside it); weights built without cache`);
  console.log('memory: weights as held (two per-axis factors for lat-lon pairs, else the sparse matrix); work buffers; largest growth of live heap + array buffers while applying (after a collection per level), against one target level; peak RSS');
  const head = ['case', 'entries', 'weights ms', 'apply ms', 'ms/level', 'weights cpu', 'apply cpu', 'weights MB', 'work MB', 'live MB', 'one level MB', 'RSS MB'];
  const rows: string[][] = [];
  let ours_b: Result | null = null;
  for (const c of cases) {
    const r = await runOurs(c.src, c.tgt);
    if (c.name.startsWith('(b)')) ours_b = r;
    const nz = c.tgt.vertical!.nz;
    rows.push([c.name, String(r.nnz), fmt(r.buildMs), fmt(r.applyMs), fmt(r.applyMs / nz, 2), fmt(r.buildCpuMs), fmt(r.applyCpuMs), fmt(r.weightsMb, 2), fmt(r.workMb, 1), fmt(Math.max(0, r.liveMb), 1), fmt(r.levelMb, 2), fmt(r.rssMb)]);
  }
  table(head, rows);

  const peer = runPeer();
  const o = ours_b!;
  console.log('\n(b) side by side with the numpy/scipy peer (tests/bench/peers/regrid_peer.py), same data, same algorithm');
  const agree = Math.abs(o.checksum / peer.checksum - 1) < 1e-5 && o.nnz === peer.nnz;
  const ratio = (a: number, b: number): string => fmt(a / b, 2);
  table(
    ['phase', 'ours ms', 'numpy/scipy ms', 'ratio', 'ours cpu ms', 'peer cpu ms', 'cpu ratio', 'bar'],
    [
      ['weights', fmt(o.buildMs), fmt(peer.buildMs), ratio(o.buildMs, peer.buildMs), fmt(o.buildCpuMs), fmt(peer.buildCpuMs), ratio(o.buildCpuMs, peer.buildCpuMs), ''],
      ['apply 102 levels', fmt(o.applyMs), fmt(peer.applyMs), ratio(o.applyMs, peer.applyMs), fmt(o.applyCpuMs), fmt(peer.applyCpuMs), ratio(o.applyCpuMs, peer.applyCpuMs), ''],
      ['  of which making the source levels', fmt(o.sourceMs), fmt(peer.sourceMs), ratio(o.sourceMs, peer.sourceMs), '', '', '', ''],
      [
        'total',
        fmt(o.buildMs + o.applyMs),
        fmt(peer.buildMs + peer.applyMs),
        ratio(o.buildMs + o.applyMs, peer.buildMs + peer.applyMs),
        fmt(o.buildCpuMs + o.applyCpuMs),
        fmt(peer.buildCpuMs + peer.applyCpuMs),
        ratio(o.buildCpuMs + o.applyCpuMs, peer.buildCpuMs + peer.applyCpuMs),
        '<= 1',
      ],
    ],
  );
  console.log(`entries ours ${o.nnz} / peer ${peer.nnz}; checksum ours ${o.checksum.toFixed(4)} / peer ${peer.checksum.toFixed(4)}: ${agree ? 'agree' : 'DISAGREE'}`);
  const total = (o.buildMs + o.applyMs) / (peer.buildMs + peer.applyMs);
  if (!agree) process.exitCode = 1;
  console.log(total <= 1 ? `(b) within the bar: ${total.toFixed(2)} x the peer` : `(b) slower than the peer: ${total.toFixed(2)} x (bar 1)`);
}

function table(head: string[], rows: string[][]): void {
  const w = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (r: string[]): string => r.map((x, i) => (i === 0 ? x.padEnd(w[i]) : x.padStart(w[i]))).join('  ');
  console.log(line(head));
  for (const r of rows) console.log(line(r));
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
