/**
 * The mean profile of a region: the reference (dashed) and every run against depth, depth downwards, a legend
 * beside the plot. The workbench's Profile view shows this figure and exports the same one.
 */
import { FONT_PT, INK, widthPt, type FigureWidth } from './page.js';
import { bottomAxis, figureRoot, figureTitle, frame, LEFT_AXIS_PT, leftAxis, legend, r2, RUN_COLOURS, type Figure, type LegendItem, type Rect } from './parts.js';
import { linear, padded } from './scale.js';
import { el } from './svg-tree.js';
import { typesetUnits } from './typeset.js';

export interface ProfileFigureSpec {
  name: string;
  title: string;
  subtitle?: string;
  width: FigureWidth;
  quantity: string;
  units: string;
  depthCentres: ArrayLike<number>;
  /** deepest depth drawn (m) */
  depthMax: number;
  reference: { label: string; values: ArrayLike<number> };
  runs: { label: string; values: ArrayLike<number> }[];
}

const X_AXIS = FONT_PT.tick * 2 + 12;

export function profileFigure(spec: ProfileFigureSpec): Figure {
  const W = widthPt(spec.width);
  const scratch = el('g');
  const top = figureTitle(scratch, 6, FONT_PT.title + 2, W - 12, spec.title, spec.subtitle);
  // the legend as wide as its longest label (DejaVu Sans averages ~0.55 em), so no run's name is cut
  const longest = Math.max(...[`${spec.reference.label} (reference)`, ...spec.runs.map((r) => r.label)].map((l) => l.length));
  const legendW = Math.min(W * 0.4, 24 + longest * FONT_PT.label * 0.58);
  const plotW = W - LEFT_AXIS_PT - 6 - legendW;
  const plot: Rect = { x: LEFT_AXIS_PT + 6, y: top + 4, w: plotW, h: Math.min(plotW * 0.8, 300) };
  const H = plot.y + plot.h + X_AXIS + 4;
  const svg = figureRoot(W, H, `${spec.title}${spec.subtitle ? `. ${spec.subtitle}` : ''}`);
  for (const c of scratch.children) svg.append(c);
  const nz = spec.depthCentres.length;
  const within = (k: number): boolean => spec.depthCentres[k] <= spec.depthMax;
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of [spec.reference, ...spec.runs]) {
    for (let k = 0; k < nz; k++) {
      const v = s.values[k];
      if (Number.isFinite(v) && within(k)) {
        lo = Math.min(lo, v);
        hi = Math.max(hi, v);
      }
    }
  }
  const X = linear(padded(lo, hi), [plot.x, plot.x + plot.w]);
  const Y = linear([0, spec.depthMax], [plot.y, plot.y + plot.h]);
  const axes = el('g', { class: 'axes' });
  bottomAxis(axes, plot, X, `${spec.quantity} (${typesetUnits(spec.units)})`, { grid: true, ticks: 6 });
  leftAxis(axes, plot, Y, 'Depth (m)', { grid: true, ticks: 6 });
  svg.append(axes);
  const path = (values: ArrayLike<number>): string => {
    let d = '';
    let pen = false;
    for (let k = 0; k < nz; k++) {
      const v = values[k];
      if (!Number.isFinite(v) || !within(k)) {
        pen = false;
        continue;
      }
      d += `${pen ? 'L' : 'M'}${r2(X(v))},${r2(Y(spec.depthCentres[k]))}`;
      pen = true;
    }
    return d;
  };
  const lines = el('g', { class: 'series' });
  spec.runs.forEach((r, i) => lines.append(el('path', { d: path(r.values), fill: 'none', stroke: RUN_COLOURS[i % RUN_COLOURS.length], 'stroke-width': 1, 'stroke-linejoin': 'round', class: 'series-line', 'data-label': r.label })));
  lines.append(el('path', { d: path(spec.reference.values), fill: 'none', stroke: INK, 'stroke-width': 1.2, 'stroke-dasharray': '3 2', class: 'series-line', 'data-label': spec.reference.label }));
  svg.append(lines);
  svg.append(frame(plot));
  const items: LegendItem[] = [{ label: `${spec.reference.label} (reference)`, colour: INK, marker: 'dash' }, ...spec.runs.map((r, i) => ({ label: r.label, colour: RUN_COLOURS[i % RUN_COLOURS.length], marker: 'line' as const }))];
  legend(svg, plot.x + plot.w + 8, plot.y + 6, items, 'Lines');
  if (!Number.isFinite(lo)) svg.append(el('text', { x: r2(plot.x + plot.w / 2), y: r2(plot.y + plot.h / 2), 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'no-data' }, 'No values in this region'));
  return { name: spec.name, title: spec.title, svg, widthPt: W, heightPt: H };
}
