/**
 * Browser side of tests/bench/workbench.bench.ts: the map view's own lookup and paint functions
 * (renderer/views/map.ts) on a synthetic regular grid, against Plotly's heatmap (what one would write with
 * the plotting library the project ships) on the same grid. The fields are invented; only time is measured.
 */
import { quantileRange } from '../../app/render/colour-scales.js';
import { canvasHeightFor } from '../../app/render/pixel-lookup.js';
import type { ViewGrid } from '../../contract/view-types.js';
import { panWindow, windowed, zoomWindow } from '../../app/render/map-window.js';
import { FIELD_SCALES } from '../../app/render/named-scales.js';
import { lookupFor, paint, projectionOf, type MapChoice } from '../../renderer/views/map-paint.js';

interface PlotlyLike {
  newPlot(el: HTMLElement, data: unknown[], layout: unknown, config: unknown): Promise<unknown>;
  react(el: HTMLElement, data: unknown[], layout: unknown, config: unknown): Promise<unknown>;
  purge(el: HTMLElement): void;
}

function regularGrid(step: number): ViewGrid {
  const nx = Math.round(360 / step);
  const ny = Math.round(180 / step);
  const lonEdges = Float64Array.from({ length: nx + 1 }, (_, i) => -180 + i * step);
  const latEdges = Float64Array.from({ length: ny + 1 }, (_, j) => -90 + j * step);
  return { nx, ny, nz: 1, lonEdges, latEdges, depthEdges: Float64Array.of(0, 1), depthCentres: Float64Array.of(0.5), area: new Float64Array(nx * ny) };
}

/** A smooth invented field per "depth", with a land-like NaN patch so that missing values are exercised. */
function level(grid: ViewGrid, k: number): Float32Array {
  const v = new Float32Array(grid.nx * grid.ny);
  for (let j = 0; j < grid.ny; j++) {
    const lat = (grid.latEdges[j] + grid.latEdges[j + 1]) / 2;
    for (let i = 0; i < grid.nx; i++) {
      const lon = (grid.lonEdges[i] + grid.lonEdges[i + 1]) / 2;
      const land = lat > 10 && lat < 50 && lon > -10 && lon < 40;
      v[j * grid.nx + i] = land ? NaN : 25 * Math.cos((lat * Math.PI) / 180) / (1 + k) + Math.sin((lon * Math.PI) / 60 + k);
    }
  }
  return v;
}

const nextFrame = () => new Promise<number>((r) => requestAnimationFrame(() => r(performance.now())));

export interface OursResult {
  lookupMs: number;
  recolourMs: number[];
  recolourWithRangeMs: number[];
  /** the 2-98 % range alone (quantileRange of model and reference) */
  rangeMs: number[];
  /** a zoom step (×1.5 about a point, a new pixel lookup for the window, then the paint) */
  zoomMs: number[];
  /** a pan of a zoomed map by a tenth of its width (new lookup, paint) */
  panMs: number[];
  /** switching the colour scale (paint with another palette) */
  scaleMs: number[];
  cells: number;
  pixels: number;
}

/** Ours: build the pixel lookup once (first draw), then each depth change recolours through it. */
async function ours(step: number, width: number, repeats: number): Promise<OursResult> {
  const grid = regularGrid(step);
  const levels = [0, 1, 2, 3].map((k) => level(grid, k));
  const proj = projectionOf('equal-earth');
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = canvasHeightFor(proj, width);
  document.body.append(canvas);
  performance.mark(`lookup-start-${step}`);
  const lut = lookupFor(proj, grid, canvas.width, canvas.height);
  const lookupMs = performance.measure(`lookup-${step}`, `lookup-start-${step}`).duration;
  const choice = (values: Float32Array, r: [number, number]): MapChoice => ({ values, min: r[0], max: r[1], diverging: false, caption: '', title: '', subtitle: '', units: 'degC' });
  const fixed: [number, number] = [-2, 30];
  paint(canvas, lut, choice(levels[0], fixed)); // warm up
  await nextFrame();
  const recolourMs: number[] = [];
  const recolourWithRangeMs: number[] = [];
  const rangeMs: number[] = [];
  for (let n = 0; n < repeats; n++) {
    const values = levels[(n % 3) + 1];
    let t0 = performance.now();
    paint(canvas, lut, choice(values, fixed));
    recolourMs.push((await nextFrame()) - t0);
    // as the view does when no colour range is fixed: the 2-98 % range of model and reference first
    t0 = performance.now();
    const r = quantileRange([values, levels[0]]) ?? fixed;
    rangeMs.push(performance.now() - t0);
    paint(canvas, lut, choice(values, r));
    recolourWithRangeMs.push((await nextFrame()) - t0);
  }
  // zoom and pan as the map view does them: a window of the projection, its lookup, the paint
  const zoomMs: number[] = [];
  const panMs: number[] = [];
  const scaleMs: number[] = [];
  const full = proj.extent;
  let win: ReturnType<typeof zoomWindow> = null;
  for (let n = 0; n < repeats; n++) {
    let t0 = performance.now();
    // zoom in ×1.5 about a point that moves a little each time (so that no window repeats and every lookup is
    // built anew, as when a person zooms), starting again from the whole map every fourth step
    win = n % 4 === 0 ? null : win;
    win = zoomWindow(full, win, 1.5, -3e6 + n * 1.7e5, 3e6 - n * 0.9e5);
    const zl = lookupFor(windowed(proj, win), grid, canvas.width, canvas.height);
    paint(canvas, zl, choice(levels[1], fixed));
    zoomMs.push((await nextFrame()) - t0);
    t0 = performance.now();
    // a drag pans by whole canvas pixels (as the view does): about a tenth of the width, a few pixels more each time
    win = panWindow(full, win, (Math.round(canvas.width * 0.1) + n) * ((win!.xmax - win!.xmin) / canvas.width), 0);
    const pl = lookupFor(windowed(proj, win), grid, canvas.width, canvas.height);
    paint(canvas, pl, choice(levels[1], fixed));
    panMs.push((await nextFrame()) - t0);
    t0 = performance.now();
    paint(canvas, pl, { ...choice(levels[1], fixed), scale: FIELD_SCALES[(n % (FIELD_SCALES.length - 1)) + 1].scale });
    scaleMs.push((await nextFrame()) - t0);
  }
  canvas.remove();
  return { lookupMs, recolourMs, recolourWithRangeMs, rangeMs, zoomMs, panMs, scaleMs, cells: grid.nx * grid.ny, pixels: canvas.width * canvas.height };
}

