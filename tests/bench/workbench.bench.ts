/**
 * Workbench map speed in Debian's Chromium, with performance marks (issue 5):
 *  1. the real workbench in browser mode on the demo recipe (1° common grid): first draw of the map
 *     (navigation start to the view's 'map-first-draw' mark), and a change of depth (the view's own
 *     'map-recolour' measure, and from the change of the Depth control until that measure ends, which
 *     includes fetching the level from the server);
 *  2. the map view's lookup and paint functions on a 1° and a 0.25° (1440 × 720) field, against a Plotly
 *     heatmap of the same field redrawn with the next level (the peer: what one writes with the plotting
 *     library the project ships; it draws plate carrée only, with no projection).
 *  0. the first views of issue 17 (tests/bench/first-views.ts): page open, Scores, Diagram, Spin-up, Line and
 *     changes of the map's variable and run, each timed in the page up to the figure's data-drawn mark.
 * Bars: recolour under 100 ms at 1°, under 300 ms at 0.25°; zoom step, pan and colour scale switch under 50 ms at
 * 0.25° (issue 14). Fields in part 2 are invented; only time counts.
 * Run: npm run bench -- workbench
 */
import { build } from 'esbuild';
import { copyFileSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { CHROMIUM, PROJECT, SAMPLE_DATA, openWorkbench, prepare, startServe } from '../e2e/harness.js';
import type { OursResult } from './workbench-page.js';
import { firstViews, type FirstViewRow } from './first-views.js';

const REPEATS = 15;
const WIDTH = 1000;

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? (s[(s.length - 1) >> 1] + s[s.length >> 1]) / 2 : NaN;
};
const fmt = (x: number): string => (Number.isFinite(x) ? x.toFixed(1) : '—');

interface Row {
  task: string;
  ours: number;
  peer?: number;
  bar?: number;
}

