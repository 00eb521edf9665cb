/**
 * Spin-up drift: for each tracer, the change of its mean since the first snapshot against model years on a
 * logarithmic axis (decades of spin-up read as equal steps), one line per depth layer.
 */
import { decadeDomain, logPosition, logTicks, logTickText } from '../render/log-axis.js';
import { FONT_PT, GRIDLINE, INK, widthPt, type FigureWidth } from './page.js';
import { figureRoot, figureTitle, frame, LEFT_AXIS_PT, leftAxis, legend, r2, RUN_COLOURS, text, type Figure, type Rect } from './parts.js';
import { linear, padded } from './scale.js';
import { el, type SvgNode } from './svg-tree.js';
import { typesetUnits } from './typeset.js';

export interface DriftPanel {
  tracer: string;
  units: string;
  series: { label: string; values: number[] }[];
}

export interface SpinupDriftSpec {
  name: string;
  title: string;
  subtitle?: string;
  width: FigureWidth;
  years: number[];
  panels: DriftPanel[];
}

function logAxis(g: SvgNode, r: Rect, domain: [number, number]): (v: number) => number {
  const X = (v: number) => logPosition(v, domain, [r.x, r.x + r.w]);
  const t = logTicks(domain[0], domain[1]);
  const y = r.y + r.h;
  for (const v of t.minor) g.append(el('line', { x1: r2(X(v)), x2: r2(X(v)), y1: r2(y), y2: r2(y + 1.5), stroke: INK, 'stroke-width': 0.4 }));
  for (const v of t.major) {
    g.append(el('line', { x1: r2(X(v)), x2: r2(X(v)), y1: r2(r.y), y2: r2(y), stroke: GRIDLINE, 'stroke-width': 0.4 }));
    g.append(el('line', { x1: r2(X(v)), x2: r2(X(v)), y1: r2(y), y2: r2(y + 2.5), stroke: INK, 'stroke-width': 0.5 }));
    g.append(text(X(v), y + 2.5 + FONT_PT.tick + 1, logTickText(v), { 'text-anchor': 'middle', 'font-size': FONT_PT.tick }));
  }
  g.append(text(r.x + r.w / 2, y + FONT_PT.tick * 2 + 7.5, 'Model year (log scale)', { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'axis-label' }));
  return X;
}

export function spinupDriftFigure(spec: SpinupDriftSpec): Figure {
  const W = widthPt(spec.width);
  const scratch = el('g');
  const top = figureTitle(scratch, 6, FONT_PT.title + 2, W - 12, spec.title, spec.subtitle);
  const legendW = 86;
  const cols = spec.width === 'double' ? 2 : 1;
  const colW = (W - legendW - cols * (LEFT_AXIS_PT + 8)) / cols;
  const panelH = Math.min(110, colW * 0.6);
  const rowH = FONT_PT.panelTitle + 4 + panelH + FONT_PT.tick * 2 + 14;
  const rows = Math.ceil(spec.panels.length / cols);
  const H = top + Math.max(1, rows) * rowH + 6;
  const svg = figureRoot(W, H, `${spec.title}${spec.subtitle ? `. ${spec.subtitle}` : ''}`);
  for (const c of scratch.children) svg.append(c);
  const pos = spec.years.filter((y) => y > 0);
  const domain = pos.length ? decadeDomain(Math.min(...pos), Math.max(...pos)) : ([1, 10] as [number, number]);
  const labels = [...new Set(spec.panels.flatMap((p) => p.series.map((s) => s.label)))];
  spec.panels.forEach((p, i) => {
    const r: Rect = { x: LEFT_AXIS_PT + 4 + (i % cols) * (colW + LEFT_AXIS_PT + 8), y: top + Math.floor(i / cols) * rowH + FONT_PT.panelTitle + 4, w: colW, h: panelH };
    const g = el('g', { class: 'panel' });
    g.append(text(r.x, r.y - 3, `${p.tracer}: change since year ${spec.years[0]}`, { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold', class: 'panel-title' }));
    let lo = Infinity;
    let hi = -Infinity;
    for (const s of p.series) s.values.forEach((v, k) => {
      if (Number.isFinite(v) && spec.years[k] > 0) {
        lo = Math.min(lo, v);
        hi = Math.max(hi, v);
      }
    });
    const Y = linear(padded(Math.min(lo, 0), Math.max(hi, 0), 0.06), [r.y + r.h, r.y]);
    const X = logAxis(g, r, domain);
    leftAxis(g, r, Y, `Change (${typesetUnits(p.units)})`, { ticks: 4, grid: true });
    g.append(el('line', { x1: r2(r.x), x2: r2(r.x + r.w), y1: r2(Y(0)), y2: r2(Y(0)), stroke: INK, 'stroke-width': 0.4, 'stroke-dasharray': '1.5 1.5' }));
    for (const s of p.series) {
      const colour = RUN_COLOURS[labels.indexOf(s.label) % RUN_COLOURS.length];
      let d = '';
      let pen = false;
      s.values.forEach((v, k) => {
        if (!Number.isFinite(v) || !(spec.years[k] > 0)) {
          pen = false;
          return;
        }
        d += `${pen ? 'L' : 'M'}${r2(X(spec.years[k]))},${r2(Y(v))}`;
        pen = true;
      });
      g.append(el('path', { d, fill: 'none', stroke: colour, 'stroke-width': 0.9 }));
    }
    g.append(frame(r));
    svg.append(g);
  });
  legend(svg, W - legendW + 4, top + 16, labels.map((l, i) => ({ label: l, colour: RUN_COLOURS[i % RUN_COLOURS.length], marker: 'line' as const })), 'Layer');
  return { name: spec.name, title: spec.title, svg, widthPt: W, heightPt: H };
}
