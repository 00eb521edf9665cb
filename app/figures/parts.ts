/**
 * Building blocks of every figure: the root with its title, axes with ticks and a label (units always), a
 * colour bar with units, legends and markers. Styling is written as SVG attributes so that a figure looks the
 * same in the report, in a standalone file and on the screen.
 */
import { FONT_FAMILY, FONT_PT, GRIDLINE, INK, MM_PER_PT, MUTED } from './page.js';
import type { Scale } from './scale.js';
import { el, type SvgNode } from './svg-tree.js';

export interface Rect {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** A figure: its tree, its size in points, and a name to file it under. */
export interface Figure {
  name: string;
  title: string;
  svg: SvgNode;
  widthPt: number;
  heightPt: number;
}

/** The root <svg>, in points, with a white paper and a <title> naming what is drawn. */
export function figureRoot(width: number, height: number, label: string): SvgNode {
  const svg = el('svg', {
    xmlns: 'http://www.w3.org/2000/svg',
    viewBox: `0 0 ${width.toFixed(3)} ${height.toFixed(3)}`,
    width: `${r2(width * MM_PER_PT)}mm`,
    height: `${r2(height * MM_PER_PT)}mm`,
    role: 'img',
    'aria-label': label,
    'font-family': FONT_FAMILY,
    'font-size': FONT_PT.label,
    fill: INK,
  });
  svg.append(el('title', {}, label));
  // the paper: white in every file; the screen hides it where a canvas lies under the figure
  svg.append(el('rect', { x: 0, y: 0, width: r2(width), height: r2(height), fill: '#ffffff', class: 'paper' }));
  return svg;
}

export function r2(v: number): number {
  return Math.round(v * 100) / 100;
}

export function text(x: number, y: number, str: string, attrs: Record<string, string | number> = {}): SvgNode {
  return el('text', { x: r2(x), y: r2(y), ...attrs }, str);
}

/** Words into at most `maxLines` lines of about `chars` characters; the last line ends in … when cut. */
export function wrap(str: string, chars: number, maxLines: number): string[] {
  const lines: string[] = [];
  let cur = '';
  for (const w of str.split(/\s+/).filter(Boolean)) {
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

/** about how many characters of a font size fit in a width (DejaVu Sans averages ~0.55 em) */
export function charsIn(width: number, fontPt: number): number {
  return Math.max(8, Math.floor(width / (fontPt * 0.55)));
}

/** Title (and a wrapped subtitle) at the top of a figure; returns the y below them. */
export function figureTitle(svg: SvgNode, x: number, y: number, width: number, main: string, sub?: string): number {
  const mainLines = wrap(main, Math.floor(charsIn(width, FONT_PT.title) * 0.85), 2);
  mainLines.forEach((line, i) => svg.append(text(x, y + i * (FONT_PT.title + 2), line, { 'font-size': FONT_PT.title, 'font-weight': 'bold', class: 'figure-title' })));
  let yy = y + (mainLines.length - 1) * (FONT_PT.title + 2) + 4;
  if (sub) {
    const lines = wrap(sub, charsIn(width, FONT_PT.label), 2);
    lines.forEach((line, i) => svg.append(text(x, yy + FONT_PT.label + 1 + i * (FONT_PT.label + 2), line, { 'font-size': FONT_PT.label, fill: MUTED, class: 'figure-subtitle' })));
    yy += lines.length * (FONT_PT.label + 2) + 1;
  }
  return yy + 6;
}

/** A horizontal axis along the bottom of `r` with a label (units in it). */
export function bottomAxis(g: SvgNode, r: Rect, sc: Scale, label: string, opts: { grid?: boolean; ticks?: number; format?: (v: number) => string } = {}): void {
  const n = opts.ticks ?? 5;
  const y = r.y + r.h;
  g.append(el('line', { x1: r2(r.x), x2: r2(r.x + r.w), y1: r2(y), y2: r2(y), stroke: INK, 'stroke-width': 0.6 }));
  for (const t of sc.ticks(n)) {
    const x = sc(t);
    if (x < r.x - 0.5 || x > r.x + r.w + 0.5) continue;
    if (opts.grid) g.append(el('line', { x1: r2(x), x2: r2(x), y1: r2(r.y), y2: r2(y), stroke: GRIDLINE, 'stroke-width': 0.4 }));
    g.append(el('line', { x1: r2(x), x2: r2(x), y1: r2(y), y2: r2(y + 2.5), stroke: INK, 'stroke-width': 0.5 }));
    g.append(text(x, y + 2.5 + FONT_PT.tick + 1, opts.format ? opts.format(t) : sc.tickText(t, n), { 'text-anchor': 'middle', 'font-size': FONT_PT.tick }));
  }
  g.append(text(r.x + r.w / 2, y + 2.5 + FONT_PT.tick * 2 + 5, label, { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'axis-label' }));
}

/** room a left axis needs beside its plot (tick text and the rotated label) */
export const LEFT_AXIS_PT = 34;

/** A vertical axis along the left of `r`. */
export function leftAxis(g: SvgNode, r: Rect, sc: Scale, label: string, opts: { grid?: boolean; ticks?: number; format?: (v: number) => string } = {}): void {
  const n = opts.ticks ?? 5;
  g.append(el('line', { x1: r2(r.x), x2: r2(r.x), y1: r2(r.y), y2: r2(r.y + r.h), stroke: INK, 'stroke-width': 0.6 }));
  for (const t of sc.ticks(n)) {
    const y = sc(t);
    if (y < r.y - 0.5 || y > r.y + r.h + 0.5) continue;
    if (opts.grid) g.append(el('line', { x1: r2(r.x), x2: r2(r.x + r.w), y1: r2(y), y2: r2(y), stroke: GRIDLINE, 'stroke-width': 0.4 }));
    g.append(el('line', { x1: r2(r.x - 2.5), x2: r2(r.x), y1: r2(y), y2: r2(y), stroke: INK, 'stroke-width': 0.5 }));
    g.append(text(r.x - 4, y + FONT_PT.tick * 0.35, opts.format ? opts.format(t) : sc.tickText(t, n), { 'text-anchor': 'end', 'font-size': FONT_PT.tick }));
  }
  const cx = r.x - LEFT_AXIS_PT + FONT_PT.label;
  const cy = r.y + r.h / 2;
  g.append(text(cx, cy, label, { 'text-anchor': 'middle', 'font-size': FONT_PT.label, transform: `rotate(-90 ${r2(cx)} ${r2(cy)})`, class: 'axis-label' }));
}

/** Colour bars live in colour-bar.ts (log stretch, clip arrows, horizontal and vertical); re-exported for the figures that import them from here. */
export { colourBarH, colourBarV } from './colour-bar.js';

export type MarkerKind = 'circle' | 'square' | 'triangle' | 'down' | 'diamond' | 'line' | 'dash' | 'star';

export interface LegendItem {
  label: string;
  colour: string;
  marker?: MarkerKind;
}

/** A marker shape at (x, y). */
export function marker(kind: MarkerKind | undefined, x: number, y: number, colour: string, size = 3): SvgNode {
  const p = (pts: [number, number][]) => pts.map(([a, b], i) => `${i ? 'L' : 'M'}${r2(x + a * size)},${r2(y + b * size)}`).join('') + 'Z';
  const edge = { stroke: '#ffffff', 'stroke-width': 0.4 };
  switch (kind) {
    case 'square':
      return el('rect', { x: r2(x - size), y: r2(y - size), width: r2(2 * size), height: r2(2 * size), fill: colour, ...edge });
    case 'triangle':
      return el('path', { d: p([[0, -1.2], [1.1, 0.8], [-1.1, 0.8]]), fill: colour, ...edge });
    case 'down':
      return el('path', { d: p([[0, 1.2], [1.1, -0.8], [-1.1, -0.8]]), fill: colour, ...edge });
    case 'diamond':
      return el('path', { d: p([[0, -1.3], [1, 0], [0, 1.3], [-1, 0]]), fill: colour, ...edge });
    case 'star': {
      const pts: [number, number][] = [];
      for (let i = 0; i < 10; i++) {
        const a = -Math.PI / 2 + (i * Math.PI) / 5;
        const rr = i % 2 === 0 ? 1.4 : 0.63;
        pts.push([rr * Math.cos(a), rr * Math.sin(a)]);
      }
      return el('path', { d: p(pts), fill: colour, stroke: INK, 'stroke-width': 0.3 });
    }
    case 'line':
      return el('line', { x1: r2(x - 6), x2: r2(x + 6), y1: r2(y), y2: r2(y), stroke: colour, 'stroke-width': 1.2 });
    case 'dash':
      return el('line', { x1: r2(x - 6), x2: r2(x + 6), y1: r2(y), y2: r2(y), stroke: colour, 'stroke-width': 1.2, 'stroke-dasharray': '3 2' });
    default:
      return el('circle', { cx: r2(x), cy: r2(y), r: size, fill: colour, ...edge });
  }
}

/** A legend in rows from (x, y); returns its height. */
export function legend(g: SvgNode, x: number, y: number, items: LegendItem[], heading?: string): number {
  let yy = y;
  if (heading) {
    g.append(text(x, yy + 2.5, heading, { 'font-size': FONT_PT.label, 'font-weight': 'bold' }));
    yy += 10;
  }
  for (const it of items) {
    g.append(marker(it.marker, x + 6, yy, it.colour));
    g.append(text(x + 15, yy + 2.5, it.label, { 'font-size': FONT_PT.label }));
    yy += 10;
  }
  return yy - y;
}

/** Colours for runs, distinguishable also by colour-blind readers (Okabe & Ito 2008 palette). */
export const RUN_COLOURS = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#000000', '#F0E442'];
export const REGION_MARKERS: MarkerKind[] = ['circle', 'square', 'triangle', 'diamond', 'down', 'star'];

export const frame = (r: Rect, stroke = INK): SvgNode =>
  el('rect', { x: r2(r.x), y: r2(r.y), width: r2(r.w), height: r2(r.h), fill: 'none', stroke, 'stroke-width': 0.6 });
