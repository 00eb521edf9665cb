/**
 * Model against observation at stations: one panel per source (the reference climatology sampled there and
 * each run), observed along x, model along y, the 1:1 line, and the panel's statistics (n, bias, RMSE, r) in
 * its corner. Both axes share one domain across all panels, so the panels compare by eye. Quantities that
 * span decades (the recipe's logStats) get logarithmic axes and the statistics of log10 values beside the
 * plain ones; pairs that a log axis cannot show (≤ 0) are counted in the panel, never dropped silently.
 */
import { decadeDomain, logPosition, logTicks, logTickText } from '../render/log-axis.js';
import { FONT_PT, GRIDLINE, INK, MUTED, NO_DATA, widthPt, type FigureWidth } from './page.js';
import { bottomAxis, charsIn, figureRoot, figureTitle, frame, LEFT_AXIS_PT, leftAxis, r2, RUN_COLOURS, text, wrap, type Figure, type Rect } from './parts.js';
import { linear, padded } from './scale.js';
import { el, type SvgNode } from './svg-tree.js';
import { shortNumber, typesetUnits } from './typeset.js';

/** The numbers printed in a panel (app/points/station-stats.ts computes them; every station weighs the same). */
export interface ScatterStats {
  n: number;
  bias: number | null;
  rmse: number | null;
  corr: number | null;
}

export interface ScatterPanel {
  label: string;
  /** model value at each station, NaN where this source has none (land, below its seafloor, off its grid) */
  model: ArrayLike<number>;
  stats: ScatterStats;
  /** statistics of log10(model) against log10(observed), for log axes */
  log10?: ScatterStats;
}

export interface StationScatterSpec {
  name: string;
  title: string;
  subtitle?: string;
  width: FigureWidth;
  /** the variable, e.g. "PO4" (axis labels, with units) */
  quantity: string;
  units: string;
  /** observed value at each station */
  observed: ArrayLike<number>;
  panels: ScatterPanel[];
  /** logarithmic axes (variables that span decades) */
  log: boolean;
}

const GAP = 14;
const BOTTOM_AXIS_PT = FONT_PT.tick * 2 + 12;
const PANEL_TITLE = FONT_PT.panelTitle + 4;

/** Smallest and largest value on the axes: every observed value and every model value that has a pair. */
function extent(spec: StationScatterSpec): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  const take = (v: number) => {
    if (!Number.isFinite(v) || (spec.log && !(v > 0))) return;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  };
  for (let i = 0; i < spec.observed.length; i++) take(spec.observed[i]);
  for (const p of spec.panels) for (let i = 0; i < p.model.length; i++) if (Number.isFinite(spec.observed[i])) take(p.model[i]);
  return [lo, hi];
}

interface Axis {
  at(v: number): number;
  draw(g: SvgNode, r: Rect, label: string, side: 'bottom' | 'left'): void;
}

function linearAxis(domain: [number, number]): (range: [number, number]) => Axis {
  return (range) => {
    const sc = linear(domain, range);
    return {
      at: sc,
      draw: (g, r, label, side) => (side === 'bottom' ? bottomAxis(g, r, sc, label, { grid: true, ticks: 4 }) : leftAxis(g, r, sc, label, { grid: true, ticks: 4 })),
    };
  };
}

