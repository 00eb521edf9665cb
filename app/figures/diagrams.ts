/**
 * Taylor diagram (Taylor 2001) beside a target diagram (Jolliff et al. 2009) for one variable and layer: one
 * point per run × region, colour for the run and marker shape for the region, both normalised by the
 * reference's standard deviation (app/render/diagram-geometry.ts).
 */
import { rmsArc, targetPoint, taylorPoint, type SkillNumbers } from '../render/diagram-geometry.js';
import { FONT_PT, GRIDLINE, INK, MUTED, widthPt, type FigureWidth } from './page.js';
import { figureRoot, figureTitle, legend, marker, r2, REGION_MARKERS, RUN_COLOURS, text, type Figure } from './parts.js';
import { linear } from './scale.js';
import { el, type SvgNode } from './svg-tree.js';

export interface DiagramRow extends SkillNumbers {
  run: string;
  region: string;
}

export interface DiagramsSpec {
  name: string;
  title: string;
  subtitle?: string;
  width: FigureWidth;
  rows: DiagramRow[];
  runs: string[];
  regions: string[];
  referenceLabel: string;
}

function styleOf(spec: DiagramsSpec, r: DiagramRow) {
  const ri = Math.max(0, spec.runs.indexOf(r.run));
  const gi = Math.max(0, spec.regions.indexOf(r.region));
  return { colour: RUN_COLOURS[ri % RUN_COLOURS.length], mark: REGION_MARKERS[gi % REGION_MARKERS.length] };
}

const label = (x: number, y: number, s: string, extra: Record<string, string | number> = {}) => text(x, y, s, { 'font-size': FONT_PT.tick, ...extra });

function taylor(g: SvgNode, spec: DiagramsSpec, ox: number, oy: number, radius: number): number {
  const pts = spec.rows.map((r) => ({ r, p: taylorPoint(r) })).filter((x) => x.p !== null) as { r: DiagramRow; p: NonNullable<ReturnType<typeof taylorPoint>> }[];
  const sMax = Math.ceil(Math.max(1.25, ...pts.map((x) => Math.min(3, x.p.s) * 1.08)) / 0.25) * 0.25;
  const sc = linear([0, sMax], [0, radius]);
  const X = (x: number) => ox + sc(x);
  const Y = (y: number) => oy - sc(y);
  const lines = el('g', { fill: 'none' });
  lines.append(el('path', { d: `M${r2(X(sMax))},${r2(Y(0))} A${r2(radius)},${r2(radius)} 0 0 0 ${r2(X(0))},${r2(Y(sMax))}`, stroke: INK, 'stroke-width': 0.6 }));
  lines.append(el('line', { x1: r2(X(0)), y1: r2(Y(0)), x2: r2(X(sMax)), y2: r2(Y(0)), stroke: INK, 'stroke-width': 0.6 }));
  lines.append(el('line', { x1: r2(X(0)), y1: r2(Y(0)), x2: r2(X(0)), y2: r2(Y(sMax)), stroke: INK, 'stroke-width': 0.6 }));
  for (let sd = 0.5; sd < sMax + 1e-9; sd += 0.5) {
    const one = Math.abs(sd - 1) < 1e-9;
    lines.append(el('path', { d: `M${r2(X(sd))},${r2(Y(0))} A${r2(sc(sd))},${r2(sc(sd))} 0 0 0 ${r2(X(0))},${r2(Y(sd))}`, stroke: one ? '#8a929b' : GRIDLINE, 'stroke-width': 0.5, ...(one ? { 'stroke-dasharray': '2 1.5' } : {}) }));
    g.append(label(X(sd), Y(0) + FONT_PT.tick + 2, String(sd), { 'text-anchor': 'middle' }));
    g.append(label(X(0) - 3, Y(sd) + 2.5, String(sd), { 'text-anchor': 'end' }));
  }
  for (const c of [0.2, 0.4, 0.6, 0.8, 0.9, 0.95, 0.99]) {
    const th = Math.acos(c);
    lines.append(el('line', { x1: r2(X(0)), y1: r2(Y(0)), x2: r2(X(sMax * Math.cos(th))), y2: r2(Y(sMax * Math.sin(th))), stroke: GRIDLINE, 'stroke-width': 0.4 }));
    g.append(label(X(sMax * 1.03 * Math.cos(th)), Y(sMax * 1.03 * Math.sin(th)) + 2.5, String(c), { fill: MUTED }));
  }
  for (const e of [0.5, 1, 1.5]) {
    for (const arc of rmsArc(e, sMax, false)) {
      lines.append(el('path', { d: arc.map(([x, y], i) => `${i ? 'L' : 'M'}${r2(X(x))},${r2(Y(y))}`).join(''), stroke: '#9bb8d3', 'stroke-width': 0.5, 'stroke-dasharray': '2 2' }));
    }
  }
  g.append(lines);
  const cx = X(sMax * 0.78);
  const cy = Y(sMax * 0.78) - 8;
  g.append(text(cx, cy, 'Correlation', { 'font-size': FONT_PT.label, transform: `rotate(45 ${r2(cx)} ${r2(cy)})`, 'text-anchor': 'middle' }));
  g.append(text(X(sMax / 2), Y(0) + FONT_PT.tick * 2 + 6, 'Standard deviation / σ reference (1)', { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'axis-label' }));
  g.append(marker('star', X(1), Y(0), '#111111', 3));
  for (const { r, p } of pts) {
    const st = styleOf(spec, r);
    const m = marker(st.mark, X(Math.min(p.x, sMax)), Y(Math.min(p.y, sMax)), st.colour, 2.6);
    m.append(el('title', {}, `${r.run}, ${r.region}: r = ${p.r.toFixed(3)}, σm/σr = ${p.s.toFixed(3)}`));
    g.append(m);
  }
  return spec.rows.length - pts.length;
}

