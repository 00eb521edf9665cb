/**
 * One depth section as a figure: a meridian, a parallel or a zonal mean of one field (a run, the reference, or
 * their difference), the seafloor filled, the depth axis linear or stretched over the upper ocean, and a colour
 * bar with units below. The workbench's Section view shows this figure and exports the same one.
 */
import type { ColourScale } from '../render/colour-scales.js';
import { FONT_PT, widthPt, type FigureWidth } from './page.js';
import { colourBarH, figureRoot, figureTitle, LEFT_AXIS_PT, type Figure, type Rect } from './parts.js';
import { deepestWater, MARK_ROW_PT, sectionPanel, type SectionMark } from './section-panel.js';
import type { SectionGrid } from './section-raster.js';
import { el } from './svg-tree.js';
import { typesetUnits } from './typeset.js';

export interface SectionFigureSpec {
  name: string;
  title: string;
  subtitle?: string;
  width: FigureWidth;
  grid: SectionGrid;
  /** level-major values[k * n + s] */
  values: ArrayLike<number>;
  seafloor: ArrayLike<number>;
  scale: ColourScale;
  limits: [number, number];
  /** the colour bar's label before its units, e.g. "PO4" or "PO4, run minus reference" */
  quantity: string;
  units: string;
  xLabel: string;
  formatX?: (v: number) => string;
  /** deepest depth drawn (m); the deepest water when left out */
  depthMax?: number;
  stretch?: boolean;
  marks?: SectionMark[];
}

const X_AXIS = FONT_PT.tick * 2 + 12;
const BAR = 5 + 24;

export function sectionFigure(spec: SectionFigureSpec): Figure {
  const W = widthPt(spec.width);
  const scratch = el('g');
  const top = figureTitle(scratch, 6, FONT_PT.title + 2, W - 12, spec.title, spec.subtitle);
  const marksH = spec.marks?.length ? MARK_ROW_PT : 0;
  const plot: Rect = { x: LEFT_AXIS_PT + 6, y: top + marksH + 2, w: W - LEFT_AXIS_PT - 14, h: (W - LEFT_AXIS_PT) * (spec.width === 'double' ? 0.42 : 0.6) };
  const barY = plot.y + plot.h + X_AXIS + 4;
  const H = barY + BAR + 2;
  const svg = figureRoot(W, H, `${spec.title}${spec.subtitle ? `. ${spec.subtitle}` : ''}`);
  for (const c of scratch.children) svg.append(c);
  svg.append(
    sectionPanel(plot, {
      grid: spec.grid,
      values: spec.values,
      scale: spec.scale,
      limits: spec.limits,
      seafloor: spec.seafloor,
      depthMax: spec.depthMax ?? deepestWater(spec.seafloor, spec.grid.depthEdges),
      stretch: spec.stretch,
      marks: spec.marks,
      xLabel: spec.xLabel,
      formatX: spec.formatX,
      title: '',
      emptyText: 'No values along this section',
      xTicks: 8,
      depthTicks: 6,
      className: 'panel section',
      panelId: 'section',
    }),
  );
  const bars = el('g', { class: 'colour-bars' });
  colourBarH(bars, { x: plot.x + plot.w * 0.2, y: barY, w: plot.w * 0.6, h: 5 }, spec.scale, spec.limits[0], spec.limits[1], `${spec.quantity} (${typesetUnits(spec.units)})`);
  svg.append(bars);
  return { name: spec.name, title: spec.title, svg, widthPt: W, heightPt: H };
}
