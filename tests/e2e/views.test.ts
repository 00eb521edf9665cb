// The workbench views end to end, in Debian's Chromium against browser mode (issue 5): the demo loads, every
// view renders without console errors, the probe shows what the data layer reads at a chosen place and depth,
// a change of depth recolours the map, exports give files that parse, and no request leaves 127.0.0.1.
// Screenshots of every view go to tests/e2e/screenshots/ for a person to look at.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Download, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openField } from '../../app/cf/open-field.js';
import { timedField } from '../../app/compare/read-level.js';
import { loadRecipe } from '../../app/recipe/index.js';
import { regridField } from '../../app/regrid/regrid-field.js';
import { gswDensity } from '../unit/render/gsw.js';
import { SAMPLE_DATA, canRunBrowser, openWorkbench, type Workbench } from './harness.js';

const SLOW = 240_000;

async function drawn(page: Page, view: string): Promise<string> {
  const sel = `.view-${view} [data-drawn]`;
  await page.waitForSelector(sel, { timeout: SLOW });
  return (await page.getAttribute(sel, 'data-drawn')) ?? '';
}

async function download(page: Page, click: () => Promise<void>): Promise<Buffer> {
  const [d] = await Promise.all([page.waitForEvent('download', { timeout: SLOW }), click()]);
  const path = await (d as Download).path();
  return readFileSync(path);
}

/** A digest of the map canvas pixels, to tell one drawing from another. */
function canvasDigest(page: Page): Promise<{ sum: number; opaque: number }> {
  return page.evaluate(() => {
    const c = document.querySelector('canvas.map-canvas') as HTMLCanvasElement;
    const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
    let sum = 0;
    let opaque = 0;
    for (let i = 0; i < d.length; i += 4) {
      sum = (sum * 31 + d[i] * 3 + d[i + 1] * 5 + d[i + 2] * 7) % 1_000_000_007;
      if (d[i + 3] === 255) opaque++;
    }
    return { sum, opaque };
  });
}

async function chooseOption(page: Page, select: string, value: string): Promise<void> {
  await page.selectOption(select, value);
}