function target(g: SvgNode, spec: DiagramsSpec, x0: number, y0: number, size: number): void {
  const pts = spec.rows.map((r) => ({ r, p: targetPoint(r) })).filter((x) => x.p !== null) as { r: DiagramRow; p: NonNullable<ReturnType<typeof targetPoint>> }[];
  const m = Math.ceil(Math.max(1.25, ...pts.map((x) => Math.min(4, Math.max(Math.abs(x.p.x), Math.abs(x.p.y))) * 1.1)) / 0.25) * 0.25;
  const sx = linear([-m, m], [x0, x0 + size]);
  const sy = linear([-m, m], [y0 + size, y0]);
  const lines = el('g', { fill: 'none' });
  for (const t of sx.ticks(4)) {
    lines.append(el('line', { x1: r2(sx(t)), x2: r2(sx(t)), y1: r2(y0), y2: r2(y0 + size), stroke: GRIDLINE, 'stroke-width': 0.4 }));
    lines.append(el('line', { y1: r2(sy(t)), y2: r2(sy(t)), x1: r2(x0), x2: r2(x0 + size), stroke: GRIDLINE, 'stroke-width': 0.4 }));
    g.append(label(sx(t), y0 + size + FONT_PT.tick + 2, sx.tickText(t, 4), { 'text-anchor': 'middle' }));
    g.append(label(x0 - 3, sy(t) + 2.5, sx.tickText(t, 4), { 'text-anchor': 'end' }));
  }
  lines.append(el('line', { x1: r2(sx(0)), x2: r2(sx(0)), y1: r2(y0), y2: r2(y0 + size), stroke: INK, 'stroke-width': 0.5 }));
  lines.append(el('line', { y1: r2(sy(0)), y2: r2(sy(0)), x1: r2(x0), x2: r2(x0 + size), stroke: INK, 'stroke-width': 0.5 }));
  lines.append(el('circle', { cx: r2(sx(0)), cy: r2(sy(0)), r: r2(sx(1) - sx(0)), stroke: '#8a929b', 'stroke-width': 0.5, 'stroke-dasharray': '2 1.5' }));
  lines.append(el('rect', { x: r2(x0), y: r2(y0), width: r2(size), height: r2(size), stroke: INK, 'stroke-width': 0.6 }));
  g.append(lines);
  g.append(text(x0 + size / 2, y0 + size + FONT_PT.tick * 2 + 6, "Unbiased RMS difference / σ reference, signed by σm − σr (1)", { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'axis-label' }));
  const cx = x0 - 22;
  const cy = y0 + size / 2;
  g.append(text(cx, cy, 'Bias / σ reference (1)', { 'text-anchor': 'middle', 'font-size': FONT_PT.label, transform: `rotate(-90 ${r2(cx)} ${r2(cy)})`, class: 'axis-label' }));
  for (const { r, p } of pts) {
    const st = styleOf(spec, r);
    const mk = marker(st.mark, sx(Math.max(-m, Math.min(m, p.x))), sy(Math.max(-m, Math.min(m, p.y))), st.colour, 2.6);
    mk.append(el('title', {}, `${r.run}, ${r.region}: bias/σr = ${p.y.toFixed(3)}, E'/σr = ${p.x.toFixed(3)}`));
    g.append(mk);
  }
}

export function diagramsFigure(spec: DiagramsSpec): Figure {
  const W = widthPt(spec.width);
  const legendW = 92;
  const scratch = el('g');
  const top = figureTitle(scratch, 6, FONT_PT.title + 2, W - 12, spec.title, spec.subtitle);
  const size = Math.min((W - legendW - 40 - 40) / 2, 200);
  const H = top + 14 + size + FONT_PT.tick * 2 + 14;
  const svg = figureRoot(W, H, `${spec.title}${spec.subtitle ? `. ${spec.subtitle}` : ''}`);
  for (const c of scratch.children) svg.append(c);
  const g = el('g', { class: 'diagrams' });
  g.append(text(30, top + 6, 'Taylor diagram', { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold', class: 'panel-title' }));
  const skipped = taylor(g, spec, 30, top + 14 + size, size);
  const tx = 30 + size + 40;
  g.append(text(tx, top + 6, 'Target diagram', { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold', class: 'panel-title' }));
  target(g, spec, tx, top + 14, size);
  const lx = W - legendW;
  let ly = top + 10;
  ly += legend(g, lx, ly, spec.runs.map((r, i) => ({ label: r, colour: RUN_COLOURS[i % RUN_COLOURS.length], marker: 'square' as const })), 'Run (colour)') + 6;
  ly += legend(g, lx, ly, spec.regions.map((r, i) => ({ label: r, colour: '#6b7280', marker: REGION_MARKERS[i % REGION_MARKERS.length] })), 'Region (shape)') + 6;
  legend(g, lx, ly, [{ label: 'reference', colour: '#111111', marker: 'star' }]);
  if (skipped > 0) g.append(text(lx, ly + 16, `${skipped} without numbers`, { 'font-size': FONT_PT.tick, fill: MUTED }));
  if (spec.rows.length === 0) g.append(text(W / 2, top + 14 + size / 2, 'No compared cells in this layer', { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'no-data' }));
  svg.append(g);
  return { name: spec.name, title: spec.title, svg, widthPt: W, heightPt: H };
}
