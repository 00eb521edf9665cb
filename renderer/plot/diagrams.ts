/**
 * Taylor diagram (Taylor 2001) and target diagram (Jolliff et al. 2009) of skill rows, one point per
 * run × region: colour tells the run, the marker the region; both legends are drawn.
 */
import { rmsArc, targetPoint, taylorPoint, type SkillNumbers } from '../../app/render/diagram-geometry.js';
import { s } from '../elements.js';
import { linear } from '../../app/figures/scale.js';
import { figureRoot, GRIDLINE, INK, legend, marker, MUTED, REGION_MARKERS, RUN_COLOURS, text, title, type LegendItem } from './svg-parts.js';

export interface DiagramRow extends SkillNumbers {
  run: string;
  region: string;
}

export interface DiagramSpec {
  width: number;
  height: number;
  title: string;
  subtitle: string;
  rows: DiagramRow[];
  runs: string[];
  regions: string[];
  referenceLabel: string;
}

function styleOf(spec: DiagramSpec, r: DiagramRow): { colour: string; mark: LegendItem['marker'] } {
  const ri = Math.max(0, spec.runs.indexOf(r.run));
  const gi = Math.max(0, spec.regions.indexOf(r.region));
  return { colour: RUN_COLOURS[ri % RUN_COLOURS.length], mark: REGION_MARKERS[gi % REGION_MARKERS.length] };
}

/** Run and region legends; returns their height. */
function legends(svg: SVGSVGElement, spec: DiagramSpec, x: number, y: number, skipped: number): number {
  const h1 = legend(svg, x, y, spec.runs.map((r, i) => ({ label: r, colour: RUN_COLOURS[i % RUN_COLOURS.length], marker: 'square' as const })), 'Run (colour)');
  const h2 = legend(svg, x, y + h1 + 14, spec.regions.map((g, i) => ({ label: g, colour: '#6b7280', marker: REGION_MARKERS[i % REGION_MARKERS.length] })), 'Region (marker)');
  if (skipped > 0) svg.append(text(x, y + h1 + h2 + 30, `${skipped} row${skipped > 1 ? 's' : ''} without numbers not shown`, { 'font-size': 11, fill: MUTED }));
  return h1 + h2 + 14 + (skipped > 0 ? 24 : 0);
}

