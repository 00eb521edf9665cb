/**
 * A map panel's raster: the pixel-to-cell lookup of app/render paints one level of a field, and the pixels
 * become a PNG to embed in the SVG. Lookups are kept for the few (projection, grid, size) combinations a
 * report draws, so the reference, every run and every difference share one.
 */
import { log10Values } from '../render/colour-mapping.js';
import { buildPixelLookup, canvasHeightFor } from '../render/pixel-lookup.js';
import type { MapProjection } from '../render/projections.js';
import { packRgba, recolour } from '../render/recolour.js';
import type { ColourScale } from '../render/colour-scales.js';
import { encodePng, pngDataUrl } from './png.js';

export interface RasterGrid {
  lonEdges: ArrayLike<number>;
  latEdges: ArrayLike<number>;
}

const lookups: { key: string; grid: RasterGrid; lookup: Int32Array }[] = [];
const KEEP = 4;

export function lookupFor(p: MapProjection, grid: RasterGrid, width: number, height: number): Int32Array {
  const e = p.extent;
  const key = `${p.info.id}|${e.xmin},${e.xmax},${e.ymin},${e.ymax}|${width}x${height}`;
  const hit = lookups.find((l) => l.key === key && l.grid.lonEdges === grid.lonEdges && l.grid.latEdges === grid.latEdges);
  if (hit) return hit.lookup;
  const lookup = buildPixelLookup(p, grid.lonEdges, grid.latEdges, width, height);
  lookups.unshift({ key, grid, lookup });
  if (lookups.length > KEEP) lookups.length = KEEP;
  return lookup;
}

/** Raster width for a panel: print resolution, but no more than a few pixels per grid cell. */
export function rasterWidth(panelMm: number, nx: number, dpi = 300): number {
  return Math.max(64, Math.min(Math.round((panelMm / 25.4) * dpi), Math.max(720, 4 * nx)));
}

export const MISSING_RGBA = packRgba(0xe3, 0xe5, 0xe8);
export const OFF_MAP_RGBA = packRgba(255, 255, 255, 0);
/** land (no water in the common grid) and water without values: two greys a person can tell apart (screen and export) */
export const LAND_RGBA = packRgba(190, 188, 182);
export const NO_DATA_RGBA = packRgba(236, 236, 240);

export interface PaintOptions {
  /** logarithmic stretch: min and max are values (> 0); values at or below zero take the lowest colour */
  log?: boolean;
  /** above zero where a cell has water: its missing value is drawn as no data, others as land */
  water?: ArrayLike<number>;
}

/** PNG data URL of one field painted on a projection. */
export function paintMap(p: MapProjection, grid: RasterGrid, values: Float32Array, scale: ColourScale, min: number, max: number, width: number, opts: PaintOptions = {}): { url: string; width: number; height: number } {
  const height = canvasHeightFor(p, width);
  const lookup = lookupFor(p, grid, width, height);
  const pixels = new Uint32Array(width * height);
  recolour(opts.log ? log10Values(values) : values, lookup, pixels, {
    palette: scale.packed,
    min: opts.log ? Math.log10(min) : min,
    max: opts.log ? Math.log10(max) : max,
    missing: opts.water ? LAND_RGBA : MISSING_RGBA,
    background: OFF_MAP_RGBA,
    water: opts.water,
    noData: NO_DATA_RGBA,
  });
  const png = encodePng(new Uint8Array(pixels.buffer), width, height);
  return { url: pngDataUrl(png), width, height };
}