/** Peer: a Plotly heatmap of the same field (plate carrée only), redrawn with the next level's values. */
async function peer(step: number, width: number, repeats: number): Promise<{ firstMs: number; recolourMs: number[]; zoomMs: number[]; panMs: number[]; scaleMs: number[] }> {
  const Plotly = (globalThis as unknown as { Plotly: PlotlyLike }).Plotly;
  const grid = regularGrid(step);
  const rows = (v: Float32Array): number[][] => Array.from({ length: grid.ny }, (_, j) => Array.from(v.subarray(j * grid.nx, (j + 1) * grid.nx), (x) => (Number.isNaN(x) ? (null as unknown as number) : x)));
  const levels = [0, 1, 2, 3].map((k) => rows(level(grid, k)));
  const el = document.createElement('div');
  el.style.width = `${width}px`;
  el.style.height = `${Math.round(width / 2)}px`;
  document.body.append(el);
  const layout = { width, height: Math.round(width / 2), margin: { l: 40, r: 80, t: 10, b: 30 } };
  const config = { staticPlot: true };
  const trace = (z: number[][]) => ({ type: 'heatmap', z, zmin: -2, zmax: 30, colorscale: 'Viridis' });
  let t0 = performance.now();
  await Plotly.newPlot(el, [trace(levels[0])], layout, config);
  const firstMs = (await nextFrame()) - t0;
  const recolourMs: number[] = [];
  for (let n = 0; n < repeats; n++) {
    t0 = performance.now();
    await Plotly.react(el, [trace(levels[(n % 3) + 1])], layout, config);
    recolourMs.push((await nextFrame()) - t0);
  }
  // zoom, pan and a change of colour scale as one would ask Plotly for them: new axis ranges, a new colour scale
  const zoomMs: number[] = [];
  const panMs: number[] = [];
  const scaleMs: number[] = [];
  const P = Plotly as unknown as PlotlyLike & { relayout(el: HTMLElement, u: unknown): Promise<unknown>; restyle(el: HTMLElement, u: unknown): Promise<unknown> };
  let span = grid.nx;
  for (let n = 0; n < repeats; n++) {
    span = n % 4 === 0 ? grid.nx / 1.5 : span / 1.5;
    const x0 = grid.nx * 0.4 - span / 2;
    t0 = performance.now();
    await P.relayout(el, { 'xaxis.range': [x0, x0 + span], 'yaxis.range': [grid.ny * 0.7 - span / 4, grid.ny * 0.7 + span / 4] });
    zoomMs.push((await nextFrame()) - t0);
    t0 = performance.now();
    await P.relayout(el, { 'xaxis.range': [x0 + span / 10, x0 + span * 1.1] });
    panMs.push((await nextFrame()) - t0);
    t0 = performance.now();
    await P.restyle(el, { colorscale: n % 2 ? 'Viridis' : 'Hot' });
    scaleMs.push((await nextFrame()) - t0);
  }
  Plotly.purge(el);
  el.remove();
  return { firstMs, recolourMs, zoomMs, panMs, scaleMs };
}

(globalThis as unknown as { workbenchBench: unknown }).workbenchBench = { ours, peer };
