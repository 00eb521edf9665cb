/**
 * A depth section figure: distance along the section (latitude or longitude) across, depth downwards,
 * the field as a raster, the seafloor filled below the deepest water, a colour bar with units.
 */
import type { ColourScale } from '../../app/render/colour-scales.js';
import { findInterval } from '../../app/render/pixel-lookup.js';
import { paletteIndex } from '../../app/render/recolour.js';
import { h, s } from '../elements.js';
import { linear, stretchedDepth } from '../../app/figures/scale.js';
import { bottomAxis, colourBar, figureRoot, INK, leftAxis, title, type Rect } from './svg-parts.js';

export interface SectionFigureSpec {
  width: number;
  height: number;
  title: string;
  subtitle: string;
  /** sample edges along the section (n + 1) */
  edges: ArrayLike<number>;
  axisLabel: string;
  formatX?: (v: number) => string;
  depthEdges: ArrayLike<number>;
  /** deepest depth shown, m */
  depthMax: number;
  /** level-major [k * n + s] */
  values: Float32Array;
  seafloor: ArrayLike<number>;
  scale: ColourScale;
  min: number;
  max: number;
  units: string;
  caption: string;
  /** raster rows per figure unit (2 for print) */
  rasterScale?: number;
  /** depth axis stretched over the upper 1000 m */
  stretch?: boolean;
  /** marks along the top axis (waypoints of a line): position on the x axis and a short label */
  marks?: { at: number; label: string }[];
}

export const SEAFLOOR = '#6f6a63';

export function sectionFigure(spec: SectionFigureSpec): { svg: SVGSVGElement; plot: Rect } {
  const svg = figureRoot(spec.width, spec.height, `${spec.title}. ${spec.subtitle}`);
  title(svg, 12, 18, spec.title, spec.subtitle);
  // waypoint marks take a row of their own above the plot, below the subtitle
  const top = spec.marks?.length ? 72 : 52;
  const plot: Rect = { x: 76, y: top, w: spec.width - 76 - 120, h: spec.height - top - 48 };
  const n = spec.edges.length - 1;
  const x0 = spec.edges[0];
  const x1 = spec.edges[n];
  const sx = linear([x0, x1], [plot.x, plot.x + plot.w]);
  const sy = spec.stretch ? stretchedDepth(spec.depthMax, [plot.y, plot.y + plot.h]) : linear([0, spec.depthMax], [plot.y, plot.y + plot.h]);

  // raster: one column per sample, rows by depth
  const rows = Math.max(1, Math.round(plot.h * (spec.rasterScale ?? 1)));
  const canvas = h('canvas', { width: n, height: rows });
  const ctx = canvas.getContext('2d');
  if (ctx) {
    const img = ctx.createImageData(n, rows);
    const nz = spec.depthEdges.length - 1;
    for (let r = 0; r < rows; r++) {
      const depth = sy.invert(plot.y + ((r + 0.5) / rows) * plot.h);
      const k = findInterval(spec.depthEdges, depth);
      if (k < 0 || k >= nz) continue;
      for (let q = 0; q < n; q++) {
        const v = spec.values[k * n + q];
        const c = paletteIndex(v, spec.min, spec.max, spec.scale.packed.length);
        if (c < 0) continue;
        const o = (r * n + q) * 4;
        img.data[o] = spec.scale.rgb[c * 3];
        img.data[o + 1] = spec.scale.rgb[c * 3 + 1];
        img.data[o + 2] = spec.scale.rgb[c * 3 + 2];
        img.data[o + 3] = 255;
      }
    }
    ctx.putImageData(img, 0, 0);
  }
  svg.append(s('rect', { x: plot.x, y: plot.y, width: plot.w, height: plot.h, fill: '#e9eaec' }));
  svg.append(s('image', { x: plot.x, y: plot.y, width: plot.w, height: plot.h, preserveAspectRatio: 'none', href: canvas.toDataURL('image/png'), style: 'image-rendering:pixelated', class: 'section-raster' }));

  // seafloor: filled below the deepest water of each sample; dry samples are filled to the surface
  let d = `M${sx(x0).toFixed(2)},${(plot.y + plot.h).toFixed(2)}`;
  for (let q = 0; q < n; q++) {
    const f = spec.seafloor[q];
    const y = Number.isFinite(f) ? sy(Math.min(f, spec.depthMax)) : plot.y;
    d += `L${sx(spec.edges[q]).toFixed(2)},${y.toFixed(2)}L${sx(spec.edges[q + 1]).toFixed(2)},${y.toFixed(2)}`;
  }
  d += `L${sx(x1).toFixed(2)},${(plot.y + plot.h).toFixed(2)}Z`;
  svg.append(s('path', { d, fill: SEAFLOOR, stroke: '#3b3833', 'stroke-width': 0.6, class: 'seafloor' }));
  svg.append(s('rect', { x: plot.x, y: plot.y, width: plot.w, height: plot.h, fill: 'none', stroke: INK, 'stroke-width': 0.9 }));

  if (spec.marks?.length) {
    const g = s('g', { class: 'waypoint-marks' });
    for (const m of spec.marks) {
      const x = sx(m.at);
      g.append(s('path', { d: `M${x - 5},${plot.y - 9}L${x + 5},${plot.y - 9}L${x},${plot.y - 1}Z`, fill: INK }));
      g.append(s('text', { x, y: plot.y - 12, 'text-anchor': 'middle', 'font-size': 11, 'font-weight': 600 }, m.label));
      g.append(s('line', { x1: x, x2: x, y1: plot.y, y2: plot.y + plot.h, stroke: '#ffffff', 'stroke-width': 0.8, 'stroke-dasharray': '3 3', 'stroke-opacity': 0.8 }));
    }
    svg.append(g);
  }
  const axes = s('g', {});
  bottomAxis(axes, plot, sx, spec.axisLabel, { ticks: 8, format: spec.formatX });
  leftAxis(axes, plot, sy, spec.stretch ? 'Depth (m), upper 1000 m stretched' : 'Depth (m)', { ticks: 7 });
  svg.append(axes);
  const barH = Math.min(plot.h * 0.85, 300);
  colourBar(svg, { x: plot.x + plot.w + 18, y: plot.y + (plot.h - barH) / 2, w: 14, h: barH }, spec.scale, spec.min, spec.max, spec.units, spec.caption);
  return { svg, plot };
}

export const latText = (v: number): string => (v === 0 ? '0°' : `${Math.abs(v)}°${v < 0 ? 'S' : 'N'}`);
export const lonText = (v: number): string => {
  const l = ((((v + 180) % 360) + 360) % 360) - 180;
  return l === 0 ? '0°' : Math.abs(l) === 180 ? '180°' : `${Math.abs(l)}°${l < 0 ? 'W' : 'E'}`;
};
