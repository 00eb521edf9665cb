/**
 * The comparison (issue 4, Benchmark):
 *  (a) a 1° x 1° x 102-level reference and one run on the reference grid, all 6 regions x 5 layers
 *      ([0,100], [100,1000], [1000,6000] m, surface, bottom): our runComparison (reading, basins, statistics)
 *      vs tests/bench/peers/compare_peer.py (netCDF4 + vectorised numpy, the same weighted statistics; it is
 *      given the basin index of each cell so that it does not redo our boundary lines).   bar: at most 1x
 *  (b) the demo recipe (sample-data/demo-recipe.json) end to end, when the demo data exist (for information).
 * Files are generated into a temporary folder and removed afterwards. Median of REPEATS after one warm-up.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runComparison } from '../../app/compare/run.js';
import { makeRegularGrid } from '../../app/grid/rectilinear.js';
import { loadRecipe } from '../../app/recipe/load.js';
import { validateRecipe } from '../../app/recipe/validate.js';
import { basinIndex } from '../../app/regions/basins.js';

const REPEATS = 5;
const PY = '/usr/bin/python3';
const PEER = join(process.cwd(), 'tests', 'bench', 'peers', 'compare_peer.py');

function median(xs: number[]): number {
  const s = xs.slice().sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

type PeerRow = { region: string; layer: string; n: number; bias?: number; rmse?: number; corr?: number };

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'sw-compare-bench-'));
  const cache = mkdtempSync(join(tmpdir(), 'sw-compare-bench-cache-'));
  try {
    const made = spawnSync(PY, [PEER, 'make', dir], { encoding: 'utf8' });
    if (made.status !== 0) throw new Error(`could not make the benchmark files: ${made.stderr}`);
    const grid = makeRegularGrid(1, 1);
    writeFileSync(join(dir, 'basins.u8'), basinIndex(grid.lon, grid.lat));
    const recipe = validateRecipe(
      {
        reference: { label: 'ref', variables: { PO4: { file: 'ref.nc' } } },
        runs: [{ label: 'run', variables: { PO4: { file: 'run.nc' } } }],
        regions: ['global', 'atlantic', 'pacific', 'indian', 'southern', 'arctic'],
        layers: [[0, 100], [100, 1000], [1000, 6000], 'surface', 'bottom'],
      },
      dir,
    );
    const ours: number[] = [];
    let rows: Awaited<ReturnType<typeof runComparison>>['rows'] = [];
    for (let r = 0; r <= REPEATS; r++) {
      const t0 = performance.now();
      rows = (await runComparison(recipe, { cacheDir: cache })).rows;
      if (r > 0) ours.push(performance.now() - t0);
    }
    const peerTimes: number[] = [];
    let peerRows: PeerRow[] = [];
    for (let r = 0; r <= REPEATS; r++) {
      const p = spawnSync(PY, [PEER, 'run', dir], { encoding: 'utf8', maxBuffer: 1 << 26 });
      if (p.status !== 0) throw new Error(`peer failed: ${p.stderr}`);
      const outp = JSON.parse(p.stdout) as { seconds: number; rows: PeerRow[] };
      peerRows = outp.rows;
      if (r > 0) peerTimes.push(outp.seconds * 1000);
    }
    // the two must agree before their times mean anything
    let worst = 0;
    let compared = 0;
    for (const pr of peerRows) {
      const layer = pr.layer.startsWith('(') ? pr.layer.replace(/\((\d+), (\d+)\)/, '$1-$2 m') : pr.layer;
      const ourRow = rows.find((x) => x.region === pr.region && x.layer === layer);
      if (!ourRow) throw new Error(`no row of ours for ${pr.region} ${layer}`);
      if (ourRow.n !== pr.n) throw new Error(`n differs for ${pr.region} ${layer}: ${ourRow.n} vs ${pr.n}`);
      if (pr.n > 0 && pr.bias !== undefined && ourRow.bias !== null && ourRow.rmse !== null) {
        worst = Math.max(worst, Math.abs(ourRow.bias - pr.bias) / Math.max(1e-12, pr.rmse!), Math.abs(ourRow.rmse - pr.rmse!) / pr.rmse!);
        compared++;
      }
    }
    const o = median(ours);
    const p = median(peerTimes);
    const ratio = o / p;
    console.log(`\n(a) 1°x1°x102 reference + 1 run on its grid, 6 regions x 5 layers; median of ${REPEATS} after a warm-up, milliseconds`);
    console.log(['case', 'ours ms', 'peer', 'peer ms', 'ratio', 'bar', ''].join('  '));
    console.log(['compare', o.toFixed(0), 'netCDF4+numpy', p.toFixed(0), `${ratio.toFixed(2)}x`, '<= 1x', ratio <= 1 ? 'ok' : 'MISSED'].join('  '));
    console.log(`rows agree with the peer: ${compared} rows with data, equal n, largest bias/RMSE difference ${worst.toExponential(2)} of RMSE`);
    if (ratio > 1 || worst > 1e-5) process.exitCode = 1;

    const demo = join(process.cwd(), 'sample-data', 'demo-recipe.json');
    if (existsSync(demo)) {
      try {
        const rec = await loadRecipe(demo);
        const t0 = performance.now();
        const res = await runComparison(rec, { cacheDir: cache });
        const cold = performance.now() - t0;
        const t1 = performance.now();
        await runComparison(rec, { cacheDir: cache });
        const warm = performance.now() - t1;
        console.log(`\n(b) demo recipe end to end: ${rec.runs.length} runs x ${rec.variables.length} variables x ${rec.regions.length} regions x ${rec.layers.length} layers = ${res.rows.length} rows; first run ${cold.toFixed(0)} ms (builds regridding weights), second ${warm.toFixed(0)} ms (weights cached)`);
      } catch (e) {
        console.log(`\n(b) demo recipe: failed: ${(e as Error).message}`);
        process.exitCode = 1;
      }
    } else {
      console.log('\n(b) demo recipe: sample-data/demo-recipe.json not found (run `stillwater make-demo`); skipped');
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
    rmSync(cache, { recursive: true, force: true });
  }
}

main().catch((e) => {
  console.error(e);
  process.exitCode = 1;
});
