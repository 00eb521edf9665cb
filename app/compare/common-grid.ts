/** The common grid of a comparison: the reference's own, or a regular lat-lon grid (with optional depth edges). */
import { cornerRow } from '../grid/corners.js';
import type { Grid, HorizontalGrid, VerticalAxis } from '../grid/types.js';
import { makeRegularGrid } from '../grid/rectilinear.js';
import { makeVerticalAxis } from '../grid/vertical.js';
import type { RecipeOptions } from '../recipe/schema.js';

export function commonGridFor(option: RecipeOptions['commonGrid'], refGrid: Grid): Grid {
  if (option === 'reference') return refGrid;
  const horizontal = makeRegularGrid(option.regular.dlon, option.regular.dlat, option.regular.lon0 ?? -180);
  const vertical = option.depthEdges ? makeVerticalAxis(Float64Array.from(option.depthEdges)) : refGrid.vertical;
  return { horizontal, vertical };
}

function close(a: ArrayLike<number>, b: ArrayLike<number>, tol: number): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!(Math.abs(a[i] - b[i]) <= tol)) return false;
  return true;
}

export function sameHorizontal(a: HorizontalGrid, b: HorizontalGrid): boolean {
  if (a === b) return true;
  return a.nx === b.nx && a.ny === b.ny && close(a.lon, b.lon, 1e-9) && close(a.lat, b.lat, 1e-9) && closeCorners(a, b, 1e-9);
}

/** Corners compared row by row (a grid that keeps its corners once each never makes the 4-per-cell arrays). */
function closeCorners(a: HorizontalGrid, b: HorizontalGrid, tol: number): boolean {
  const ra = new Float64Array(4 * a.nx), rb = new Float64Array(4 * b.nx);
  for (const which of ['lon', 'lat'] as const) {
    for (let j = 0; j < a.ny; j++) if (!close(cornerRow(a, j, which, ra), cornerRow(b, j, which, rb), tol)) return false;
  }
  return true;
}

export function sameVertical(a: VerticalAxis | null, b: VerticalAxis | null): boolean {
  if (a === b) return true;
  if (!a || !b) return false;
  return close(a.edges, b.edges, 1e-9);
}

export function sameGrid(a: Grid, b: Grid): boolean {
  return sameHorizontal(a.horizontal, b.horizontal) && sameVertical(a.vertical, b.vertical);
}
