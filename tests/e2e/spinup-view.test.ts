// The spin-up view end to end in Debian's Chromium against browser mode (issue 6): on the demo scenario the
// deviation of the chosen tracers and regions is drawn against model year on a logarithmic axis, with the
// skill of each snapshot on the same axis and a table of drift rates and verdicts; the scores view carries a
// banner when a scored run has not settled. Screenshots go to tests/e2e/screenshots/ for a person to look at.
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Download, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { canRunBrowser, callInPage, openWorkbench, SAMPLE_DATA, type Workbench } from './harness.js';
import { spinupJson } from '../../app/spinup/write-output.js';
import type { SpinupResult } from '../../app/spinup/types.js';

// following thirteen snapshots of three runs' worth of tracers takes minutes on a loaded machine
const SLOW = 1_200_000;

async function drawnKey(page: Page): Promise<string> {
  await page.waitForSelector('.view-spinup [data-drawn]', { timeout: SLOW });
  return (await page.getAttribute('.view-spinup [data-drawn]', 'data-drawn')) ?? '';
}

/** x positions of the major tick labels of the first log axis, by their value. */
function tickPositions(page: Page): Promise<Record<string, number>> {
  return page.evaluate(() => {
    const axis = document.querySelector('.view-spinup svg g.log-axis')!;
    const out: Record<string, number> = {};
    for (const t of axis.querySelectorAll('text.tick-label')) out[t.textContent ?? ''] = Number(t.getAttribute('x'));
    return out;
  });
}

