// Heavy work in worker threads (issue 5: "the screen never freezes"): the job runs on another thread, streams
// progress, returns typed arrays intact, is cancellable, and a job that ignores cancellation is terminated.
import { build } from 'esbuild';
import { mkdtempSync, realpathSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { threadId } from 'node:worker_threads';
import { beforeAll, describe, expect, it } from 'vitest';
import { workerRunner } from '../../../main/workers.js';

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

const job = (name: string, input: unknown) => ({ name, input, jobId: 'j', roots: [top], granted: [], cacheDir: top });

describe('worker threads', () => {
  it('run the job on another thread, report progress and return typed arrays intact', async () => {
    const seen: number[] = [];
    const run = workerRunner(workerFile);
    const r = (await run(job('count', { steps: 5, ms: 1 }), { progress: (f) => seen.push(f), signal: new AbortController().signal })) as { squares: Float64Array; threadId: number };
    expect(r.squares).toBeInstanceOf(Float64Array);
    expect(Array.from(r.squares)).toEqual([0, 1, 4, 9, 16]);
    expect(r.threadId).not.toBe(threadId);
    expect(seen).toEqual([0.2, 0.4, 0.6, 0.8, 1]);
  });
  it('stop a job that looks at its signal, answering E_CANCELLED', async () => {
    const c = new AbortController();
    const run = workerRunner(workerFile);
    const p = run(job('count', { steps: 1000, ms: 5 }), { progress: () => undefined, signal: c.signal });
    setTimeout(() => c.abort(), 100);
    await expect(p).rejects.toMatchObject({ code: 'E_CANCELLED' });
  });
  it('terminate a job that ignores its signal, after a short grace', async () => {
    const c = new AbortController();
    const run = workerRunner(workerFile);
    const started = Date.now();
    const p = run(job('stubborn', {}), { progress: () => undefined, signal: c.signal });
    setTimeout(() => c.abort(), 200);
    await expect(p).rejects.toMatchObject({ code: 'E_CANCELLED' });
    expect(Date.now() - started).toBeLessThan(10_000);
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
