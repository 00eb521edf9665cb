import type { VerticalAxis } from '../grid/types.js';
import type { LayerSpec } from './types.js';

/**
 * For each layer, the fraction of each level's thickness that lies inside the layer (0..1), so that a
 * level straddling a layer edge contributes only the part of its volume inside. The bottom layer has no
 * fractions: it is collected column by column (deepest wet cell).
 */
export function layerFractions(layers: LayerSpec[], vertical: VerticalAxis | null): (Float64Array | null)[] {
  return layers.map((layer) => {
    if (layer.kind === 'bottom') return null;
    if (!vertical) return Float64Array.of(1);
    const f = new Float64Array(vertical.nz);
    for (let k = 0; k < vertical.nz; k++) {
      const top = Math.max(layer.top, vertical.edges[k]);
      const bottom = Math.min(layer.bottom, vertical.edges[k + 1]);
      f[k] = bottom > top ? (bottom - top) / vertical.thickness[k] : 0;
    }
    return f;
  });
}

/** Deeper than any ocean (the deepest sounding is near 11 000 m): a layer to this depth holds the whole column. */
export const FULL_DEPTH_M = 12_000;

export const WHOLE_COLUMN: LayerSpec = { name: 'all depths', kind: 'depth', top: 0, bottom: FULL_DEPTH_M };

/** Below this depth a layer is in the deep ocean (common practice). */
export const DEEP_OCEAN_M = 1000;

export function isDeepLayer(layer: LayerSpec): boolean {
  return layer.kind === 'bottom' || layer.bottom > DEEP_OCEAN_M;
}
