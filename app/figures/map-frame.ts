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

/**
 * Polylines cut to a rectangle as they are drawn (Liang–Barsky clipping of each segment), so a panel needs no
 * SVG clip path: a rasteriser draws every clip path as a layer the size of the whole figure, which made each
 * map figure several times slower and heavier to rasterise.
 */
export class ClippedPath {
  private readonly parts: string[] = [];
  private x = NaN;
  private y = NaN;
  /** where the pen is in the output (after the last point drawn), NaN when lifted */
  private penX = NaN;
  private penY = NaN;

  constructor(private readonly r: Rect, private readonly round: (v: number) => number = r2) {}

  moveTo(x: number, y: number): void {
    this.x = x;
    this.y = y;
    this.penX = NaN;
    if (this.inside(x, y)) this.emit('M', x, y);
  }

  lineTo(x: number, y: number): void {
    const x0 = this.x;
    const y0 = this.y;
    this.x = x;
    this.y = y;
    if (x0 !== x0) return this.moveTo(x, y);
    const c = this.clip(x0, y0, x, y);
    if (!c) {
      this.penX = NaN;
      return;
    }
    const [ax, ay, bx, by] = c;
    if (this.penX !== ax || this.penY !== ay) this.emit('M', ax, ay);
    this.emit('L', bx, by);
    if (bx !== x || by !== y) this.penX = NaN;
  }

  /** lift the pen: the next point starts a new piece */
  lift(): void {
    this.x = NaN;
    this.penX = NaN;
  }

  toString(): string {
    return this.parts.join('');
  }

  private inside(x: number, y: number): boolean {
    const r = this.r;
    return x >= r.x && x <= r.x + r.w && y >= r.y && y <= r.y + r.h;
  }

  private emit(cmd: 'M' | 'L', x: number, y: number): void {
    this.parts.push(`${cmd}${this.round(x)},${this.round(y)}`);
    this.penX = x;
    this.penY = y;
  }

  private clip(x0: number, y0: number, x1: number, y1: number): [number, number, number, number] | null {
    const r = this.r;
    const dx = x1 - x0;
    const dy = y1 - y0;
    let t0 = 0;
    let t1 = 1;
    const edges: [number, number][] = [
      [-dx, x0 - r.x],
      [dx, r.x + r.w - x0],
      [-dy, y0 - r.y],
      [dy, r.y + r.h - y0],
    ];
    for (const [p, q] of edges) {
      if (p === 0) {
        if (q < 0) return null;
      } else {
        const t = q / p;
        if (p < 0) {
          if (t > t1) return null;
          if (t > t0) t0 = t;
        } else {
          if (t < t0) return null;
          if (t < t1) t1 = t;
        }
      }
    }
    return [t0 === 0 ? x0 : x0 + t0 * dx, t0 === 0 ? y0 : y0 + t0 * dy, t1 === 1 ? x1 : x0 + t1 * dx, t1 === 1 ? y1 : y0 + t1 * dy];
  }
}

