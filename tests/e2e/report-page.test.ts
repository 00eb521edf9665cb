// report.html in Debian's Chromium (issue 11): the page opens from a file with JavaScript switched off, makes no
// request other than its own file, logs no console error, shows every figure, and a screenshot is saved to look at.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { CHROMIUM, CHROMIUM_ARGS, PROJECT, SCREENSHOTS, canRunBrowser } from './harness.js';

describe.skipIf(!canRunBrowser)('report.html in Chromium', () => {
  it('renders self-contained with no console error', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sw-report-page-'));
    try {
      const fix = join(PROJECT, 'tests', 'fixtures', 'compare');
      const recipe = join(dir, 'r.json');
      writeFileSync(recipe, JSON.stringify({
        title: 'Report page test (fixture fields)',
        reference: { label: 'Reference', variables: { PO4: { file: join(fix, 'ref.nc'), name: 'p_mean' } } },
        runs: [{ label: 'Run A', variables: { PO4: { file: join(fix, 'run_same.nc'), name: 'PO4' } } }],
        regions: ['global', 'atlantic'],
        layers: ['bottom'],
        report: { mapLayers: ['bottom'], lines: [], zonalBasins: ['atlantic'] },
      }));
      const out = join(dir, 'out');
      const r = spawnSync(process.execPath, [join(PROJECT, 'main', 'launch.mjs'), 'report', '--recipe', recipe, '--out', out], { encoding: 'utf8', cwd: PROJECT, timeout: 300_000 });
      expect(r.status, r.stderr).toBe(0);
      const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true });
      try {
        const context = await browser.newContext({ javaScriptEnabled: false, viewport: { width: 1100, height: 900 } });
        const page = await context.newPage();
        const errors: string[] = [];
        const requests: string[] = [];
        page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
        page.on('pageerror', (e) => errors.push(e.message));
        context.on('request', (q) => requests.push(q.url()));
        const url = pathToFileURL(join(out, 'report.html')).href;
        await page.goto(url, { waitUntil: 'load' });
        const figures = await page.locator('figure svg').count();
        expect(figures).toBeGreaterThanOrEqual(3);
        const box = await page.locator('figure svg').first().boundingBox();
        expect(box!.width).toBeGreaterThan(500);
        expect(errors).toEqual([]);
        // data: URLs of the embedded rasters are not requests to anywhere
        expect(requests.filter((u) => u !== url && !u.startsWith('data:'))).toEqual([]);
        mkdirSync(SCREENSHOTS, { recursive: true });
        await page.screenshot({ path: join(SCREENSHOTS, 'report-page.png'), fullPage: false });
        await page.locator('figure').first().screenshot({ path: join(SCREENSHOTS, 'report-first-figure.png') });
      } finally {
        await browser.close();
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 400_000);
});
