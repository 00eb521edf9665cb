/**
 * Labelled contour lines of a map field at its colour bar's ticks (decades and 2, 5 × 10^k under a logarithmic
 * stretch), traced by app/render's marching squares on the grid and projected onto the panel.
 */
import { logTicks } from '../render/colour-mapping.js';
import { formatTick, niceTicks } from '../render/colour-scales.js';
import { contourSegments } from '../render/contours.js';
import type { MapProjection } from '../render/projections.js';
import { ClippedPath, type ToPanel } from './map-frame.js';
import { FONT_PT, INK } from './page.js';
import { text, type Rect } from './parts.js';
import { el, type SvgNode } from './svg-tree.js';

export interface ContourSpec {
  values: Float32Array;
  lonEdges: ArrayLike<number>;
  latEdges: ArrayLike<number>;
  min: number;
  max: number;
  log?: boolean;
}

/** The contour levels: the colour bar's ticks. */
export function contourLevels(min: number, max: number, log = false): number[] {
  return log ? logTicks(min, max) : niceTicks(min, max, 6);
}

/** Contour lines cut to the panel (no SVG clip path: rasterisers draw those slowly), each level labelled a few times. */
export function contourGroup(c: ContourSpec, p: MapProjection, r: Rect, to: ToPanel): SvgNode {
  const levels = contourLevels(c.min, c.max, c.log);
  const values = c.log ? c.values.map((v) => (v > 0 ? Math.log10(v) : -Infinity)) : c.values;
  const lines = contourSegments(values, c.lonEdges, c.latEdges, c.log ? levels.map(Math.log10) : levels);
  const g = el('g', { class: 'contours' });
  const paths = el('g', { fill: 'none', stroke: INK, 'stroke-width': 0.35, 'stroke-opacity': 0.8 });
  const labels = el('g', { 'font-size': FONT_PT.tick, 'text-anchor': 'middle', 'paint-order': 'stroke', stroke: '#ffffff', 'stroke-width': 1.4, 'stroke-linejoin': 'round' });
  g.append(paths, labels);
  const step = levels.length > 1 ? levels[1] - levels[0] : 1;
  // labels at least a fifth of the panel apart, at most six per level
  const spacing = Math.max(r.w, r.h) / 5;
  lines.forEach((line, li) => {
    const path = new ClippedPath(r);
    const seg = line.segments;
    let count = 0;
    let last: [number, number] | null = null;
    for (let k = 0; k < seg.length; k += 4) {
      const a = p.forward(seg[k], seg[k + 1]);
      const b = p.forward(seg[k + 2], seg[k + 3]);
      if (!a || !b) continue;
      const [ax, ay] = to(a[0], a[1]);
      const [bx, by] = to(b[0], b[1]);
      // a segment that jumps across the map (the antimeridian, a polar cut) is not drawn
      if (Math.abs(bx - ax) > r.w / 8) continue;
      path.moveTo(ax, ay);
      path.lineTo(bx, by);
      const seen = ax >= r.x && ax <= r.x + r.w && ay >= r.y && ay <= r.y + r.h;
      if (seen && count < 6 && (!last || Math.hypot(ax - last[0], ay - last[1]) > spacing)) {
        last = [ax, ay];
        count++;
        const v = levels[li];
        labels.append(text(ax, ay + FONT_PT.tick * 0.35, c.log ? formatTick(v, v / 10) : formatTick(v, step).replace(/^-/, '−'), { fill: INK, class: 'contour-label' }));
      }
    }
    const d = path.toString();
    if (d) paths.append(el('path', { d, 'data-level': levels[li] }));
  });
  return g;
}
