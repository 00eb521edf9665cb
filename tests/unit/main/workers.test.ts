// Heavy work in worker threads (issue 5: "the screen never freezes"): the job runs on another thread, streams
// progress, returns typed arrays intact, is cancellable, and a job that ignores cancellation is terminated.
import { build } from 'esbuild';
import { mkdtempSync, realpathSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { threadId } from 'node:worker_threads';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { HeavyJob } from '../../../main/dispatch.js';
import { poolSize, WorkerPool } from '../../../main/workers.js';

let workerFile: string;
let top: string;

beforeAll(async () => {
  top = realpathSync(mkdtempSync(join(tmpdir(), 'sw-workers-')));
  // inside the project so that the bundle's imports (zod) resolve from node_modules
  workerFile = join(__dirname, '..', '..', '..', 'dist', 'test', `test-worker-${process.pid}.mjs`);
  await build({
    entryPoints: [join(__dirname, '..', '..', 'fixtures', 'main', 'test-worker.ts')],
    outfile: workerFile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    packages: 'external',
    logLevel: 'error',
  });
});

let jobs = 0;
const job = (name: string, input: unknown, extra: Partial<HeavyJob> = {}): HeavyJob => ({ name, input, jobId: `j${++jobs}`, roots: [top], granted: [], cacheDir: top, ...extra });
const pools: WorkerPool[] = [];
const workerRunner = (file: string, size = 2, queueLimit = 64) => {
  const pool = new WorkerPool(file, { size, queueLimit });
  pools.push(pool);
  return pool.runner;
};
const free = () => ({ progress: () => undefined, signal: new AbortController().signal });
afterAll(async () => {
  for (const p of pools) await p.close();
});

describe('worker threads', () => {
  it('run the job on another thread, report progress and return typed arrays intact', async () => {
    const seen: number[] = [];
    const run = workerRunner(workerFile);
    const r = (await run(job('count', { steps: 5, ms: 1 }), { progress: (f: number) => seen.push(f), signal: new AbortController().signal })) as { squares: Float64Array; threadId: number };
    expect(r.squares).toBeInstanceOf(Float64Array);
    expect(Array.from(r.squares)).toEqual([0, 1, 4, 9, 16]);
    expect(r.threadId).not.toBe(threadId);
    expect(seen).toEqual([0.2, 0.4, 0.6, 0.8, 1]);
  });
  it('stop a job that looks at its signal, answering E_CANCELLED', async () => {
    const c = new AbortController();
    const run = workerRunner(workerFile);
    // cancelled once it is certainly running: at its first progress report
    const p = run(job('count', { steps: 1000, ms: 5 }), { progress: () => c.abort(), signal: c.signal });
    await expect(p).rejects.toMatchObject({ code: 'E_CANCELLED' });
  });
  it('terminate a job that ignores its signal, after a short grace', async () => {
    const c = new AbortController();
    const pool = new WorkerPool(workerFile, { size: 1 });
    pools.push(pool);
    // cancelled once its thread is stuck: the job reports progress, then blocks for 20 s ignoring the signal
    const p = pool.run(job('stubborn', {}), { progress: () => c.abort(), signal: c.signal });
    await expect(p).rejects.toMatchObject({ code: 'E_CANCELLED' });
    // the answer came from terminating the thread, not from the job ending by itself
    expect(pool.threads).toBe(0);
  });
  it('keep the path rule inside the thread', async () => {
    const run = workerRunner(workerFile);
    await expect(run(job('reads', { path: '/etc/passwd' }), { progress: () => undefined, signal: new AbortController().signal })).rejects.toMatchObject({ code: 'E_FILE' });
    await expect(run(job('reads', { path: join(top, 'x.nc') }), { progress: () => undefined, signal: new AbortController().signal })).resolves.toBe(join(top, 'x.nc'));
  });
  it('report a schema error from the thread as E_INPUT naming the field', async () => {
    const run = workerRunner(workerFile);
    await expect(run(job('count', { steps: -1, ms: 0 }), { progress: () => undefined, signal: new AbortController().signal })).rejects.toMatchObject({ code: 'E_INPUT', message: expect.stringMatching(/input\.steps/) });
  });
  it('say plainly when the worker bundle is missing', async () => {
    const run = workerRunner(join(top, 'absent.mjs'));
    await expect(run(job('count', { steps: 1, ms: 0 }), { progress: () => undefined, signal: new AbortController().signal })).rejects.toThrow(/worker bundle is missing/);
  });
});

describe('the pool of worker threads (issue 16, items 1 and 11)', () => {
  it('stops a job that passes its deadline with one sentence naming the file, and keeps serving', async () => {
    const pool = new WorkerPool(workerFile, { size: 1 });
    pools.push(pool);
    const hung = pool.run(job('hang', { path: '/data/damaged.nc' }, { deadlineMs: 300 }), free());
    const after = pool.run(job('count', { steps: 2, ms: 1 }), free());
    await expect(hung).rejects.toMatchObject({ code: 'E_FORMAT', message: '/data/damaged.nc: could not be read within 0.3 s (the file may be damaged).' });
    await expect(after).resolves.toMatchObject({ squares: Float64Array.from([0, 1]) });
  });
  it('never starts more threads than its size, however many jobs come at once', async () => {
    const pool = new WorkerPool(workerFile, { size: 2, queueLimit: 100 });
    pools.push(pool);
    let most = 0;
    const all = Array.from({ length: 12 }, () =>
      pool.run(job('count', { steps: 3, ms: 2 }), { progress: () => (most = Math.max(most, pool.threads)), signal: new AbortController().signal }),
    );
    const results = (await Promise.all(all)) as { threadId: number }[];
    expect(most).toBeLessThanOrEqual(2);
    expect(new Set(results.map((r) => r.threadId)).size).toBeLessThanOrEqual(2);
  });
  it('answers "busy" beyond its queue instead of taking more', async () => {
    const pool = new WorkerPool(workerFile, { size: 1, queueLimit: 2 });
    pools.push(pool);
    const taken = [0, 1, 2].map(() => pool.run(job('count', { steps: 2, ms: 5 }), free()));
    await expect(pool.run(job('count', { steps: 1, ms: 0 }), free())).rejects.toMatchObject({ code: 'E_BUSY', message: expect.stringMatching(/busy/) });
    await Promise.all(taken);
  });
  it('runs every call of a session on the thread that opened it', async () => {
    const pool = new WorkerPool(workerFile, { size: 2 });
    pools.push(pool);
    const a = (await pool.run(job('open', { name: 'a' }, { session: { mode: 'open' } }), free())) as { session: string; threadId: number };
    // keep the other thread busy too, so that a wrong routing would show
    const calls = Array.from({ length: 6 }, () => pool.run(job('use', { session: a.session }, { session: { mode: 'use', id: a.session } }), free()));
    for (const r of (await Promise.all(calls)) as { threadId: number }[]) expect(r.threadId).toBe(a.threadId);
  });
  it("runs a session's call beside another of its calls that waits (a view waiting for the skill rows does not hold up the map)", async () => {
    const pool = new WorkerPool(workerFile, { size: 1 });
    pools.push(pool);
    const a = (await pool.run(job('open', { name: 'h' }, { session: { mode: 'open' } }), free())) as { session: string };
    const use = { session: { mode: 'use' as const, id: a.session } };
    const holding = pool.run(job('hold', { session: a.session }, use), free());
    // one call a thread would queue this behind the held call for ever
    await expect(pool.run(job('letGo', { session: a.session }, use), free())).resolves.toMatchObject({ wasHeld: true });
    await expect(holding).resolves.toMatchObject({ held: true });
    // a call without a session still waits for the thread to be idle: it runs after both
    await expect(pool.run(job('count', { steps: 1, ms: 0 }), free())).resolves.toMatchObject({ threadId: expect.any(Number) });
  });
  it('says a session is gone once its thread was stopped', async () => {
    const pool = new WorkerPool(workerFile, { size: 1 });
    pools.push(pool);
    const a = (await pool.run(job('open', { name: 'b' }, { session: { mode: 'open' } }), free())) as { session: string };
    await expect(pool.run(job('hang', { path: 'x.nc' }, { deadlineMs: 200 }), free())).rejects.toMatchObject({ code: 'E_FORMAT' });
    await expect(pool.run(job('use', { session: a.session }, { session: { mode: 'use', id: a.session } }), free())).rejects.toThrow(/no longer open; open the recipe again/);
  });
});

describe('the pool size (issue 16, item 10)', () => {
  const KIB = 1024;
  it('is the cores without an address-space limit', () => {
    expect(poolSize(8, undefined)).toBe(8);
  });
  it('takes no more threads than fit under a limit, and at least one', () => {
    // measured per thread: 0.6 GiB for its isolate, 2.6 GiB for its HDF5 thread (see main/workers.ts)
    expect(poolSize(32, 8_000_000 * KIB)).toBe(1);
    expect(poolSize(32, 16_000_000 * KIB)).toBe(3);
    expect(poolSize(2, 16_000_000 * KIB)).toBe(2);
    expect(poolSize(8, 1_000_000 * KIB)).toBe(1);
  });
});
