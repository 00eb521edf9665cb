/**
 * The frame of a map figure: title, the plot rectangle where the raster goes, coastlines, graticule,
 * the globe's outline and a colour bar with units. The raster itself is a canvas (screen) or an
 * embedded image (export) placed on `plot`.
 */
import type { ColourScale } from '../../app/render/colour-scales.js';
import type { MapProjection } from '../../app/render/projections.js';
import { s } from '../elements.js';
import { logTicks } from '../../app/render/colour-mapping.js';
import { formatTick, niceTicks } from '../../app/render/colour-scales.js';
import { contourSegments } from '../../app/render/contours.js';
import type { ViewGrid } from '../../contract/view-types.js';
import { colourBar, figureRoot, INK, title, type ColourBarOptions, type Rect } from './svg-parts.js';

export interface MapFigureSpec {
  width: number;
  /** upper bound of the figure's height (the map shrinks to fit) */
  maxHeight?: number;
  projection: MapProjection;
  title: string;
  subtitle: string;
  scale: ColourScale;
  min: number;
  max: number;
  units: string;
  caption: string;
  coast: Float64Array[];
  /** logarithmic stretch and clip arrows of the colour bar */
  bar?: ColourBarOptions;
  /** labelled contour lines of these values at the colour bar's ticks */
  contours?: { values: Float32Array; grid: ViewGrid } | null;
}

export interface MapFigure {
  svg: SVGSVGElement;
  plot: Rect;
  /** group above the raster where markers (probe, stations) go */
  overlay: SVGGElement;
  /** figure units of projected coordinates */
  toFigure(x: number, y: number): [number, number];
}

const TOP = 50;
const BAR_SPACE = 104;

/** Where the map itself goes in a figure of this width (and at most this height). */
export function mapPlotRect(projection: MapProjection, width: number, maxHeight?: number): Rect {
  const e = projection.extent;
  const aspect = (e.ymax - e.ymin) / (e.xmax - e.xmin);
  // the equirectangular map carries longitude and latitude ticks: room for them left and below
  const left = projection.info.id === 'plate' ? 44 : 12;
  const below = projection.info.id === 'plate' ? 34 : 16;
  let pw = width - left - 4 - BAR_SPACE;
  let ph = pw * aspect;
  if (maxHeight && TOP + ph + below > maxHeight) {
    ph = Math.max(120, maxHeight - TOP - below);
    pw = ph / aspect;
  }
  return { x: left, y: TOP, w: Math.round(pw), h: Math.round(ph) };
}