describe.skipIf(!canRunBrowser)('workbench views in Chromium', () => {
  let wb: Workbench;
  let page: Page;
  const cache = mkdtempSync(join(tmpdir(), 'sw-views-cache-'));

  beforeAll(async () => {
    wb = await openWorkbench();
    page = wb.page;
    await page.waitForSelector('body[data-ready="true"]', { timeout: SLOW });
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
    rmSync(cache, { recursive: true, force: true });
  });

  it('opens the demo recipe and draws the map', async () => {
    expect(await drawn(page, 'map')).toMatch(/\|equal-earth\|model$/);
    const d = await canvasDigest(page);
    expect(d.opaque).toBeGreaterThan(10_000);
    // the sources panel lists the reference and the three runs with units
    const text = await page.textContent('#sources-panel');
    expect(text).toContain('Demo climatology');
    expect(text).toContain('µmol kg⁻¹');
    expect(text).toContain('mmol m⁻³');
    const marks = await page.evaluate(() => performance.getEntriesByName('map-first-draw').length);
    expect(marks).toBe(1);
    await wb.shot('view-map');
  }, SLOW);

  it('the probe shows what the data layer reads at a chosen longitude, latitude and depth', async () => {
    await chooseOption(page, '#choose-variable', 'PO4');
    // the level nearest to 1000 m
    const layer = await page.evaluate(() => {
      const opts = [...(document.querySelector('#choose-layer') as HTMLSelectElement).options].filter((o) => o.value.startsWith('k:'));
      return opts.reduce((best, o) => (Math.abs(parseFloat(o.text) - 1000) < Math.abs(parseFloat(best.text) - 1000) ? o : best)).value;
    });
    await chooseOption(page, '#choose-layer', layer);
    await drawn(page, 'map');
    const lon = -150.3;
    const lat = -20.7;
    await page.fill('#probe-lon', String(lon));
    await page.fill('#probe-lat', String(lat));
    await page.click('#probe-go');
    // the panel says which position it shows (data-at) once that position's values are in
    await page.waitForFunction((at) => (document.querySelector('#probe-values') as HTMLElement | null)?.dataset.at === at, `${lon},${lat}`, { timeout: SLOW });
    const shown = await page.evaluate(() => {
      const get = (k: string) => Number((document.querySelector(`#probe-values dd[data-probe="${k}"]`) as HTMLElement).dataset.value);
      return { model: get('model'), reference: get('reference'), difference: get('difference'), volume: get('volume'), cell: get('cell') };
    });

    // the data layer, read here on its own: the reference on its grid (the common grid of the demo), the run
    // regridded conservatively onto it, then mmol m-3 to umol kg-1 (umol kg-1 = mmol m-3 × 1000 / ρ; common
    // practice) with the recipe's density: its nominal value, or TEOS-10 (python3-gsw) from the reference's
    // temperature and salinity
    const recipe = await loadRecipe(join(SAMPLE_DATA, 'demo-recipe.json'));
    const k = Number(layer.slice(2));
    const refSpec = recipe.reference.variables.PO4;
    const runSpec = recipe.runs[0].variables.PO4;
    const ref = await openField(refSpec.file, refSpec.name);
    const run = await regridField(await openField(runSpec.file, runSpec.name), ref.grid, { method: recipe.options.method, coverage: recipe.options.coverage, cacheDir: cache });
    const axes = ref.grid.horizontal.axes!;
    const i = axes.lonEdges.findIndex((e, q) => q < axes.lonEdges.length - 1 && lon >= e && lon < axes.lonEdges[q + 1]);
    const j = axes.latEdges.findIndex((e, q) => q < axes.latEdges.length - 1 && lat >= e && lat < axes.latEdges[q + 1]);
    const c = j * ref.grid.horizontal.nx + i;
    expect(shown.cell).toBe(c);
    const refValue = (await timedField(ref, refSpec, { monthlyRows: false }).readLevel(0, k))[c];
    const tSpec = recipe.reference.variables.T;
    const sSpec = recipe.reference.variables.S;
    const t = (await (await openField(tSpec.file, tSpec.name)).readLevel(0, k))[c];
    const s = (await (await openField(sSpec.file, sSpec.name)).readLevel(0, k))[c];
    const [rho] = recipe.options.density === 'nominal' ? [recipe.options.nominalDensity] : gswDensity([[t, s, ref.grid.vertical!.centres[k], ref.grid.horizontal.lon[c], ref.grid.horizontal.lat[c]]]);
    const runValue = ((await timedField(run, runSpec, { monthlyRows: false }).readLevel(0, k))[c] * 1000) / rho;
    expect(Number.isFinite(refValue)).toBe(true);
    expect(shown.reference).toBeCloseTo(refValue, 5);
    // within the 5e-4 that separates the app's TEOS-10 density (Absolute Salinity from the reference composition,
    // pressure at 45° latitude) from gsw's (with the Absolute Salinity anomaly, pressure at the cell's latitude)
    expect(shown.model / runValue).toBeCloseTo(1, 3);
    expect(Math.abs(shown.difference - (shown.model - shown.reference))).toBeLessThan(1e-6);
    // cell volume = cell area × layer thickness
    const v = ref.grid.vertical!;
    expect(shown.volume / (ref.grid.horizontal.area[c] * v.thickness[k])).toBeCloseTo(1, 6);
    await wb.shot('view-map-probe');
  }, SLOW);

  it('a change of depth recolours the map', async () => {
    const before = await canvasDigest(page);
    const count = await page.evaluate(() => performance.getEntriesByName('map-recolour-end').length);
    await chooseOption(page, '#choose-layer', 'k:0');
    await page.waitForFunction(() => document.querySelector('.view-map [data-drawn]')?.getAttribute('data-drawn')?.includes('|k:0|'), undefined, { timeout: SLOW });
    const after = await canvasDigest(page);
    expect(after.sum).not.toBe(before.sum);
    expect(await page.evaluate(() => performance.getEntriesByName('map-recolour-end').length)).toBeGreaterThan(count);
    for (const p of ['north-polar', 'south-polar', 'plate']) {
      await chooseOption(page, '#choose-projection', p);
      await page.waitForFunction((id) => document.querySelector('.view-map [data-drawn]')?.getAttribute('data-drawn')?.includes(`|${id}|`), p, { timeout: SLOW });
      await wb.shot(`view-map-${p}`);
    }
    await chooseOption(page, '#choose-projection', 'equal-earth');
  }, SLOW);

  it('map figures export as SVG that parses and PNG at 180 mm and 300 dpi', async () => {
    const svg = (await download(page, () => page.click('#export-svg'))).toString('utf8');
    const check = await page.evaluate((text) => {
      const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
      const root = doc.documentElement;
      return { error: doc.getElementsByTagName('parsererror').length, name: root.nodeName, width: root.getAttribute('width'), text: root.textContent ?? '' };
    }, svg);
    expect(check.error).toBe(0);
    expect(check.name).toBe('svg');
    expect(check.width).toBe('180mm');
    expect(check.text).toContain('(µmol kg⁻¹)'); // the colour bar carries units, typeset
    const png = await download(page, () => page.click('#export-png'));
    // PNG signature and IHDR width (ISO/IEC 15948): 180 mm at 300 dpi = 2126 pixels; pHYs 300 dpi = 11811 px/m
    expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    expect(png.readUInt32BE(16)).toBe(2126);
    const phys = png.indexOf(Buffer.from('pHYs'));
    expect(phys).toBeGreaterThan(0);
    expect(png.readUInt32BE(phys + 4)).toBe(11811);
  }, SLOW);

  it('the difference map is drawn on a scale centred on zero', async () => {
    await page.click('#tab-difference');
    await drawn(page, 'difference');
    const [lo, hi] = await page.evaluate(() => [...document.querySelectorAll('.view-difference .range-input')].map((e) => Number((e as HTMLInputElement).value)));
    expect(lo).toBeCloseTo(-hi, 10);
    expect(wb.consoleErrors).toEqual([]);
    await wb.shot('view-difference');
  }, SLOW);

  it('section and profile views draw with depth downwards and units on their axes', async () => {
    await page.click('#tab-section');
    await drawn(page, 'section');
    const text = await page.textContent('.view-section svg');
    expect(text).toContain('Depth (m)');
    expect(text).toContain('(µmol kg⁻¹)');
    expect(await page.locator('.view-section path.seafloor').count()).toBe(1);
    await wb.shot('view-section');
    await page.click('.view-section button[data-value="zonal"]');
    await page.waitForFunction(() => document.querySelector('.view-section [data-drawn]')?.getAttribute('data-drawn')?.includes('|zonal|'), undefined, { timeout: SLOW });
    await wb.shot('view-section-zonal');
    await page.click('#tab-profile');
    await drawn(page, 'profile');
    const ptext = await page.textContent('.view-profile svg');
    expect(ptext).toContain('PO4 (µmol kg⁻¹)');
    expect(ptext).toContain('remin-short');
    await wb.shot('view-profile');
    expect(wb.consoleErrors).toEqual([]);
  }, SLOW);

  it('the diagrams show every run × region with legends', async () => {
    await page.click('#tab-diagram');
    await drawn(page, 'diagram');
    const markers = await page.locator('.view-diagram g.points > *').count();
    expect(markers).toBeGreaterThanOrEqual(3 * 6 - 2);
    const text = await page.textContent('.view-diagram svg');
    expect(text).toContain('Run (colour)');
    expect(text).toContain('Region (shape)'); // the legend of app/figures, as the report draws it
    expect(text).toContain('atlantic');
    await wb.shot('view-diagram-taylor');
    await page.click('.view-diagram button[data-value="target"]');
    await page.waitForFunction(() => document.querySelector('.view-diagram [data-drawn]')?.getAttribute('data-drawn')?.startsWith('target'), undefined, { timeout: SLOW });
    await wb.shot('view-diagram-target');
    const svg = (await download(page, () => page.click('#export-svg'))).toString('utf8');
    expect(svg).toMatch(/^<\?xml/);
    expect(svg).toContain('Bias / σ reference (1)');
  }, SLOW);

  it('the scores table sorts, filters and exports CSV, Markdown, LaTeX and JSON', async () => {
    await page.click('#tab-scores');
    await page.waitForSelector('#scores-table tbody tr', { timeout: SLOW });
    const rows = await page.locator('#scores-table tbody tr').count();
    expect(rows).toBeGreaterThan(0);
    await page.fill('#scores-filter', 'atlantic');
    const filtered = await page.locator('#scores-table tbody tr').count();
    expect(filtered).toBeLessThan(rows);
    expect(filtered).toBeGreaterThan(0);
    const csv = (await download(page, () => page.click('#export-table-csv'))).toString('utf8').trim().split(/\r?\n/);
    expect(csv[0].split(',').slice(0, 4)).toEqual(['run', 'variable', 'region', 'layer']);
    expect(csv.length - 1).toBe(filtered);
    const regionCol = csv[0].split(',').indexOf('region');
    for (const line of csv.slice(1)) expect(line).toContain('atlantic');
    expect(regionCol).toBeGreaterThan(0);
    const json = JSON.parse((await download(page, () => page.click('#export-table-json'))).toString('utf8')) as { rows: unknown[] };
    expect(json.rows.length).toBe(filtered);
    expect((await download(page, () => page.click('#export-table-markdown'))).toString('utf8')).toMatch(/\| *run *\|/);
    expect((await download(page, () => page.click('#export-table-latex'))).toString('utf8')).toMatch(/\\begin\{(tabular|longtable)\}/);
    // sorting by bias puts the rows in order
    await page.fill('#scores-filter', '');
    await page.click('#scores-table th:nth-child(9) button');
    const bias = await page.$$eval('#scores-table tbody td:nth-child(9)', (tds) => tds.map((t) => Number(t.textContent)).filter(Number.isFinite));
    expect(bias).toEqual([...bias].sort((a, b) => a - b));
    await wb.shot('view-scores');
  }, SLOW);

  // the spin-up view belongs to the spin-up part, which has its own end-to-end test
  it('the line view draws a transect from the lines part', async () => {
    await page.click('#tab-line');
    await drawn(page, 'line');
    expect(await page.textContent('.view-line .figure-stage svg')).toContain('Distance along the line (km)');
    // the column-mean panel says which cells its means use (issue 13 item 9)
    expect(await page.textContent('.view-line')).toContain('only cells where the reference and every run have values');
    await wb.shot('view-line', { fullPage: true });
  }, SLOW);

  it('is keyboard reachable: the tabs follow the arrow keys and Alt+number', async () => {
    await page.focus('#tab-scores');
    await page.keyboard.press('ArrowLeft');
    expect(await page.getAttribute('#tab-diagram', 'aria-selected')).toBe('true');
    await page.keyboard.press('Alt+1');
    expect(await page.getAttribute('#tab-map', 'aria-selected')).toBe('true');
  }, SLOW);

  it('made no request beyond 127.0.0.1 and logged no console errors', () => {
    expect(wb.foreignRequests()).toEqual([]);
    expect(wb.consoleErrors).toEqual([]);
  });
});
