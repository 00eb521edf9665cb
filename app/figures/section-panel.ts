/**
 * One depth-section panel, the part every section figure is made of (the screen's Section and Line views, the
 * report's zonal means and transects): the field as a raster, the seafloor filled below the deepest water, the
 * frame, the axes, and the waypoints of a line marked A, B, C… on the top axis. The depth axis is linear, or
 * stretched so that the upper 1000 m take half the height.
 */
import type { ColourScale } from '../render/colour-scales.js';
import { FONT_PT, INK, MM_PER_PT, NO_DATA } from './page.js';
import { bottomAxis, frame, leftAxis, r2, text, type Rect } from './parts.js';
import { linear, stretchedDepth, type Scale } from './scale.js';
import { paintSection, type SectionGrid } from './section-raster.js';
import { el, type SvgNode } from './svg-tree.js';

export const SEAFLOOR_FILL = '#8a847b';
/** room above a panel's frame that waypoint marks take (a letter over a small triangle) */
export const MARK_ROW_PT = FONT_PT.tick + 6;

export interface SectionMark {
  /** position on the x axis (distance along the line, km) */
  at: number;
  /** A, B, C… */
  label: string;
}

export interface SectionPanelSpec {
  grid: SectionGrid;
  /** level-major values[k * n + s] */
  values: ArrayLike<number>;
  scale: ColourScale;
  /** colour limits, or null when there is nothing to colour */
  limits: [number, number] | null;
  /** deepest water of each sample (m), 0 or NaN on land */
  seafloor: ArrayLike<number>;
  /** deepest depth drawn (m) */
  depthMax: number;
  stretch?: boolean;
  marks?: SectionMark[];
  xLabel: string;
  formatX?: (v: number) => string;
  /** bold title above the panel ('' for none) */
  title: string;
  /** what the empty panel says */
  emptyText: string;
  xTicks?: number;
  depthTicks?: number;
  /** raster pixels per point across the panel (print: about 200 dpi) */
  pixelsPerPt?: number;
  /** a class for the panel's group, e.g. "panel field" */
  className?: string;
  /** what the panel shows, as data-panel on its plot area (the screen's readout finds the values by it) */
  panelId?: string;
}

function hasData(v: ArrayLike<number>): boolean {
  for (let i = 0; i < v.length; i++) if (v[i] === v[i]) return true;
  return false;
}

/** The depth axis of a panel: linear over [0, depthMax], or the upper 1000 m over half the height. */
export function depthScale(depthMax: number, range: [number, number], stretch = false): Scale {
  return stretch ? stretchedDepth(depthMax, range) : linear([0, depthMax], range);
}

/** The label of a depth axis, saying when it is stretched (a reader must not take it for a linear one). */
export function depthLabel(depthMax: number, stretch = false): string {
  return stretch && depthMax > 1500 ? 'Depth (m), upper 1000 m stretched' : 'Depth (m)';
}

/** Deepest water along a section (m), or the deepest edge when no sample has water. */
export function deepestWater(seafloor: ArrayLike<number>, depthEdges: ArrayLike<number>): number {
  let d = 0;
  for (let s = 0; s < seafloor.length; s++) if (seafloor[s] > d) d = seafloor[s];
  return d > 0 ? d : depthEdges[depthEdges.length - 1];
}

