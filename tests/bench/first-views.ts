/**
 * The workbench's first views on the demo recipe (issue 17), timed in the page: from the user's action (a click
 * on a tab, a change of a control) to the moment the view sets its figure's data-drawn mark, with a
 * MutationObserver, so that nothing outside the page (Playwright's round trips) is counted. Page open is the
 * navigation start to the map's 'map-first-draw' mark.
 *
 * Every page gets a server of its own and a cache folder of its own (XDG_CACHE_HOME), so "first" means first:
 * no regridding weights, skill rows or spin-up sums from an earlier page. One extra row opens the recipe a
 * second time on the spin-up's cache folder: what a person sees the next time.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { SAMPLE_DATA, openWorkbench } from '../e2e/harness.js';

export interface FirstViewRow {
  task: string;
  ours: number;
  bar?: number;
  /** how many measurements the number is the median of, when more than one */
  of?: number;
}

const TIMEOUT_MS = 180_000;

type Action = { click: string } | { choose: [string, string] };

/** Do the action in the page and wait until `mark`'s data-drawn holds `want`; the milliseconds between the two. */
async function timed(page: Page, action: Action, mark: string, want: string): Promise<number> {
  return page.evaluate(
    ({ action, mark, want, timeoutMs }) =>
      new Promise<number>((resolve, reject) => {
        const drawn = (): boolean => (document.querySelector(mark)?.getAttribute('data-drawn') ?? '\u0000').includes(want);
        const observer = new MutationObserver(() => {
          if (!drawn()) return;
          const ms = performance.now() - t0;
          observer.disconnect();
          clearTimeout(timer);
          resolve(ms);
        });
        const timer = setTimeout(() => {
          observer.disconnect();
          reject(new Error(`${mark} did not show '${want}' within ${timeoutMs} ms`));
        }, timeoutMs);
        observer.observe(document.body, { subtree: true, childList: true, attributes: true, attributeFilter: ['data-drawn'] });
        const t0 = performance.now();
        if ('click' in action) {
          (document.querySelector(action.click) as HTMLElement).click();
        } else {
          const sel = document.querySelector(action.choose[0]) as HTMLSelectElement;
          sel.value = action.choose[1];
          sel.dispatchEvent(new Event('change', { bubbles: true }));
        }
      }),
    { action, mark, want, timeoutMs: TIMEOUT_MS },
  );
}

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? (s[(s.length - 1) >> 1] + s[s.length >> 1]) / 2 : NaN;
};

interface Opened {
  page: Page;
  firstMapMs: number;
  close(): Promise<void>;
}

/** A fresh server (on `cacheDir`) and page on the demo recipe, once the first map is drawn. */
async function openDemo(cacheDir: string): Promise<Opened> {
  process.env.XDG_CACHE_HOME = cacheDir; // the server inherits it: weights, spin-up sums and results go there
  const wb = await openWorkbench({ viewport: { width: 1600, height: 1000 }, serveArgs: ['--root', SAMPLE_DATA, '--recipe', join(SAMPLE_DATA, 'demo-recipe.json')] });
  try {
    await wb.page.waitForFunction(() => performance.getEntriesByName('map-first-draw').length > 0, undefined, { timeout: TIMEOUT_MS });
    const firstMapMs = await wb.page.evaluate(() => performance.getEntriesByName('map-first-draw')[0].startTime);
    if (wb.consoleErrors.length) throw new Error(`console errors: ${wb.consoleErrors.join(' | ')}`);
    return {
      page: wb.page,
      firstMapMs,
      async close() {
        if (wb.consoleErrors.length) console.log(`console errors: ${wb.consoleErrors.join(' | ')}`);
        if (wb.foreignRequests().length) throw new Error(`requests left 127.0.0.1: ${wb.foreignRequests().join(', ')}`);
        await wb.close();
      },
    };
  } catch (e) {
    await wb.close();
    throw e;
  }
}

const options = (page: Page, sel: string): Promise<string[]> => page.$$eval(`${sel} option`, (os) => os.map((o) => (o as HTMLOptionElement).value));
const chosen = (page: Page, sel: string): Promise<string> => page.$eval(sel, (s) => (s as HTMLSelectElement).value);

