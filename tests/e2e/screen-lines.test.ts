// Section, Profile and Line on the screen are figures of app/figures (issue 11, one figure code path): what the
// stage shows is the figure the export writes. The Line view exports the report's line figure (reference, runs,
// differences, column means) as SVG and as PNG at 300 dpi with its resolution in the file (read with Pillow).
// The data behind each figure downloads as CSV and CF NetCDF (issue 14, "data out"); each NetCDF is read with
// netCDF4-python (Debian's /usr/bin/python3, tests/e2e/compare_data_files.py) and compared cell by cell with its
// CSV. Screenshots go to tests/e2e/screenshots/ for a person to look at.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Download, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { callInPage, canRunBrowser, readyWorkbench, SAMPLE_DATA, SCREENSHOTS, type Workbench } from './harness.js';

const SLOW = 240_000;

async function waitDrawn(page: Page, view: string, re: RegExp): Promise<string> {
  await page.waitForFunction(([v, src]) => new RegExp(src).test(document.querySelector(`.view-${v} [data-drawn]`)?.getAttribute('data-drawn') ?? ''), [view, re.source] as const, { timeout: SLOW });
  return (await page.getAttribute(`.view-${view} [data-drawn]`, 'data-drawn')) ?? '';
}

async function download(page: Page, click: () => Promise<void>): Promise<{ name: string; bytes: Buffer }> {
  const [d] = await Promise.all([page.waitForEvent('download', { timeout: SLOW }), click()]);
  return { name: (d as Download).suggestedFilename(), bytes: readFileSync((await (d as Download).path())!) };
}

/** the texts of an SVG, in order (the screen's and the exported file's must be the same figure) */
async function screenTexts(page: Page, view: string): Promise<string[]> {
  return page.$$eval(`.view-${view} .figure-stage svg text`, (ts) => ts.map((t) => t.textContent ?? ''));
}
function fileTexts(svg: string): string[] {
  const py = spawnSync('/usr/bin/python3', ['-c', 'import sys, json\nimport xml.etree.ElementTree as ET\nr = ET.fromstring(sys.stdin.read())\nprint(json.dumps(["".join(t.itertext()) for t in r.iter("{http://www.w3.org/2000/svg}text")]))'], { input: svg, encoding: 'utf8', maxBuffer: 1 << 28 });
  if (py.status !== 0) throw new Error(py.stderr);
  return JSON.parse(py.stdout) as string[];
}

interface Compared {
  header: Record<string, string>;
  heading: string[];
  rows: number;
  cells_with_values: number;
  fields: string[];
  field_headings_match: boolean;
  units: string[];
  fill_values: number[];
  bounds: Record<string, string | null>;
  mismatches: unknown[];
  conventions: string;
}