/** The panel in `r`; x scale over the grid's x edges. */
export function sectionPanel(r: Rect, spec: SectionPanelSpec): SvgNode {
  const g = el('g', { class: spec.className ?? 'panel' });
  const n = spec.grid.xEdges.length - 1;
  const x0 = spec.grid.xEdges[0];
  const x1 = spec.grid.xEdges[n];
  const X = linear([x0, x1], [r.x, r.x + r.w]);
  const Y = depthScale(spec.depthMax, [r.y, r.y + r.h], spec.stretch);
  const marksH = spec.marks?.length ? MARK_ROW_PT : 0;
  if (spec.title) g.append(text(r.x, r.y - 3 - marksH, spec.title, { 'font-size': FONT_PT.panelTitle, 'font-weight': 'bold', class: 'panel-title' }));
  g.append(el('rect', { x: r2(r.x), y: r2(r.y), width: r2(r.w), height: r2(r.h), fill: NO_DATA, class: 'panel-area', 'data-panel': spec.panelId }));
  const lim = spec.limits;
  if (!hasData(spec.values) || lim === null) {
    g.append(text(r.x + r.w / 2, r.y + r.h / 2, spec.emptyText, { 'text-anchor': 'middle', 'font-size': FONT_PT.label, class: 'no-data' }));
  } else {
    const perPt = spec.pixelsPerPt ?? (MM_PER_PT * 200) / 25.4;
    const pxW = Math.max(64, Math.min(1400, Math.round(r.w * perPt)));
    const pxH = Math.max(48, Math.min(1400, Math.round(r.h * perPt)));
    const url = paintSection(spec.grid, spec.values, spec.scale, lim[0], lim[1], (f) => Y.invert(r.y + f * r.h), pxW, pxH);
    // cells stay blocks (no smoothing across their edges), and rasterisers draw it several times faster
    g.append(el('image', { x: r2(r.x), y: r2(r.y), width: r2(r.w), height: r2(r.h), preserveAspectRatio: 'none', 'image-rendering': 'optimizeSpeed', href: url, class: 'section-raster' }));
    // seafloor: filled below the deepest water of each sample; dry samples are filled to the surface
    let d = `M${r2(X(x0))},${r2(r.y + r.h)}`;
    for (let s = 0; s < n; s++) {
      const f = spec.seafloor[s];
      const y = f > 0 ? Y(Math.min(f, spec.depthMax)) : r.y;
      d += `L${r2(X(spec.grid.xEdges[s]))},${r2(y)}L${r2(X(spec.grid.xEdges[s + 1]))},${r2(y)}`;
    }
    g.append(el('path', { d: d + `L${r2(X(x1))},${r2(r.y + r.h)}Z`, fill: SEAFLOOR_FILL, stroke: '#3b3833', 'stroke-width': 0.3, class: 'seafloor' }));
  }
  if (spec.marks?.length) g.append(waypointMarks(r, X, spec.marks));
  g.append(frame(r));
  const axes = el('g', { class: 'axes' });
  bottomAxis(axes, r, X, spec.xLabel, { ticks: spec.xTicks ?? 5, format: spec.formatX });
  leftAxis(axes, r, Y, depthLabel(spec.depthMax, spec.stretch), { ticks: spec.depthTicks ?? 4 });
  g.append(axes);
  return g;
}

/** Waypoints on the top axis: a letter over a small triangle, and a faint dashed line down through the section. */
export function waypointMarks(r: Rect, X: Scale, marks: SectionMark[]): SvgNode {
  const g = el('g', { class: 'waypoint-marks' });
  for (const m of marks) {
    const x = X(m.at);
    if (!(x >= r.x - 0.5 && x <= r.x + r.w + 0.5)) continue;
    g.append(el('line', { x1: r2(x), x2: r2(x), y1: r2(r.y), y2: r2(r.y + r.h), stroke: '#ffffff', 'stroke-width': 0.4, 'stroke-dasharray': '1.5 1.5', 'stroke-opacity': 0.85 }));
    g.append(el('path', { d: `M${r2(x - 2.2)},${r2(r.y - 3.6)}L${r2(x + 2.2)},${r2(r.y - 3.6)}L${r2(x)},${r2(r.y - 0.3)}Z`, fill: INK, class: 'waypoint-mark' }));
    g.append(text(x, r.y - 4.8, m.label, { 'text-anchor': 'middle', 'font-size': FONT_PT.tick, 'font-weight': 'bold', class: 'waypoint-label' }));
  }
  return g;
}

/** The first and last samples with water under them (seafloor > 0), or null when none has. */
export function waterSpan(seafloor: ArrayLike<number>): [number, number] | null {
  let first = -1;
  let last = -1;
  for (let s = 0; s < seafloor.length; s++) {
    if (seafloor[s] > 0) {
      if (first < 0) first = s;
      last = s;
    }
  }
  return first < 0 ? null : [first, last];
}

/** Samples first..last (inclusive) of level-major values[k * n + s]. */
export function cutSamples(values: Float32Array, n: number, first: number, last: number): Float32Array {
  const nz = Math.round(values.length / n);
  const m = last - first + 1;
  const out = new Float32Array(nz * m);
  for (let k = 0; k < nz; k++) out.set(values.subarray(k * n + first, k * n + last + 1), k * m);
  return out;
}
