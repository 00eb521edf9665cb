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
  /** which diagrams, side by side (default both) */
  kinds?: DiagramKind[];
  /** the Taylor diagram shows only the square around the reference point that holds every run (runs that pile up there) */
  zoom?: boolean;
}

export type DiagramKind = 'taylor' | 'target';

function styleOf(spec: DiagramsSpec, r: DiagramRow) {
  const ri = Math.max(0, spec.runs.indexOf(r.run));
  const gi = Math.max(0, spec.regions.indexOf(r.region));
  return { colour: RUN_COLOURS[ri % RUN_COLOURS.length], mark: REGION_MARKERS[gi % REGION_MARKERS.length] };
}

const label = (x: number, y: number, s: string, extra: Record<string, string | number> = {}) => text(x, y, s, { 'font-size': FONT_PT.tick, ...extra });

type Placed = { r: DiagramRow; p: NonNullable<ReturnType<typeof taylorPoint>> };

/** The square (normalised units) around the reference point (1, 0) that holds every point, resting on the σ axis. */
export function zoomWindow(pts: { x: number; y: number }[], sMax: number): { x0: number; x1: number; y0: number; y1: number } | null {
  const d = Math.max(0.02, ...pts.map((p) => Math.hypot(p.x - 1, p.y))) * 1.25;
  // no gain when the square would be most of the diagram
  if (2 * d > sMax * 0.6) return null;
  return { x0: 1 - d, x1: 1 + d, y0: 0, y1: 2 * d };
}

/** Correlations worth a ray inside an angle of `thetaMax`: the usual ones, then finer near 1, at most eight. */
function correlationTicks(thetaMax: number): number[] {
  const candidates = [0.2, 0.4, 0.6, 0.8, 0.9, 0.95, 0.97, 0.98, 0.99, 0.995, 0.998, 0.999, 0.9995, 0.9998, 0.9999];
  const inside = candidates.filter((c) => Math.acos(c) < thetaMax * 0.97);
  while (inside.length > 8) inside.splice(0, 1);
  return inside;
}

function taylor(g: SvgNode, spec: DiagramsSpec, ox: number, oy: number, radius: number): number {
  const pts = spec.rows.map((r) => ({ r, p: taylorPoint(r) })).filter((x) => x.p !== null) as Placed[];
  const sMax = Math.ceil(Math.max(1.25, ...pts.map((x) => Math.min(3, x.p.s) * 1.08)) / 0.25) * 0.25;
  const win = spec.zoom ? zoomWindow(pts.map((x) => x.p), sMax) : null;
  if (win) taylorZoomed(g, spec, pts, ox, oy, radius, win);
  else taylorWhole(g, spec, pts, ox, oy, radius, sMax);
  return spec.rows.length - pts.length;
}

function taylorWhole(g: SvgNode, spec: DiagramsSpec, pts: Placed[], ox: number, oy: number, radius: number, sMax: number): void {
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
    g.append(label(X(sMax * 1.03 * Math.cos(th)), Y(sMax * 1.03 * Math.sin(th)) + 2.5, String(c), { fill: MUTED, class: 'correlation-label' }));
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
  drawPoints(g, spec, pts, X, Y, (v) => Math.min(v, sMax));
}

let zoomClip = 0;

/** The part of the Taylor diagram around the reference point: the same arcs and rays, clipped to a square. */
function taylorZoomed(g: SvgNode, spec: DiagramsSpec, pts: Placed[], ox: number, oy: number, size: number, w: { x0: number; x1: number; y0: number; y1: number }): void {
  const sx = linear([w.x0, w.x1], [ox, ox + size]);
  const sy = linear([w.y0, w.y1], [oy, oy - size]);
  const id = `tzoom${++zoomClip}`;
  g.append(el('defs', {}, el('clipPath', { id }, el('rect', { x: r2(ox), y: r2(oy - size), width: r2(size), height: r2(size) }))));
  const lines = el('g', { fill: 'none', 'clip-path': `url(#${id})` });
  const poly = (pts2: [number, number][]) => pts2.map(([x, y], i) => `${i ? 'L' : 'M'}${r2(sx(x))},${r2(sy(y))}`).join('');
  const arc = (cx: number, r: number, from: number, to: number): [number, number][] => {
    const out: [number, number][] = [];
    for (let i = 0; i <= 120; i++) {
      const a = from + ((to - from) * i) / 120;
      out.push([cx + r * Math.cos(a), r * Math.sin(a)]);
    }
    return out;
  };
  // standard deviation: arcs about the origin, labelled where they meet the σ axis
  const rMin = Math.max(0, w.x0);
  const rMax = Math.hypot(w.x1, w.y1);
  const sdScale = linear([rMin, rMax], [0, 1]);
  for (const sd of sdScale.ticks(6)) {
    if (sd <= 0) continue;
    const one = Math.abs(sd - 1) < 1e-9;
    lines.append(el('path', { d: poly(arc(0, sd, 0, Math.PI / 2)), stroke: one ? '#8a929b' : GRIDLINE, 'stroke-width': 0.5, ...(one ? { 'stroke-dasharray': '2 1.5' } : {}) }));
    if (sd >= w.x0 && sd <= w.x1) g.append(label(sx(sd), oy + FONT_PT.tick + 2, sdScale.tickText(sd, 6), { 'text-anchor': 'middle' }));
  }
  // correlation: rays from the origin, labelled where they leave the square
  const thetaMax = Math.atan2(w.y1, Math.max(1e-9, w.x0));
  for (const c of correlationTicks(thetaMax)) {
    const th = Math.acos(c);
    const far = Math.min(w.x1 / Math.cos(th), w.y1 / Math.sin(th));
    lines.append(el('line', { x1: r2(sx(0)), y1: r2(sy(0)), x2: r2(sx(far * Math.cos(th))), y2: r2(sy(far * Math.sin(th))), stroke: GRIDLINE, 'stroke-width': 0.4 }));
    const top = w.y1 / Math.sin(th) <= w.x1 / Math.cos(th);
    const lx = sx(far * Math.cos(th)) + (top ? 0 : 3);
    const ly = sy(far * Math.sin(th)) + (top ? -2.5 : 2.5);
    g.append(label(lx, ly, String(c), { fill: MUTED, 'text-anchor': top ? 'middle' : 'start', class: 'correlation-label' }));
  }
  // centred RMS difference: arcs about the reference point, labelled at their top
  const eScale = linear([0, Math.min(w.x1 - 1, w.y1) * 0.95], [0, 1]);
  for (const e of eScale.ticks(4)) {
    if (e <= 0) continue;
    lines.append(el('path', { d: poly(arc(1, e, 0, Math.PI)), stroke: '#9bb8d3', 'stroke-width': 0.5, 'stroke-dasharray': '2 2' }));
    g.append(label(sx(1) + 2, sy(e) - 1.5, eScale.tickText(e, 4), { fill: '#4d7aa6' }));
  }
  g.append(lines);
  g.append(el('rect', { x: r2(ox), y: r2(oy - size), width: r2(size), height: r2(size), fill: 'none', stroke: INK, 'stroke-width': 0.6 }));
  g.append(text(ox + size / 2, oy + FONT_PT.tick * 2 + 6, 'Standard deviation / σ reference (1), near the reference', { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'axis-label' }));
  g.append(marker('star', sx(1), sy(0), '#111111', 3));
  drawPoints(g, spec, pts, sx, sy, (v) => v);
}