function logAxis(domain: [number, number]): (range: [number, number]) => Axis {
  return (range) => {
    const at = (v: number) => logPosition(v, domain, range);
    const t = logTicks(domain[0], domain[1]);
    return {
      at,
      draw(g, r, label, side) {
        const bottom = side === 'bottom';
        const y = r.y + r.h;
        const tick = (v: number, len: number, w: number) =>
          bottom ? el('line', { x1: r2(at(v)), x2: r2(at(v)), y1: r2(y), y2: r2(y + len), stroke: INK, 'stroke-width': w }) : el('line', { x1: r2(r.x - len), x2: r2(r.x), y1: r2(at(v)), y2: r2(at(v)), stroke: INK, 'stroke-width': w });
        g.append(bottom ? el('line', { x1: r2(r.x), x2: r2(r.x + r.w), y1: r2(y), y2: r2(y), stroke: INK, 'stroke-width': 0.6 }) : el('line', { x1: r2(r.x), x2: r2(r.x), y1: r2(r.y), y2: r2(y), stroke: INK, 'stroke-width': 0.6 }));
        for (const v of t.minor) g.append(tick(v, 1.5, 0.4));
        for (const v of t.major) {
          g.append(bottom ? el('line', { x1: r2(at(v)), x2: r2(at(v)), y1: r2(r.y), y2: r2(y), stroke: GRIDLINE, 'stroke-width': 0.4 }) : el('line', { x1: r2(r.x), x2: r2(r.x + r.w), y1: r2(at(v)), y2: r2(at(v)), stroke: GRIDLINE, 'stroke-width': 0.4 }));
          g.append(tick(v, 2.5, 0.5));
          g.append(bottom ? text(at(v), y + 2.5 + FONT_PT.tick + 1, logTickText(v), { 'text-anchor': 'middle', 'font-size': FONT_PT.tick }) : text(r.x - 4, at(v) + FONT_PT.tick * 0.35, logTickText(v), { 'text-anchor': 'end', 'font-size': FONT_PT.tick }));
        }
        if (bottom) g.append(text(r.x + r.w / 2, y + 2.5 + FONT_PT.tick * 2 + 5, label, { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'axis-label' }));
        else {
          const cx = r.x - LEFT_AXIS_PT + FONT_PT.label;
          const cy = r.y + r.h / 2;
          g.append(text(cx, cy, label, { 'text-anchor': 'middle', 'font-size': FONT_PT.label, transform: `rotate(-90 ${r2(cx)} ${r2(cy)})`, class: 'axis-label' }));
        }
      },
    };
  };
}

/** The lines of a panel's corner: n, bias, RMSE, r (and their log10 counterparts on log axes). */
export function scatterStatsLines(p: ScatterPanel, stations: number, units: string, log: boolean): string[] {
  const s = p.stats;
  const lines = [`n ${s.n} of ${stations} stations`, `bias ${shortNumber(s.bias)} ${units}`, `RMSE ${shortNumber(s.rmse)} ${units}`, `r ${shortNumber(s.corr)}`];
  if (log && p.log10) lines.push(`log₁₀ bias ${shortNumber(p.log10.bias)}`, `log₁₀ RMSE ${shortNumber(p.log10.rmse)}`, `log₁₀ r ${shortNumber(p.log10.corr)}`);
  return lines;
}

function cornerBox(g: SvgNode, r: Rect, lines: string[]): void {
  const h = lines.length * (FONT_PT.corner + 1.5) + 3;
  const w = Math.min(r.w - 3, Math.max(...lines.map((l) => l.length)) * FONT_PT.corner * 0.56 + 6);
  const box = el('g', { class: 'panel-stats' });
  box.append(el('rect', { x: r2(r.x + 1.5), y: r2(r.y + 1.5), width: r2(w), height: r2(h), fill: '#ffffff', 'fill-opacity': 0.85 }));
  lines.forEach((line, i) => box.append(text(r.x + 4, r.y + 1.5 + (i + 1) * (FONT_PT.corner + 1.5) - 1, line, { 'font-size': FONT_PT.corner })));
  g.append(box);
}

function noDataNote(g: SvgNode, r: Rect, what: string): void {
  g.append(el('rect', { x: r2(r.x), y: r2(r.y), width: r2(r.w), height: r2(r.h), fill: NO_DATA }));
  const lines = wrap(what, charsIn(r.w - 8, FONT_PT.label), 3);
  lines.forEach((line, i) => g.append(text(r.x + r.w / 2, r.y + r.h / 2 + (i - (lines.length - 1) / 2) * (FONT_PT.label + 2), line, { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'no-data' })));
}

