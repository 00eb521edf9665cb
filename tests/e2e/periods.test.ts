// The period choice in Chromium (issue 12, views) on the monthly fixtures of tests/fixtures/time: the bar's
// Period menu lists the year, the months and the seasons of a recipe with options.periods; choosing January
// changes the map, and the probe then shows January's values as xarray's groupby('time.month') with day-count
// weights gives them (tests/fixtures/views-periods/expected.json, make_views_periods.py); every view follows
// the period; Profile draws the monthly cycle month × depth; the saved view keeps the period; a period the
// recipe has no data for is refused at the control with a sentence. Screenshots go to tests/e2e/screenshots/.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { canRunBrowser, readyWorkbench, type Workbench } from './harness.js';

const SLOW = 240_000;
const FX = resolve(__dirname, '../fixtures');
const HERE = join(FX, 'views-periods');
const expected = JSON.parse(readFileSync(join(HERE, 'expected.json'), 'utf8'));
const MONTHS = ['JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC'];

/**
 * Wait until a view has drawn: `data-drawn` ending with `end` or starting with `start`, and `data-period` (the
 * period drawn) equal to `period`.
 */
async function drawnAs(page: Page, view: string, want: { end?: string; start?: string; period?: string }): Promise<string> {
  const sel = `.view-${view} [data-drawn]`;
  await page.waitForFunction(
    ([s, end, start, period]) => {
      const e = document.querySelector(s);
      const d = e?.getAttribute('data-drawn');
      return typeof d === 'string' && d.endsWith(end) && d.startsWith(start) && (period === '' || e?.getAttribute('data-period') === period);
    },
    [sel, want.end ?? '', want.start ?? '', want.period ?? ''] as const,
    { timeout: SLOW },
  );
  return (await page.getAttribute(sel, 'data-drawn')) ?? '';
}

/**
 * The probe's numbers at a place for a period (as the probe panel shows them, data-value attributes), once the
 * panel says it shows that place and period (its data-at and data-period): values of an earlier request may
 * still be on screen when a new one is on its way.
 */
async function probeAt(page: Page, lon: number, lat: number, period: string): Promise<{ model: number; reference: number; cell: number }> {
  await page.fill('#probe-lon', String(lon));
  await page.fill('#probe-lat', String(lat));
  await page.click('#probe-go');
  await page.waitForFunction(
    ([at, p]) => {
      const t = document.querySelector('#probe-values') as HTMLElement | null;
      return t?.dataset.at === at && t.dataset.period === p && t.querySelector('dd[data-probe="model"]') !== null;
    },
    [`${lon},${lat}`, period] as const,
    { timeout: SLOW },
  );
  return page.evaluate(() => {
    const get = (k: string) => Number((document.querySelector(`#probe-values dd[data-probe="${k}"]`) as HTMLElement).dataset.value);
    return { model: get('model'), reference: get('reference'), cell: get('cell') };
  });
}

function canvasDigest(page: Page): Promise<number> {
  return page.evaluate(() => {
    const c = document.querySelector('canvas.map-canvas') as HTMLCanvasElement;
    const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
    let sum = 0;
    for (let i = 0; i < d.length; i += 4) sum = (sum * 31 + d[i] * 3 + d[i + 1] * 5 + d[i + 2] * 7) % 1_000_000_007;
    return sum;
  });
}

