/**
 * The multi-panel map: the reference, each run, and each run minus the reference, for one variable at one
 * depth or layer. ONE colour scale serves the reference and all runs and ONE symmetric diverging scale all
 * differences (shared-limits.ts), so panels side by side can be compared by eye; each difference panel
 * carries the bias, RMSE and correlation of its region and layer (the skill rows' numbers) in its corner.
 */
import { clipped, positiveRange } from '../render/colour-mapping.js';
import { DIVERGING, SEQUENTIAL, type ColourScale } from '../render/colour-scales.js';
import type { MapProjection } from '../render/projections.js';
import { graticuleSteps } from './map-figure.js';
import { mapOverlay } from './map-frame.js';
import { paintMap, rasterWidth, type RasterGrid } from './map-raster.js';
import { FONT_PT, MM_PER_PT, MUTED, NO_DATA, widthPt, type FigureWidth } from './page.js';
import { colourBarH, figureRoot, figureTitle, frame, r2, text, wrap, charsIn, type Figure, type Rect } from './parts.js';
import { sharedLimits } from './shared-limits.js';
import { el, type SvgNode } from './svg-tree.js';
import { shortNumber, typesetUnits } from './typeset.js';

export interface PanelStats {
  bias: number | null;
  rmse: number | null;
  corr: number | null;
  n: number;
}

export interface MapPanelsSpec {
  name: string;
  /** what is drawn, e.g. "Oxygen, bottom layer" */
  title: string;
  subtitle?: string;
  /** the quantity, e.g. "Oxygen" (colour-bar label, with units) */
  quantity: string;
  units: string;
  width: FigureWidth;
  projection: MapProjection;
  grid: RasterGrid;
  /** cell areas (weights of the shared limits) */
  area: ArrayLike<number>;
  reference: { label: string; values: Float32Array };
  runs: { label: string; values: Float32Array; difference: Float32Array; stats: PanelStats | null }[];
  /** projected coastlines (app/render/coastline.ts) */
  coast: Float64Array[];
  /** what the corner statistics cover, e.g. "global, bottom" */
  statsScope: string;
  /** a fixed ± limit for the differences (from the recipe) */
  fixedDifference?: number | null;
  /** the colour scales (the screen's choice); the default sequential and diverging ones when absent */
  fieldScale?: ColourScale;
  differenceScale?: ColourScale;
  /** logarithmic stretch of the reference and run panels (their shared range made positive) */
  log?: boolean;
  /** how far a window of the projection is zoomed in (1: the whole map) */
  zoom?: number;
}

const GAP = 8;
const LEFT = 24;
const PANEL_TITLE = FONT_PT.panelTitle + 3;

function hasData(v: ArrayLike<number>): boolean {
  for (let i = 0; i < v.length; i++) if (v[i] === v[i]) return true;
  return false;
}

/** A note across an empty panel, so that a missing picture is never a blank frame. */
function noDataNote(g: SvgNode, r: Rect, what: string): void {
  g.append(el('rect', { x: r2(r.x), y: r2(r.y), width: r2(r.w), height: r2(r.h), fill: NO_DATA }));
  const lines = wrap(what, charsIn(r.w - 8, FONT_PT.label), 3);
  lines.forEach((line, i) => g.append(text(r.x + r.w / 2, r.y + r.h / 2 + (i - (lines.length - 1) / 2) * (FONT_PT.label + 2), line, { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'no-data' })));
}

function cornerStats(g: SvgNode, r: Rect, s: PanelStats | null, scope: string, units: string): void {
  const lines = !s || s.n === 0 ? [`${scope}: no compared cells`] : [scope, `bias ${shortNumber(s.bias)} ${units}`, `RMSE ${shortNumber(s.rmse)} ${units}`, `r ${shortNumber(s.corr)}`];
  const h = lines.length * (FONT_PT.corner + 1.5) + 3;
  const w = Math.min(r.w - 4, Math.max(...lines.map((l) => l.length)) * FONT_PT.corner * 0.56 + 6);
  const box = el('g', { class: 'panel-stats' });
  box.append(el('rect', { x: r2(r.x + 1.5), y: r2(r.y + r.h - h - 1.5), width: r2(w), height: r2(h), fill: '#ffffff', 'fill-opacity': 0.85 }));
  lines.forEach((line, i) => box.append(text(r.x + 4, r.y + r.h - h - 1.5 + (i + 1) * (FONT_PT.corner + 1.5), line, { 'font-size': FONT_PT.corner })));
  g.append(box);
}

