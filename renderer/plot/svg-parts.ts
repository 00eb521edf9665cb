/**
 * Building blocks of every figure: frame, axes with ticks and labels (units always), a colour bar
 * with units, a title and a legend. Styling is written as SVG attributes, so an exported figure
 * looks the same outside the workbench.
 */
import { typesetUnits } from '../../app/figures/typeset.js';
import type { ColourScale } from '../../app/render/colour-scales.js';
import { logTicks } from '../../app/render/colour-mapping.js';
import { cssColour, formatTick, niceTicks } from '../../app/render/colour-scales.js';
import { s } from '../elements.js';
import type { Scale } from '../../app/figures/scale.js';

export const FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif";
export const INK = '#1d2228';
export const MUTED = '#5b636d';
export const GRIDLINE = '#d5d9de';

export interface Rect {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** The root <svg> of a figure, in figure units. */
export function figureRoot(width: number, height: number, label: string): SVGSVGElement {
  const svg = s('svg', {
    xmlns: 'http://www.w3.org/2000/svg',
    viewBox: `0 0 ${width} ${height}`,
    width,
    height,
    role: 'img',
    'aria-label': label,
    'font-family': FONT,
    'font-size': 12,
    fill: INK,
    class: 'figure-svg',
  });
  // the paper: kept in exports, hidden on screen where the map's canvas lies underneath
  svg.append(s('rect', { x: 0, y: 0, width, height, fill: '#ffffff', class: 'paper' }));
  svg.append(s('title', {}, label));
  return svg;
}

export function text(x: number, y: number, str: string, attrs: Record<string, string | number> = {}): SVGTextElement {
  return s('text', { x, y, ...attrs }, str);
}

/** Title and subtitle; a long subtitle wraps onto a second line. Returns the number of subtitle lines. */
export function title(svg: SVGSVGElement, x: number, y: number, main: string, sub?: string): number {
  svg.append(text(x, y, main, { 'font-size': 14, 'font-weight': 600 }));
  if (!sub) return 0;
  const width = Number((svg.getAttribute('viewBox') ?? '0 0 800 0').split(/\s+/)[2]) - x - 8;
  const lines = wrap(sub, Math.max(30, Math.floor(width / 6.1)), 2);
  lines.forEach((line, i) => svg.append(text(x, y + 17 + i * 14, line, { 'font-size': 11.5, fill: MUTED })));
  return lines.length;
}

/** Words into at most `maxLines` lines of about `chars` characters; the last line ends in … when cut. */
export function wrap(str: string, chars: number, maxLines: number): string[] {
  const words = str.split(/\s+/);
  const lines: string[] = [];
  let cur = '';
  for (const w of words) {
    if (cur && (cur + ' ' + w).length > chars) {
      lines.push(cur);
      cur = w;
    } else cur = cur ? `${cur} ${w}` : w;
  }
  if (cur) lines.push(cur);
  if (lines.length > maxLines) {
    const kept = lines.slice(0, maxLines);
    kept[maxLines - 1] = kept[maxLines - 1].replace(/.{0,1}$/, '…');
    return kept;
  }
  return lines;
}

/** A horizontal axis along the bottom of `r`, with gridlines when asked. */
export function bottomAxis(g: SVGElement, r: Rect, sc: Scale, label: string, opts: { grid?: boolean; ticks?: number; format?: (v: number) => string } = {}): void {
  const n = opts.ticks ?? 6;
  const y = r.y + r.h;
  g.append(s('line', { x1: r.x, x2: r.x + r.w, y1: y, y2: y, stroke: INK, 'stroke-width': 1 }));
  for (const t of sc.ticks(n)) {
    const x = sc(t);
    if (x < r.x - 0.5 || x > r.x + r.w + 0.5) continue;
    if (opts.grid) g.append(s('line', { x1: x, x2: x, y1: r.y, y2: y, stroke: GRIDLINE, 'stroke-width': 0.75 }));
    g.append(s('line', { x1: x, x2: x, y1: y, y2: y + 4, stroke: INK }));
    g.append(text(x, y + 16, opts.format ? opts.format(t) : sc.tickText(t, n), { 'text-anchor': 'middle', 'font-size': 11 }));
  }
  g.append(text(r.x + r.w / 2, y + 34, label, { 'text-anchor': 'middle', 'font-size': 12, class: 'axis-label' }));
}

/** A vertical axis along the left of `r`. */
export function leftAxis(g: SVGElement, r: Rect, sc: Scale, label: string, opts: { grid?: boolean; ticks?: number; format?: (v: number) => string } = {}): void {
  const n = opts.ticks ?? 6;
  g.append(s('line', { x1: r.x, x2: r.x, y1: r.y, y2: r.y + r.h, stroke: INK, 'stroke-width': 1 }));
  for (const t of sc.ticks(n)) {
    const y = sc(t);
    if (y < r.y - 0.5 || y > r.y + r.h + 0.5) continue;
    if (opts.grid) g.append(s('line', { x1: r.x, x2: r.x + r.w, y1: y, y2: y, stroke: GRIDLINE, 'stroke-width': 0.75 }));
    g.append(s('line', { x1: r.x - 4, x2: r.x, y1: y, y2: y, stroke: INK }));
    g.append(text(r.x - 7, y + 4, opts.format ? opts.format(t) : sc.tickText(t, n), { 'text-anchor': 'end', 'font-size': 11 }));
  }
  const cx = r.x - 48;
  const cy = r.y + r.h / 2;
  g.append(text(cx, cy, label, { 'text-anchor': 'middle', 'font-size': 12, transform: `rotate(-90 ${cx} ${cy})`, class: 'axis-label' }));
}

export interface ColourBarOptions {
  /** logarithmic stretch: min and max are the values (> 0), ticks at 1, 2, 5 × 10^k */
  log?: boolean;
  /** values lie below min / above max: an arrow at that end says they are drawn in the end colour */
  below?: boolean;
  above?: boolean;
}

/** A vertical colour bar in `r`, ticks and the units label to its right. */
export function colourBar(g: SVGElement, r: Rect, scale: ColourScale, min: number, max: number, units: string, caption: string, opts: ColourBarOptions = {}): void {
  const n = scale.packed.length;
  const id = `cb-${Math.random().toString(36).slice(2, 9)}`;
  const grad = s('linearGradient', { id, x1: 0, y1: 1, x2: 0, y2: 0 });
  const stops = 32;
  for (let i = 0; i <= stops; i++) {
    const k = Math.min(n - 1, Math.round((i / stops) * (n - 1)));
    grad.append(s('stop', { offset: (i / stops).toFixed(4), 'stop-color': cssColour(scale, k) }));
  }
  g.append(s('defs', {}, grad));
  g.append(s('rect', { x: r.x, y: r.y, width: r.w, height: r.h, fill: `url(#${id})`, stroke: INK, 'stroke-width': 0.75 }));
  // clip arrows: triangles in the end colours, beyond the bar's ends
  const arrow = (top: boolean): void => {
    const k = top ? n - 1 : 0;
    const y0 = top ? r.y : r.y + r.h;
    const tip = top ? y0 - r.w : y0 + r.w;
    g.append(s('path', { d: `M${r.x},${y0}L${r.x + r.w / 2},${tip}L${r.x + r.w},${y0}Z`, fill: cssColour(scale, k), stroke: INK, 'stroke-width': 0.75, class: top ? 'clip-above' : 'clip-below' }));
  };
  if (opts.above) arrow(true);
  if (opts.below) arrow(false);
  const lmin = opts.log ? Math.log10(min) : min;
  const lmax = opts.log ? Math.log10(max) : max;
  const ticks = opts.log ? logTicks(min, max) : niceTicks(min, max, 6);
  const step = ticks.length > 1 ? ticks[1] - ticks[0] : 1;
  for (const t of ticks) {
    const v = opts.log ? Math.log10(t) : t;
    const y = r.y + r.h - ((v - lmin) / (lmax - lmin)) * r.h;
    g.append(s('line', { x1: r.x + r.w, x2: r.x + r.w + 4, y1: y, y2: y, stroke: INK }));
    g.append(text(r.x + r.w + 7, y + 4, opts.log ? formatTick(t, t / 10) : formatTick(t, step), { 'font-size': 11 }));
  }
  const cx = r.x + r.w + 58;
  const cy = r.y + r.h / 2;
  g.append(text(cx, cy, `${caption} (${typesetUnits(units)})${opts.log ? ', log scale' : ''}`, { 'text-anchor': 'middle', 'font-size': 12, transform: `rotate(-90 ${cx} ${cy})` }));
}

export interface LegendItem {
  label: string;
  colour: string;
  marker?: 'circle' | 'square' | 'triangle' | 'down' | 'diamond' | 'line' | 'dash' | 'star';
}

/** A marker shape at (x, y). */
export function marker(kind: LegendItem['marker'], x: number, y: number, colour: string, size = 5): SVGElement {
  switch (kind) {
    case 'square':
      return s('rect', { x: x - size, y: y - size, width: 2 * size, height: 2 * size, fill: colour, stroke: '#ffffff', 'stroke-width': 0.8 });
    case 'triangle':
      return s('path', { d: `M${x},${y - size * 1.2}L${x + size * 1.1},${y + size * 0.8}L${x - size * 1.1},${y + size * 0.8}Z`, fill: colour, stroke: '#ffffff', 'stroke-width': 0.8 });
    case 'down':
      return s('path', { d: `M${x},${y + size * 1.2}L${x + size * 1.1},${y - size * 0.8}L${x - size * 1.1},${y - size * 0.8}Z`, fill: colour, stroke: '#ffffff', 'stroke-width': 0.8 });
    case 'diamond':
      return s('path', { d: `M${x},${y - size * 1.3}L${x + size},${y}L${x},${y + size * 1.3}L${x - size},${y}Z`, fill: colour, stroke: '#ffffff', 'stroke-width': 0.8 });
    case 'star':
      return s('path', { d: starPath(x, y, size * 1.4), fill: colour, stroke: INK, 'stroke-width': 0.6 });
    case 'line':
      return s('line', { x1: x - 10, x2: x + 10, y1: y, y2: y, stroke: colour, 'stroke-width': 2 });
    case 'dash':
      return s('line', { x1: x - 10, x2: x + 10, y1: y, y2: y, stroke: colour, 'stroke-width': 2, 'stroke-dasharray': '5 3' });
    default:
      return s('circle', { cx: x, cy: y, r: size, fill: colour, stroke: '#ffffff', 'stroke-width': 0.8 });
  }
}

function starPath(x: number, y: number, r: number): string {
  let d = '';
  for (let i = 0; i < 10; i++) {
    const a = -Math.PI / 2 + (i * Math.PI) / 5;
    const rr = i % 2 === 0 ? r : r * 0.45;
    d += `${i === 0 ? 'M' : 'L'}${(x + rr * Math.cos(a)).toFixed(2)},${(y + rr * Math.sin(a)).toFixed(2)}`;
  }
  return d + 'Z';
}

/** A legend in rows starting at (x, y); returns its height. */
export function legend(g: SVGElement, x: number, y: number, items: LegendItem[], heading?: string): number {
  let yy = y;
  if (heading) {
    g.append(text(x, yy + 4, heading, { 'font-size': 11.5, 'font-weight': 600 }));
    yy += 18;
  }
  for (const it of items) {
    g.append(marker(it.marker, x + 10, yy, it.colour));
    g.append(text(x + 26, yy + 4, it.label, { 'font-size': 11.5 }));
    yy += 18;
  }
  return yy - y;
}

/** Colours for runs, distinguishable also in grey print (Okabe & Ito 2008 palette for colour-blind readers). */
export const RUN_COLOURS = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#F0E442', '#000000'];
export const REGION_MARKERS: LegendItem['marker'][] = ['circle', 'square', 'triangle', 'diamond', 'down', 'star'];
