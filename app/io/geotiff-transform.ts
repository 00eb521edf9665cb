/**
 * Pixel-centre coordinates of a north-up GeoTIFF from its georeferencing tags (GeoTIFF 1.1, OGC 19-008r4):
 * ModelTiepoint + ModelPixelScale, or ModelTransformation without rotation terms.
 * For PixelIsArea rasters the centre of pixel i lies at raster coordinate i + 0.5; for PixelIsPoint at i.
 */
export interface AxisTransform {
  /** model coordinate of raster coordinate 0 */
  origin: number;
  /** model units per pixel (negative for y in a north-up image) */
  step: number;
}

export interface GeoTransform {
  x: AxisTransform;
  y: AxisTransform;
}

export function geoTransformFromTags(
  tiepoint: ArrayLike<number> | undefined, scale: ArrayLike<number> | undefined, matrix: ArrayLike<number> | undefined,
): GeoTransform | 'rotated' | undefined {
  if (tiepoint && tiepoint.length >= 6 && scale && scale.length >= 2) {
    const [i, j, , x, y] = Array.from(tiepoint);
    return { x: { origin: x - i * scale[0], step: scale[0] }, y: { origin: y + j * scale[1], step: -scale[1] } };
  }
  if (matrix && matrix.length >= 8) {
    if (matrix[1] !== 0 || matrix[4] !== 0) return 'rotated';
    return { x: { origin: matrix[3], step: matrix[0] }, y: { origin: matrix[7], step: matrix[5] } };
  }
  return undefined;
}

export function pixelCentres(axis: AxisTransform, n: number, pixelIsPoint: boolean): Float64Array {
  const shift = pixelIsPoint ? 0 : 0.5;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = axis.origin + (i + shift) * axis.step;
  return out;
}
