/**
 * Spin-up drift: for each tracer, the change of its mean since the first snapshot against model years on a
 * logarithmic axis (decades of spin-up read as equal steps), one line per depth layer.
 */
import { FONT_PT, widthPt, type FigureWidth } from './page.js';
import { figureRoot, figureTitle, LEFT_AXIS_PT, legend, RUN_COLOURS, text, type Figure, type Rect } from './parts.js';
import { logLinePanel, YEAR_LABEL, yearDomain } from './log-lines.js';
import { el } from './svg-tree.js';
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
  const domain = yearDomain(spec.years);
  const labels = [...new Set(spec.panels.flatMap((p) => p.series.map((s) => s.label)))];
  spec.panels.forEach((p, i) => {
    const r: Rect = { x: LEFT_AXIS_PT + 4 + (i % cols) * (colW + LEFT_AXIS_PT + 8), y: top + Math.floor(i / cols) * rowH + FONT_PT.panelTitle + 4, w: colW, h: panelH };
    const g = el('g', { class: 'panel' });
    g.append(text(r.x, r.y - 3, `${p.tracer}: change since year ${spec.years[0]}`, { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold', class: 'panel-title' }));
    const series = p.series.map((sr) => ({ xs: spec.years, ys: sr.values, colour: RUN_COLOURS[labels.indexOf(sr.label) % RUN_COLOURS.length], label: `${p.tracer}, ${sr.label}` }));
    logLinePanel(g, r, domain, series, YEAR_LABEL, `Change (${typesetUnits(p.units)})`, { zeroLine: true, yTicks: 4, points: false });
    svg.append(g);
  });
  legend(svg, W - legendW + 4, top + 16, labels.map((l, i) => ({ label: l, colour: RUN_COLOURS[i % RUN_COLOURS.length], marker: 'line' as const })), 'Layer');
  return { name: spec.name, title: spec.title, svg, widthPt: W, heightPt: H };
}
