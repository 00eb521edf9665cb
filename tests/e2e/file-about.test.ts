// "About this file" in the sources panel, end to end in Debian's Chromium against browser mode: the header
// (files.describe), the CF view (cf.inspect) and, on request, each data variable's value ranges. The ranges
// and counts are checked against netCDF4-python + numpy reading the same file (Debian's python3-netcdf4;
// masked and scaled as CF says, plain mean of the valid values).
import { spawnSync } from 'node:child_process';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { canRunBrowser, readyWorkbench, type Workbench } from './harness.js';

const SLOW = 600_000;

function numpyStats(file: string, name: string): { min: number; max: number; mean: number; count: number; total: number } {
  const py = `
import json, sys, numpy as np, netCDF4
with netCDF4.Dataset(sys.argv[1]) as ds:
    v = np.ma.masked_invalid(np.ma.asarray(ds[sys.argv[2]][...], dtype='f8'))
    print(json.dumps({"min": float(v.min()), "max": float(v.max()), "mean": float(v.mean()), "count": int(v.count()), "total": int(v.size)}))
`;
  const r = spawnSync('/usr/bin/python3', ['-c', py, file, name], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(r.stderr);
  return JSON.parse(r.stdout) as ReturnType<typeof numpyStats>;
}

describe.skipIf(!canRunBrowser)('About this file, in Chromium', () => {
  let wb: Workbench;
  let page: Page;
  beforeAll(async () => {
    ({ wb, page } = await readyWorkbench('.source.reference button.about-file', SLOW));
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
  });

  it('shows the header and the CF view, then value ranges equal to numpy', async () => {
    const button = page.locator('.source.reference button.about-file').first();
    const file = (await button.getAttribute('data-file'))!;
    await button.click();
    const dialog = page.locator('dialog.file-about');
    await dialog.locator('.about-header p').first().filter({ hasNotText: 'Reading the header' }).waitFor({ timeout: SLOW });
    await dialog.locator('.about-grid').first().waitFor({ timeout: SLOW });
    expect(await dialog.locator('.about-header').textContent()).toMatch(/NetCDF/i);
    expect(await dialog.locator('.about-grid').first().textContent()).toMatch(/rectilinear, 360 × 180/);
    await dialog.locator('button.about-stats').click();
    await dialog.locator('.about-vars th', { hasText: 'Min' }).waitFor({ timeout: SLOW });
    await wb.shot('file-about');
    const rows = await dialog.locator('.about-vars tbody tr').evaluateAll((trs) =>
      trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent ?? '')),
    );
    expect(rows.length).toBeGreaterThan(0);
    const [name, , , min, max, mean, valid] = rows[0];
    const want = numpyStats(file, name);
    // the screen prints four significant digits (app/output/number-format.ts)
    for (const [shown, exact] of [[min, want.min], [max, want.max], [mean, want.mean]] as const) {
      expect(Math.abs(Number(shown.replace('−', '-')) - exact)).toBeLessThanOrEqual(Math.abs(exact) * 5e-4 + 1e-12);
    }
    expect(valid).toBe(`${want.count} of ${want.total}`);
    await dialog.locator('button', { hasText: 'Close' }).click();
    expect(await page.locator('dialog.file-about').count()).toBe(0);
    expect(wb.consoleErrors).toEqual([]);
  }, SLOW);
});
