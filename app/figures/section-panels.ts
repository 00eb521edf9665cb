/**
 * Depth sections side by side: the reference, each run, and each run minus the reference, along one x axis
 * (latitude for a zonal mean, distance for a transect), with the seafloor filled, ONE colour scale for the
 * reference and runs and ONE symmetric diverging scale for the differences (weights: layer thickness × the
 * width each sample stands for). A transect adds a panel of column means along the line.
 */
import { DIVERGING, SEQUENTIAL } from '../render/colour-scales.js';
import { FONT_PT, INK, MUTED, widthPt, type FigureWidth } from './page.js';
import { bottomAxis, charsIn, colourBarH, figureRoot, figureTitle, frame, LEFT_AXIS_PT, leftAxis, legend, r2, RUN_COLOURS, text, wrap, type Figure, type Rect } from './parts.js';
import { linear, padded } from './scale.js';
import { deepestWater, MARK_ROW_PT, sectionPanel, waypointMarks, type SectionMark } from './section-panel.js';
import type { SectionGrid } from './section-raster.js';
import { sharedLimits } from './shared-limits.js';
import { el, type SvgNode } from './svg-tree.js';
import { typesetUnits } from './typeset.js';

export interface SectionPanelsSpec {
  name: string;
  title: string;
  subtitle?: string;
  quantity: string;
  units: string;
  width: FigureWidth;
  grid: SectionGrid;
  /** x axis label with its units, e.g. "Latitude" or "Distance along the line (km)" */
  xLabel: string;
  formatX?: (v: number) => string;
  /** deepest water of each sample (m), 0 or NaN on land */
  seafloor: ArrayLike<number>;
  reference: { label: string; values: Float32Array };
  runs: { label: string; values: Float32Array; difference: Float32Array }[];
  fixedDifference?: number | null;
  /** deepest depth drawn (m); the deepest water along the section when left out */
  depthMax?: number;
  /** the upper 1000 m take half the height of each panel */
  stretch?: boolean;
  /** waypoints of a line, marked A, B, C… on the top axis of every panel */
  marks?: SectionMark[];
  /** column means along the line (transects): reference first, then the runs in order, each over the cells where all of them have values (app/lines/column-mean.ts comparedColumnMeans) */
  columnMeans?: { label: string; values: ArrayLike<number> }[];
}

const GAP = 10;
const PANEL_TITLE = FONT_PT.panelTitle + 3;
/** Which cells compared column means use (the screen's Line view says the same). */
export const COLUMN_MEAN_CAPTION = 'only cells where the reference and every run have values';
const X_AXIS = FONT_PT.tick * 2 + 10;

function sectionWeights(g: SectionGrid): Float64Array {
  const n = g.xEdges.length - 1;
  const nz = g.depthEdges.length - 1;
  const w = new Float64Array(nz * n);
  for (let k = 0; k < nz; k++) for (let s = 0; s < n; s++) w[k * n + s] = (g.depthEdges[k + 1] - g.depthEdges[k]) * Math.abs(g.xEdges[s + 1] - g.xEdges[s]);
  return w;
}