export function mapFigure(spec: MapFigureSpec): MapFigure {
  const e = spec.projection.extent;
  const plot = mapPlotRect(spec.projection, spec.width, spec.maxHeight);
  const ph = plot.h;
  const plate = spec.projection.info.id === 'plate';
  const height = TOP + ph + (plate ? 34 : 16);
  const svg = figureRoot(spec.width, height, `${spec.title}. ${spec.subtitle}`);
  title(svg, 12, 18, spec.title, spec.subtitle);

  const toFigure = (x: number, y: number): [number, number] => [
    plot.x + ((x - e.xmin) / (e.xmax - e.xmin)) * plot.w,
    plot.y + ((e.ymax - y) / (e.ymax - e.ymin)) * plot.h,
  ];

  // the raster sits under everything below (placeholder group, filled by the caller)
  svg.append(s('g', { class: 'raster' }));

  const clipId = `clip-${Math.random().toString(36).slice(2, 9)}`;
  svg.append(s('defs', {}, s('clipPath', { id: clipId }, s('rect', { x: plot.x, y: plot.y, width: plot.w, height: plot.h }))));
  const graticule = s('g', { 'clip-path': `url(#${clipId})`, fill: 'none', stroke: '#ffffff', 'stroke-opacity': 0.55, 'stroke-width': 0.6 });
  graticule.append(s('path', { d: graticulePath(spec.projection, toFigure) }));
  svg.append(graticule);

  const coast = s('g', { 'clip-path': `url(#${clipId})`, fill: 'none', stroke: '#2b2f33', 'stroke-width': 0.6, 'stroke-linejoin': 'round', class: 'coastline' });
  let d = '';
  for (const line of spec.coast) {
    for (let i = 0; i < line.length; i += 2) {
      const [fx, fy] = toFigure(line[i], line[i + 1]);
      d += `${i === 0 ? 'M' : 'L'}${fx.toFixed(1)},${fy.toFixed(1)}`;
    }
  }
  coast.append(s('path', { d }));
  svg.append(coast);

  svg.append(s('path', { d: outlinePath(spec.projection, toFigure), fill: 'none', stroke: INK, 'stroke-width': 0.9, 'clip-path': `url(#${clipId})` }));
  if (spec.contours) svg.append(contourGroup(spec, toFigure, clipId));
  const inPlot = (x: number, y: number): boolean => x >= plot.x - 0.5 && x <= plot.x + plot.w + 0.5 && y >= plot.y - 0.5 && y <= plot.y + plot.h + 0.5;
  const lonLabel = (lon: number): string => (lon === 0 || Math.abs(lon) === 180 ? `${Math.abs(lon)}°` : `${Math.abs(lon)}°${lon < 0 ? 'W' : 'E'}`);
  const latLabel = (lat: number): string => (lat === 0 ? '0°' : `${Math.abs(lat)}°${lat < 0 ? 'S' : 'N'}`);
  const ticks = s('g', { 'font-size': 11, fill: INK, class: 'graticule-labels' });
  const at = (lon: number, lat: number): [number, number] | null => {
    const q = spec.projection.forward(lon, lat);
    return q ? toFigure(q[0], q[1]) : null;
  };
  if (plate) {
    for (let lon = -180; lon <= 180; lon += 60) {
      const p = at(Math.max(-179.9999, Math.min(179.9999, lon)), 0);
      if (!p || p[0] < plot.x - 0.5 || p[0] > plot.x + plot.w + 0.5) continue;
      ticks.append(s('line', { x1: p[0], x2: p[0], y1: plot.y + ph, y2: plot.y + ph + 4, stroke: INK }));
      ticks.append(s('text', { x: p[0], y: plot.y + ph + 16, 'text-anchor': 'middle' }, lon === 0 ? '0°' : lonLabel(lon)));
    }
    for (let lat = -90; lat <= 90; lat += 30) {
      const p = at(0, Math.max(-89.9999, Math.min(89.9999, lat)));
      if (!p || p[1] < plot.y - 0.5 || p[1] > plot.y + ph + 0.5) continue;
      ticks.append(s('line', { x1: plot.x - 4, x2: plot.x, y1: p[1], y2: p[1], stroke: INK }));
      ticks.append(s('text', { x: plot.x - 6, y: p[1] + 4, 'text-anchor': 'end' }, latLabel(lat)));
    }
  } else if (spec.projection.info.latitudeLimit === null) {
    // world map: parallels labelled where they meet the left edge of the globe, meridians along the equator
    for (let lat = -60; lat <= 60; lat += 30) {
      const p = at(-179.9, lat);
      if (p && inPlot(p[0], p[1])) ticks.append(s('text', { x: p[0] + 3, y: p[1] - 3, 'text-anchor': 'start', class: 'halo' }, latLabel(lat)));
    }
    for (let lon = -120; lon <= 120; lon += 60) {
      const p = at(lon, 0);
      if (p && inPlot(p[0], p[1])) ticks.append(s('text', { x: p[0] + 3, y: p[1] + 12, 'text-anchor': 'start', class: 'halo' }, lonLabel(lon)));
    }
  } else {
    // polar map: parallels labelled along the 45° meridian, meridians inside the limit circle
    const lim = spec.projection.info.latitudeLimit;
    const sign = lim > 0 ? 1 : -1;
    for (const l of [50, 60, 70, 80]) {
      const p = at(45, sign * l);
      if (p && inPlot(p[0], p[1])) ticks.append(s('text', { x: p[0] + 3, y: p[1] - 3, class: 'halo' }, latLabel(sign * l)));
    }
    for (let lon = -150; lon <= 180; lon += 30) {
      const p = at(lon, lim + sign * 3);
      if (p && inPlot(p[0], p[1])) ticks.append(s('text', { x: p[0], y: p[1] + 4, 'text-anchor': 'middle', class: 'halo' }, lonLabel(lon)));
    }
  }
  // white halos keep labels legible over the field
  for (const tx of ticks.querySelectorAll('text.halo')) {
    tx.setAttribute('paint-order', 'stroke');
    tx.setAttribute('stroke', '#ffffff');
    tx.setAttribute('stroke-width', '3');
    tx.setAttribute('stroke-linejoin', 'round');
  }
  svg.append(ticks);
  const overlay = s('g', { class: 'overlay' });
  svg.append(overlay);

  const barH = Math.min(ph * 0.8, 300);
  colourBar(svg, { x: plot.x + plot.w + 18, y: plot.y + (ph - barH) / 2, w: 14, h: barH }, spec.scale, spec.min, spec.max, spec.units, spec.caption, spec.bar);
  return { svg, plot, overlay, toFigure };
}

