// "Run in a worker with a deadline" (issue 16, items 1 and 2): work that never returns, such as a library
// looping inside WebAssembly on a damaged file, is stopped by terminating its thread; the caller gets one
// sentence and the next call runs on a fresh thread.
import { build } from 'esbuild';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { DeadlineWorker, runInWorkerWithDeadline } from '../../../main/deadline-worker.js';

let workerFile: string;

beforeAll(async () => {
  // inside the project so that the bundle's imports resolve from node_modules
  workerFile = join(__dirname, '..', '..', '..', 'dist', 'test', `deadline-test-worker-${process.pid}.mjs`);
  await build({
    entryPoints: [join(__dirname, '..', '..', 'fixtures', 'main', 'deadline-test-worker.ts')],
    outfile: workerFile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    packages: 'external',
    logLevel: 'error',
  });
});

const LONG = 60_000;

describe('DeadlineWorker', () => {
  it('answers calls on another thread, typed arrays intact', async () => {
    const w = new DeadlineWorker(workerFile);
    try {
      expect(await w.call({ op: 'echo', value: { a: [1, 'x'] } }, { deadlineMs: LONG })).toEqual({ a: [1, 'x'] });
      const sq = await w.call<Float64Array>({ op: 'squares', n: 4 }, { deadlineMs: LONG });
      expect(sq).toBeInstanceOf(Float64Array);
      expect(Array.from(sq)).toEqual([0, 1, 4, 9]);
      expect(w.generation).toBe(1); // both calls on one thread
    } finally {
      await w.close();
    }
  });

  it('stops a call that never returns at its deadline with one sentence naming the file, then starts afresh', async () => {
    const w = new DeadlineWorker(workerFile);
    try {
      const file = '/data/run/damaged.nc';
      const err = await w.call({ op: 'loop' }, { deadlineMs: 300, subject: { file } }).catch((e: unknown) => e);
      expect(err).toMatchObject({ code: 'E_FORMAT', subject: { file } });
      expect((err as Error).message).toBe(`${file}: could not be read within 0.3 s (the file may be damaged).`);
      // the stuck thread is gone: the next call gets a new one and is answered
      expect(await w.call({ op: 'echo', value: 7 }, { deadlineMs: LONG })).toBe(7);
      expect(w.generation).toBe(2);
      // ... started only once the stopped one had exited: a thread holding the HDF5 library reserves about
      // 2.6 GiB of address space, and under `ulimit -v 4000000` two at once abort the process
      expect(w.peakThreads).toBe(1);
    } finally {
      await w.close();
    }
  });

  it('passes a StillwaterError thrown in the worker through with its code and subject', async () => {
    const w = new DeadlineWorker(workerFile);
    try {
      await expect(w.call({ op: 'refuse', file: 'x.nc' }, { deadlineMs: LONG })).rejects.toMatchObject({
        code: 'E_FORMAT',
        message: 'x.nc: the header is damaged.',
        subject: { file: 'x.nc' },
      });
      await expect(w.call({ op: 'fault' }, { deadlineMs: LONG })).rejects.toMatchObject({ code: 'E_INTERNAL' });
    } finally {
      await w.close();
    }
  });

  it('is cancelled through an AbortSignal, even while the worker is stuck', async () => {
    const w = new DeadlineWorker(workerFile);
    const c = new AbortController();
    const p = w.call({ op: 'loop' }, { deadlineMs: LONG, signal: c.signal });
    // abort once the thread is certainly busy: after another call on a fresh worker has come back
    await runInWorkerWithDeadline(workerFile, { op: 'echo', value: 1 }, { deadlineMs: LONG });
    c.abort();
    await expect(p).rejects.toMatchObject({ code: 'E_CANCELLED' });
    await w.close();
  });

  it('runs one request on a thread of its own', async () => {
    expect(await runInWorkerWithDeadline(workerFile, { op: 'echo', value: 'once' }, { deadlineMs: LONG })).toBe('once');
    await expect(runInWorkerWithDeadline(workerFile, { op: 'loop' }, { deadlineMs: 200, subject: { file: 'f.tif' } })).rejects.toMatchObject({ code: 'E_FORMAT' });
  });
});
