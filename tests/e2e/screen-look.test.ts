// The workbench screen as issue 14 asks for it, in Debian's Chromium against browser mode: colour scales,
// logarithmic stretch, clip arrows, a range shared by every run, contours; zoom, pan and reset; crop to a
// region with its statistics beside the difference map. Screenshots go to tests/e2e/screenshots/.
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Download, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { canRunBrowser, readyWorkbench, type Workbench } from './harness.js';

const SLOW = 240_000;

/** Wait until the open view has drawn something new (its data-look or data-drawn attribute changes). */
async function lookAfter(page: Page, view: string, act: () => Promise<unknown>): Promise<string> {
  const sel = `.view-${view} [data-look]`;
  const before = (await page.getAttribute(sel, 'data-look').catch(() => null)) ?? '';
  const marks = await page.evaluate(() => performance.getEntriesByName('map-recolour').length);
  await act();
  await page.waitForFunction(([s, b, m]) => {
    const el = document.querySelector(s as string);
    return !!el && (el.getAttribute('data-look') !== b || performance.getEntriesByName('map-recolour').length > (m as number));
  }, [sel, before, marks] as const, { timeout: SLOW });
  return (await page.getAttribute(sel, 'data-look')) ?? '';
}

function pixels(page: Page): Promise<number> {
  return page.evaluate(() => {
    const c = document.querySelector('canvas.map-canvas') as HTMLCanvasElement;
    const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
    let sum = 0;
    for (let i = 0; i < d.length; i += 4) sum = (sum * 31 + d[i] * 3 + d[i + 1] * 5 + d[i + 2] * 7) % 1_000_000_007;
    return sum;
  });
}

describe.skipIf(!canRunBrowser)('the screen: colour, zoom, crop', () => {
  let wb: Workbench;
  let page: Page;
  beforeAll(async () => {
    ({ wb, page } = await readyWorkbench('.view-map [data-look]', SLOW));
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
  });

  it('offers colour scales of our own; switching one recolours the map', async () => {
    const before = await pixels(page);
    const look = await lookAfter(page, 'map', () => page.selectOption('#field-colour-scale', 'ember'));
    expect(look.startsWith('ember|linear')).toBe(true);
    expect(await pixels(page)).not.toBe(before);
    await wb.shot('screen-map-ember');
    await lookAfter(page, 'map', () => page.selectOption('#field-colour-scale', 'lagoon'));
  }, SLOW);

  it('a logarithmic stretch labels the colour bar in decades', async () => {
    await page.selectOption('#choose-variable', 'PO4');
    await page.waitForFunction(() => document.querySelector('.view-map [data-drawn]')?.getAttribute('data-drawn')?.startsWith('PO4|'), undefined, { timeout: SLOW });
    const look = await lookAfter(page, 'map', () => page.check('#field-log-colour'));
    expect(look).toContain('|log|');
    expect(await page.textContent('.view-map svg')).toContain('log scale');
    await wb.shot('screen-map-log');
    await lookAfter(page, 'map', () => page.uncheck('#field-log-colour'));
  }, SLOW);

  it('a narrow colour range puts clip arrows on the colour bar', async () => {
    expect(await page.locator('.view-map path.clip-above').count()).toBeGreaterThan(0); // the automatic 2–98 % range clips the top 2 %
    await page.fill('#field-range-min', '0.5');
    await page.fill('#field-range-max', '1');
    await lookAfter(page, 'map', () => page.press('#field-range-max', 'Enter'));
    expect(await page.locator('.view-map path.clip-above').count()).toBe(1);
    expect(await page.locator('.view-map path.clip-below').count()).toBe(1);
    await page.click('.view-map button:has-text("Auto range")');
  }, SLOW);
});