export function mapPanelsFigure(spec: MapPanelsSpec): Figure {
  const W = widthPt(spec.width);
  const p = spec.projection;
  const e = p.extent;
  const aspect = (e.ymax - e.ymin) / (e.xmax - e.xmin);
  const colW = (W - LEFT - GAP - 6) / 2;
  const mapH = colW * aspect;
  const rowH = PANEL_TITLE + mapH + GAP;
  const fields = [spec.reference.values, ...spec.runs.map((r) => r.values)];
  const diffs = spec.runs.map((r) => r.difference);
  const limits = sharedLimits(fields, diffs, spec.area, spec.fixedDifference);
  if (spec.log && limits.field) limits.field = positiveRange(limits.field[0], limits.field[1]);
  const units = typesetUnits(spec.units);
  const fieldScale = spec.fieldScale ?? SEQUENTIAL;
  const diffScale = spec.differenceScale ?? DIVERGING;
  const steps = graticuleSteps(spec.zoom);
  /** whether any panel's values lie beyond the shared range, at either end (arrows on the colour bar) */
  const beyond = (arrays: Float32Array[], lo: number, hi: number) => {
    const c = arrays.map((a) => clipped(a, lo, hi));
    return { below: c.some((x) => x.below), above: c.some((x) => x.above) };
  };

  // measure the title block by drawing it into a scratch root
  const scratch = el('g');
  const top = figureTitle(scratch, 6, FONT_PT.title + 2, W - 12, spec.title, spec.subtitle);
  const rows = 1 + spec.runs.length;
  const mapsBottom = top + rows * rowH + FONT_PT.tick + 2;
  const barsH = 8 + 24;
  const H = mapsBottom + barsH + 6;
  const svg = figureRoot(W, H, `${spec.title}${spec.subtitle ? `. ${spec.subtitle}` : ''}`);
  for (const c of scratch.children) svg.append(c);

  const pxW = rasterWidth(colW * MM_PER_PT, spec.grid.lonEdges.length - 1);
  const panels = el('g', { class: 'panels' });
  const drawMap = (r: Rect, label: string, values: Float32Array, diverging: boolean, lastRow: boolean, left: boolean): SvgNode => {
    const g = el('g', { class: diverging ? 'panel difference' : 'panel field' });
    g.append(text(r.x, r.y - 3, label, { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold', class: 'panel-title' }));
    const lim = diverging ? (limits.difference === null ? null : [-limits.difference, limits.difference]) : limits.field;
    if (!hasData(values) || lim === null) {
      noDataNote(g, r, 'No compared cells here: nothing to draw for this layer');
    } else {
      const raster = paintMap(p, spec.grid, values, diverging ? diffScale : fieldScale, lim[0], lim[1], pxW, { log: !diverging && spec.log });
      // cells stay blocks (no smoothing across their edges), and rasterisers draw it several times faster
      g.append(el('image', { x: r2(r.x), y: r2(r.y), width: r2(r.w), height: r2(r.h), preserveAspectRatio: 'none', 'image-rendering': 'optimizeSpeed', href: raster.url }));
    }
    g.append(mapOverlay(p, r, spec.coast, { lat: left, lon: lastRow, ...steps }));
    return g;
  };

  const xL = LEFT;
  const xR = LEFT + colW + GAP;
  const rect = (row: number, x: number): Rect => ({ x, y: top + row * rowH + PANEL_TITLE, w: colW, h: mapH });
  panels.append(drawMap(rect(0, xL), `${spec.reference.label} (reference)`, spec.reference.values, false, rows === 1, true));
  // beside the reference: what the scales are
  const note = [
    `Colours of ${spec.reference.label} and every run share one scale; all differences share one symmetric scale,`,
    limits.differenceSource === 'fixed by the recipe'
      ? `fixed by the recipe at ±${shortNumber(limits.difference)} ${units}.`
      : `±${shortNumber(limits.difference)} ${units}: the 98th percentile of |run − reference|, area-weighted, pooled over the runs.`,
    `Grey: no compared value.`,
  ].join(' ');
  const noteLines = wrap(note, charsIn(colW, FONT_PT.label), Math.max(3, Math.floor(mapH / (FONT_PT.label + 2))));
  noteLines.forEach((line, i) => panels.append(text(xR, top + PANEL_TITLE + FONT_PT.label + i * (FONT_PT.label + 2), line, { 'font-size': FONT_PT.label, fill: MUTED, class: 'scale-note' })));
  spec.runs.forEach((run, i) => {
    const last = i === spec.runs.length - 1;
    panels.append(drawMap(rect(i + 1, xL), run.label, run.values, false, last, true));
    const dr = rect(i + 1, xR);
    const dg = drawMap(dr, `${run.label} minus reference`, run.difference, true, last, false);
    cornerStats(dg, dr, run.stats, spec.statsScope, units);
    panels.append(dg);
  });
  svg.append(panels);

  const bars = el('g', { class: 'colour-bars' });
  const barY = mapsBottom + 4;
  if (limits.field) {
    const [lo, hi] = limits.field;
    colourBarH(bars, { x: xL + colW * 0.1, y: barY, w: colW * 0.8, h: 5 }, fieldScale, lo, hi, `${spec.quantity} (${units})`, { log: spec.log, ...beyond(fields, lo, hi) });
  }
  if (limits.difference !== null) {
    const d = limits.difference;
    colourBarH(bars, { x: xR + colW * 0.1, y: barY, w: colW * 0.8, h: 5 }, diffScale, -d, d, `Run minus reference (${units})`, beyond(diffs, -d, d));
  }
  svg.append(bars);
  svg.append(frame({ x: 0.25, y: 0.25, w: W - 0.5, h: H - 0.5 }, '#ffffff'));
  return { name: spec.name, title: spec.title, svg, widthPt: W, heightPt: H };
}
