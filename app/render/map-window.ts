/**
 * Zoom and pan of a map: the part of the projection's extent that the canvas shows. Zooming keeps the
 * extent's aspect ratio (so the canvas keeps its size) and the point under the pointer in place; the window
 * never leaves the projection's extent.
 */
import type { Extent, MapProjection } from './projections.js';

/** The smallest window: a 64th of the whole map across. */
export const MAX_ZOOM = 64;

/** The projection seen through a window of its extent (same forward and inverse, a smaller extent). */
export function windowed(proj: MapProjection, win: Extent | null): MapProjection {
  return win ? { ...proj, extent: win } : proj;
}

/** How much of the whole extent the window spans across (1 = not zoomed). */
export function zoomOf(full: Extent, win: Extent): number {
  return (full.xmax - full.xmin) / (win.xmax - win.xmin);
}

/** Move a window of the same size inside the full extent (when it is smaller than the extent). */
function keepInside(full: Extent, w: number, h: number, x0: number, y0: number): Extent {
  const xmin = Math.min(full.xmax - w, Math.max(full.xmin, x0));
  const ymin = Math.min(full.ymax - h, Math.max(full.ymin, y0));
  return { xmin, xmax: xmin + w, ymin, ymax: ymin + h };
}

/**
 * Zoom by `factor` (> 1 in, < 1 out) about the projected point (cx, cy), which stays where it is on the canvas.
 * Returns null when the result is the whole map.
 */
export function zoomWindow(full: Extent, win: Extent | null, factor: number, cx: number, cy: number): Extent | null {
  const cur = win ?? full;
  const zoom = Math.min(MAX_ZOOM, Math.max(1, zoomOf(full, cur) * factor));
  if (zoom <= 1 + 1e-9) return null;
  const w = (full.xmax - full.xmin) / zoom;
  const h = (full.ymax - full.ymin) / zoom;
  // the point keeps its fractional place in the window
  const fx = (cx - cur.xmin) / (cur.xmax - cur.xmin);
  const fy = (cy - cur.ymin) / (cur.ymax - cur.ymin);
  return keepInside(full, w, h, cx - fx * w, cy - fy * h);
}

/** Pan by (dx, dy) projected metres; the whole map does not pan. */
export function panWindow(full: Extent, win: Extent | null, dx: number, dy: number): Extent | null {
  if (!win) return null;
  return keepInside(full, win.xmax - win.xmin, win.ymax - win.ymin, win.xmin + dx, win.ymin + dy);
}
