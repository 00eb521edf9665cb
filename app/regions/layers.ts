/**
 * Depth layers: intervals [top, bottom] in metres, the surface (top level), the whole column, and the
 * bottom (deepest compared cell of each column, see bottom.ts).
 */
import type { VerticalAxis } from '../grid/types.js';

export type LayerSpec =
  | { kind: 'interval'; top: number; bottom: number }
  | { kind: 'surface' }
  | { kind: 'all' }
  | { kind: 'bottom' };

export function layerLabel(l: LayerSpec): string {
  switch (l.kind) {
    case 'interval':
      return `${fmt(l.top)}-${fmt(l.bottom)} m`;
    default:
      return l.kind;
  }
}

function fmt(x: number): string {
  return String(Math.round(x * 1000) / 1000);
}

/** Length of the overlap of [a0, a1] with [b0, b1] (0 when they do not meet). */
export function overlap1d(a0: number, a1: number, b0: number, b1: number): number {
  return Math.max(0, Math.min(a1, b1) - Math.max(a0, b0));
}

/**
 * Metres of each level that count for a layer: a cell's weight is its area times this number.
 * Bottom is chosen column by column and has no per-level weight (all zeros here).
 */
export function layerLevelMetres(layer: LayerSpec, vertical: VerticalAxis): Float64Array {
  const out = new Float64Array(vertical.nz);
  for (let k = 0; k < vertical.nz; k++) {
    const top = vertical.edges[k];
    const bot = vertical.edges[k + 1];
    switch (layer.kind) {
      case 'interval':
        out[k] = overlap1d(top, bot, layer.top, layer.bottom);
        break;
      case 'surface':
        out[k] = k === 0 ? bot - top : 0;
        break;
      case 'all':
        out[k] = bot - top;
        break;
      case 'bottom':
        out[k] = 0;
        break;
    }
  }
  return out;
}
