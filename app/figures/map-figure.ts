/**
 * One map: a field (or a difference) at one depth or layer on a projection, or on a window of it (zoom), with
 * title, the raster, graticule, coastlines, longitude/latitude labels, optional labelled contours and a vertical
 * colour bar with units (logarithmic stretch and clip arrows when they apply). The Map and Difference views
 * insert this figure and paint their canvas on `plot`; their export embeds the same raster as PNG.
 */
import type { ColourScale } from '../render/colour-scales.js';
import type { MapProjection } from '../render/projections.js';
import { colourBarV, V_BAR_SIDE_PT, type ColourBarOptions } from './colour-bar.js';
import { contourGroup } from './map-contours.js';
import { mapOverlay, panelTransform, type ToPanel } from './map-frame.js';
import { FONT_PT, widthPt, type FigureWidth } from './page.js';
import { figureRoot, figureTitle, r2, type Figure, type Rect } from './parts.js';
import { el, type SvgNode } from './svg-tree.js';

export interface MapFigureSpec {
  name: string;
  title: string;
  subtitle?: string;
  width: FigureWidth;
  /** the projection, or a window of it (app/render/map-window.ts) */
  projection: MapProjection;
  /** projected coastlines (app/render/coastline.ts) */
  coast: Float64Array[];
  scale: ColourScale;
  min: number;
  max: number;
  /** what the colour bar shows, with units, e.g. "Oxygen (µmol kg⁻¹)" */
  barLabel: string;
  bar?: ColourBarOptions;
  /** the raster as a PNG data URL; absent: the screen lays its canvas on `plot` */
  raster?: string | null;
  /** labelled contours at the colour bar's ticks */
  contours?: { values: Float32Array; lonEdges: ArrayLike<number>; latEdges: ArrayLike<number> } | null;
  /** how far the window is zoomed in (1: the whole map); finer graticule and labels when zoomed */
  zoom?: number;
}

/** Graticule steps for a zoom: 60°/30° on the whole map, 30°/15° from 2.5×, 10°/10° from 6×, 5°/5° from 12×. */
export function graticuleSteps(zoom = 1): { lonStep: number; latStep: number } {
  if (zoom >= 12) return { lonStep: 5, latStep: 5 };
  if (zoom >= 6) return { lonStep: 10, latStep: 10 };
  if (zoom >= 2.5) return { lonStep: 30, latStep: 15 };
  return { lonStep: 60, latStep: 30 };
}

export interface MapFigure extends Figure {
  /** where the raster lies, in figure points */
  plot: Rect;
  /** figure points of projected coordinates */
  toFigure: ToPanel;
}

const BAR_W = 6;
const BAR_GAP = 10;

/** Where the map goes: under the title, room for labels left and below on the equirectangular map, the bar on the right. */
function layout(p: MapProjection, W: number, top: number): { plot: Rect; height: number } {
  const e = p.extent;
  const aspect = (e.ymax - e.ymin) / (e.xmax - e.xmin);
  const plate = p.info.id === 'plate';
  const left = plate ? 26 : 6;
  const below = plate ? FONT_PT.tick + 6 : 4;
  const right = BAR_GAP + BAR_W + V_BAR_SIDE_PT + 4;
  const w = W - left - right;
  const h = w * aspect;
  return { plot: { x: left, y: top, w, h }, height: top + h + below + 6 };
}

/** The figure's size and the map's place in it, without drawing it (for a raster painted before the figure). */
export function mapFigureLayout(spec: Pick<MapFigureSpec, 'projection' | 'width' | 'title' | 'subtitle'>): { widthPt: number; heightPt: number; plot: Rect; titleBlock: SvgNode } {
  const W = widthPt(spec.width);
  const titleBlock = el('g');
  const top = figureTitle(titleBlock, 6, FONT_PT.title + 2, W - 12, spec.title, spec.subtitle) + 2;
  const { plot, height } = layout(spec.projection, W, top);
  return { widthPt: W, heightPt: height, plot, titleBlock };
}

export function mapFigure(spec: MapFigureSpec): MapFigure {
  const p = spec.projection;
  const { widthPt: W, heightPt: height, plot, titleBlock: scratch } = mapFigureLayout(spec);
  const svg = figureRoot(W, height, `${spec.title}${spec.subtitle ? `. ${spec.subtitle}` : ''}`);
  for (const c of scratch.children) svg.append(c);
  const to = panelTransform(p, plot);

  const raster = el('g', { class: 'raster' });
  if (spec.raster) raster.append(el('image', { x: r2(plot.x), y: r2(plot.y), width: r2(plot.w), height: r2(plot.h), preserveAspectRatio: 'none', 'image-rendering': 'optimizeSpeed', href: spec.raster }));
  svg.append(raster);
  if (spec.contours) svg.append(contourGroup({ ...spec.contours, min: spec.min, max: spec.max, log: spec.bar?.log }, p, plot, to));
  svg.append(mapOverlay(p, plot, spec.coast, { lat: true, lon: true, ...graticuleSteps(spec.zoom) }));
  // markers the screen adds (probe, stations) go here, above the map and below nothing
  svg.append(el('g', { class: 'overlay' }));

  const bars: SvgNode = el('g', { class: 'colour-bars' });
  const barH = Math.min(plot.h * 0.8, 220);
  colourBarV(bars, { x: plot.x + plot.w + BAR_GAP, y: plot.y + (plot.h - barH) / 2, w: BAR_W, h: barH }, spec.scale, spec.min, spec.max, spec.barLabel, spec.bar);
  svg.append(bars);
  return { name: spec.name, title: spec.title, svg, widthPt: W, heightPt: height, plot, toFigure: to };
}
