// The view saved in the recipe (its `screen` section) and restored when the recipe is opened again; and the three
// jobs done with the keyboard alone (a bottom-layer comparison, a transect, a table export). Debian's Chromium
// against browser mode on the demo; screenshots go to tests/e2e/screenshots/.
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import type { Download, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SAMPLE_DATA, canRunBrowser, openWorkbench, readyWorkbench, type Workbench } from './harness.js';

const SLOW = 240_000;
const SAVED = join(SAMPLE_DATA, 'e2e-screen-recipe.json');

async function tabTo(page: Page, selector: string, limit = 80): Promise<void> {
  for (let i = 0; i < limit; i++) {
    if (await page.evaluate((s) => document.activeElement?.matches(s) ?? false, selector)) return;
    await page.keyboard.press('Tab');
  }
  throw new Error(`Tab never reached ${selector}`);
}

describe.skipIf(!canRunBrowser)('the view saved in the recipe, and keyboard-only jobs', () => {
  let wb: Workbench;
  let page: Page;
  beforeAll(async () => {
    rmSync(SAVED, { force: true });
    ({ wb, page } = await readyWorkbench('.view-map [data-drawn]', SLOW));
  }, SLOW);
  afterAll(async () => {
    await wb?.close();
    rmSync(SAVED, { force: true });
  });

  it('keyboard only: the bottom-layer comparison (variable, bottom, difference map, probe on the map)', async () => {
    await tabTo(page, '#choose-variable');
    await page.keyboard.press('End'); // the last variable of the menu
    await tabTo(page, '#choose-layer');
    await page.keyboard.press('End'); // the bottom is the last depth choice
    expect(await page.evaluate(() => (document.querySelector('#choose-layer') as HTMLSelectElement).value)).toBe('bottom');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('choose-layer');
    await page.keyboard.press('Alt+2');
    await page.waitForFunction(() => /\|bottom\|.*\|diff$/.test(document.querySelector('.view-difference [data-drawn]')?.getAttribute('data-drawn') ?? ''), undefined, { timeout: SLOW });
    await tabTo(page, 'canvas.map-canvas');
    await page.keyboard.press('ArrowRight');
    await page.waitForFunction(() => /Difference/.test(document.querySelector('#probe-panel')?.textContent ?? ''));
    await wb.shot('keyboard-bottom-difference');
  }, SLOW);

  it('keyboard only: a transect (waypoints typed, Enter to draw, a waypoint moved with the arrows)', async () => {
    await page.keyboard.press('Alt+8');
    await tabTo(page, '#line-points');
    await page.keyboard.press('Control+a');
    await page.keyboard.type('-40,-50; -40,20');
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => /\|2$/.test(document.querySelector('.view-line [data-drawn]')?.getAttribute('data-drawn') ?? ''), undefined, { timeout: SLOW });
    await tabTo(page, '#line-map circle[data-index="1"]');
    await page.keyboard.press('ArrowUp');
    expect(await page.inputValue('#line-points')).toBe('-40,-50; -40,21');
    await wb.shot('keyboard-transect');
  }, SLOW);

  it('keyboard only: a table export (Scores, filter, CSV)', async () => {
    await page.keyboard.press('Alt+6');
    await page.waitForSelector('#scores-table tbody tr', { timeout: SLOW });
    await tabTo(page, '#scores-filter');
    await page.keyboard.type('bottom');
    await tabTo(page, '#export-table-csv');
    const [d] = await Promise.all([page.waitForEvent('download', { timeout: SLOW }), page.keyboard.press('Enter')]);
    const csv = readFileSync(await (d as Download).path(), 'utf8').trim().split(/\r?\n/);
    expect(csv.length).toBeGreaterThan(1);
    const layer = csv[0].split(',').indexOf('layer');
    for (const line of csv.slice(1)) expect(line.split(',')[layer]).toBe('bottom');
  }, SLOW);

  it('saves the view in the recipe under "screen" and restores it when the recipe is opened again', async () => {
    await page.keyboard.press('Alt+1');
    await page.waitForSelector('.view-map [data-drawn]', { timeout: SLOW });
    await page.selectOption('#choose-projection', 'north-polar');
    await page.selectOption('#field-colour-scale', 'kelp');
    await page.click('#tab-line');
    await page.click('#sources-panel summary:has-text("Save as recipe")');
    await page.fill('#save-path', SAVED);
    await page.click('#sources-panel .save-form button[type="submit"]');
    await page.waitForFunction(() => /Saved the recipe/.test(document.querySelector('#status')?.textContent ?? ''), undefined, { timeout: SLOW });
    expect(existsSync(SAVED)).toBe(true);
    const saved = JSON.parse(readFileSync(SAVED, 'utf8')) as { screen: Record<string, unknown> };
    expect(saved.screen.view).toBe('line');
    expect(saved.screen.projection).toBe('north-polar');
    expect(saved.screen.fieldScale).toBe('kelp');
    expect((saved.screen.line as { points: number[][] }).points).toEqual([[-40, -50], [-40, 21]]);

    const again = await openWorkbench({ viewport: { width: 1600, height: 1000 }, serveArgs: ['--root', SAMPLE_DATA, '--recipe', SAVED] });
    try {
      await again.page.waitForSelector('body[data-ready="true"]', { timeout: SLOW });
      await again.page.waitForSelector('.view-line [data-drawn]', { timeout: SLOW });
      expect(await again.page.getAttribute('#tab-line', 'aria-selected')).toBe('true');
      expect(await again.page.inputValue('#line-points')).toBe('-40,-50; -40,21');
      expect(await again.page.inputValue('#choose-projection')).toBe('north-polar');
      expect(await again.page.inputValue('#choose-layer')).toBe('bottom');
      await again.shot('restored-from-recipe');
      expect(again.consoleErrors).toEqual([]);
    } finally {
      await again.close();
    }
  }, SLOW);

  it('made no request beyond 127.0.0.1 and logged no console errors', () => {
    expect(wb.foreignRequests()).toEqual([]);
    expect(wb.consoleErrors).toEqual([]);
  });
});