function pathOf(p: MapProjection, lines: [number, number][][], to: ToPanel, clipTo?: Rect): string {
  if (clipTo) {
    const path = new ClippedPath(clipTo);
    for (const line of lines) {
      path.lift();
      for (const [lon, lat] of line) {
        const q = p.forward(lon, lat);
        if (!q) {
          path.lift();
          continue;
        }
        const [fx, fy] = to(q[0], q[1]);
        path.lineTo(fx, fy);
      }
    }
    return path.toString();
  }
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

export function graticulePath(p: MapProjection, to: ToPanel, clipTo?: Rect, lonStep = 60, latStep = 30): string {
  const lines: [number, number][][] = [];
  for (let lon = -180; lon <= 180; lon += lonStep) {
    const pts: [number, number][] = [];
    for (let lat = -89.9; lat <= 89.9; lat += 2) pts.push([clampLon(lon), lat]);
    lines.push(pts);
  }
  const lim = p.info.latitudeLimit;
  const parallels: number[] = [];
  if (lim === null) for (let lat = -90 + latStep; lat < 90; lat += latStep) parallels.push(lat);
  else parallels.push(...[50, 60, 70, 80].map((l) => (lim > 0 ? l : -l)));
  const along = Math.min(2, lonStep / 10);
  for (const lat of parallels) {
    const pts: [number, number][] = [];
    for (let lon = -180; lon <= 180; lon += along) pts.push([clampLon(lon), lat]);
    lines.push(pts);
  }
  return pathOf(p, lines, to, clipTo);
}

/** The globe's edge (or the polar view's limit circle), closed; cut to `clipTo` when given (a zoomed window). */
export function outlinePath(p: MapProjection, to: ToPanel, clipTo?: Rect): string {
  const pts: [number, number][] = [];
  if (p.info.latitudeLimit !== null) {
    for (let lon = -180; lon <= 180; lon += 2) pts.push([clampLon(lon), p.info.latitudeLimit]);
  } else {
    for (let lat = -89.999; lat <= 89.999; lat += 1) pts.push([179.9999, lat]);
    pts.push([179.9999, 89.9999]);
    for (let lat = 89.999; lat >= -89.999; lat -= 1) pts.push([-179.9999, lat]);
    pts.push([-179.9999, -89.9999]);
  }
  if (clipTo) return pathOf(p, [[...pts, pts[0]]], to, clipTo);
  return pathOf(p, [pts], to) + 'Z';
}

/**
 * Coastlines as one path cut to the panel `clipTo`; points closer than `minStep` (pt) to the last one kept are
 * dropped, as print cannot show them.
 */
export function coastPath(coast: Float64Array[], to: ToPanel, clipTo: Rect, minStep = 0.35): string {
  const path = new ClippedPath(clipTo, (v) => Math.round(v * 10) / 10);
  for (const line of coast) {
    let lx = NaN;
    let ly = NaN;
    const n = line.length / 2;
    path.lift();
    for (let i = 0; i < n; i++) {
      const [fx, fy] = to(line[2 * i], line[2 * i + 1]);
      if (i > 0 && i < n - 1 && Math.abs(fx - lx) < minStep && Math.abs(fy - ly) < minStep) continue;
      path.lineTo(fx, fy);
      lx = fx;
      ly = fy;
    }
  }
  return path.toString();
}

export interface OverlayOptions {
  /** latitude labels (left edge, or on the globe), longitude labels (below, or along the equator) */
  lat: boolean;
  lon: boolean;
  /** meridians every this many degrees (60 on a whole map, finer in a zoomed window) */
  lonStep?: number;
  /** parallels every this many degrees (world maps) */
  latStep?: number;
}

/** Graticule, coastlines and outline over a panel, clipped to it, with longitude and latitude labels when asked. */
export function mapOverlay(p: MapProjection, r: Rect, coast: Float64Array[], labels: OverlayOptions): SvgNode {
  const to = panelTransform(p, r);
  const g = el('g', { class: 'map-frame' });
  g.append(el('path', { d: graticulePath(p, to, r, labels.lonStep, labels.latStep), fill: 'none', stroke: '#ffffff', 'stroke-opacity': 0.6, 'stroke-width': 0.3, class: 'graticule' }));
  g.append(el('path', { d: coastPath(coast, to, r), fill: 'none', stroke: '#2b2f33', 'stroke-width': 0.35, 'stroke-linejoin': 'round', class: 'coastline' }));
  // cut to the panel too: a zoomed window shows only part of the globe's edge
  g.append(el('path', { d: outlinePath(p, to, r), fill: 'none', stroke: INK, 'stroke-width': 0.5, class: 'outline' }));
  if (labels.lat || labels.lon) g.append(graticuleLabels(p, r, to, labels));
  return g;
}

const inside = (r: Rect, x: number, y: number): boolean => x >= r.x - 0.5 && x <= r.x + r.w + 0.5 && y >= r.y - 0.5 && y <= r.y + r.h + 0.5;

/** The first of 400 points along a curve (t from 0 to 1) that lies inside the panel, with a margin for its label. */
function firstInside(r: Rect, point: (t: number) => [number, number] | null): [number, number] | null {
  const m = FONT_PT.tick;
  for (let k = 0; k <= 400; k++) {
    const q = point(k / 400);
    if (q && q[0] >= r.x && q[0] <= r.x + r.w - 2 * m && q[1] >= r.y + m && q[1] <= r.y + r.h) return q;
  }
  return null;
}

/** A label drawn over the field: a white halo keeps it legible on any colour. */
const halo = { 'paint-order': 'stroke', stroke: '#ffffff', 'stroke-width': 1.6, 'stroke-linejoin': 'round', class: 'halo' };

/**
 * Longitude and latitude labels: on the equirectangular map as ticks outside the frame (left and below); on a
 * world map on the globe (parallels at its left edge, meridians along the equator); on a polar map parallels
 * along the 45° meridian and meridians just inside the limit circle. Only those that fall inside the panel
 * (a zoomed window shows fewer).
 */
function graticuleLabels(p: MapProjection, r: Rect, to: ToPanel, labels: OverlayOptions): SvgNode {
  const g = el('g', { class: 'graticule-labels', 'font-size': FONT_PT.tick });
  const at = (lon: number, lat: number): [number, number] | null => {
    const q = p.forward(clampLon(lon), Math.max(-89.9999, Math.min(89.9999, lat)));
    return q ? to(q[0], q[1]) : null;
  };
  const lonStep = labels.lonStep ?? 60;
  if (p.info.id === 'plate') {
    if (labels.lon) {
      for (let lon = -180; lon <= 180; lon += lonStep) {
        const q = at(lon, 0);
        if (!q || q[0] < r.x - 0.5 || q[0] > r.x + r.w + 0.5) continue;
        g.append(el('line', { x1: r2(q[0]), x2: r2(q[0]), y1: r2(r.y + r.h), y2: r2(r.y + r.h + 2), stroke: INK, 'stroke-width': 0.4 }));
        g.append(text(q[0], r.y + r.h + 2 + FONT_PT.tick, lonLabel(lon), { 'text-anchor': 'middle' }));
      }
    }
    if (labels.lat) {
      for (let lat = -90; lat <= 90; lat += labels.latStep ?? 30) {
        const q = at(0, lat);
        if (!q || q[1] < r.y - 0.5 || q[1] > r.y + r.h + 0.5) continue;
        g.append(el('line', { x1: r2(r.x - 2), x2: r2(r.x), y1: r2(q[1]), y2: r2(q[1]), stroke: INK, 'stroke-width': 0.4 }));
        g.append(text(r.x - 3, q[1] + FONT_PT.tick * 0.35, latLabel(lat), { 'text-anchor': 'end' }));
      }
    }
    return g;
  }
  const lim = p.info.latitudeLimit;
  if (lim === null) {
    if (labels.lat) {
      // where a parallel enters the panel from the left: the globe's edge, or the panel's edge in a zoomed window
      for (let lat = -90 + (labels.latStep ?? 30); lat < 90; lat += labels.latStep ?? 30) {
        const q = firstInside(r, (t) => at(-179.9 + t * 359.8, lat));
        if (q) g.append(text(q[0] + 2, q[1] - 1.5, latLabel(lat), halo));
      }
    }
    if (labels.lon) {
      // along the equator, or where the meridian leaves the panel at the bottom when the equator is out of view
      const equator = at(0, 0);
      const onEquator = equator !== null && equator[1] >= r.y && equator[1] <= r.y + r.h;
      for (let lon = -180 + lonStep; lon < 180; lon += lonStep) {
        const q = onEquator ? at(lon, 0) : firstInside(r, (t) => at(lon, -89.9 + t * 179.8));
        if (q && inside(r, q[0], q[1])) g.append(text(q[0] + 1.5, onEquator ? q[1] + FONT_PT.tick + 1 : q[1] - 1.5, lonLabel(lon), halo));
      }
    }
    return g;
  }
  const sign = lim > 0 ? 1 : -1;
  if (labels.lat) {
    for (const l of [50, 60, 70, 80]) {
      const q = at(45, sign * l);
      if (q && inside(r, q[0], q[1])) g.append(text(q[0] + 1.5, q[1] - 1.5, latLabel(sign * l), halo));
    }
  }
  if (labels.lon) {
    for (let lon = -180 + lonStep; lon <= 180; lon += lonStep) {
      const q = at(lon, lim + sign * 3);
      if (q && inside(r, q[0], q[1])) g.append(text(q[0], q[1] + FONT_PT.tick * 0.35, lonLabel(lon), { ...halo, 'text-anchor': 'middle' }));
    }
  }
  return g;
}