export function stationScatterFigure(spec: StationScatterSpec): Figure {
  const W = widthPt(spec.width);
  const units = typesetUnits(spec.units);
  // four panels read better as two by two than as three and one
  const n = Math.max(1, spec.panels.length);
  const perRow = spec.width === 'single' ? Math.min(n, 2) : n === 4 ? 2 : Math.min(n, 3);
  const rows = Math.ceil(spec.panels.length / perRow);
  // room on the right for the last tick label
  const size = (W - 16 - perRow * (LEFT_AXIS_PT + 4) - (perRow - 1) * GAP) / perRow;
  const scratch = el('g');
  const top = figureTitle(scratch, 6, FONT_PT.title + 2, W - 12, spec.title, spec.subtitle);
  const rowH = PANEL_TITLE + size + BOTTOM_AXIS_PT;
  const H = top + rows * rowH + 6;
  const svg = figureRoot(W, H, `${spec.title}${spec.subtitle ? `. ${spec.subtitle}` : ''}`);
  for (const c of scratch.children) svg.append(c);

  const [lo, hi] = extent(spec);
  const any = Number.isFinite(lo);
  const domain: [number, number] = !any ? [0, 1] : spec.log ? decadeDomain(lo, hi) : padded(lo, hi);
  const axisOf = spec.log && any ? logAxis(domain) : linearAxis(domain);
  const xLabel = `Observed ${spec.quantity}${spec.log ? ', log scale' : ''} (${units})`;
  const yLabel = `Model ${spec.quantity} (${units})`;

  const panels = el('g', { class: 'panels' });
  spec.panels.forEach((p, i) => {
    const col = i % perRow;
    const row = Math.floor(i / perRow);
    const r: Rect = { x: 6 + LEFT_AXIS_PT + 4 + col * (size + LEFT_AXIS_PT + 4 + GAP), y: top + row * rowH + PANEL_TITLE, w: size, h: size };
    const g = el('g', { class: 'panel scatter' });
    g.append(text(r.x, r.y - 4, p.label, { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold', class: 'panel-title' }));
    const X = axisOf([r.x, r.x + r.w]);
    const Y = axisOf([r.y + r.h, r.y]);
    X.draw(g, r, xLabel, 'bottom');
    Y.draw(g, r, yLabel, 'left');
    if (p.stats.n === 0) {
      noDataNote(g, r, `No station lies in the water of ${p.label}: nothing to compare`);
    } else {
      // the 1:1 line across the shared square domain
      g.append(el('line', { x1: r2(r.x), y1: r2(r.y + r.h), x2: r2(r.x + r.w), y2: r2(r.y), stroke: MUTED, 'stroke-width': 0.6, 'stroke-dasharray': '3 2', class: 'one-to-one' }));
      const colour = RUN_COLOURS[i % RUN_COLOURS.length];
      const dots: string[] = [];
      let hidden = 0;
      for (let s = 0; s < spec.observed.length; s++) {
        const o = spec.observed[s];
        const m = p.model[s];
        if (!Number.isFinite(o) || !Number.isFinite(m)) continue;
        if (spec.log && !(o > 0 && m > 0)) {
          hidden++;
          continue;
        }
        // one path of small squares: hundreds of stations stay one element
        const x = X.at(o);
        const y = Y.at(m);
        dots.push(`M${r2(x - 0.9)},${r2(y - 0.9)}h1.8v1.8h-1.8Z`);
      }
      g.append(el('path', { d: dots.join(''), fill: colour, 'fill-opacity': 0.75, class: 'stations' }));
      const lines = scatterStatsLines(p, spec.observed.length, units, spec.log);
      if (hidden) lines.push(`${hidden} pairs ≤ 0 not on the log axes`);
      cornerBox(g, r, lines);
    }
    g.append(frame(r));
    panels.append(g);
  });
  svg.append(panels);
  return { name: spec.name, title: spec.title, svg, widthPt: W, heightPt: H };
}