export function sectionPanelsFigure(spec: SectionPanelsSpec): Figure {
  const W = widthPt(spec.width);
  const colW = (W - LEFT_AXIS_PT - GAP - 8 - LEFT_AXIS_PT) / 2;
  const panelH = colW * 0.55;
  const marksH = spec.marks?.length ? MARK_ROW_PT : 0;
  const rowH = PANEL_TITLE + marksH + panelH + X_AXIS;
  const units = typesetUnits(spec.units);
  const n = spec.grid.xEdges.length - 1;
  const x0 = spec.grid.xEdges[0];
  const x1 = spec.grid.xEdges[n];
  const depthMax = spec.depthMax ?? deepestWater(spec.seafloor, spec.grid.depthEdges);
  const weights = sectionWeights(spec.grid);
  const limits = sharedLimits([spec.reference.values, ...spec.runs.map((r) => r.values)], spec.runs.map((r) => r.difference), weights, spec.fixedDifference);

  const scratch = el('g');
  const top = figureTitle(scratch, 6, FONT_PT.title + 2, W - 12, spec.title, spec.subtitle);
  const rows = 1 + spec.runs.length;
  const meansH = spec.columnMeans ? panelH + PANEL_TITLE + marksH + X_AXIS + 6 : 0;
  const barsY = top + rows * rowH + 2;
  const meansY = barsY + 34;
  const H = meansY + meansH + 4;
  const svg = figureRoot(W, H, `${spec.title}${spec.subtitle ? `. ${spec.subtitle}` : ''}`);
  for (const c of scratch.children) svg.append(c);

  const panel = (r: Rect, label: string, values: Float32Array, diverging: boolean, panelId: string): SvgNode =>
    sectionPanel(r, {
      panelId,
      grid: spec.grid,
      values,
      scale: diverging ? DIVERGING : SEQUENTIAL,
      limits: diverging ? (limits.difference === null ? null : [-limits.difference, limits.difference]) : limits.field,
      seafloor: spec.seafloor,
      depthMax,
      stretch: spec.stretch,
      marks: spec.marks,
      xLabel: spec.xLabel,
      formatX: spec.formatX,
      title: label,
      emptyText: 'No compared cells along this section',
      className: diverging ? 'panel difference' : 'panel field',
    });
  const xL = LEFT_AXIS_PT + 2;
  const xR = xL + colW + GAP + LEFT_AXIS_PT;
  const rect = (row: number, x: number): Rect => ({ x, y: top + row * rowH + PANEL_TITLE + marksH, w: colW, h: panelH });
  svg.append(panel(rect(0, xL), `${spec.reference.label} (reference)`, spec.reference.values, false, 'reference'));
  const note = `${spec.reference.label} and every run share one colour scale; all differences share one symmetric scale, ${
    limits.differenceSource === 'fixed by the recipe' ? 'fixed by the recipe' : 'the 98th percentile of |run − reference| pooled over the runs, weighted by layer thickness × width'
  }. Brown: below the seafloor.`;
  wrap(note, charsIn(colW, FONT_PT.label), 6).forEach((line, i) => svg.append(text(xR - LEFT_AXIS_PT + 8, top + PANEL_TITLE + marksH + FONT_PT.label + i * (FONT_PT.label + 2), line, { 'font-size': FONT_PT.label, fill: MUTED, class: 'scale-note' })));
  spec.runs.forEach((run, i) => {
    svg.append(panel(rect(i + 1, xL), run.label, run.values, false, `run:${i}`));
    svg.append(panel(rect(i + 1, xR), `${run.label} minus reference`, run.difference, true, `difference:${i}`));
  });
  const bars = el('g', { class: 'colour-bars' });
  if (limits.field) colourBarH(bars, { x: xL + colW * 0.1, y: barsY, w: colW * 0.8, h: 5 }, SEQUENTIAL, limits.field[0], limits.field[1], `${spec.quantity} (${units})`);
  if (limits.difference !== null) colourBarH(bars, { x: xR + colW * 0.1, y: barsY, w: colW * 0.8, h: 5 }, DIVERGING, -limits.difference, limits.difference, `Run minus reference (${units})`);
  svg.append(bars);

  if (spec.columnMeans) {
    // the legend as wide as its longest label (DejaVu Sans averages ~0.55 em), so no run's name is cut
    const longest = Math.max(9, ...spec.columnMeans.slice(1).map((c) => c.label.length));
    const legendW = Math.min(W * 0.35, 24 + longest * FONT_PT.label * 0.58);
    const r: Rect = { x: xL, y: meansY + PANEL_TITLE + marksH, w: W - xL - legendW, h: panelH };
    const g = el('g', { class: 'panel column-means' });
    // the caption says which cells the means use: a cell one source lacks (a seamount's flank) moves none of them
    g.append(el('text', { x: r2(r.x), y: r2(r.y - 3 - marksH), 'font-size': FONT_PT.panelTitle, class: 'panel-title' },
      el('tspan', { 'font-weight': 'bold' }, 'Column means along the line'),
      el('tspan', { class: 'panel-caption' }, ` (${COLUMN_MEAN_CAPTION})`),
    ));
    let lo = Infinity;
    let hi = -Infinity;
    for (const c of spec.columnMeans) for (let s = 0; s < c.values.length; s++) if (Number.isFinite(c.values[s])) {
      lo = Math.min(lo, c.values[s]);
      hi = Math.max(hi, c.values[s]);
    }
    const X = linear([x0, x1], [r.x, r.x + r.w]);
    const Y = linear(padded(lo, hi, 0.06), [r.y + r.h, r.y]);
    const axes = el('g');
    bottomAxis(axes, r, X, spec.xLabel, { ticks: 6, format: spec.formatX, grid: true });
    leftAxis(axes, r, Y, `${spec.quantity} (${units})`, { ticks: 4, grid: true });
    g.append(axes);
    const items = spec.columnMeans.map((c, i) => ({ label: i === 0 ? 'reference' : c.label, colour: i === 0 ? INK : RUN_COLOURS[(i - 1) % RUN_COLOURS.length], marker: (i === 0 ? 'dash' : 'line') as 'dash' | 'line' }));
    spec.columnMeans.forEach((c, i) => {
      let d = '';
      let pen = false;
      for (let s = 0; s < c.values.length; s++) {
        const v = c.values[s];
        if (!Number.isFinite(v)) {
          pen = false;
          continue;
        }
        const xm = (spec.grid.xEdges[s] + spec.grid.xEdges[s + 1]) / 2;
        d += `${pen ? 'L' : 'M'}${r2(X(xm))},${r2(Y(v))}`;
        pen = true;
      }
      g.append(el('path', { d, fill: 'none', stroke: items[i].colour, 'stroke-width': 0.9, ...(i === 0 ? { 'stroke-dasharray': '3 2' } : {}) }));
    });
    if (spec.marks?.length) g.append(waypointMarks(r, X, spec.marks));
    g.append(frame(r));
    legend(g, r.x + r.w + 6, r.y + 4, items);
    if (!Number.isFinite(lo)) g.append(text(r.x + r.w / 2, r.y + r.h / 2, 'No column means along this line', { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'no-data' }));
    svg.append(g);
  }
  return { name: spec.name, title: spec.title, svg, widthPt: W, heightPt: H };
}
