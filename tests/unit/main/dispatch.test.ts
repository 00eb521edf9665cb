// The one dispatcher both transports use: unknown services, schema checks, heavy entries handed to the
// worker runner with the path rule, progress events bounded in number, cancellation, and faults kept apart
// from refusals (DESIGN.md section 3: bad input versus an internal fault).
import { mkdtempSync, realpathSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { StillwaterError } from '../../../app/errors.js';
import { entry, type ServiceEntry } from '../../../app/services/types.js';
import { Dispatcher, type HeavyRunner } from '../../../main/dispatch.js';
import { PathGuard } from '../../../main/path-guard.js';
import type { ProgressEvent } from '../../../contract/transport.js';

const root = realpathSync(mkdtempSync(join(tmpdir(), 'sw-dispatch-')));

const table: ServiceEntry[] = [
  entry({ name: 'plain', summary: 'plain', input: z.object({ k: z.string() }), run: async (i) => i.k.toUpperCase() }),
  entry({
    name: 'chatty',
    summary: 'many progress calls',
    input: z.object({}),
    heavy: true,
    async run(_i, ctx) {
      for (let i = 0; i <= 10_000; i++) ctx.progress(i / 10_000, 'step');
      return 'ok';
    },
  }),
  entry({ name: 'broken', summary: 'a fault of ours', input: z.object({}), run: async () => Promise.reject(new TypeError('x is undefined')) }),
  entry({ name: 'refuses', summary: 'bad input', input: z.object({}), run: async () => Promise.reject(new StillwaterError('E_RECIPE', 'runs[0].file: no such file', { path: 'runs[0].file' })) }),
  entry({ name: 'forever', summary: 'never ends by itself', input: z.object({}), run: () => new Promise(() => undefined) }),
];

function make(heavy?: HeavyRunner) {
  const d = new Dispatcher({ table, guard: new PathGuard([root]), cacheDir: root, heavy });
  const events: ProgressEvent[] = [];
  d.events.on('progress', (e: ProgressEvent) => events.push(e));
  return { d, events };
}

describe('Dispatcher', () => {
  it('runs a valid call and refuses an unknown service or bad input with E_INPUT', async () => {
    const { d } = make();
    expect(await d.call('plain', { k: 'abc' }, 'j1')).toEqual({ ok: true, result: 'ABC' });
    expect(await d.call('nope', {}, 'j2')).toMatchObject({ ok: false, error: { code: 'E_INPUT', message: "There is no service 'nope'." } });
    expect(await d.call('plain', { k: 3 }, 'j3')).toMatchObject({ ok: false, error: { code: 'E_INPUT', message: expect.stringMatching(/^plain: input\.k: /) } });
    expect(await d.call(42, {}, 'j4')).toMatchObject({ ok: false, error: { code: 'E_INPUT' } });
  });
  it('keeps a refusal (with its recipe path) apart from a fault of ours', async () => {
    const { d } = make();
    expect(await d.call('refuses', {}, 'a')).toEqual({ ok: false, error: { code: 'E_RECIPE', message: 'runs[0].file: no such file', path: 'runs[0].file' } });
    expect(await d.call('broken', {}, 'b')).toMatchObject({ ok: false, error: { code: 'E_INTERNAL', message: expect.stringContaining('x is undefined') } });
  });
  it('sends heavy entries to the worker runner with the allowed folders', async () => {
    const seen: unknown[] = [];
    const { d } = make(async (job, hooks) => {
      seen.push(job);
      hooks.progress(0.5, 'half');
      return 'from worker';
    });
    expect(await d.call('chatty', {}, 'h1')).toEqual({ ok: true, result: 'from worker' });
    expect(seen).toEqual([{ name: 'chatty', input: {}, jobId: 'h1', roots: [root], granted: [], cacheDir: root }]);
    expect(await d.call('plain', { k: 'x' }, 'h2')).toEqual({ ok: true, result: 'X' }); // light entries stay here
    expect(seen).toHaveLength(1);
  });
  it('bounds the progress events of a job that reports ten thousand times, and ends with done', async () => {
    const { d, events } = make();
    await d.call('chatty', {}, 'p1');
    const mine = events.filter((e) => e.jobId === 'p1');
    expect(mine.length).toBeLessThan(100);
    expect(mine[0]).toMatchObject({ fraction: 0, state: 'running' });
    expect(mine[mine.length - 1]).toMatchObject({ fraction: 1, state: 'done' });
    for (const e of mine) expect(e.fraction).toBeGreaterThanOrEqual(0);
  });
  it('cancels a job that never looks at its signal, and forgets it afterwards', async () => {
    const { d } = make();
    const p = d.call('forever', {}, 'c1');
    expect(d.cancel('c1')).toBe(true);
    expect(await p).toMatchObject({ ok: false, error: { code: 'E_CANCELLED' } });
    expect(d.cancel('c1')).toBe(false);
  });
  it('refuses a second job under a running job id, and replaces a malformed id', async () => {
    const { d, events } = make();
    const first = d.call('forever', {}, 'same');
    expect(await d.call('plain', { k: 'x' }, 'same')).toMatchObject({ ok: false, error: { message: "Job 'same' is already running." } });
    d.cancel('same');
    await first;
    await d.call('chatty', {}, '<script>');
    expect(events.some((e) => e.jobId === '<script>')).toBe(false);
  });
});
