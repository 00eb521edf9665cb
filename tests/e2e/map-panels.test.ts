// The multi-panel export of the Map and Difference views (issue 11), in Debian's Chromium against browser mode:
// reference | each run | each run minus reference, one colour bar for the fields and one for the differences,
// the corner numbers equal to the skill rows (what Scores lists) of the region and layer; PNG at 300 dpi.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import type { Download, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { shortNumber } from '../../app/figures/typeset.js';
import { callInPage, canRunBrowser, readyWorkbench, type Workbench } from './harness.js';

const SLOW = 300_000;

async function download(page: Page, click: () => Promise<void>): Promise<Buffer> {
  const [d] = await Promise.all([page.waitForEvent('download', { timeout: SLOW }), click()]);
  return readFileSync(await (d as Download).path());
}

interface Row {
  run: string;
  region: string;
  layer: string;
  period?: string;
  bias: number | null;
  rmse: number | null;
  corr: number | null;
}

describe.skipIf(!canRunBrowser)('Map and Difference: the multi-panel export', () => {
  let wb: Workbench;
  let page: Page;
  beforeAll(async () => {
    ({ wb, page } = await readyWorkbench('.view-map [data-drawn]', SLOW));
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
  });

  it('downloads an SVG that parses, names each run, has two colour bars and the skill rows in the corners', async () => {
    await page.click('#tab-difference');
    await page.waitForSelector('.view-difference [data-drawn]', { timeout: SLOW });
    await page.selectOption('#choose-layer', 'bottom');
    await page.waitForFunction(() => document.querySelector('.view-difference [data-drawn]')?.getAttribute('data-drawn')?.includes('|bottom|'), undefined, { timeout: SLOW });
    const variable = await page.inputValue('#choose-variable');
    const svg = (await download(page, () => page.click('#diff-panels-svg'))).toString('utf8');
    expect(svg.startsWith('<?xml')).toBe(true);
    // outside check: Python's XML parser (expat) reads the file; the parts are found by their classes
    const py = `
import sys, json, xml.etree.ElementTree as ET
root = ET.fromstring(sys.stdin.read().encode('utf-8'))
ns = '{http://www.w3.org/2000/svg}'
def text(e): return ''.join(e.itertext())
out = {'title': text(root.find(ns + 'title')),
  'panels': [text(t) for t in root.iter(ns + 'text') if t.get('class') == 'panel-title'],
  'bars': [text(t) for t in root.iter(ns + 'text') if t.get('class') == 'colour-bar-label'],
  'stats': ['\\n'.join(text(t) for t in g.iter(ns + 'text')) for g in root.iter(ns + 'g') if g.get('class') == 'panel-stats'],
  'images': sum(1 for _ in root.iter(ns + 'image'))}
print(json.dumps(out))
`;
    const r = spawnSync('/usr/bin/python3', ['-c', py], { input: svg, encoding: 'utf8' });
    expect(r.stderr).toBe('');
    const got = JSON.parse(r.stdout) as { title: string; panels: string[]; bars: string[]; stats: string[]; images: number };
    const recipe = await page.evaluate(() => (globalThis as unknown as { stillwaterBridge: { startRecipe(): Promise<string | null> } }).stillwaterBridge.startRecipe());
    const info = await callInPage<{ session: string; reference: { label: string }; variables: { key: string; runs: string[] }[] }>(page, 'view.open', { recipe });
    const runs = info.variables.find((v) => v.key === variable)!.runs;
    expect(runs.length).toBeGreaterThanOrEqual(2);
    expect(got.title).toContain(variable);
    expect(got.panels).toEqual([`${info.reference.label} (reference)`, ...runs.flatMap((run) => [run, `${run} minus reference`])]);
    expect(got.bars).toHaveLength(2);
    expect(got.bars[1].startsWith('Run minus reference (')).toBe(true);
    expect(got.images).toBe(1 + 2 * runs.length);
    // the rows Scores lists for this variable (view.skill), region global, bottom layer
    const rows = (await callInPage<{ rows: Row[] }>(page, 'view.skill', { session: info.session, variable })).rows;
    expect(got.stats).toHaveLength(runs.length);
    runs.forEach((run, i) => {
      const row = rows.find((x) => x.run === run && x.region === 'global' && x.layer === 'bottom' && (x.period ?? 'annual') === 'annual')!;
      expect(row).toBeDefined();
      const corner = got.stats[i];
      expect(corner).toContain(`bias ${shortNumber(row.bias)} `);
      expect(corner).toContain(`RMSE ${shortNumber(row.rmse)} `);
      expect(corner).toContain(`r ${shortNumber(row.corr)}`);
    });
    await callInPage(page, 'view.close', { session: info.session });
    await wb.shot('map-panels-difference');
  }, SLOW);

  it('downloads the same panels as PNG, 180 mm at 300 dpi with the resolution in the file', async () => {
    const png = await download(page, () => page.click('#diff-panels-png'));
    // PNG signature and IHDR width (ISO/IEC 15948): 180 mm at 300 dpi = 2126 pixels; pHYs 300 dpi = 11811 px/m
    expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    expect(png.readUInt32BE(16)).toBe(2126);
    const phys = png.indexOf(Buffer.from('pHYs'));
    expect(phys).toBeGreaterThan(0);
    expect(png.readUInt32BE(phys + 4)).toBe(11811);
    expect(await page.textContent('#diff-panels-note')).toContain('.png');
    expect(wb.consoleErrors).toEqual([]);
  }, SLOW);
});