function table(rows: Row[]): void {
  const head = ['task', 'ours ms', 'peer ms', 'peer/ours', 'bar ms', 'within bar'];
  const body = rows.map((r) => [
    r.task,
    fmt(r.ours),
    r.peer === undefined ? '—' : fmt(r.peer),
    r.peer === undefined ? '—' : (r.peer / r.ours).toFixed(1) + '×',
    r.bar === undefined ? '—' : String(r.bar),
    r.bar === undefined ? '—' : r.ours < r.bar ? 'yes' : 'NO',
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((b) => b[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  console.log(line(head));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const b of body) console.log(line(b));
}

/** Part 1: the real page on the demo recipe. */
async function realWorkbench(): Promise<Row[]> {
  const wb = await openWorkbench({ serveArgs: ['--root', SAMPLE_DATA, '--recipe', join(SAMPLE_DATA, 'demo-recipe.json')] });
  try {
    const page = wb.page;
    await page.waitForFunction(() => performance.getEntriesByName('map-first-draw').length > 0, undefined, { timeout: 120_000 });
    const firstDraw = await page.evaluate(() => performance.getEntriesByName('map-first-draw')[0].startTime);
    const options = await page.$$eval('#choose-layer option', (os) => os.map((o) => (o as HTMLOptionElement).value));
    const paintMs: number[] = [];
    const changeMs: number[] = [];
    // visit every depth once (levels are fetched and cached), then measure changes among cached and fresh ones
    for (let n = 0; n < Math.min(REPEATS, options.length - 1); n++) {
      const value = options[(n + 1) % options.length];
      const before = await page.evaluate(() => performance.getEntriesByName('map-recolour').length);
      const t0 = await page.evaluate((v) => {
        const sel = document.querySelector('#choose-layer') as HTMLSelectElement;
        const t = performance.now();
        sel.value = v;
        sel.dispatchEvent(new Event('change', { bubbles: true }));
        return t;
      }, value);
      await page.waitForFunction((b) => performance.getEntriesByName('map-recolour').length > b, before, { timeout: 60_000 });
      const m = await page.evaluate(() => {
        const all = performance.getEntriesByName('map-recolour');
        const last = all[all.length - 1];
        return { start: last.startTime, duration: last.duration };
      });
      paintMs.push(m.duration);
      changeMs.push(m.start + m.duration - t0);
    }
    await wb.shot('bench-map');
    if (wb.foreignRequests().length) throw new Error(`requests left 127.0.0.1: ${wb.foreignRequests().join(', ')}`);
    console.log(`demo map: ${options.length} depth choices, ${paintMs.length} changes measured`);
    return [
      { task: 'demo map, first draw (navigation to map-first-draw)', ours: firstDraw },
      { task: 'demo 1°, depth change: map-recolour measure', ours: median(paintMs), bar: 100 },
      { task: 'demo 1°, depth change: control to recoloured (incl. fetch)', ours: median(changeMs) },
    ];
  } finally {
    await wb.close();
  }
}

/** Part 2: the view's functions at 1° and 0.25° against Plotly, on a bench page served like the workbench. */
async function syntheticFields(): Promise<Row[]> {
  const outDir = join(PROJECT, 'dist', 'renderer', 'bench');
  mkdirSync(outDir, { recursive: true });
  await build({ entryPoints: [join(PROJECT, 'tests', 'bench', 'workbench-page.ts')], outfile: join(outDir, 'page.js'), bundle: true, platform: 'browser', format: 'esm', target: 'chrome120', logLevel: 'error' });
  // The peer is a devDependency: copied beside the bench page, never served by the workbench itself.
  copyFileSync(join(PROJECT, 'node_modules', 'plotly.js-dist-min', 'plotly.min.js'), join(outDir, 'plotly.min.js'));
  const csp = /http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(readFileSync(join(PROJECT, 'renderer', 'index.html'), 'utf8'))![1];
  writeFileSync(
    join(outDir, 'index.html'),
    `<!doctype html><html><head><meta charset="utf-8"><meta http-equiv="Content-Security-Policy" content="${csp}"><title>bench</title><link rel="icon" href="data:,">` +
      `<script src="plotly.min.js"></script><script type="module" src="page.js"></script></head><body></body></html>`,
  );
  const served = await startServe(['--root', SAMPLE_DATA]);
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'] });
  try {
    const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
    const errors: string[] = [];
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(`http://127.0.0.1:${served.port}/bench/index.html?token=${served.token}`, { timeout: 180_000 });
    await page.waitForFunction(() => 'workbenchBench' in globalThis && 'Plotly' in globalThis, undefined, { timeout: 60_000 });
    const rows: Row[] = [];
    for (const [step, label, bar] of [[1, '1°', 100], [0.25, '0.25° (1440×720)', 300]] as const) {
      const o = (await page.evaluate(
        ([s, w, r]) => (globalThis as unknown as { workbenchBench: { ours(s: number, w: number, r: number): Promise<unknown> } }).workbenchBench.ours(s, w, r),
        [step, WIDTH, REPEATS] as const,
      )) as OursResult;
      const p = (await page.evaluate(
        ([s, w, r]) => (globalThis as unknown as { workbenchBench: { peer(s: number, w: number, r: number): Promise<unknown> } }).workbenchBench.peer(s, w, r),
        [step, WIDTH, Math.max(3, Math.floor(REPEATS / 3))] as const,
      )) as { firstMs: number; recolourMs: number[]; zoomMs: number[]; panMs: number[]; scaleMs: number[] };
      console.log(`${label}: ${o.cells} cells, ${o.pixels} pixels (equal-area world map ${WIDTH} px wide)`);
      rows.push({ task: `${label}: first draw (pixel lookup) vs heatmap newPlot`, ours: o.lookupMs, peer: p.firstMs });
      rows.push({ task: `${label}: recolour, fixed range`, ours: median(o.recolourMs), peer: median(p.recolourMs), bar });
      rows.push({ task: `${label}: recolour incl. 2–98 % range`, ours: median(o.recolourWithRangeMs), peer: median(p.recolourMs), bar });
      rows.push({ task: `${label}: of which the 2–98 % range alone`, ours: median(o.rangeMs) });
      // issue 14: zoom step, pan and a colour scale switch under 50 ms on the 0.25° map
      const bar14 = step === 0.25 ? 50 : undefined;
      rows.push({ task: `${label}: zoom step ×1.5 (lookup + paint) vs axis relayout`, ours: median(o.zoomMs), peer: median(p.zoomMs), bar: bar14 });
      rows.push({ task: `${label}: pan by a tenth (shifted lookup + paint) vs axis relayout`, ours: median(o.panMs), peer: median(p.panMs), bar: bar14 });
      rows.push({ task: `${label}: colour scale switch vs restyle`, ours: median(o.scaleMs), peer: median(p.scaleMs), bar: bar14 });
    }
    if (errors.length) throw new Error(`console errors on the bench page: ${errors.join(' | ')}`);
    return rows;
  } finally {
    await browser.close();
    await served.stop();
    rmSync(outDir, { recursive: true, force: true }); // the bench page is not part of the workbench
  }
}

/** Which parts to run: STILLWATER_BENCH_PARTS=first-views,map,fields (default all). */
const PARTS = (process.env.STILLWATER_BENCH_PARTS ?? 'first-views,map,fields').split(',');

async function main(): Promise<void> {
  await prepare();
  let first: FirstViewRow[] = [];
  if (PARTS.includes('first-views')) {
    first = await firstViews();
    console.log('');
    console.log("issue 17, the screen's first views on the demo (in the page: from the action to the figure's data-drawn mark; every page on a fresh server and cache folder)");
    console.log('no peer: the bars are the issue\'s; the machine is shared, so repeat the run before trusting one number');
    table(first.map((r) => ({ task: r.of ? `${r.task} [median of ${r.of}]` : r.task, ours: r.ours, bar: r.bar })));
  }
  const rows = [...(PARTS.includes('map') ? await realWorkbench() : []), ...(PARTS.includes('fields') ? await syntheticFields() : [])];
  if (rows.length) {
    console.log('');
    console.log('times are medians over repeated changes; each includes the next animation frame');
    table(rows);
  }
  const missed = [...first, ...rows].filter((r) => r.bar !== undefined && !(r.ours < r.bar));
  if (missed.length) {
    console.log(`\nover the bar: ${missed.map((r) => r.task).join('; ')}`);
    process.exitCode = 1;
  }
}

main().catch((e) => {
  console.error(e);
  process.exitCode = 1;
});