describe.skipIf(!canRunBrowser)('the period of the year in the workbench', () => {
  let wb: Workbench;
  let page: Page;
  const work = mkdtempSync(join(tmpdir(), 'sw-periods-e2e-'));

  beforeAll(async () => {
    ({ wb, page } = await readyWorkbench('.view-map [data-drawn]', SLOW, ['--root', FX, '--root', work, '--recipe', join(HERE, 'recipe.json')]));
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
    rmSync(work, { recursive: true, force: true });
  });

  it('the Period menu offers the year, every month and every season', async () => {
    const options = await page.$$eval('#choose-period option', (os) => os.map((o) => ({ value: (o as HTMLOptionElement).value, disabled: (o as HTMLOptionElement).disabled })));
    expect(options.map((o) => o.value)).toEqual(['annual', ...MONTHS, 'DJF', 'MAM', 'JJA', 'SON']);
    expect(options.every((o) => !o.disabled)).toBe(true);
    expect(await page.isEnabled('#choose-period')).toBe(true);
  });

  it("choosing January changes the map to January's values (xarray's monthly grouping of the fixture)", async () => {
    await drawnAs(page, 'map', { period: 'annual' });
    const before = await canvasDigest(page);
    // 135° E, 0° N is the cell (row 1, column 1) of the 4 × 3 fixture grid, level 0 (5 m)
    const annual = await probeAt(page, 135, 0, 'annual');
    expect(annual.cell).toBe(5);
    await page.selectOption('#choose-period', 'JAN');
    await drawnAs(page, 'map', { period: 'JAN' });
    const jan = await probeAt(page, 135, 0, 'JAN');
    expect(jan.model).not.toBe(annual.model);
    expect(jan.model).toBeCloseTo(expected.run.months[0][5], 5);
    expect(jan.reference).toBeCloseTo(expected.reference.months[0][5], 5);
    expect(await canvasDigest(page)).not.toBe(before);
    expect(await page.textContent('.view-map')).toContain('January');
    await wb.shot('periods-map-january');
    // April, the peak of the fixture's cycle
    await page.selectOption('#choose-period', 'APR');
    await drawnAs(page, 'map', { period: 'APR' });
    const apr = await probeAt(page, 135, 0, 'APR');
    expect(apr.model).toBeCloseTo(expected.run.months[3][5], 5);
    await page.selectOption('#choose-period', 'JAN');
    await drawnAs(page, 'map', { period: 'JAN' });
  }, SLOW);

  it('Difference, Section, Profile, Diagram and Scores follow the period', async () => {
    await page.click('#tab-difference');
    await drawnAs(page, 'difference', { end: '|diff', period: 'JAN' });
    await wb.shot('periods-difference-january');
    await page.click('#tab-section');
    await page.fill('#section-at', '135').catch(() => undefined);
    await drawnAs(page, 'section', { period: 'JAN' });
    await page.click('#tab-profile');
    await drawnAs(page, 'profile', { period: 'JAN' });
    expect(await page.textContent('.view-profile svg')).toContain('January');
    await page.click('#tab-diagram');
    await drawnAs(page, 'diagram', { period: 'JAN' });
    await page.click('#tab-scores');
    await page.waitForSelector('#scores-table tbody tr', { timeout: SLOW });
    await page.waitForFunction(() => /January/.test(document.querySelector('#scores-count')?.textContent ?? ''), undefined, { timeout: SLOW });
    const periods = await page.$$eval('#scores-table tbody tr', (rows) => rows.map((r) => (r as HTMLTableRowElement).cells[4].textContent));
    // the recipe's two layers (full depth, 0-20 m) of the one run and region, January's rows only
    expect(periods).toEqual(['JAN', 'JAN']);
    await page.selectOption('#choose-period', 'JJA');
    await page.waitForFunction(() => /JJA/.test(document.querySelector('#scores-count')?.textContent ?? ''), undefined, { timeout: SLOW });
    expect(await page.$$eval('#scores-table tbody tr', (rows) => rows.map((r) => (r as HTMLTableRowElement).cells[4].textContent))).toEqual(['JJA', 'JJA']);
    await wb.shot('periods-scores-jja');
    await page.selectOption('#choose-period', 'JAN');
  }, SLOW);

  it('Profile draws the monthly cycle of the region month × depth, with the run minus the reference', async () => {
    await page.click('#tab-profile');
    await page.click('#profile-mode button:has-text("Monthly cycle")');
    await page.selectOption('#choose-layer', 'all');
    // wait for the cycle of the layer chosen: the cycle of the layer before it (the map's level) may be drawn
    // first when it comes back before the layer changes
    const drawn = await drawnAs(page, 'profile', { start: 'cycle|', end: '|all' });
    expect(drawn).toBe('cycle|X|Run|global|all');
    const text = await page.textContent('.view-profile svg');
    expect(text).toContain('monthly cycle');
    expect(text).toContain('Run minus reference');
    // the months along x; the Period menu has nothing to choose here and says so
    expect(text).toContain('Jan');
    expect(await page.isDisabled('#choose-period')).toBe(true);
    await wb.shot('periods-profile-monthly-cycle');
  }, SLOW);

  it('the saved view carries the period', async () => {
    const saved = join(work, 'saved.json');
    await page.click('#sources-panel summary:has-text("Save as recipe")');
    await page.fill('#save-path', saved);
    await page.click('#sources-panel .save-form button[type="submit"]');
    await page.waitForFunction(() => /Saved the recipe/.test(document.querySelector('#status')?.textContent ?? ''), undefined, { timeout: SLOW });
    const doc = JSON.parse(readFileSync(saved, 'utf8')) as { screen: Record<string, unknown> };
    expect(doc.screen.period).toBe('JAN');
    expect(doc.screen.profileCycle).toBe(true);
    expect(doc.screen.view).toBe('profile');
  }, SLOW);

  it('made no request beyond 127.0.0.1 and logged no console errors', () => {
    expect(wb.foreignRequests()).toEqual([]);
    expect(wb.consoleErrors).toEqual([]);
  });
});

describe.skipIf(!canRunBrowser)('a period the recipe has no data for', () => {
  it('a saved January on a recipe with seasons only is refused at the Period menu with a sentence, and the year is shown', async () => {
    const { wb, page } = await readyWorkbench('.view-map [data-drawn]', SLOW, ['--root', FX, '--recipe', join(HERE, 'recipe-screen-jan.json')]);
    try {
      await page.waitForSelector('#period-refused', { timeout: SLOW });
      expect(await page.textContent('#period-refused')).toBe("January cannot be shown because the recipe's options.periods gives DJF, MAM, JJA, SON besides the year.");
      expect(await page.inputValue('#choose-period')).toBe('annual');
      expect(await page.$eval('#choose-period option[value="JAN"]', (o) => (o as HTMLOptionElement).disabled)).toBe(true);
      expect(await page.$eval('#choose-period option[value="DJF"]', (o) => (o as HTMLOptionElement).disabled)).toBe(false);
      await drawnAs(page, 'map', { period: 'annual' });
      await wb.shot('periods-refused-january');
      // a season it has is taken, and the sentence goes
      await page.selectOption('#choose-period', 'DJF');
      await drawnAs(page, 'map', { period: 'DJF' });
      expect(await page.$('#period-refused')).toBeNull();
      expect(wb.consoleErrors).toEqual([]);
    } finally {
      await wb.close();
    }
  }, SLOW);

  it('a recipe that compares the year only disables the Period menu and says why', async () => {
    const { wb, page } = await readyWorkbench('.view-map [data-drawn]', SLOW, ['--root', FX, '--recipe', join(HERE, 'recipe-annual.json')]);
    try {
      expect(await page.isDisabled('#choose-period')).toBe(true);
      const title = await page.$eval('#choose-period', (s) => (s.closest('label') as HTMLLabelElement).title);
      expect(title).toMatch(/^The recipe compares the year only: add "periods"/);
      expect(wb.consoleErrors).toEqual([]);
    } finally {
      await wb.close();
    }
  }, SLOW);
});
