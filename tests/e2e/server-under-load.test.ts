// The browser-mode server stays responsive (issue 16, items 1 and 11): while a damaged file is being described
// (simulated by a header read that loops for ever, as the HDF5 library does on some damaged files: only
// terminating its thread stops it), GET / and a light service still answer within a second, and the describe
// call comes back as one sentence when its deadline passes; under 200 parallel heavy requests, light requests
// still answer, and requests beyond the pool's queue get a clear "busy" answer (503) instead of a thread each.
// The limits are generous bounds on responsiveness (a frozen server fails them by far), not benchmarks.
import { build } from 'esbuild';
import { mkdtempSync, realpathSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Dispatcher } from '../../main/dispatch.js';
import { startServer, type RunningServer } from '../../main/http.js';
import { PathGuard } from '../../main/path-guard.js';
import { WorkerPool } from '../../main/workers.js';
import { testTable } from '../fixtures/main/test-table.js';
import { raw } from '../unit/main/helpers.js';

let server: RunningServer;
let pool: WorkerPool;

beforeAll(async () => {
  const top = realpathSync(mkdtempSync(join(tmpdir(), 'sw-load-')));
  const workerFile = join(__dirname, '..', '..', 'dist', 'test', `load-worker-${process.pid}.mjs`);
  await build({ entryPoints: [join(__dirname, '..', 'fixtures', 'main', 'test-worker.ts')], outfile: workerFile, bundle: true, platform: 'node', format: 'esm', packages: 'external', logLevel: 'error' });
  pool = new WorkerPool(workerFile, { size: 2, queueLimit: 64 });
  const dispatcher = new Dispatcher({ table: testTable, guard: new PathGuard([top], top), cacheDir: top, heavy: pool.runner });
  // a project folder with a page to serve
  const { mkdirSync, writeFileSync } = await import('node:fs');
  mkdirSync(join(top, 'project', 'dist', 'renderer'), { recursive: true });
  writeFileSync(join(top, 'project', 'dist', 'renderer', 'index.html'), '<!doctype html><title>t</title>');
  server = await startServer({ dispatcher, root: join(top, 'project') });
});

afterAll(async () => {
  await server?.close();
  await pool?.close();
});

const headers = () => ({ 'content-type': 'application/json', 'x-stillwater-token': server.token });
const api = (name: string, input: unknown) => raw(server.port, { method: 'POST', path: `/api/${name}`, headers: headers(), body: JSON.stringify({ input }) });
const page = () => raw(server.port, { path: '/', headers: { 'x-stillwater-token': server.token } });

async function timed<T>(work: () => Promise<T>): Promise<{ value: T; ms: number }> {
  const t0 = performance.now();
  const value = await work();
  return { value, ms: performance.now() - t0 };
}

describe('a damaged file being described', () => {
  it('leaves the page and light calls answering, and comes back as one sentence', async () => {
    let describedAt = 0;
    const describe = api('files.describe', { path: 'damaged.nc' }).then((r) => {
      describedAt = performance.now();
      return r;
    });
    const get = await timed(page);
    const light = await timed(() => api('files.roots', {}));
    expect(get.value.status).toBe(200);
    expect(light.value.status).toBe(200);
    expect(describedAt).toBe(0); // both answered while the describe was still looping
    expect(get.ms).toBeLessThan(1000);
    expect(light.ms).toBeLessThan(1000);
    const r = await describe;
    const body = JSON.parse(r.body.toString()) as { error: { code: string; message: string } };
    expect(body.error).toMatchObject({ code: 'E_FORMAT', message: 'damaged.nc: could not be read within 2 s (the file may be damaged).' });
    // and the pool serves the next heavy call on a fresh thread
    expect((await api('count', { steps: 2, ms: 1 })).status).toBe(200);
  });
});

describe('200 parallel heavy requests', () => {
  it('keep light requests answering and get "busy" beyond the queue', async () => {
    const heavy = Array.from({ length: 200 }, () => api('count', { steps: 40, ms: 5 }));
    // once the first "busy" comes back, the queue is full and both threads are working: the load is on
    const firstBusy = await Promise.race(heavy.map((p) => p.then((r) => (r.status === 503 ? r : new Promise<never>(() => undefined)))));
    const gets = [];
    for (let i = 0; i < 5; i++) gets.push(await timed(page), await timed(() => api('files.roots', {})));
    const stillWaiting = pool.waiting;
    const replies = await Promise.all(heavy);
    const busy = replies.filter((r) => r.status === 503);
    console.log(`light requests under load: ${gets.map((g) => g.ms.toFixed(0)).join(', ')} ms (bar 100 ms); heavy: ${replies.length - busy.length} done, ${busy.length} busy`);
    expect(stillWaiting).toBeGreaterThan(0); // the light requests were answered while heavy ones still queued
    for (const g of gets) {
      expect(g.value.status).toBe(200);
      expect(g.ms).toBeLessThan(1000);
    }
    expect(replies.every((r) => r.status === 200 || r.status === 503)).toBe(true);
    expect((JSON.parse(firstBusy.body.toString()) as { error: { code: string; message: string } }).error).toMatchObject({ code: 'E_BUSY', message: expect.stringMatching(/^The workbench is busy/) });
    expect(firstBusy.headers['retry-after']).toBe('2');
    expect(pool.threads).toBeLessThanOrEqual(2);
  });
});
