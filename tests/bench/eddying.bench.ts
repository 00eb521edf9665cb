/**
 * Eddying grids (issue 17): a global rotated-pole curvilinear run (30 levels, two tracers, NetCDF-4 deflate,
 * one chunk per level, CF 2-D bounds) compared with a 1° reference, at 1°, 0.5°, 0.25° and 0.1° (3600 × 1800).
 * The files are generated here by tests/bench/peers/make_eddying.py into a temporary folder and removed
 * afterwards. Each compare runs in a child process of its own (so its peak resident memory is its own),
 * first with an empty weight cache (weights built), then again with the weights cached; the skill rows of
 * both runs must be equal. Printed per resolution: wall time, CPU time (process.cpuUsage, less disturbed by
 * other work on a shared machine), peak RSS, CPU microseconds per source cell (the growth table).
 * Bars at 0.1°: at most 40 s and at most 1 GB peak; cost per source cell flat from 1° to 0.1°.
 * No peer: the bars are absolute. The fields are invented; only time and memory count.
 *   npm run bench -- eddying                          all four resolutions (the 0.1° files take minutes and 1 GB of disk)
 *   EDDYING_STEPS=1,0.5 npm run bench -- eddying      some of them
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { runComparison } from '../../app/compare/run.js';
import { loadRecipe } from '../../app/recipe/load.js';

const PY = '/usr/bin/python3';
const MAKE = join(process.cwd(), 'tests', 'bench', 'peers', 'make_eddying.py');
const NZ = 30;
const BAR_SECONDS = 40;
const BAR_BYTES = 1024 ** 3;

const RECIPE = {
  title: 'eddying bench',
  reference: { label: 'ref', variables: { PO4: { file: 'ref.nc', name: 'po4' }, O2: { file: 'ref.nc', name: 'o2' } } },
  runs: [{ label: 'run', variables: { PO4: { file: 'run.nc', name: 'po4' }, O2: { file: 'run.nc', name: 'o2' } } }],
  regions: ['global', 'atlantic', 'pacific'],
  layers: [[0, 200], [200, 1000], [1000, 6000], 'bottom'],
};

interface ChildResult {
  wallMs: number;
  cpuMs: number;
  maxRssBytes: number;
  rows: string;
}

/** In the child: one compare, then its own time, CPU time and peak RSS. */
async function child(dir: string, cache: string): Promise<void> {
  const recipe = await loadRecipe(join(dir, 'recipe.json'));
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const res = await runComparison(recipe, { cacheDir: cache });
  const wallMs = performance.now() - t0;
  const c = process.cpuUsage(c0);
  const out: ChildResult = { wallMs, cpuMs: (c.user + c.system) / 1000, maxRssBytes: process.resourceUsage().maxRSS * 1024, rows: JSON.stringify(res.rows) };
  process.stdout.write(JSON.stringify(out));
}

function runChild(dir: string, cache: string): ChildResult {
  const self = fileURLToPath(import.meta.url);
  const r = spawnSync(process.execPath, [self, 'child', dir, cache], { encoding: 'utf8', maxBuffer: 1 << 28 });
  if (r.status !== 0) throw new Error(`compare failed: ${r.stderr}`);
  return JSON.parse(r.stdout) as ChildResult;
}

async function main(): Promise<void> {
  const steps = (process.env.EDDYING_STEPS ?? '1,0.5,0.25,0.1').split(',').map(Number);
  const table: string[] = [];
  let failed = false;
  for (const step of steps) {
    const dir = mkdtempSync(join(tmpdir(), `sw-eddying-${step}-`));
    const cache = join(dir, 'cache');
    try {
      const made = spawnSync(PY, [MAKE, dir, String(step), String(NZ)], { encoding: 'utf8' });
      if (made.status !== 0) throw new Error(`could not make the ${step}° files: ${made.stderr}`);
      writeFileSync(join(dir, 'recipe.json'), JSON.stringify(RECIPE));
      const cells = Math.round(360 / step) * Math.round(180 / step);
      const cold = runChild(dir, cache);
      const warm = runChild(dir, cache);
      const same = cold.rows === warm.rows;
      if (!same) failed = true;
      const line = (what: string, r: ChildResult): string =>
        [`${step}°`.padEnd(6), String(cells).padStart(8), what.padEnd(15), (r.wallMs / 1000).toFixed(1).padStart(7), (r.cpuMs / 1000).toFixed(1).padStart(7),
          (r.maxRssBytes / 2 ** 20).toFixed(0).padStart(7), ((r.cpuMs * 1000) / cells).toFixed(2).padStart(9)].join('  ');
      table.push(line('weights built', cold), line('weights cached', warm));
      if (step === 0.1) {
        const ok = Math.max(cold.wallMs, warm.wallMs) <= BAR_SECONDS * 1000 && Math.max(cold.maxRssBytes, warm.maxRssBytes) <= BAR_BYTES;
        if (!ok) failed = true;
        table.push(`0.1° bar: <= ${BAR_SECONDS} s and <= 1024 MB: ${ok ? 'met' : 'MISSED'}`);
      }
      table.push(`${step}°: skill rows with weights built and with weights cached ${same ? 'equal' : 'DIFFER'}`);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }
  console.log(`compare of a rotated-pole curvilinear run (${NZ} levels, 2 tracers, deflate) with a 1° reference, 3 regions x 4 layers`);
  console.log(['run'.padEnd(6), 'cells'.padStart(8), 'weights'.padEnd(15), 'wall s'.padStart(7), 'CPU s'.padStart(7), 'RSS MB'.padStart(7), 'CPU µs/cell'.padStart(9)].join('  '));
  for (const l of table) console.log(l);
  console.log(`load average at the end: ${loadavg().map((x) => x.toFixed(1)).join(' ')} (wall time on a shared machine varies; CPU time less so)`);
  if (failed) process.exitCode = 1;
}

if (process.argv[2] === 'child') {
  child(process.argv[3], process.argv[4]).catch((e) => {
    console.error(e);
    process.exitCode = 1;
  });
} else {
  main().catch((e) => {
    console.error(e);
    process.exitCode = 1;
  });
}