/** Download the data of a view as NetCDF and CSV through its buttons, and compare them with netCDF4-python. */
async function downloadBoth(page: Page, id: string, dims: string): Promise<Compared> {
  const nc = await download(page, () => page.click(`#${id}-download-netcdf`));
  const csv = await download(page, () => page.click(`#${id}-download-csv`));
  expect(nc.name).toMatch(/\.nc$/);
  expect(csv.name).toMatch(/\.csv$/);
  const dir = mkdtempSync(join(tmpdir(), 'sw-data-out-'));
  try {
    writeFileSync(join(dir, 'a.nc'), nc.bytes);
    writeFileSync(join(dir, 'a.csv'), csv.bytes);
    const py = spawnSync('/usr/bin/python3', [join(__dirname, 'compare_data_files.py'), join(dir, 'a.nc'), join(dir, 'a.csv'), dims], { encoding: 'utf8', maxBuffer: 1 << 28 });
    expect(py.status, py.stderr).toBe(0);
    return JSON.parse(py.stdout) as Compared;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function expectSameData(c: Compared, units: string): void {
  expect(c.conventions).toBe('CF-1.10');
  expect(c.mismatches).toEqual([]);
  expect(c.rows).toBe(c.cells_with_values);
  expect(c.rows).toBeGreaterThan(0);
  expect(c.field_headings_match).toBe(true);
  expect(c.units).toEqual([units]);
  // NetCDF's default fill value for float (9.9692099683868690e+36, netcdf.h NC_FILL_FLOAT), as CF allows
  expect(c.fill_values).toEqual([Math.fround(9.969209968386869e36)]);
}

describe.skipIf(!canRunBrowser)('section, profile and line figures on the screen are the exported figures', () => {
  let wb: Workbench;
  let page: Page;
  beforeAll(async () => {
    ({ wb, page } = await readyWorkbench('.view-map [data-drawn]', SLOW));
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
  });

  it('Section: the stage shows the figure the SVG export writes (same texts, one raster, the seafloor)', async () => {
    await page.click('#tab-section');
    await waitDrawn(page, 'section', /\|/);
    const shown = await screenTexts(page, 'section');
    expect(shown.join(' ')).toContain('Depth (m)');
    expect(shown).toContain('T (°C)');
    expect(await page.locator('.view-section image.section-raster').count()).toBe(1);
    expect(await page.locator('.view-section path.seafloor').count()).toBe(1);
    const svg = (await download(page, () => page.click('#export-svg'))).bytes.toString('utf8');
    expect(fileTexts(svg)).toEqual(shown);
    await wb.shot('lines-section');
    // the readout over the figure: the value of the cell under the pointer, as a session of its own reads it
    const box = (await page.locator('.view-section rect.panel-area').boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.42, box.y + box.height * 0.3);
    await page.waitForFunction(() => !!document.querySelector('.view-section .section-readout')?.getAttribute('data-cell'), undefined, { timeout: SLOW });
    const cell = (await page.getAttribute('.view-section .section-readout', 'data-cell'))!.split(',').map(Number);
    const shownValue = Number(await page.getAttribute('.view-section .section-readout', 'data-value'));
    const own = await callInPage<{ session: string }>(page, 'view.open', { recipe: join(SAMPLE_DATA, 'demo-recipe.json') });
    const sec = await callInPage<{ model: Float32Array; edges: Float64Array }>(page, 'view.section', { session: own.session, variable: 'T', run: 'remin-short (L = 200 m)', kind: 'meridian', at: -25 });
    const n = sec.edges.length - 1;
    expect(shownValue).toBe(sec.model[cell[0] * n + cell[1]]);
    expect(await page.textContent('.view-section .section-readout')).toMatch(/^remin-short \(L = 200 m\) at [\d.]+°[NS], \d+ m: [\d.]+ °C$/);
    const data = await downloadBoth(page, 'section', 'depth,lat');
    expectSameData(data, 'degC');
    expect(data.header).toMatchObject({ variable: 'T', units: 'degC', period: 'annual', run: 'remin-short (L = 200 m)' });
    expect(data.header.section).toMatch(/^meridian section along 24\.5°W/);
    expect(data.bounds).toEqual({ depth: 'depth_bnds', lat: 'lat_bnds' });
  }, SLOW);

  it('Profile: the stage shows the figure the SVG export writes', async () => {
    await page.click('#tab-profile');
    await waitDrawn(page, 'profile', /\|/);
    const shown = await screenTexts(page, 'profile');
    expect(shown).toContain('T (°C)');
    expect(shown).toContain('Demo climatology (reference)');
    const svg = (await download(page, () => page.click('#export-svg'))).bytes.toString('utf8');
    expect(fileTexts(svg)).toEqual(shown);
    await wb.shot('lines-profile');
    const data = await downloadBoth(page, 'profile', 'depth');
    expectSameData(data, 'degC');
    expect(data.header).toMatchObject({ variable: 'T', period: 'annual' });
    expect(data.header.region).toMatch(/^global /);
    expect(data.fields).toHaveLength(4); // the reference and the demo's three runs
  }, SLOW);

  it('Line: the report\'s line figure on the stage, exported as one SVG and one 300 dpi PNG', async () => {
    await page.click('#tab-line');
    await page.fill('#line-points', '-30,-60; -30,0; -20,60');
    await page.press('#line-points', 'Enter');
    await waitDrawn(page, 'line', /\|3$/);
    const shown = await screenTexts(page, 'line');
    expect(shown).toContain('Demo climatology (reference)');
    // the demo recipe's runs (sample-data/demo-recipe.json)
    for (const r of ['remin-short (L = 200 m)', 'remin-mid (L = 350 m)', 'remin-long (L = 600 m)']) {
      expect(shown).toContain(r);
      expect(shown).toContain(`${r} minus reference`);
    }
    expect(shown.some((t) => t.startsWith('Column means along the line'))).toBe(true);
    expect(shown).toContain('Run minus reference (°C)');
    // the waypoints A, B, C on the top axis of the first panel
    expect(await page.locator('.view-line .waypoint-marks').first().locator('.waypoint-label').allTextContents()).toEqual(['A', 'B', 'C']);
    // the readout names the panel under the pointer and its value (a difference panel of the first run)
    const diffBox = (await page.locator('.view-line rect.panel-area[data-panel="difference:0"]').boundingBox())!;
    await page.mouse.move(diffBox.x + diffBox.width * 0.3, diffBox.y + diffBox.height * 0.1);
    await page.waitForFunction(() => document.querySelector('.view-line .section-readout')?.getAttribute('data-panel') === 'difference:0', undefined, { timeout: SLOW });
    expect(await page.textContent('.view-line .section-readout')).toMatch(/^remin-short \(L = 200 m\) minus reference at \d+ km along the line, \d+ m: [−\-\d.e]+ °C$/);
    await wb.shot('lines-line-readout');
    const svg = await download(page, () => page.click('#export-svg'));
    expect(svg.name).toMatch(/\.svg$/);
    expect(fileTexts(svg.bytes.toString('utf8'))).toEqual(shown);
    const png = await download(page, () => page.click('#export-png'));
    writeFileSync(join(SCREENSHOTS, 'lines-line-export.png'), png.bytes);
    const py = spawnSync('/usr/bin/python3', ['-c', 'import sys, io, json\nfrom PIL import Image\nim = Image.open(io.BytesIO(sys.stdin.buffer.read()))\nprint(json.dumps({"size": im.size, "dpi": [round(v, 2) for v in im.info["dpi"]]}))'], { input: png.bytes });
    expect(py.status, py.stderr?.toString()).toBe(0);
    const info = JSON.parse(py.stdout.toString()) as { size: [number, number]; dpi: [number, number] };
    // 180 mm at 300 dpi: 180 / 25.4 × 300 = 2126 px; pHYs says 300 dpi (11811 px per metre, PNG specification)
    expect(info.size[0]).toBe(2126);
    expect(info.dpi[0]).toBeCloseTo(300, 0);
    await wb.shot('lines-line', { fullPage: true });
    const data = await downloadBoth(page, 'line', 'depth,distance');
    expectSameData(data, 'degC');
    expect(data.header.line).toMatch(/^great-circle through A 30°W 60°S at 0 km; B 30°W 0° at [\d.]+ km; C 20°W 60°N at [\d.]+ km; sampled every 100 km/);
    expect(data.fields).toHaveLength(7); // reference, three runs, three differences
    expect(data.heading.slice(0, 9)).toEqual(['depth (m)', 'depth_min', 'depth_max', 'distance (km)', 'distance_min', 'distance_max', 'lon (degrees_east)', 'lat (degrees_north)', 'seafloor_depth (m)']);
    expect(wb.consoleErrors).toEqual([]);
  }, SLOW);

  it('Spin-up: the stage shows the figure the SVG export writes; units and the banner\'s sentences typeset', async () => {
    await page.click('#tab-spinup');
    await page.waitForSelector('.view-spinup [data-drawn]', { timeout: SLOW });
    // every tracer, so that temperature (°C) and the nutrients (mmol m⁻³) are drawn, and the inventory (J, mol)
    await page.evaluate(() => {
      for (const b of document.querySelectorAll<HTMLInputElement>('#spinup-tracers input')) if (!b.checked) b.click();
    });
    await page.waitForFunction(() => /\|T,|,T\||,T,/.test(document.querySelector('.view-spinup [data-drawn]')?.getAttribute('data-drawn') ?? ''), undefined, { timeout: SLOW });
    const shown = await screenTexts(page, 'spinup');
    const axes = await page.$$eval('.view-spinup svg text.axis-label', (ts) => ts.map((t) => t.textContent ?? ''));
    expect(axes).toContain('Model year (log scale)');
    expect(axes).toContain('Mean deviation (°C)');
    expect(axes).toContain('Mean deviation (mmol m⁻³)');
    const banner = (await page.textContent('.view-spinup .spinup-banner')) ?? '';
    const all = `${shown.join(' ')} ${banner} ${(await page.textContent('#spinup-table')) ?? ''}`;
    // UDUNITS spellings belong in machine files, not on the screen (µmol kg⁻¹, kg m⁻³, °C as in the figures)
    for (const raw of ['degC', 'kg m-3', 'mmol m-3', 'umol kg-1', 'J kg-1', 'mol-1']) expect(all).not.toContain(raw);
    const svg = (await download(page, () => page.click('#export-svg'))).bytes.toString('utf8');
    expect(svg).toContain('width="180mm"');
    expect(fileTexts(svg)).toEqual(shown);
    await page.click('.view-spinup button[data-value="inventory"]');
    await page.waitForFunction(() => document.querySelector('.view-spinup [data-drawn]')?.getAttribute('data-drawn')?.includes('|inventory|'), undefined, { timeout: SLOW });
    const inv = await page.$$eval('.view-spinup svg text.axis-label', (ts) => ts.map((t) => t.textContent ?? ''));
    expect(inv).toContain('Inventory deviation (J)');
    expect(inv).toContain('Inventory deviation (mol)');
    await wb.shot('lines-spinup');
    expect(wb.consoleErrors).toEqual([]);
  }, SLOW);
});
