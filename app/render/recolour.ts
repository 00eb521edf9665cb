/**
 * The tight loop that turns one level of a field into pixels through a precomputed lookup.
 * Pixels are packed RGBA in a Uint32Array over ImageData's bytes (little-endian byte order,
 * as on every platform Chromium and Electron run on): 0xAABBGGRR.
 */
import { OFF_MAP } from './pixel-lookup.js';

export function packRgba(r: number, g: number, b: number, a = 255): number {
  return ((a << 24) | (b << 16) | (g << 8) | r) >>> 0;
}

export interface RecolourStyle {
  /** palette of packed colours, lowest value first (any length ≥ 2) */
  palette: Uint32Array;
  /** value at the bottom and top of the palette; values outside are clamped */
  min: number;
  max: number;
  /** colour of missing values (land, no data) and of cells the grid does not cover */
  missing: number;
  /** colour of pixels off the map */
  background: number;
  /** metres of water per cell: a missing value where there is water is drawn in `noData`, not as land */
  water?: ArrayLike<number>;
  noData?: number;
}

/** Index into the palette for a value, or -1 for a missing value. */
export function paletteIndex(v: number, min: number, max: number, n: number): number {
  if (v !== v) return -1;
  const t = max > min ? (v - min) / (max - min) : 0.5;
  const k = Math.floor(t * n);
  return k < 0 ? 0 : k >= n ? n - 1 : k;
}

/** Fill `pixels` (one per lookup entry) with the colours of `values` (one per grid cell). */
export function recolour(values: Float32Array, lookup: Int32Array, pixels: Uint32Array, style: RecolourStyle): void {
  // colour each cell once, then gather per pixel: cheaper when pixels outnumber cells and never worse than 2×
  gatherColours(cellColours(values, style), lookup, pixels, style);
}

/** The colour of each cell (packed RGBA): the first half of recolour, kept by the screen while only the lookup changes (zoom, pan). */
export function cellColours(values: Float32Array, style: RecolourStyle, out: Uint32Array = new Uint32Array(values.length)): Uint32Array {
  const { palette, min, max, missing, water } = style;
  const noData = style.noData ?? missing;
  const n = palette.length;
  const scale = max > min ? n / (max - min) : 0;
  const mid = n >> 1;
  for (let c = 0; c < values.length; c++) {
    const v = values[c];
    if (v !== v) {
      out[c] = water !== undefined && water[c] > 0 ? noData : missing;
      continue;
    }
    let k = scale === 0 ? mid : Math.floor((v - min) * scale);
    if (k < 0) k = 0;
    else if (k >= n) k = n - 1;
    out[c] = palette[k];
  }
  return out;
}

/** Each pixel takes its cell's colour; pixels off the map the background, off the grid the missing colour. */
export function gatherColours(cellColour: Uint32Array, lookup: Int32Array, pixels: Uint32Array, style: Pick<RecolourStyle, 'missing' | 'background'>): void {
  const { missing, background } = style;
  const m = lookup.length;
  for (let p = 0; p < m; p++) {
    const c = lookup[p];
    pixels[p] = c >= 0 ? cellColour[c] : c === OFF_MAP ? background : missing;
  }
}
