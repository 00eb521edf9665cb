// The shell end to end, in Debian's Chromium against browser mode (issue 5): the page loads with the bridge
// working and no console errors, nothing is requested from anywhere but 127.0.0.1, the CSP header arrives,
// and the page refuses to load without the token.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { callInPage, canRunBrowser, openWorkbench, type Workbench } from './harness.js';

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
