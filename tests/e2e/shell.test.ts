// The shell end to end, in Debian's Chromium against browser mode (issue 5): the page loads with the bridge
// working and no console errors, nothing is requested from anywhere but 127.0.0.1, the CSP header arrives,
// and the page refuses to load without the token.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SAMPLE_DATA, callInPage, canRunBrowser, openWorkbench, type Workbench } from './harness.js';

describe.skipIf(!canRunBrowser)('workbench shell in Chromium', () => {
  let wb: Workbench;
  beforeAll(async () => {
    wb = await openWorkbench();
    await wb.page.waitForFunction(() => 'stillwaterBridge' in globalThis, undefined, { timeout: 30_000 });
    // let the first view settle (it opens the demo recipe) before judging errors and requests
    await wb.page.waitForLoadState('networkidle');
  });
  afterAll(async () => {
    await wb?.close();
  });

  it('loads the page through the bridge in browser mode', async () => {
    expect(await wb.page.title()).toBe('Stillwater');
    const kind = await wb.page.evaluate(() => (globalThis as unknown as { stillwaterBridge: { transportKind(): string } }).stillwaterBridge.transportKind());
    expect(kind).toBe('browser');
  });

  it('answers a service call from the page with the allowed folders', async () => {
    const roots = await callInPage<{ name: string; path: string }[]>(wb.page, 'files.roots', {});
    expect(roots.map((r) => r.name)).toEqual(['sample-data']);
  });

  it('keeps typed arrays across the wire into the page', async () => {
    const d = await callInPage<{ variables: { name: string }[] }>(wb.page, 'files.describe', { path: 'sample-data/generated/ref.nc' });
    expect(d.variables.length).toBeGreaterThan(0);
  });

  it('reports a refused path as an error with its code, inside the page', async () => {
    const code = await wb.page.evaluate(async () => {
      const b = (globalThis as unknown as { stillwaterBridge: { call(n: string, i: unknown): Promise<unknown> } }).stillwaterBridge;
      try {
        await b.call('files.list', { folder: '/etc' });
        return 'accepted';
      } catch (e) {
        return (e as { code?: string }).code;
      }
    });
    expect(code).toBe('E_FILE');
  });

  it('runs a heavy job in a worker thread with progress in the page, and cancels it', async () => {
    const recipe = JSON.parse(readFileSync(join(SAMPLE_DATA, 'demo-recipe.json'), 'utf8')) as unknown;
    const outcome = await wb.page.evaluate(
      async ([r, base]) => {
        type Ev = { jobId: string; fraction: number; state?: string };
        const b = (globalThis as unknown as {
          stillwaterBridge: {
            call(n: string, i: unknown, o: { jobId: string; onProgress(e: Ev): void }): Promise<unknown>;
            cancel(id: string): Promise<void>;
            onProgress(cb: (e: Ev) => void): () => void;
          };
        }).stillwaterBridge;
        const seen: Ev[] = [];
        const all: Ev[] = [];
        const off = b.onProgress((e) => all.push(e));
        const jobId = 'e2e-heavy-1';
        let cancelled = false;
        // a threshold of its own: the spin-up cache (keyed by the request) cannot answer at once
        const p = b.call('spinup.run', { recipe: r, baseDir: base, threshold: 0.1 + Math.random() / 1000 }, {
          jobId,
          onProgress: (e) => {
            seen.push(e);
            if (!cancelled && e.fraction > 0) {
              cancelled = true;
              void b.cancel(jobId);
            }
          },
        });
        // a job that reports no progress past 0 within 20 s is cancelled anyway
        setTimeout(() => {
          if (!cancelled) {
            cancelled = true;
            void b.cancel(jobId);
          }
        }, 20_000);
        let code = 'finished';
        try {
          await p;
        } catch (e) {
          code = (e as { code?: string }).code ?? String(e);
        }
        await new Promise((w) => setTimeout(w, 200));
        off();
        return { code, mine: seen.length, states: all.filter((e) => e.jobId === jobId).map((e) => e.state) };
      },
      [recipe, SAMPLE_DATA] as const,
    );
    expect(outcome.code).toBe('E_CANCELLED');
    expect(outcome.mine).toBeGreaterThan(0);
    expect(outcome.states[outcome.states.length - 1]).toBe('cancelled');
  });

  it('sends the Content-Security-Policy with the page', async () => {
    const res = await wb.page.request.get(wb.served.url);
    expect(res.headers()['content-security-policy']).toMatch(/default-src 'none'/);
  });

  it('asks nothing of any address other than 127.0.0.1', () => {
    expect(wb.requests.length).toBeGreaterThan(1);
    expect(wb.foreignRequests()).toEqual([]);
  });

  it('shows no console errors', async () => {
    await wb.shot('shell');
    expect(wb.consoleErrors).toEqual([]);
  });

  it('shows only a refusal without the token', async () => {
    const page = await wb.context.newPage();
    const url = `http://127.0.0.1:${wb.served.port}/`;
    await wb.context.clearCookies();
    const res = await page.goto(url);
    expect(res?.status()).toBe(401);
    expect(await page.textContent('body')).toMatch(/token/);
    await page.close();
  });
});
