import { StillwaterError } from '../errors.js';
import type { VerticalAxis } from './types.js';

/** A vertical axis from layer edges (metres, positive down, increasing). */
/** Centres default to layer midpoints; standard levels pass their own (e.g. a level at 0 m). */
export function makeVerticalAxis(edges: Float64Array, boundsDerived = false, levelCentres?: Float64Array): VerticalAxis {
  const nz = edges.length - 1;
  if (nz < 1) throw new StillwaterError('E_GRID', 'A vertical axis needs at least two layer edges.');
  const centres = new Float64Array(nz);
  const thickness = new Float64Array(nz);
  for (let k = 0; k < nz; k++) {
    if (!(edges[k + 1] > edges[k])) throw new StillwaterError('E_GRID', `Depth edges must increase downwards (index ${k + 1}).`);
    centres[k] = levelCentres ? levelCentres[k] : 0.5 * (edges[k] + edges[k + 1]);
    thickness[k] = edges[k + 1] - edges[k];
  }
  return { nz, centres, edges, thickness, boundsDerived };
}

/**
 * Edges for standard levels given only by their centres: midpoints between centres,
 * the surface at 0 (or the first centre when it is negative), and the last edge extrapolated.
 */
export function edgesFromCentres(centres: Float64Array): Float64Array {
  const nz = centres.length;
  const edges = new Float64Array(nz + 1);
  edges[0] = Math.min(0, centres[0]);
  for (let k = 1; k < nz; k++) edges[k] = 0.5 * (centres[k - 1] + centres[k]);
  edges[nz] = nz > 1 ? centres[nz - 1] + 0.5 * (centres[nz - 1] - centres[nz - 2]) : 2 * centres[0] - edges[0];
  return edges;
}