function graticulePath(p: MapProjection, toFigure: (x: number, y: number) => [number, number]): string {
  const lines: [number, number][][] = [];
  for (let lon = -180; lon <= 180; lon += 30) {
    const pts: [number, number][] = [];
    for (let lat = -89.9; lat <= 89.9; lat += 1) pts.push([lon === 180 ? 179.999 : lon === -180 ? -179.999 : lon, lat]);
    lines.push(pts);
  }
  const lim = p.info.latitudeLimit;
  const parallels = lim === null ? [-60, -30, 0, 30, 60] : [50, 60, 70, 80].map((l) => (lim > 0 ? l : -l));
  for (const lat of parallels) {
    const pts: [number, number][] = [];
    for (let lon = -180; lon <= 180; lon += 1) pts.push([Math.max(-179.999, Math.min(179.999, lon)), lat]);
    lines.push(pts);
  }
  return pathOf(p, lines, toFigure);
}

function outlinePath(p: MapProjection, toFigure: (x: number, y: number) => [number, number]): string {
  if (p.info.latitudeLimit !== null) {
    const pts: [number, number][] = [];
    for (let lon = -180; lon <= 180; lon += 2) pts.push([lon, p.info.latitudeLimit]);
    return pathOf(p, [pts], toFigure) + 'Z';
  }
  const pts: [number, number][] = [];
  for (let lat = -89.999; lat <= 89.999; lat += 1) pts.push([179.9999, lat]);
  pts.push([179.9999, 89.9999]);
  for (let lat = 89.999; lat >= -89.999; lat -= 1) pts.push([-179.9999, lat]);
  pts.push([-179.9999, -89.9999]);
  return pathOf(p, [pts], toFigure) + 'Z';
}

function pathOf(p: MapProjection, lines: [number, number][][], toFigure: (x: number, y: number) => [number, number]): string {
  let d = '';
  for (const line of lines) {
    let pen = false;
    for (const [lon, lat] of line) {
      const q = p.forward(lon, lat);
      if (!q) {
        pen = false;
        continue;
      }
      const [fx, fy] = toFigure(q[0], q[1]);
      d += `${pen ? 'L' : 'M'}${fx.toFixed(1)},${fy.toFixed(1)}`;
      pen = true;
    }
  }
  return d;
}

/** Contour lines at the colour bar's ticks, each level labelled a few times along its length. */
function contourGroup(spec: MapFigureSpec, toFigure: (x: number, y: number) => [number, number], clipId: string): SVGGElement {
  const c = spec.contours!;
  const log = !!spec.bar?.log;
  const levels = log ? logTicks(spec.min, spec.max) : niceTicks(spec.min, spec.max, 6);
  const values = log ? c.values.map((v) => (v > 0 ? Math.log10(v) : -Infinity)) : c.values;
  const lines = contourSegments(values, c.grid.lonEdges, c.grid.latEdges, log ? levels.map(Math.log10) : levels);
  const g = s('g', { class: 'contours', 'clip-path': `url(#${clipId})` });
  const step = levels.length > 1 ? levels[1] - levels[0] : 1;
  lines.forEach((line, li) => {
    let d = '';
    const seg = line.segments;
    let labels = 0;
    let lastLabel: [number, number] | null = null;
    for (let k = 0; k < seg.length; k += 4) {
      const a = spec.projection.forward(seg[k], seg[k + 1]);
      const b = spec.projection.forward(seg[k + 2], seg[k + 3]);
      if (!a || !b) continue;
      const [ax, ay] = toFigure(a[0], a[1]);
      const [bx, by] = toFigure(b[0], b[1]);
      // a segment that jumps across the map (the antimeridian, a polar cut) is not drawn
      if (Math.abs(bx - ax) > spec.width / 8) continue;
      d += `M${ax.toFixed(1)},${ay.toFixed(1)}L${bx.toFixed(1)},${by.toFixed(1)}`;
      if (labels < 6 && (!lastLabel || Math.hypot(ax - lastLabel[0], ay - lastLabel[1]) > 140)) {
        lastLabel = [ax, ay];
        labels++;
        g.append(s('text', { x: ax, y: ay, 'font-size': 9.5, 'text-anchor': 'middle', 'dominant-baseline': 'middle', fill: INK, stroke: '#ffffff', 'stroke-width': 2.5, 'paint-order': 'stroke', class: 'contour-label' }, log ? formatTick(levels[li], levels[li] / 10) : formatTick(levels[li], step)));
      }
    }
    g.prepend(s('path', { d, fill: 'none', stroke: '#1d2228', 'stroke-width': 0.7, 'stroke-opacity': 0.8 }));
  });
  return g;
}
