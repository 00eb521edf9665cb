/** A depth section painted into pixels: columns are samples along the x axis, rows are depths. */
import { findInterval } from '../render/pixel-lookup.js';
import { paletteIndex } from '../render/recolour.js';
import type { ColourScale } from '../render/colour-scales.js';
import { encodePng, pngDataUrl } from './png.js';

export interface SectionGrid {
  /** x edges of the samples (n + 1), increasing */
  xEdges: ArrayLike<number>;
  /** depth edges of the levels (nz + 1), metres, increasing */
  depthEdges: ArrayLike<number>;
}

/**
 * PNG data URL of level-major values[k * n + s], `width` × `height` pixels over [x0, x1] and the depths that
 * `depthAt` gives for each row (0 at the top edge, 1 at the bottom): linear or stretched, as the axis is.
 */
export function paintSection(g: SectionGrid, values: ArrayLike<number>, scale: ColourScale, min: number, max: number, depthAt: (fraction: number) => number, width: number, height: number): string {
  const n = g.xEdges.length - 1;
  const nz = g.depthEdges.length - 1;
  const x0 = g.xEdges[0];
  const x1 = g.xEdges[n];
  const col = new Int32Array(width);
  for (let px = 0; px < width; px++) col[px] = findInterval(g.xEdges, x0 + ((px + 0.5) / width) * (x1 - x0));
  const rgba = new Uint8Array(width * height * 4);
  const ncol = scale.packed.length;
  for (let py = 0; py < height; py++) {
    const k = findInterval(g.depthEdges, depthAt((py + 0.5) / height));
    if (k < 0 || k >= nz) continue;
    for (let px = 0; px < width; px++) {
      const s = col[px];
      if (s < 0) continue;
      const c = paletteIndex(values[k * n + s], min, max, ncol);
      if (c < 0) continue;
      const o = (py * width + px) * 4;
      rgba[o] = scale.rgb[c * 3];
      rgba[o + 1] = scale.rgb[c * 3 + 1];
      rgba[o + 2] = scale.rgb[c * 3 + 2];
      rgba[o + 3] = 255;
    }
  }
  return pngDataUrl(encodePng(rgba, width, height));
}