/** Every row of issue 17's table of first views, each on fresh pages as described above. */
export async function firstViews(): Promise<FirstViewRow[]> {
  const rows: FirstViewRow[] = [];
  const folders: string[] = [];
  const fresh = (): string => {
    const d = mkdtempSync(join(tmpdir(), 'sw-bench-cache-'));
    folders.push(d);
    return d;
  };
  const opens: number[] = [];
  try {
    // 1. the map: page open, then every other variable once and every other run once; then Scores
    {
      const o = await openDemo(fresh());
      opens.push(o.firstMapMs);
      const page = o.page;
      const variables = await options(page, '#choose-variable');
      const start = await chosen(page, '#choose-variable');
      const variableMs: number[] = [];
      for (const v of variables.filter((x) => x !== start)) {
        variableMs.push(await timed(page, { choose: ['#choose-variable', v] }, '.view-map [data-drawn]', `${v}|`));
      }
      const variable = await chosen(page, '#choose-variable');
      const runs = await options(page, '#choose-run');
      const firstRun = await chosen(page, '#choose-run');
      const runMs: number[] = [];
      for (const r of runs.filter((x) => x !== firstRun)) {
        runMs.push(await timed(page, { choose: ['#choose-run', r] }, '.view-map [data-drawn]', `${variable}|${r}|`));
      }
      rows.push({ task: 'Map: change variable (each other variable once)', ours: median(variableMs), bar: 200, of: variableMs.length });
      rows.push({ task: 'Map: change variable, the slowest', ours: Math.max(...variableMs), bar: 200 });
      rows.push({ task: 'Map: change run (each other run once)', ours: median(runMs), bar: 200, of: runMs.length });
      rows.push({ task: 'Map: change run, the slowest', ours: Math.max(...runMs), bar: 200 });
      const scoresOne = await timed(page, { click: '#tab-scores' }, '.view-scores [data-drawn]', `${variable}|`);
      const scoresAll = await timed(page, { click: '#scores-all-variables' }, '.view-scores [data-drawn]', '*all|');
      const allRows = await page.$eval('.view-scores [data-drawn]', (e) => e.getAttribute('data-drawn')!.split('|')[1]);
      rows.push({ task: `Scores, first: one variable (${variable}, after the map)`, ours: scoresOne, bar: 1000 });
      rows.push({ task: `Scores, first: all ${allRows} rows`, ours: scoresAll, bar: 3000 });
      await o.close();
    }
    // 2. the diagram straight after the first map
    {
      const o = await openDemo(fresh());
      opens.push(o.firstMapMs);
      const variable = await chosen(o.page, '#choose-variable');
      rows.push({ task: 'Diagram, first (after the map)', ours: await timed(o.page, { click: '#tab-diagram' }, '.view-diagram [data-drawn]', `|${variable}|`), bar: 1000 });
      await o.close();
    }
    // 3. the line straight after the first map, then a change of variable
    {
      const o = await openDemo(fresh());
      opens.push(o.firstMapMs);
      const page = o.page;
      const variable = await chosen(page, '#choose-variable');
      rows.push({ task: 'Line, first (after the map)', ours: await timed(page, { click: '#tab-line' }, '.view-line [data-drawn]', `${variable}|`), bar: 500 });
      const others = (await options(page, '#choose-variable')).filter((v) => v !== variable);
      const lineMs: number[] = [];
      for (const v of others.slice(0, 3)) lineMs.push(await timed(page, { choose: ['#choose-variable', v] }, '.view-line [data-drawn]', `${v}|`));
      rows.push({ task: 'Line: change variable', ours: median(lineMs), bar: 500, of: lineMs.length });
      await o.close();
    }
    // 4. the spin-up straight after the first map; then the same recipe opened again on the same cache folder
    {
      const cache = fresh();
      let o = await openDemo(cache);
      opens.push(o.firstMapMs);
      rows.push({ task: 'Spin-up, first visit (after the map)', ours: await timed(o.page, { click: '#tab-spinup' }, '.view-spinup [data-drawn]', '|'), bar: 3000 });
      await o.close();
      o = await openDemo(cache);
      rows.push({ task: 'Spin-up, first visit, recipe opened before', ours: await timed(o.page, { click: '#tab-spinup' }, '.view-spinup [data-drawn]', '|'), bar: 3000 });
      rows.push({ task: 'page open → first map, recipe opened before', ours: o.firstMapMs, bar: 1000 });
      await o.close();
    }
    rows.unshift({ task: 'page open → first map (navigation to map-first-draw)', ours: median(opens), bar: 1000, of: opens.length }, { task: 'page open → first map, the slowest', ours: Math.max(...opens), bar: 1000 });
    return rows;
  } finally {
    for (const d of folders) rmSync(d, { recursive: true, force: true });
  }
}
