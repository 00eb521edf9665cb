// Runs mutants of fixtures through tests/fuzz/harness.ts in child processes under limits, and pins every
// hang, crash or memory blow-up on its mutant: a child that stays on one mutant longer than `timeLimitMs`
// is killed and recorded as a hang; a child that dies is recorded as a crash; then a fresh child goes on
// with the next mutant. Each child runs under `ulimit -v` (address space) and a V8 heap limit.
import { spawn } from 'node:child_process';
import { build } from 'esbuild';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

export async function buildHarness() {
  const out = join(root, 'dist', 'test', `fuzz-harness-${process.pid}.mjs`);
  mkdirSync(dirname(out), { recursive: true });
  await build({
    entryPoints: [join(root, 'tests', 'fuzz', 'harness.ts')],
    outfile: out,
    bundle: true,
    platform: 'node',
    format: 'esm',
    packages: 'external',
    logLevel: 'error',
    banner: { js: "import { createRequire as __swRequire } from 'node:module'; const require = __swRequire(import.meta.url);" },
  });
  return out;
}

/**
 * Fuzz one fixture: mutants [0, count) under `seed`. Returns one record per mutant:
 * { index, kind, code (0, 2, 1 = internal fault, 'hang', 'crash'), message, problem, unchanged, maxRssMb }.
 */
export async function fuzzFixture(harness, fixture, { seed, count, timeLimitMs = 60_000, addressSpaceKb = 4_000_000, heapMb = 1024, onRecord = () => {} }) {
  const tmpDir = mkdtempSync(join(tmpdir(), 'sw-fuzz-'));
  const records = [];
  let next = 0;
  try {
    while (next < count) {
      const job = { fixture, seed, from: next, to: count, tmpDir, distDir: join(root, 'dist') };
      next = await runChild(harness, job, { timeLimitMs, addressSpaceKb, heapMb }, (r) => {
        records.push(r);
        onRecord(r);
      });
    }
  } finally {
    rmSync(tmpDir, { recursive: true, force: true });
  }
  return records;
}

/** One child from job.from on; resolves with the index to go on from. */
function runChild(harness, job, limits, record) {
  return new Promise((resolve) => {
    const cmd = `ulimit -v ${limits.addressSpaceKb} && exec '${process.execPath}' --disable-wasm-trap-handler --max-old-space-size=${limits.heapMb} '${harness}' "$0"`;
    const child = spawn('/bin/bash', ['-c', cmd, JSON.stringify(job)], { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
    let current = -1;
    let last = job.from;
    let timer;
    let stderr = '';
    let buffered = '';
    let hung = false;
    const arm = () => {
      clearTimeout(timer);
      timer = setTimeout(() => {
        hung = true;
        child.kill('SIGKILL');
      }, limits.timeLimitMs);
    };
    child.stderr.on('data', (d) => {
      stderr = (stderr + d).slice(-4000);
    });
    child.stdout.on('data', (d) => {
      buffered += d;
      let nl;
      while ((nl = buffered.indexOf('\n')) >= 0) {
        const line = buffered.slice(0, nl);
        buffered = buffered.slice(nl + 1);
        let m;
        try {
          m = JSON.parse(line);
        } catch {
          continue;
        }
        if (m.start !== undefined) {
          current = m.start;
          arm();
        } else if (m.end !== undefined) {
          clearTimeout(timer);
          record({ index: m.end, kind: m.kind, where: m.where, code: m.code, message: m.message, problem: m.problem, unchanged: m.unchanged, maxRssMb: m.maxRssMb });
          last = m.end + 1;
          current = -1;
        }
      }
    });
    child.on('exit', (code, signal) => {
      clearTimeout(timer);
      if (current >= 0) {
        record({ index: current, kind: 'unknown', code: hung ? 'hang' : 'crash', message: hung ? `no answer within ${limits.timeLimitMs} ms` : `child ended (${signal ?? code}): ${stderr.slice(-1500)}`, unchanged: true, maxRssMb: 0 });
        resolve(current + 1);
      } else if (last < job.to && code !== 0) {
        // died between mutants: do not loop on it
        record({ index: last, kind: 'unknown', code: 'crash', message: `child ended (${signal ?? code}) between mutants: ${stderr.slice(-1500)}`, unchanged: true, maxRssMb: 0 });
        resolve(last + 1);
      } else resolve(Math.max(last, job.to));
    });
  });
}

/** Counts of outcomes, for printing. */
export function tally(records) {
  const t = { total: records.length, ok: 0, refused: 0, unreadable: 0, deadline: 0, fault: 0, hang: 0, crash: 0, changed: 0, maxRssMb: 0 };
  for (const r of records) {
    if (r.code === 0) t.ok++;
    else if (r.code === 2) {
      t.refused++;
      if (r.problem) t.unreadable++;
      // refused because the HDF5 library did not return within its deadline (its thread was stopped)
      if (/could not be read within/.test(String(r.message))) t.deadline++;
    } else if (r.code === 1) t.fault++;
    else if (r.code === 'hang') t.hang++;
    else t.crash++;
    if (!r.unchanged) t.changed++;
    t.maxRssMb = Math.max(t.maxRssMb, r.maxRssMb ?? 0);
  }
  return t;
}
