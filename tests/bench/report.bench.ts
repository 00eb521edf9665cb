/**
 * The report benchmark (issue 11): the demo recipe (sample-data/demo-recipe.json, invented data) end to end,
 * `stillwater report` beside `stillwater compare` on the same recipe, each in a fresh process, alternating,
 * with elapsed time, CPU time of all threads and peak resident memory (GNU time's %e, %U + %S and %M). Bar:
 * report at most 2× compare. On a shared machine the elapsed times move with the others' load: read the
 * ratio of one run, and the CPU times beside it (they move less).
 *
 *   npm run bench -- report      (run `npm run --silent stillwater -- make-demo` first)
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const ROUNDS = 2;
const BAR = 2;
const root = process.cwd();
const recipe = join(root, 'sample-data', 'demo-recipe.json');

/** elapsed seconds and peak resident memory (MiB) of one command in a fresh process, from GNU time */
interface Measured {
  seconds: number;
  cpu: number;
  peakMiB: number;
  figures: number;
}

function measure(args: string[]): Measured {
  const p = spawnSync('/usr/bin/time', ['-f', 'SW_TIME %e %U %S %M', process.execPath, join(root, 'main', 'launch.mjs'), ...args], { encoding: 'utf8', maxBuffer: 1 << 26 });
  const m = /SW_TIME (\S+) (\S+) (\S+) (\S+)/.exec(p.stderr);
  if (p.status !== 0 || !m) throw new Error(`${args[0]} failed: ${p.stderr.slice(-2000)}`);
  const figures = Number(/wrote (\d+) figures/.exec(p.stdout + p.stderr)?.[1] ?? 0);
  return { seconds: Number(m[1]), cpu: Number(m[2]) + Number(m[3]), peakMiB: Number(m[4]) / 1024, figures };
}

function main(): void {
  if (!existsSync(join(root, 'sample-data', 'generated', 'ref.nc'))) {
    console.log('report benchmark: no demo data; run `npm run --silent stillwater -- make-demo` first');
    return;
  }
  const dir = mkdtempSync(join(tmpdir(), 'sw-report-bench-'));
  const cache = join(dir, 'cache');
  try {
    // warm the weight cache once so both sides start from cached weights
    measure(['compare', '--recipe', recipe, '--out', join(dir, 'warm'), '--cache', cache]);
    const compare: Measured[] = [];
    const report: Measured[] = [];
    for (let r = 0; r < ROUNDS; r++) {
      compare.push(measure(['compare', '--recipe', recipe, '--out', join(dir, `c${r}`), '--cache', cache]));
      report.push(measure(['report', '--recipe', recipe, '--out', join(dir, `r${r}`), '--cache', cache]));
    }
    const best = (xs: Measured[]) => Math.min(...xs.map((x) => x.seconds));
    const cpu = (xs: Measured[]) => Math.min(...xs.map((x) => x.cpu));
    const peak = (xs: Measured[]) => Math.max(...xs.map((x) => x.peakMiB));
    const ratio = best(report) / best(compare);
    console.log('\nreport benchmark: the demo recipe end to end, best of', ROUNDS, 'fresh processes each (elapsed s, CPU s of all threads, peak RSS MiB)');
    console.log(`  each round: compare ${compare.map((x) => x.seconds.toFixed(1)).join(' / ')} s, report ${report.map((x) => x.seconds.toFixed(1)).join(' / ')} s`);
    console.log(`  ours   stillwater report   ${best(report).toFixed(2)} s   CPU ${cpu(report).toFixed(1)} s   ${peak(report).toFixed(0)} MiB   ${report[0].figures} figures (SVG + PNG)`);
    console.log(`  peer   stillwater compare  ${best(compare).toFixed(2)} s   CPU ${cpu(compare).toFixed(1)} s   ${peak(compare).toFixed(0)} MiB`);
    console.log(`  ratio  elapsed ${ratio.toFixed(2)}   CPU ${(cpu(report) / cpu(compare)).toFixed(2)}   peak memory ${(peak(report) / peak(compare)).toFixed(2)}   bar: elapsed at most ${BAR}x   ${ratio <= BAR ? 'met' : 'NOT met'}`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main();