export function taylorFigure(spec: DiagramSpec): SVGSVGElement {
  const svg = figureRoot(spec.width, spec.height, `Taylor diagram. ${spec.title}`);
  title(svg, 12, 18, `Taylor diagram: ${spec.title}`, spec.subtitle);
  const pts = spec.rows.map((r) => ({ r, p: taylorPoint(r) })).filter((x) => x.p !== null) as { r: DiagramRow; p: NonNullable<ReturnType<typeof taylorPoint>> }[];
  const negative = pts.some((x) => x.p.r < 0);
  const sMaxRaw = Math.max(1.25, ...pts.map((x) => x.p.s * 1.08));
  const sMax = Math.ceil(sMaxRaw / 0.25) * 0.25;
  const legendW = 200;
  const top = 58;
  const availW = spec.width - 70 - legendW - 30;
  const availH = spec.height - top - 56;
  const radius = negative ? Math.min(availW / 2, availH) : Math.min(availW, availH);
  const ox = negative ? 70 + radius : 70;
  const oy = top + radius;
  const sc = linear([0, sMax], [0, radius]);
  const X = (x: number): number => ox + sc(x);
  const Y = (y: number): number => oy - sc(y);
  const g = s('g', { fill: 'none' });
  // outer arc and radial axes
  const a0 = negative ? Math.PI : Math.PI / 2;
  g.append(s('path', { d: `M${X(sMax)},${Y(0)} A${radius},${radius} 0 0 0 ${X(sMax * Math.cos(a0))},${Y(sMax * Math.sin(a0))}`, stroke: INK, 'stroke-width': 1 }));
  g.append(s('line', { x1: X(negative ? -sMax : 0), y1: Y(0), x2: X(sMax), y2: Y(0), stroke: INK }));
  if (!negative) g.append(s('line', { x1: X(0), y1: Y(0), x2: X(0), y2: Y(sMax), stroke: INK }));
  // standard deviation arcs
  for (let sd = 0.25; sd < sMax + 1e-9; sd += 0.25) {
    const major = Math.abs(sd - Math.round(sd)) < 1e-9;
    const end = negative ? -sd : 0;
    g.append(s('path', { d: `M${X(sd)},${Y(0)} A${sc(sd)},${sc(sd)} 0 0 0 ${X(end)},${Y(negative ? 0 : sd)}`, stroke: Math.abs(sd - 1) < 1e-9 ? '#8a929b' : GRIDLINE, 'stroke-width': Math.abs(sd - 1) < 1e-9 ? 1 : 0.7, 'stroke-dasharray': Math.abs(sd - 1) < 1e-9 ? '4 3' : '' }));
    if (major || sMax <= 2) {
      svg.append(text(X(sd), Y(0) + 15, sd.toFixed(2).replace(/0$/, ''), { 'text-anchor': 'middle', 'font-size': 11 }));
      if (!negative) svg.append(text(X(0) - 6, Y(sd) + 4, sd.toFixed(2).replace(/0$/, ''), { 'text-anchor': 'end', 'font-size': 11 }));
    }
  }
  // correlation rays and labels
  const corrs = [0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 0.95, 0.99];
  const allCorrs = negative ? [...corrs.filter((c) => c > 0).map((c) => -c), ...corrs] : corrs;
  for (const c of allCorrs) {
    // in a quarter disc the y axis itself is r = 0; its label would sit on the axis' own ticks
    if (c === 0 && !negative) continue;
    const th = Math.acos(c);
    const x = Math.cos(th);
    const y = Math.sin(th);
    g.append(s('line', { x1: X(0), y1: Y(0), x2: X(sMax * x), y2: Y(sMax * y), stroke: GRIDLINE, 'stroke-width': 0.6 }));
    const lx = X((sMax + sMax * 0.045) * x);
    const ly = Y((sMax + sMax * 0.045) * y);
    svg.append(text(lx, ly + 4, String(c), { 'text-anchor': x >= 0 ? 'start' : 'end', 'font-size': 10.5, fill: MUTED }));
  }
  // the word along the outer arc, outside the correlation labels, tangent to the arc
  const ca = negative ? Math.PI / 2 : Math.PI / 4;
  const clx = X(sMax * 1.13 * Math.cos(ca));
  const cly = Y(sMax * 1.13 * Math.sin(ca));
  svg.append(text(clx, cly, 'Correlation', { 'font-size': 12, fill: INK, transform: negative ? '' : `rotate(45 ${clx} ${cly})`, 'text-anchor': 'middle' }));
  // centred RMS difference arcs around the reference point
  for (const e of [0.25, 0.5, 0.75, 1, 1.25, 1.5]) {
    for (const arc of rmsArc(e, sMax, negative)) {
      g.append(s('path', { d: arc.map(([x, y], i) => `${i ? 'L' : 'M'}${X(x).toFixed(2)},${Y(y).toFixed(2)}`).join(''), stroke: '#9bb8d3', 'stroke-width': 0.8, 'stroke-dasharray': '3 3' }));
      const [lx, ly] = arc[Math.floor(arc.length * 0.6)];
      if (arc.length > 8) svg.append(text(X(lx), Y(ly) - 3, e.toFixed(2), { 'font-size': 10, fill: '#4a77a3' }));
    }
  }
  svg.append(g);
  svg.append(text(X(sMax / 2), Y(0) + 36, `Standard deviation, normalised by the reference's (σ model / σ reference)`, { 'text-anchor': 'middle', 'font-size': 12 }));
  // reference point and the rows
  svg.append(marker('star', X(1), Y(0), '#111111', 6));
  const dots = s('g', { class: 'points' });
  for (const { r, p } of pts) {
    const st = styleOf(spec, r);
    const m = marker(st.mark, X(p.x), Y(p.y), st.colour, 5.5);
    m.append(s('title', {}, `${r.run}, ${r.region}: r = ${p.r.toFixed(3)}, σm/σr = ${p.s.toFixed(3)}, E'/σr = ${p.e.toFixed(3)}`));
    dots.append(m);
  }
  svg.append(dots);
  const used = legends(svg, spec, spec.width - legendW, top + 6, spec.rows.length - pts.length);
  const ly = top + 6 + used + 8;
  legend(svg, spec.width - legendW, ly, [{ label: `${spec.referenceLabel} (reference)`, colour: '#111111', marker: 'star' }]);
  svg.append(text(spec.width - legendW, ly + 24, "Dashed blue arcs: centred RMS", { 'font-size': 10.5, fill: MUTED }));
  svg.append(text(spec.width - legendW, ly + 38, "difference E'/σr", { 'font-size': 10.5, fill: MUTED }));
  return svg;
}

