/**
 * Lines against a logarithmic horizontal axis (model years of a spin-up): the axis with decade ticks, minor ticks
 * and gridlines at the decades, and a panel of series with a linear vertical axis (units in its label) and a
 * point at every snapshot. Parts of the spin-up figures (spinup-figure.ts for the workbench, spinup-drift.ts for
 * the report).
 */
import { decadeDomain, logPosition, logTicks, logTickText } from '../render/log-axis.js';
import { FONT_PT, GRIDLINE, INK } from './page.js';
import { frame, leftAxis, r2, text, type Rect } from './parts.js';
import { linear, padded } from './scale.js';
import { el, type SvgNode } from './svg-tree.js';

export const YEAR_LABEL = 'Model year (log scale)';

export interface LineSeries {
  xs: ArrayLike<number>;
  ys: ArrayLike<number>;
  colour: string;
  /** stroke-dasharray, or none for a solid line */
  dash?: string;
  /** what the line shows (its tooltip on the screen, data-label for tests) */
  label: string;
}

/** The x domain shared by the panels of one figure: whole decades around the positive years. */
export function yearDomain(years: ArrayLike<number>): [number, number] {
  const pos = Array.from(years).filter((y) => y > 0);
  return pos.length ? decadeDomain(Math.min(...pos), Math.max(...pos)) : [1, 10];
}

/** A horizontal log axis along the bottom of `r`; returns the position function. */
export function logBottomAxis(g: SvgNode, r: Rect, domain: [number, number], label: string): (v: number) => number {
  const X = (v: number) => logPosition(v, domain, [r.x, r.x + r.w]);
  const y = r.y + r.h;
  const axis = el('g', { class: 'log-axis' });
  axis.append(el('line', { x1: r2(r.x), x2: r2(r.x + r.w), y1: r2(y), y2: r2(y), stroke: INK, 'stroke-width': 0.6 }));
  const t = logTicks(domain[0], domain[1]);
  for (const v of t.minor) axis.append(el('line', { x1: r2(X(v)), x2: r2(X(v)), y1: r2(y), y2: r2(y + 1.5), stroke: INK, 'stroke-width': 0.4, class: 'minor-tick' }));
  for (const v of t.major) {
    axis.append(el('line', { x1: r2(X(v)), x2: r2(X(v)), y1: r2(r.y), y2: r2(y), stroke: GRIDLINE, 'stroke-width': 0.4 }));
    axis.append(el('line', { x1: r2(X(v)), x2: r2(X(v)), y1: r2(y), y2: r2(y + 2.5), stroke: INK, 'stroke-width': 0.5, class: 'major-tick' }));
    axis.append(text(X(v), y + 2.5 + FONT_PT.tick + 1, logTickText(v), { 'text-anchor': 'middle', 'font-size': FONT_PT.tick, class: 'tick-label', 'data-value': v }));
  }
  axis.append(text(r.x + r.w / 2, y + FONT_PT.tick * 2 + 7.5, label, { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'axis-label' }));
  g.append(axis);
  return X;
}

function pathOf(xs: ArrayLike<number>, ys: ArrayLike<number>, X: (v: number) => number, Y: (v: number) => number): string {
  let d = '';
  let pen = false;
  for (let i = 0; i < xs.length; i++) {
    const x = X(xs[i]);
    if (!Number.isFinite(ys[i]) || !Number.isFinite(x)) {
      pen = false;
      continue;
    }
    d += `${pen ? 'L' : 'M'}${r2(x)},${r2(Y(ys[i]))}`;
    pen = true;
  }
  return d;
}

/** One panel: log x axis, linear y axis (label with units), a line per series with a point at every snapshot, the frame. */
export function logLinePanel(
  parent: SvgNode,
  r: Rect,
  domain: [number, number],
  series: LineSeries[],
  xLabel: string,
  yLabel: string,
  opts: { zeroLine?: boolean; yTicks?: number; points?: boolean } = {},
): void {
  let lo = Infinity;
  let hi = -Infinity;
  for (const sr of series) {
    for (let i = 0; i < sr.ys.length; i++) {
      const v = sr.ys[i];
      if (Number.isFinite(v) && sr.xs[i] > 0) {
        lo = Math.min(lo, v);
        hi = Math.max(hi, v);
      }
    }
  }
  if (opts.zeroLine && Number.isFinite(lo)) {
    lo = Math.min(lo, 0);
    hi = Math.max(hi, 0);
  }
  const Y = linear(padded(lo, hi, 0.06), [r.y + r.h, r.y]);
  const g = el('g', { class: 'axes' });
  const X = logBottomAxis(g, r, domain, xLabel);
  leftAxis(g, r, Y, yLabel, { grid: true, ticks: opts.yTicks ?? 5 });
  parent.append(g);
  if (opts.zeroLine && Number.isFinite(lo)) parent.append(el('line', { x1: r2(r.x), x2: r2(r.x + r.w), y1: r2(Y(0)), y2: r2(Y(0)), stroke: INK, 'stroke-width': 0.4, 'stroke-dasharray': '1.5 1.5' }));
  const lines = el('g', { class: 'series' });
  for (const sr of series) {
    lines.append(el('path', { d: pathOf(sr.xs, sr.ys, X, Y), fill: 'none', stroke: sr.colour, 'stroke-width': 0.9, 'stroke-linejoin': 'round', ...(sr.dash ? { 'stroke-dasharray': sr.dash } : {}), class: 'series-line', 'data-label': sr.label }, el('title', {}, sr.label)));
    if (opts.points !== false) {
      for (let i = 0; i < sr.xs.length; i++) if (sr.xs[i] > 0 && Number.isFinite(sr.ys[i])) lines.append(el('circle', { cx: r2(X(sr.xs[i])), cy: r2(Y(sr.ys[i])), r: 1.2, fill: sr.colour }));
    }
  }
  parent.append(lines);
  parent.append(frame(r));
}
