/**
 * Point in polygon on the lon/lat plane by ray casting (even-odd rule), rings as flat [lon, lat, ...] lists.
 * A polygon is an outer ring and optional holes, as in GeoJSON.
 */
export type Ring = ArrayLike<number>;

export function pointInRing(x: number, y: number, ring: Ring): boolean {
  let inside = false;
  const n = ring.length / 2;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const xi = ring[2 * i], yi = ring[2 * i + 1];
    const xj = ring[2 * j], yj = ring[2 * j + 1];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Inside the outer ring and in none of the holes. */
export function pointInPolygon(x: number, y: number, rings: Ring[]): boolean {
  if (rings.length === 0 || !pointInRing(x, y, rings[0])) return false;
  for (let h = 1; h < rings.length; h++) if (pointInRing(x, y, rings[h])) return false;
  return true;
}

/** Longitude brought into [-180, 180). */
export function wrapLon(lon: number): number {
  const x = ((((lon + 180) % 360) + 360) % 360) - 180;
  return x;
}