export function targetFigure(spec: DiagramSpec): SVGSVGElement {
  const svg = figureRoot(spec.width, spec.height, `Target diagram. ${spec.title}`);
  title(svg, 12, 18, `Target diagram: ${spec.title}`, spec.subtitle);
  const pts = spec.rows.map((r) => ({ r, p: targetPoint(r) })).filter((x) => x.p !== null) as { r: DiagramRow; p: NonNullable<ReturnType<typeof targetPoint>> }[];
  const extent = Math.max(1.25, ...pts.map((x) => Math.max(Math.abs(x.p.x), Math.abs(x.p.y)) * 1.1));
  const m = Math.ceil(extent / 0.25) * 0.25;
  const legendW = 200;
  const top = 58;
  const size = Math.min(spec.width - 90 - legendW - 30, spec.height - top - 60);
  const plot = { x: 80, y: top, w: size, h: size };
  const sx = linear([-m, m], [plot.x, plot.x + size]);
  const sy = linear([-m, m], [plot.y + size, plot.y]);
  const g = s('g', { fill: 'none' });
  for (const t of sx.ticks(8)) {
    g.append(s('line', { x1: sx(t), x2: sx(t), y1: plot.y, y2: plot.y + size, stroke: GRIDLINE, 'stroke-width': 0.6 }));
    g.append(s('line', { y1: sy(t), y2: sy(t), x1: plot.x, x2: plot.x + size, stroke: GRIDLINE, 'stroke-width': 0.6 }));
    svg.append(text(sx(t), plot.y + size + 15, sx.tickText(t, 8), { 'text-anchor': 'middle', 'font-size': 11 }));
    svg.append(text(plot.x - 6, sy(t) + 4, sx.tickText(t, 8), { 'text-anchor': 'end', 'font-size': 11 }));
  }
  g.append(s('line', { x1: sx(0), x2: sx(0), y1: plot.y, y2: plot.y + size, stroke: INK, 'stroke-width': 0.8 }));
  g.append(s('line', { y1: sy(0), y2: sy(0), x1: plot.x, x2: plot.x + size, stroke: INK, 'stroke-width': 0.8 }));
  for (const rr of [0.5, 1]) {
    if (rr > m) continue;
    g.append(s('circle', { cx: sx(0), cy: sy(0), r: sx(rr) - sx(0), stroke: rr === 1 ? '#8a929b' : '#9bb8d3', 'stroke-width': rr === 1 ? 1 : 0.8, 'stroke-dasharray': '4 3' }));
    svg.append(text(sx(rr * Math.SQRT1_2) + 3, sy(rr * Math.SQRT1_2) - 3, `RMSD/σr = ${rr}`, { 'font-size': 10, fill: '#4a77a3' }));
  }
  g.append(s('rect', { x: plot.x, y: plot.y, width: size, height: size, stroke: INK, 'stroke-width': 0.9 }));
  svg.append(g);
  svg.append(text(plot.x + size / 2, plot.y + size + 36, "Unbiased RMS difference E'/σr, signed by σm − σr", { 'text-anchor': 'middle', 'font-size': 12 }));
  const cx = plot.x - 48;
  const cy = plot.y + size / 2;
  svg.append(text(cx, cy, 'Bias / σr (model − reference)', { 'text-anchor': 'middle', 'font-size': 12, transform: `rotate(-90 ${cx} ${cy})` }));
  const dots = s('g', { class: 'points' });
  for (const { r, p } of pts) {
    const st = styleOf(spec, r);
    const mk = marker(st.mark, sx(p.x), sy(p.y), st.colour, 5.5);
    mk.append(s('title', {}, `${r.run}, ${r.region}: bias/σr = ${p.y.toFixed(3)}, signed E'/σr = ${p.x.toFixed(3)}, RMSD/σr = ${p.d.toFixed(3)}`));
    dots.append(mk);
  }
  svg.append(dots);
  legends(svg, spec, spec.width - legendW, top + 6, spec.rows.length - pts.length);
  return svg;
}