describe.skipIf(!canRunBrowser)('the screen: zoom, pan, crop, keyboard, refusals', () => {
  let wb: Workbench;
  let page: Page;
  beforeAll(async () => {
    ({ wb, page } = await readyWorkbench('.view-map [data-look]', SLOW));
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
  });

  it('zooms with the button and the wheel, pans by dragging, and goes back to the whole map', async () => {
    expect((await page.getAttribute('.view-map [data-look]', 'data-look'))!.split('|')[2]).toBe('whole');
    const zoomed = await lookAfter(page, 'map', () => page.click('#map-zoom-in'));
    const w1 = zoomed.split('|')[2].split(',').map(Number);
    expect(w1).toHaveLength(4);
    const box = (await page.locator('canvas.map-canvas').boundingBox())!;
    await lookAfter(page, 'map', async () => {
      await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
      await page.mouse.wheel(0, -200);
    });
    const dragged = await lookAfter(page, 'map', async () => {
      await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
      await page.mouse.down();
      await page.mouse.move(box.x + box.width / 2 - 120, box.y + box.height / 2, { steps: 4 });
      await page.mouse.up();
    });
    const w2 = dragged.split('|')[2].split(',').map(Number);
    // dragging to the left shows what lies to the east: the window moved east, same size
    expect(w2[0]).toBeGreaterThan(w1[0]);
    await wb.shot('screen-map-zoomed');
    const whole = await lookAfter(page, 'map', () => page.click('#map-zoom-reset'));
    expect(whole.split('|')[2]).toBe('whole');
  }, SLOW);

  it('crops the difference map to a region and gives its bias, RMSE and correlation', async () => {
    await page.click('#tab-difference');
    await page.waitForSelector('.view-difference [data-look]', { timeout: SLOW });
    await page.check('#diff-crop-region');
    await page.waitForSelector('#choose-region:not([disabled])');
    await page.selectOption('#choose-region', 'atlantic');
    await page.waitForFunction(() => document.querySelector('.view-difference [data-look]')?.getAttribute('data-look')?.includes('|atlantic|'), undefined, { timeout: SLOW });
    await page.waitForSelector('#region-stats:not([hidden])');
    const text = (await page.textContent('#region-stats')) ?? '';
    expect(text).toMatch(/atlantic/);
    expect(text).toMatch(/RMSE -?\d/);
    await wb.shot('screen-difference-atlantic');
    await page.uncheck('#diff-crop-region');
    await page.click('#map-zoom-reset').catch(() => undefined);
    await page.click('#tab-map');
    await page.waitForSelector('.view-map [data-look]', { timeout: SLOW });
  }, SLOW);
});

describe.skipIf(!canRunBrowser)('the screen: the field shown, downloaded', () => {
  let wb: Workbench;
  let page: Page;
  const dir = mkdtempSync(join(tmpdir(), 'sw-export-'));
  beforeAll(async () => {
    ({ wb, page } = await readyWorkbench('.view-map [data-look]', SLOW));
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  const fetch = async (id: string, name: string): Promise<string> => {
    const [d] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.click(id)]);
    const to = join(dir, name);
    copyFileSync(await (d as Download).path(), to);
    return to;
  };

  it('as CSV and as CF NetCDF that netCDF4-python reads to the same values, with CF coordinates and bounds', async () => {
    const csvPath = await fetch('#field-download-csv', 'field.csv');
    const ncPath = await fetch('#field-download-netcdf', 'field.nc');
    const lines = readFileSync(csvPath, 'utf8').trim().split(/\r?\n/);
    expect(lines[0]).toMatch(/^lon,lat,lon_min,lon_max,lat_min,lat_max,T \(degC\)$/);
    // outside check: netCDF4-python (Debian) decodes the file (fill value to masked) and finds the CSV's values
    const py = `
import csv, json, sys, netCDF4, numpy as np
ds = netCDF4.Dataset(sys.argv[1])
v = ds.variables['T']
a = v[:]
rows = list(csv.reader(open(sys.argv[2])))[1:]
lon = ds.variables['lon'][:]; lat = ds.variables['lat'][:]
worst = 0.0
for r in rows[::97]:
    i = int(np.argmin(abs(lon - float(r[0])))); j = int(np.argmin(abs(lat - float(r[1]))))
    worst = max(worst, abs(float(a[j, i]) - float(r[6])))
print(json.dumps({"conventions": ds.Conventions, "units": v.units, "count": int(np.ma.count(a)), "rows": len(rows),
  "lat_bounds": ds.variables['lat'].bounds, "lat_bnds0": [float(x) for x in ds.variables['lat_bnds'][0]], "depth": float(ds.variables['depth'][...]), "worst": worst}))
`;
    const r = spawnSync('/usr/bin/python3', ['-c', py, ncPath, csvPath], { encoding: 'utf8' });
    expect(r.stderr).toBe('');
    const got = JSON.parse(r.stdout) as { conventions: string; units: string; count: number; rows: number; lat_bounds: string; lat_bnds0: number[]; depth: number; worst: number };
    expect(got.conventions).toBe('CF-1.10');
    expect(got.units).toBe('degC');
    expect(got.count).toBe(got.rows); // every cell with a value is a CSV row; missing cells are masked by _FillValue
    expect(got.rows).toBe(lines.length - 1);
    expect(got.lat_bounds).toBe('lat_bnds');
    expect(got.lat_bnds0[1] - got.lat_bnds0[0]).toBeCloseTo(1, 9); // the demo's common grid is 1°
    expect(got.depth).toBeGreaterThanOrEqual(0);
    expect(got.worst).toBeLessThan(1e-4); // float32 in the file, shortest round-trip text in the CSV
  }, SLOW);
});