function drawPoints(g: SvgNode, spec: DiagramsSpec, pts: Placed[], X: (x: number) => number, Y: (y: number) => number, clamp: (v: number) => number): void {
  const group = el('g', { class: 'points' });
  for (const { r, p } of pts) {
    const st = styleOf(spec, r);
    const m = marker(st.mark, X(clamp(p.x)), Y(clamp(p.y)), st.colour, 2.6);
    m.append(el('title', {}, `${r.run}, ${r.region}: r = ${p.r.toFixed(3)}, σm/σr = ${p.s.toFixed(3)}`));
    group.append(m);
  }
  g.append(group);
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
  const group = el('g', { class: 'points' });
  for (const { r, p } of pts) {
    const st = styleOf(spec, r);
    const mk = marker(st.mark, sx(Math.max(-m, Math.min(m, p.x))), sy(Math.max(-m, Math.min(m, p.y))), st.colour, 2.6);
    mk.append(el('title', {}, `${r.run}, ${r.region}: bias/σr = ${p.y.toFixed(3)}, E'/σr = ${p.x.toFixed(3)}`));
    group.append(mk);
  }
  g.append(group);
}

export function diagramsFigure(spec: DiagramsSpec): Figure {
  const W = widthPt(spec.width);
  const kinds = spec.kinds?.length ? spec.kinds : (['taylor', 'target'] as DiagramKind[]);
  // the legend as wide as its longest label (run labels can be long), within reason
  const longest = Math.max(10, ...spec.runs.map((r) => r.length), ...spec.regions.map((r) => r.length));
  const legendW = Math.min(W * 0.3, Math.max(92, 20 + longest * FONT_PT.label * 0.58));
  const scratch = el('g');
  const top = figureTitle(scratch, 6, FONT_PT.title + 2, W - 12, spec.title, spec.subtitle);
  const size = Math.min((W - legendW - 40 * kinds.length - 10) / kinds.length, kinds.length === 1 ? 280 : 200);
  // room above a diagram for its panel title and, clear of it, the correlation labels beyond the arc
  const plotTop = top + 14 + FONT_PT.tick + 4;
  const H = plotTop + size + FONT_PT.tick * 2 + 14;
  const svg = figureRoot(W, H, `${spec.title}${spec.subtitle ? `. ${spec.subtitle}` : ''}`);
  for (const c of scratch.children) svg.append(c);
  const g = el('g', { class: 'diagrams' });
  let skipped = 0;
  kinds.forEach((kind, i) => {
    const x = 30 + i * (size + 40);
    if (kind === 'taylor') {
      g.append(text(x, top + 6, spec.zoom ? 'Taylor diagram, near the reference' : 'Taylor diagram', { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold', class: 'panel-title' }));
      skipped = taylor(g, spec, x, plotTop + size, size);
    } else {
      g.append(text(x, top + 6, 'Target diagram', { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold', class: 'panel-title' }));
      target(g, spec, x, plotTop, size);
    }
  });
  const lx = W - legendW;
  let ly = top + 10;
  ly += legend(g, lx, ly, spec.runs.map((r, i) => ({ label: r, colour: RUN_COLOURS[i % RUN_COLOURS.length], marker: 'square' as const })), 'Run (colour)') + 6;
  ly += legend(g, lx, ly, spec.regions.map((r, i) => ({ label: r, colour: '#6b7280', marker: REGION_MARKERS[i % REGION_MARKERS.length] })), 'Region (shape)') + 6;
  legend(g, lx, ly, [{ label: 'reference', colour: '#111111', marker: 'star' }]);
  if (skipped > 0) g.append(text(lx, ly + 16, `${skipped} without numbers`, { 'font-size': FONT_PT.tick, fill: MUTED }));
  if (spec.rows.length === 0) g.append(text(W / 2, plotTop + size / 2, 'No compared cells in this layer', { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'no-data' }));
  svg.append(g);
  return { name: spec.name, title: spec.title, svg, widthPt: W, heightPt: H };
}
