/**
 * Column means: the thickness-weighted mean of each water column over a depth range.
 * A layer counts with the part of its thickness inside the range; dry (NaN) layers do not count,
 * so the mean is over the wet part of the range (the seafloor ends the column). Means that are compared
 * with each other (reference and runs) take only the cells every one of them has: comparedColumnMeans.
 */
import { StillwaterError } from '../errors.js';
import type { VerticalAxis } from '../grid/types.js';

export interface DepthRange {
  /** metres, positive down */
  top: number;
  bottom: number;
}

/** The whole column of a vertical axis. */
export function wholeColumn(axis: VerticalAxis): DepthRange {
  return { top: axis.edges[0], bottom: axis.edges[axis.nz] };
}

/** Refuse a range that is reversed, negative or entirely outside the axis; `where` names its source. */
export function checkDepthRange(range: DepthRange, axis: VerticalAxis, where = '--depth-range'): void {
  const { top, bottom } = range;
  if (!Number.isFinite(top) || !Number.isFinite(bottom) || top < 0 || bottom <= top) {
    throw new StillwaterError('E_INPUT', `${where} ${top},${bottom}: give a top and a deeper bottom in metres, both 0 or more.`);
  }
  const gridTop = axis.edges[0];
  const gridBottom = axis.edges[axis.nz];
  if (top >= gridBottom || bottom <= gridTop) {
    throw new StillwaterError('E_INPUT', `${where} ${top}..${bottom} m lies outside the grid, whose layers span ${gridTop}..${gridBottom} m.`);
  }
}

/** Thickness of each layer inside the range, metres (0 for layers outside it). */
export function layerOverlap(axis: VerticalAxis, range: DepthRange): Float64Array {
  const w = new Float64Array(axis.nz);
  for (let k = 0; k < axis.nz; k++) {
    const lo = Math.max(axis.edges[k], range.top);
    const hi = Math.min(axis.edges[k + 1], range.bottom);
    w[k] = hi > lo ? hi - lo : 0;
  }
  return w;
}

export interface ColumnMeans {
  /** mean per column, NaN where no wet layer lies inside the range */
  mean: Float64Array;
  /** wet thickness that entered each mean, metres */
  thickness: Float64Array;
}

/**
 * Column means of a section stored level-major: values[k * n + s] is level k of column s.
 * Levels are float32 (as read); sums are in float64.
 */
export function columnMeans(values: Float32Array | Float64Array, n: number, axis: VerticalAxis, range: DepthRange = wholeColumn(axis)): ColumnMeans {
  if (values.length !== n * axis.nz) {
    throw new StillwaterError('E_INTERNAL', `columnMeans: ${values.length} values do not fill ${axis.nz} levels of ${n} columns.`);
  }
  const w = layerOverlap(axis, range);
  const sum = new Float64Array(n);
  const thickness = new Float64Array(n);
  for (let k = 0; k < axis.nz; k++) {
    const wk = w[k];
    if (wk === 0) continue;
    const base = k * n;
    for (let s = 0; s < n; s++) {
      const v = values[base + s];
      if (v === v) {
        sum[s] += wk * v;
        thickness[s] += wk;
      }
    }
  }
  const mean = new Float64Array(n);
  for (let s = 0; s < n; s++) mean[s] = thickness[s] > 0 ? sum[s] / thickness[s] : NaN;
  return { mean, thickness };
}

/** What the outputs and figures say about the cells behind compared column means. */
export const COMPARED_CELLS =
  'column means use only the cells where the reference and every run have values (as the statistics do), so each is a mean over the same water';

/**
 * Column means that are compared with each other: each section (level-major, the same n columns)
 * averaged over only the cells where every section has a value, so that a cell one source has and
 * another lacks (a seamount's flank, a different land mask) moves none of the means. Returns the
 * means in the order given and the thickness that entered them.
 */
export function comparedColumnMeans(sections: readonly (Float32Array | Float64Array)[], n: number, axis: VerticalAxis, range: DepthRange = wholeColumn(axis)): { means: Float64Array[]; thickness: Float64Array } {
  for (const values of sections) {
    if (values.length !== n * axis.nz) {
      throw new StillwaterError('E_INTERNAL', `comparedColumnMeans: ${values.length} values do not fill ${axis.nz} levels of ${n} columns.`);
    }
  }
  const w = layerOverlap(axis, range);
  const sums = sections.map(() => new Float64Array(n));
  const thickness = new Float64Array(n);
  for (let k = 0; k < axis.nz; k++) {
    const wk = w[k];
    if (wk === 0) continue;
    const base = k * n;
    for (let s = 0; s < n; s++) {
      let valid = true;
      for (const values of sections) {
        const v = values[base + s];
        if (v !== v) {
          valid = false;
          break;
        }
      }
      if (!valid) continue;
      thickness[s] += wk;
      for (let f = 0; f < sections.length; f++) sums[f][s] += wk * sections[f][base + s];
    }
  }
  const means = sums.map((sum) => {
    const mean = new Float64Array(n);
    for (let s = 0; s < n; s++) mean[s] = thickness[s] > 0 ? sum[s] / thickness[s] : NaN;
    return mean;
  });
  return { means, thickness };
}
