/**
 * Lines against a logarithmic horizontal axis (model years of a spin-up): a panel with decade ticks, minor
 * ticks, gridlines at the decades, a linear vertical axis with units, and one path per series.
 */
import { decadeDomain, logPosition, logTicks, logTickText } from '../../app/render/log-axis.js';
import { s } from '../elements.js';
import { linear, padded } from '../../app/figures/scale.js';
import { GRIDLINE, INK, leftAxis, text, type Rect } from './svg-parts.js';

export interface LineSeries {
  xs: number[];
  ys: number[];
  colour: string;
  /** stroke-dasharray, or none for a solid line */
  dash?: string;
  /** what the line shows, for its tooltip */
  label: string;
}

/** The x domain shared by the panels of one figure: whole decades around the positive years. */
export function yearDomain(years: number[]): [number, number] {
  const pos = years.filter((y) => y > 0);
  return pos.length ? decadeDomain(Math.min(...pos), Math.max(...pos)) : [1, 10];
}

/** A horizontal log axis along the bottom of `r`; returns the position function. */
export function logBottomAxis(g: SVGElement, r: Rect, domain: [number, number], label: string): (v: number) => number {
  const sx = (v: number) => logPosition(v, domain, [r.x, r.x + r.w]);
  const y = r.y + r.h;
  const axis = s('g', { class: 'log-axis' });
  axis.append(s('line', { x1: r.x, x2: r.x + r.w, y1: y, y2: y, stroke: INK, 'stroke-width': 1 }));
  const t = logTicks(domain[0], domain[1]);
  for (const v of t.minor) {
    const x = sx(v);
    axis.append(s('line', { x1: x, x2: x, y1: y, y2: y + 2.5, stroke: INK, 'stroke-width': 0.75, class: 'minor-tick' }));
  }
  for (const v of t.major) {
    const x = sx(v);
    axis.append(s('line', { x1: x, x2: x, y1: r.y, y2: y, stroke: GRIDLINE, 'stroke-width': 0.75 }));
    axis.append(s('line', { x1: x, x2: x, y1: y, y2: y + 5, stroke: INK, class: 'major-tick' }));
    axis.append(text(x, y + 17, logTickText(v), { 'text-anchor': 'middle', 'font-size': 11, class: 'tick-label', 'data-value': v }));
  }
  axis.append(text(r.x + r.w / 2, y + 34, label, { 'text-anchor': 'middle', 'font-size': 12, class: 'axis-label' }));
  g.append(axis);
  return sx;
}

function pathOf(xs: number[], ys: number[], sx: (v: number) => number, sy: (v: number) => number): string {
  let d = '';
  let pen = false;
  for (let i = 0; i < xs.length; i++) {
    const x = sx(xs[i]);
    if (!Number.isFinite(ys[i]) || !Number.isFinite(x)) {
      pen = false;
      continue;
    }
    d += `${pen ? 'L' : 'M'}${x.toFixed(2)},${sy(ys[i]).toFixed(2)}`;
    pen = true;
  }
  return d;
}

/** One panel: frame, log x axis, linear y axis (label with units), lines and a point at every snapshot. */
export function logLinePanel(
  svg: SVGElement,
  r: Rect,
  domain: [number, number],
  series: LineSeries[],
  xLabel: string,
  yLabel: string,
  opts: { zeroLine?: boolean; yTicks?: number } = {},
): void {
  let lo = Infinity;
  let hi = -Infinity;
  for (const sr of series) {
    sr.ys.forEach((v, i) => {
      if (Number.isFinite(v) && sr.xs[i] > 0) {
        lo = Math.min(lo, v);
        hi = Math.max(hi, v);
      }
    });
  }
  if (opts.zeroLine && Number.isFinite(lo)) {
    lo = Math.min(lo, 0);
    hi = Math.max(hi, 0);
  }
  const sy = linear(padded(lo, hi, 0.06), [r.y + r.h, r.y]);
  const g = s('g', {});
  const sx = logBottomAxis(g, r, domain, xLabel);
  leftAxis(g, r, sy, yLabel, { grid: true, ticks: opts.yTicks ?? 5 });
  svg.append(g);
  if (opts.zeroLine && Number.isFinite(lo)) svg.append(s('line', { x1: r.x, x2: r.x + r.w, y1: sy(0), y2: sy(0), stroke: INK, 'stroke-width': 0.6, 'stroke-dasharray': '2 2' }));
  const lines = s('g', { class: 'series' });
  for (const sr of series) {
    lines.append(s('path', { d: pathOf(sr.xs, sr.ys, sx, sy), fill: 'none', stroke: sr.colour, 'stroke-width': 1.8, 'stroke-linejoin': 'round', ...(sr.dash ? { 'stroke-dasharray': sr.dash } : {}), class: 'series-line', 'data-label': sr.label }, s('title', {}, sr.label)));
    sr.xs.forEach((x, i) => {
      if (x > 0 && Number.isFinite(sr.ys[i])) lines.append(s('circle', { cx: sx(x).toFixed(2), cy: sy(sr.ys[i]).toFixed(2), r: 2.2, fill: sr.colour }));
    });
  }
  svg.append(lines);
  svg.append(s('rect', { x: r.x, y: r.y, width: r.w, height: r.h, fill: 'none', stroke: INK, 'stroke-width': 0.9 }));
}
