import type { VerticalAxis } from '../grid/types.js';
import { layerLevelMetres, type LayerSpec } from '../regions/layers.js';

/**
 * For each layer, the fraction of each level's thickness that counts (0..1): a level straddling a layer
 * edge contributes only the part of its volume inside (the regions helper's layerLevelMetres). The bottom
 * layer has no fractions: it is collected column by column (deepest wet cell). A 2-D field is one level
 * that every layer but the bottom takes whole.
 */
export function layerFractions(layers: LayerSpec[], vertical: VerticalAxis | null): (Float64Array | null)[] {
  return layers.map((layer) => {
    if (layer.kind === 'bottom') return null;
    if (!vertical) return Float64Array.of(1);
    const metres = layerLevelMetres(layer, vertical);
    return metres.map((m, k) => m / vertical.thickness[k]);
  });
}

/** Below this depth a layer is in the deep ocean (common practice). */
export const DEEP_OCEAN_M = 1000;

/** Does the layer reach the deep ocean on this grid? The bottom layer does wherever the sea is deep. */
export function isDeepLayer(layer: LayerSpec, vertical: VerticalAxis | null): boolean {
  if (!vertical) return false;
  const floor = vertical.edges[vertical.nz];
  switch (layer.kind) {
    case 'bottom':
    case 'all':
      return floor > DEEP_OCEAN_M;
    case 'interval':
      return layer.bottom > DEEP_OCEAN_M && floor > DEEP_OCEAN_M;
    case 'surface':
      return false;
  }
}