describe.skipIf(!canRunBrowser)('spin-up view in Chromium', () => {
  let wb: Workbench;
  let page: Page;

  beforeAll(async () => {
    wb = await openWorkbench({ viewport: { width: 1440, height: 1000 } });
    page = wb.page;
    await page.waitForSelector('body[data-ready="true"]', { timeout: SLOW });
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
  });

  it('draws deviations against model year on a logarithmic axis', async () => {
    await page.click('#tab-spinup');
    await drawnKey(page);
    const svgText = (await page.textContent('.view-spinup svg')) ?? '';
    expect(svgText).toContain('Model year (log scale)');
    // every deviation axis names its units (the demo runs are in mmol m-3)
    expect(svgText).toMatch(/Mean deviation \([^)]+\)/);
    const x = await tickPositions(page);
    // the demo's snapshots span model years 10–5000: decades 10, 100, 1000, 10000
    expect(Object.keys(x)).toEqual(expect.arrayContaining(['10', '100', '1000', '10000']));
    // logarithmic: each decade takes the same length (definition of a log axis), and positions increase
    expect(x['100']).toBeGreaterThan(x['10']);
    expect(Math.abs(x['100'] - x['10'] - (x['1000'] - x['100']))).toBeLessThan(1);
    expect(Math.abs(x['1000'] - x['100'] - (x['10000'] - x['1000']))).toBeLessThan(1);
    // minor ticks 2..9 of each of the three decades
    expect(await page.locator('.view-spinup svg g.log-axis').first().locator('line.minor-tick').count()).toBe(24);
    await wb.shot('view-spinup');
  }, SLOW);

  it('draws one line per tracer × region, with a legend', async () => {
    // exactly two tracers and two regions
    await page.evaluate(() => {
      for (const fs of ['#spinup-tracers', '#spinup-regions']) for (const b of document.querySelectorAll<HTMLInputElement>(`${fs} input`)) if (b.checked) b.click();
    });
    for (const sel of ['#spinup-tracers input[value="PO4"]', '#spinup-tracers input[value="O2"]', '#spinup-regions input[value="global"]', '#spinup-regions input[value="atlantic"]']) await page.check(sel);
    await page.waitForFunction(() => document.querySelector('.view-spinup [data-drawn]')?.getAttribute('data-drawn')?.endsWith('|PO4,O2|global,atlantic'), undefined, { timeout: SLOW });
    const labels = await page.$$eval('.view-spinup svg g.panel-lines path.series-line, .view-spinup svg path.series-line', (ps) => ps.map((p) => p.getAttribute('data-label')));
    for (const l of ['PO4, global', 'PO4, atlantic', 'O2, global', 'O2, atlantic']) expect(labels).toContain(l);
    const legend = (await page.textContent('.view-spinup svg g.legend')) ?? '';
    expect(legend).toContain('O2, atlantic');
    // inventories, relative: one panel, in per cent
    await page.click('#spinup-quantity button[data-value="inventory"]');
    await page.click('#spinup-scale button[data-value="relative"]');
    await page.waitForFunction(() => document.querySelector('.view-spinup [data-drawn]')?.getAttribute('data-drawn')?.includes('|inventory|relative|'), undefined, { timeout: SLOW });
    expect(await page.textContent('.view-spinup svg')).toContain('Deviation (% of inventory at year 10)');
    await wb.shot('view-spinup-inventory-relative');
    await page.click('#spinup-quantity button[data-value="inventory"]');
    await page.click('#spinup-scale button[data-value="absolute"]');
    await page.waitForFunction(() => document.querySelector('.view-spinup [data-drawn]')?.getAttribute('data-drawn')?.includes('|inventory|absolute|'), undefined, { timeout: SLOW });
    // inventories in mol, as the service reports them
    expect(await page.textContent('.view-spinup svg')).toContain('Inventory deviation (mol)');
    await page.click('#spinup-quantity button[data-value="mean"]');
    await page.waitForFunction(() => document.querySelector('.view-spinup [data-drawn]')?.getAttribute('data-drawn')?.includes('|mean|absolute|'), undefined, { timeout: SLOW });
  }, SLOW);

  it('shows skill against model year and a sortable table of drift rates and verdicts', async () => {
    const text = (await page.textContent('.view-spinup svg')) ?? '';
    expect(text).toMatch(/RMSE \([^)]+\)/);
    expect(text).toContain('Correlation r (dimensionless)');
    expect(await page.locator('.view-spinup svg g.log-axis').count()).toBeGreaterThanOrEqual(3);
    const rows = await page.locator('#spinup-table tbody tr.track-row').count();
    // PO4 and O2 × global and atlantic × five layers
    expect(rows).toBe(2 * 2 * 5);
    const statuses = await page.$$eval('#spinup-table td.verdict', (tds) => tds.map((t) => t.getAttribute('data-status')));
    expect(statuses.every((s) => s === 'settled' || s === 'drifting' || s === 'undetermined')).toBe(true);
    expect(statuses).toContain('drifting');
    // the demo's O2 overshoots: the table says so
    expect(await page.textContent('#spinup-table')).toContain('non-monotonic');
    expect(await page.locator('#spinup-table tr.verdict-note-row').count()).toBeGreaterThan(0);
    // sorted by the size of the relative drift, largest first
    const pct = await page.$$eval('#spinup-table tbody tr.track-row td:nth-child(5)', (tds) => tds.map((t) => Math.abs(parseFloat(t.textContent ?? ''))).filter(Number.isFinite));
    expect(pct).toEqual([...pct].sort((a, b) => b - a));
    await page.click('#spinup-table th:nth-child(5) button');
    const up = await page.$$eval('#spinup-table tbody tr.track-row td:nth-child(5)', (tds) => tds.map((t) => Math.abs(parseFloat(t.textContent ?? ''))).filter(Number.isFinite));
    expect(up).toEqual([...up].sort((a, b) => a - b));
    await page.click('#spinup-table th:nth-child(5) button');
    await wb.shot('view-spinup-full', { fullPage: false });
    await page.locator('#spinup-table').scrollIntoViewIfNeeded();
    await wb.shot('view-spinup-table');
  }, SLOW);

  it('exports the figure as SVG with its log axis', async () => {
    const [d] = await Promise.all([page.waitForEvent('download', { timeout: SLOW }), page.click('#export-svg')]);
    const svg = readFileSync(await (d as Download).path()).toString('utf8');
    expect(svg).toMatch(/^<\?xml/);
    expect(svg).toContain('Model year (log scale)');
    expect(svg).toContain('width="180mm"');
  }, SLOW);

  it('the scores view says that remin-mid has not settled, without holding up the table', async () => {
    await page.click('#tab-scores');
    await page.waitForSelector('#scores-table tbody tr', { timeout: SLOW });
    await page.waitForSelector('#scores-spinup-banner p[data-run]', { timeout: SLOW });
    const banner = (await page.textContent('#scores-spinup-banner')) ?? '';
    expect(banner).toContain('remin-mid (L = 350 m)');
    expect(banner).toContain('has not settled');
    // the runs without snapshots: settling unknown, said once
    expect(banner).toContain('remin-short (L = 200 m)');
    expect(banner.match(/is unknown/g)?.length).toBe(1);
    await wb.shot('view-scores-banner');
  }, SLOW);

  it('keyboard: the controls take focus and act on Space', async () => {
    await page.click('#tab-spinup');
    await drawnKey(page);
    // a tracer not shown yet (the first look picks the chosen variable and the one that drifts most)
    const tracer = (await page.getAttribute('#spinup-tracers input:not(:checked)', 'value')) ?? '';
    expect(tracer).toBeTruthy();
    await page.focus(`#spinup-tracers input[value="${tracer}"]`);
    await page.keyboard.press('Space');
    await page.waitForFunction((t) => document.querySelector('.view-spinup [data-drawn]')?.getAttribute('data-drawn')?.split('|')[4].split(',').includes(t), tracer, { timeout: 60_000 });
    expect(await page.isChecked(`#spinup-tracers input[value="${tracer}"]`)).toBe(true);
  }, SLOW);

  it('shows a spinup.json written by the command line, chosen in the file picker', async () => {
    // the same result the view computed, written as `stillwater spinup` writes it (app/spinup/write-output.ts)
    const recipe = JSON.parse(readFileSync(join(SAMPLE_DATA, 'demo-recipe.json'), 'utf8')) as unknown;
    const from = await callInPage<SpinupResult>(page, 'spinup.run', { recipe, baseDir: SAMPLE_DATA, run: 'remin-mid (L = 350 m)' });
    const file = join(SAMPLE_DATA, 'generated', 'e2e-cli-spinup.json');
    writeFileSync(file, spinupJson({ ...from, run: 'from-the-command-line' }));
    try {
      await page.click('#tab-spinup');
      await page.click('#spinup-open-results');
      // walk the picker down to the file: the folder on the way to it, until the file itself shows
      let clicked = '';
      for (let i = 0; i < 8; i++) {
        const next = await page.waitForFunction(
          ([target, last]) => {
            const paths = [...document.querySelectorAll('.picker-entry[data-path]')].map((e) => e.getAttribute('data-path') ?? '');
            if (paths.includes(target)) return target;
            return paths.find((p) => p !== last && target.startsWith(p + '/')) ?? false;
          },
          [file, clicked] as const,
          { timeout: 30_000 },
        );
        clicked = (await next.jsonValue()) as string;
        await page.click(`.picker-entry[data-path="${clicked}"]`);
        if (clicked === file) break;
      }
      await page.waitForFunction(() => document.querySelector('.view-spinup [data-drawn]')?.getAttribute('data-drawn')?.startsWith('from-the-command-line|'), null, { timeout: 60_000 });
      expect(await page.textContent('.view-spinup .spinup-banner')).toBe([from.summary.sentence, ...from.notes].join(' '));
    } finally {
      rmSync(file, { force: true });
    }
  }, SLOW);

  it('made no request beyond 127.0.0.1 and logged no console errors', () => {
    expect(wb.foreignRequests()).toEqual([]);
    expect(wb.consoleErrors).toEqual([]);
  });
});
