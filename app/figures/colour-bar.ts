/**
 * Colour bars of every figure, horizontal (under multi-panel maps) or vertical (beside one map or section):
 * a gradient of the scale, ticks, a label with units, and what the screen's bars show too: a logarithmic
 * stretch (ticks at 1, 2, 5 × 10^k) and arrows at an end when values lie beyond the range (drawn in the end
 * colour, so the reader knows they are clipped).
 */
import { logTicks } from '../render/colour-mapping.js';
import { cssColour, formatTick, niceTicks, type ColourScale } from '../render/colour-scales.js';
import { FONT_PT, INK } from './page.js';
import { r2, text, type Rect } from './parts.js';
import { el, type SvgNode } from './svg-tree.js';

export interface ColourBarOptions {
  /** logarithmic stretch: min and max are the values (> 0) */
  log?: boolean;
  /** values lie below min / above max */
  below?: boolean;
  above?: boolean;
}

let gradientCounter = 0;

/** Ticks of a bar and their text, each with its place along the bar (0 at min, 1 at max). */
export function barTicks(min: number, max: number, opts: ColourBarOptions = {}, count = 5): { value: number; at: number; label: string }[] {
  if (opts.log) {
    const lmin = Math.log10(min);
    const span = Math.log10(max) - lmin;
    return logTicks(min, max).map((t) => ({ value: t, at: (Math.log10(t) - lmin) / span, label: formatTick(t, t / 10) }));
  }
  const ticks = niceTicks(min, max, count);
  const step = ticks.length > 1 ? ticks[1] - ticks[0] : 1;
  return ticks.map((t) => ({ value: t, at: (t - min) / (max - min), label: formatTick(t, step).replace(/^-/, '−') }));
}

function gradient(scale: ColourScale, vertical: boolean): { id: string; node: SvgNode } {
  const n = scale.packed.length;
  const id = `cbar${++gradientCounter}`;
  const grad = el('linearGradient', vertical ? { id, x1: 0, y1: 1, x2: 0, y2: 0 } : { id, x1: 0, y1: 0, x2: 1, y2: 0 });
  const stops = 32;
  for (let i = 0; i <= stops; i++) {
    const k = Math.min(n - 1, Math.round((i / stops) * (n - 1)));
    grad.append(el('stop', { offset: (i / stops).toFixed(4), 'stop-color': cssColour(scale, k) }));
  }
  return { id, node: el('defs', {}, grad) };
}

/** An arrow beyond one end of the bar, in that end's colour. */
function clipArrow(scale: ColourScale, high: boolean, d: string): SvgNode {
  return el('path', { d, fill: cssColour(scale, high ? scale.packed.length - 1 : 0), stroke: INK, 'stroke-width': 0.4, class: high ? 'clip-above' : 'clip-below' });
}

const withLog = (label: string, opts: ColourBarOptions): string => (opts.log ? `${label}, log scale` : label);

/** A horizontal colour bar in `r`, ticks below and the label (with units) under them. Height used: r.h + 22. */
export function colourBarH(g: SvgNode, r: Rect, scale: ColourScale, min: number, max: number, label: string, opts: ColourBarOptions = {}): void {
  const { id, node } = gradient(scale, false);
  g.append(node);
  g.append(el('rect', { x: r2(r.x), y: r2(r.y), width: r2(r.w), height: r2(r.h), fill: `url(#${id})`, stroke: INK, 'stroke-width': 0.4 }));
  const tip = r.h * 0.9;
  if (opts.below) g.append(clipArrow(scale, false, `M${r2(r.x)},${r2(r.y)}L${r2(r.x - tip)},${r2(r.y + r.h / 2)}L${r2(r.x)},${r2(r.y + r.h)}Z`));
  if (opts.above) g.append(clipArrow(scale, true, `M${r2(r.x + r.w)},${r2(r.y)}L${r2(r.x + r.w + tip)},${r2(r.y + r.h / 2)}L${r2(r.x + r.w)},${r2(r.y + r.h)}Z`));
  for (const t of barTicks(min, max, opts)) {
    const x = r.x + t.at * r.w;
    g.append(el('line', { x1: r2(x), x2: r2(x), y1: r2(r.y + r.h), y2: r2(r.y + r.h + 2), stroke: INK, 'stroke-width': 0.5 }));
    g.append(text(x, r.y + r.h + 2 + FONT_PT.tick + 0.5, t.label, { 'text-anchor': 'middle', 'font-size': FONT_PT.tick }));
  }
  g.append(text(r.x + r.w / 2, r.y + r.h + 2 + FONT_PT.tick * 2 + 3.5, withLog(label, opts), { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'colour-bar-label' }));
}

/** room a vertical bar needs to the right of its rectangle (ticks, their text, the rotated label) */
export const V_BAR_SIDE_PT = 36;

/** A vertical colour bar in `r`, ticks and the rotated label (with units) to its right. */
export function colourBarV(g: SvgNode, r: Rect, scale: ColourScale, min: number, max: number, label: string, opts: ColourBarOptions = {}): void {
  const { id, node } = gradient(scale, true);
  g.append(node);
  g.append(el('rect', { x: r2(r.x), y: r2(r.y), width: r2(r.w), height: r2(r.h), fill: `url(#${id})`, stroke: INK, 'stroke-width': 0.4 }));
  const tip = r.w * 0.9;
  if (opts.above) g.append(clipArrow(scale, true, `M${r2(r.x)},${r2(r.y)}L${r2(r.x + r.w / 2)},${r2(r.y - tip)}L${r2(r.x + r.w)},${r2(r.y)}Z`));
  if (opts.below) g.append(clipArrow(scale, false, `M${r2(r.x)},${r2(r.y + r.h)}L${r2(r.x + r.w / 2)},${r2(r.y + r.h + tip)}L${r2(r.x + r.w)},${r2(r.y + r.h)}Z`));
  for (const t of barTicks(min, max, opts)) {
    const y = r.y + r.h - t.at * r.h;
    g.append(el('line', { x1: r2(r.x + r.w), x2: r2(r.x + r.w + 2), y1: r2(y), y2: r2(y), stroke: INK, 'stroke-width': 0.5 }));
    g.append(text(r.x + r.w + 3, y + FONT_PT.tick * 0.35, t.label, { 'font-size': FONT_PT.tick }));
  }
  const cx = r.x + r.w + V_BAR_SIDE_PT - FONT_PT.label * 0.4;
  const cy = r.y + r.h / 2;
  g.append(text(cx, cy, withLog(label, opts), { 'text-anchor': 'middle', 'font-size': FONT_PT.label, transform: `rotate(-90 ${r2(cx)} ${r2(cy)})`, class: 'colour-bar-label' }));
}
