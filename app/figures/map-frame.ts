/**
 * Vector parts of a map panel: graticule, coastlines, the globe's outline and the longitude/latitude labels,
 * placed in a panel rectangle by a projection. The raster under them comes from map-raster.ts.
 */
import type { MapProjection } from '../render/projections.js';
import { FONT_PT, INK } from './page.js';
import { r2, text, type Rect } from './parts.js';
import { el, type SvgNode } from './svg-tree.js';
import { latLabel, lonLabel } from './typeset.js';

export type ToPanel = (x: number, y: number) => [number, number];

export function panelTransform(p: MapProjection, r: Rect): ToPanel {
  const e = p.extent;
  return (x, y) => [r.x + ((x - e.xmin) / (e.xmax - e.xmin)) * r.w, r.y + ((e.ymax - y) / (e.ymax - e.ymin)) * r.h];
}

function pathOf(p: MapProjection, lines: [number, number][][], to: ToPanel): string {
  let d = '';
  for (const line of lines) {
    let pen = false;
    for (const [lon, lat] of line) {
      const q = p.forward(lon, lat);
      if (!q) {
        pen = false;
        continue;
      }
      const [fx, fy] = to(q[0], q[1]);
      d += `${pen ? 'L' : 'M'}${r2(fx)},${r2(fy)}`;
      pen = true;
    }
  }
  return d;
}

const clampLon = (lon: number): number => Math.max(-179.999, Math.min(179.999, lon));

export function graticulePath(p: MapProjection, to: ToPanel): string {
  const lines: [number, number][][] = [];
  for (let lon = -180; lon <= 180; lon += 60) {
    const pts: [number, number][] = [];
    for (let lat = -89.9; lat <= 89.9; lat += 2) pts.push([clampLon(lon), lat]);
    lines.push(pts);
  }
  const lim = p.info.latitudeLimit;
  const parallels = lim === null ? [-60, -30, 0, 30, 60] : [50, 60, 70, 80].map((l) => (lim > 0 ? l : -l));
  for (const lat of parallels) {
    const pts: [number, number][] = [];
    for (let lon = -180; lon <= 180; lon += 2) pts.push([clampLon(lon), lat]);
    lines.push(pts);
  }
  return pathOf(p, lines, to);
}

export function outlinePath(p: MapProjection, to: ToPanel): string {
  if (p.info.latitudeLimit !== null) {
    const pts: [number, number][] = [];
    for (let lon = -180; lon <= 180; lon += 2) pts.push([clampLon(lon), p.info.latitudeLimit]);
    return pathOf(p, [pts], to) + 'Z';
  }
  const pts: [number, number][] = [];
  for (let lat = -89.999; lat <= 89.999; lat += 1) pts.push([179.9999, lat]);
  pts.push([179.9999, 89.9999]);
  for (let lat = 89.999; lat >= -89.999; lat -= 1) pts.push([-179.9999, lat]);
  pts.push([-179.9999, -89.9999]);
  return pathOf(p, [pts], to) + 'Z';
}

/** Coastlines as one path; points closer than `minStep` (pt) to the last one kept are dropped, as print cannot show them. */
export function coastPath(coast: Float64Array[], to: ToPanel, minStep = 0.35): string {
  const parts: string[] = [];
  for (const line of coast) {
    let lx = NaN;
    let ly = NaN;
    const n = line.length / 2;
    for (let i = 0; i < n; i++) {
      const [fx, fy] = to(line[2 * i], line[2 * i + 1]);
      if (i > 0 && i < n - 1 && Math.abs(fx - lx) < minStep && Math.abs(fy - ly) < minStep) continue;
      parts.push(`${i === 0 ? 'M' : 'L'}${Math.round(fx * 10) / 10},${Math.round(fy * 10) / 10}`);
      lx = fx;
      ly = fy;
    }
  }
  return parts.join('');
}

let clipCounter = 0;

/** Graticule, coastlines and outline over a panel, clipped to it; labels when asked (equirectangular only). */
export function mapOverlay(p: MapProjection, r: Rect, coast: Float64Array[], labels: { lat: boolean; lon: boolean }): SvgNode {
  const to = panelTransform(p, r);
  const id = `mclip${++clipCounter}`;
  const g = el('g', { class: 'map-frame' });
  g.append(el('defs', {}, el('clipPath', { id }, el('rect', { x: r2(r.x), y: r2(r.y), width: r2(r.w), height: r2(r.h) }))));
  g.append(el('path', { d: graticulePath(p, to), fill: 'none', stroke: '#ffffff', 'stroke-opacity': 0.6, 'stroke-width': 0.3, 'clip-path': `url(#${id})` }));
  g.append(el('path', { d: coastPath(coast, to), fill: 'none', stroke: '#2b2f33', 'stroke-width': 0.35, 'stroke-linejoin': 'round', 'clip-path': `url(#${id})`, class: 'coastline' }));
  g.append(el('path', { d: outlinePath(p, to), fill: 'none', stroke: INK, 'stroke-width': 0.5 }));
  if (p.info.id === 'plate') {
    if (labels.lon) {
      for (let lon = -120; lon <= 120; lon += 120) {
        const [x] = to(p.forward(lon, 0)![0], 0);
        g.append(el('line', { x1: r2(x), x2: r2(x), y1: r2(r.y + r.h), y2: r2(r.y + r.h + 2), stroke: INK, 'stroke-width': 0.4 }));
        g.append(text(x, r.y + r.h + 2 + FONT_PT.tick, lonLabel(lon), { 'text-anchor': 'middle', 'font-size': FONT_PT.tick }));
      }
    }
    if (labels.lat) {
      for (let lat = -60; lat <= 60; lat += 60) {
        const [, y] = to(0, p.forward(0, lat)![1]);
        g.append(el('line', { x1: r2(r.x - 2), x2: r2(r.x), y1: r2(y), y2: r2(y), stroke: INK, 'stroke-width': 0.4 }));
        g.append(text(r.x - 3, y + FONT_PT.tick * 0.35, latLabel(lat), { 'text-anchor': 'end', 'font-size': FONT_PT.tick }));
      }
    }
  }
  return g;
}
