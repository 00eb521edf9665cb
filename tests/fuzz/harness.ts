/**
 * One fuzzing process: reads mutants of one fixture through the real reading path: openDataset, the first
 * level of every variable as stored, then CF decoding with every level read for statistics (as
 * `stillwater inspect --stats` does), with the HDF5 library on its own thread with a deadline as in the CLI, and prints one JSON line per mutant: "start" before, the outcome after. The driver
 * (driver.mjs) watches those lines, so a hang or a crash is pinned to its mutant.
 *
 * usage: node fuzz-harness.mjs JOB_JSON   with JOB = { fixture, seed, from, to, tmpDir, distDir }
 */
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { basename, extname, join } from 'node:path';
import { inspectDataset } from '../../app/cf/inspect.js';
import { isStillwaterError } from '../../app/errors.js';
import { openDataset } from '../../app/io/open.js';
import type { RawDataset } from '../../app/io/types.js';
import { useHdf5OffThread } from '../../main/hdf5-off-thread.js';
import { mutant } from './mutate.mjs';

interface Job {
  fixture: string;
  seed: number;
  from: number;
  to: number;
  tmpDir: string;
  distDir: string;
}

/** What a message to a person may be: one line of printable text of sensible length naming the file. */
export function messageProblem(message: string, file: string): string | undefined {
  if ([...message].some((ch) => { const c = ch.codePointAt(0) ?? 0; return c < 0x20 || (c >= 0x7f && c <= 0x9f); })) return 'control characters';
  if (message.length > 600) return `${message.length} characters`;
  if (!message.includes(file)) return 'does not name the file';
  return undefined;
}

/** The first level (index 0 along every dimension but the last two) of every variable, as stored. */
async function readFirstLevels(ds: RawDataset, refuse: (e: unknown) => void): Promise<void> {
  for (const v of ds.variables) {
    if (v.dtype === 'string') continue;
    const rank = v.shape.length;
    const start = new Array<number>(rank).fill(0);
    const count = v.shape.map((n, i) => (i >= rank - 2 ? n : Math.min(n, 1)));
    try {
      await ds.read(v.name, start, count);
    } catch (e) {
      refuse(e);
    }
  }
}

async function main(): Promise<void> {
  const job = JSON.parse(process.argv[2]) as Job;
  useHdf5OffThread(job.distDir);
  const original = readFileSync(job.fixture);
  const stem = basename(job.fixture, extname(job.fixture));
  for (let i = job.from; i < job.to; i++) {
    const m = mutant(original, job.seed, i);
    const file = join(job.tmpDir, `${stem}-${i}${extname(job.fixture)}`);
    writeFileSync(file, m.bytes);
    process.stdout.write(JSON.stringify({ start: i }) + '\n');
    let code = 0;
    let message = '';
    let problem: string | undefined;
    const refuse = (e: unknown): void => {
      if (isStillwaterError(e) && e.isBadInput) {
        if (code === 0) {
          code = 2;
          message = e.message;
        }
        problem ??= messageProblem(e.message, file);
      } else {
        code = 1;
        message = e instanceof Error ? (e.stack ?? e.message) : String(e);
      }
    };
    try {
      const ds = await openDataset(file);
      try {
        await readFirstLevels(ds, refuse);
        await inspectDataset(ds, { stats: true });
      } finally {
        await ds.close();
      }
    } catch (e) {
      refuse(e);
    }
    const unchanged = Buffer.compare(readFileSync(file), Buffer.from(m.bytes)) === 0;
    rmSync(file, { force: true });
    const maxRssMb = Math.round(process.resourceUsage().maxRSS / 1024);
    process.stdout.write(JSON.stringify({ end: i, kind: m.kind, where: m.where, code, message: message.slice(0, 2000), problem, unchanged, maxRssMb }) + '\n');
  }
  process.exit(0);
}

void main();
