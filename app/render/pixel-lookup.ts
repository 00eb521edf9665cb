/**
 * The pixel-to-cell lookup behind every map: each pixel centre is inverse-projected once and the
 * grid cell under it found, so that a change of depth or variable only recolours (see recolour.ts).
 */
import type { MapProjection } from './projections.js';

/** lookup value of a pixel that lies off the globe or outside the projection's view */
export const OFF_MAP = -1;
/** lookup value of a pixel on the globe that no grid cell covers */
export const OFF_GRID = -2;

/** Canvas height that keeps the projection's aspect ratio for a given width. */
export function canvasHeightFor(proj: MapProjection, width: number): number {
  const e = proj.extent;
  return Math.max(1, Math.round((width * (e.ymax - e.ymin)) / (e.xmax - e.xmin)));
}

/** Projected coordinates of a pixel centre (row 0 at the top). */
export function pixelToProjected(proj: MapProjection, width: number, height: number, px: number, py: number): [number, number] {
  const e = proj.extent;
  return [e.xmin + ((px + 0.5) * (e.xmax - e.xmin)) / width, e.ymax - ((py + 0.5) * (e.ymax - e.ymin)) / height];
}

/** Fractional pixel position of projected coordinates (inverse of pixelToProjected). */
export function projectedToPixel(proj: MapProjection, width: number, height: number, x: number, y: number): [number, number] {
  const e = proj.extent;
  return [((x - e.xmin) / (e.xmax - e.xmin)) * width - 0.5, ((e.ymax - y) / (e.ymax - e.ymin)) * height - 0.5];
}

/** Index of the interval of increasing `edges` that holds v, or -1. */
export function findInterval(edges: ArrayLike<number>, v: number): number {
  const n = edges.length - 1;
  if (!(v >= edges[0] && v <= edges[n])) return -1;
  let lo = 0;
  let hi = n;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (edges[mid] <= v) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Cell (j * nx + i) of a rectilinear grid with the given edges that holds (lon, lat), or OFF_GRID. */
export function cellAt(lonEdges: ArrayLike<number>, latEdges: ArrayLike<number>, lon: number, lat: number): number {
  const nx = lonEdges.length - 1;
  const west = lonEdges[0];
  const span = lonEdges[nx] - west;
  // a periodic grid takes any longitude: bring it into [west, west + 360)
  let l = lon;
  if (Math.abs(span - 360) < 1e-6) l = west + ((((lon - west) % 360) + 360) % 360);
  const i = findInterval(lonEdges, l);
  const j = findInterval(latEdges, lat);
  return i < 0 || j < 0 ? OFF_GRID : j * nx + i;
}

/**
 * For a canvas of width × height pixels showing `proj`, the cell of each pixel (row-major, row 0 at
 * the top): a grid cell index, OFF_MAP or OFF_GRID.
 */
export function buildPixelLookup(
  proj: MapProjection,
  lonEdges: ArrayLike<number>,
  latEdges: ArrayLike<number>,
  width: number,
  height: number,
): Int32Array {
  if (ROW_LINEAR.has(proj.info.id)) return rowwiseLookup(proj, lonEdges, latEdges, width, height);
  const out = new Int32Array(width * height);
  for (let py = 0; py < height; py++) {
    for (let px = 0; px < width; px++) {
      const [x, y] = pixelToProjected(proj, width, height, px, py);
      const ll = proj.inverse(x, y);
      out[py * width + px] = ll === null ? OFF_MAP : cellAt(lonEdges, latEdges, ll[0], ll[1]);
    }
  }
  return out;
}

/**
 * The lookup of a window moved by whole pixels from one whose lookup is known (a pan): the overlap is copied and
 * only the pixels that come into view are inverse-projected. `dx` pixels to the east, `dy` pixels to the north.
 */
export function shiftPixelLookup(
  previous: Int32Array,
  proj: MapProjection,
  lonEdges: ArrayLike<number>,
  latEdges: ArrayLike<number>,
  width: number,
  height: number,
  dx: number,
  dy: number,
): Int32Array {
  // a row-linear projection builds a whole lookup faster than it would project the strip pixel by pixel
  if (ROW_LINEAR.has(proj.info.id)) return rowwiseLookup(proj, lonEdges, latEdges, width, height);
  const out = new Int32Array(width * height);
  for (let py = 0; py < height; py++) {
    const oy = py - dy;
    const rowInside = oy >= 0 && oy < height;
    for (let px = 0; px < width; px++) {
      const ox = px + dx;
      if (rowInside && ox >= 0 && ox < width) {
        out[py * width + px] = previous[oy * width + ox];
        continue;
      }
      const [x, y] = pixelToProjected(proj, width, height, px, py);
      const ll = proj.inverse(x, y);
      out[py * width + px] = ll === null ? OFF_MAP : cellAt(lonEdges, latEdges, ll[0], ll[1]);
    }
  }
  return out;
}

/**
 * Projections centred on 0° in which, along a row of the map, longitude is proportional to x and latitude is
 * constant: plate carrée (λ = x / R) and Equal Earth (Šavrič, Patterson & Jenny 2018: x = 2√3 R λ cos θ /
 * (3 (9 A4 θ⁸ + 7 A3 θ⁶ + 3 A2 θ² + A1)), y a function of θ alone).
 */
const ROW_LINEAR = new Set(['plate', 'equal-earth']);

/**
 * The lookup of a row-linear projection with one inverse projection per row instead of one per pixel (a zoom
 * builds a new lookup while the person waits): the row's latitude and its degrees of longitude per metre come
 * from the inverse of one point of the row; a pixel beyond ±180° lies off the globe.
 */
function rowwiseLookup(proj: MapProjection, lonEdges: ArrayLike<number>, latEdges: ArrayLike<number>, width: number, height: number): Int32Array {
  const out = new Int32Array(width * height);
  const e = proj.extent;
  const dx = (e.xmax - e.xmin) / width;
  const nx = lonEdges.length - 1;
  const west = lonEdges[0];
  const periodic = Math.abs(lonEdges[nx] - west - 360) < 1e-6;
  // a point a little east of the central meridian, on the globe at every latitude the map shows
  const xRef = 1e-3 * (proj.forward(180 - 1e-9, 0)?.[0] ?? 1);
  for (let py = 0; py < height; py++) {
    const row = out.subarray(py * width, (py + 1) * width);
    const y = e.ymax - ((py + 0.5) * (e.ymax - e.ymin)) / height;
    const ref = proj.inverse(xRef, y);
    if (ref === null) {
      row.fill(OFF_MAP);
      continue;
    }
    const j = findInterval(latEdges, ref[1]);
    const perMetre = ref[0] / xRef;
    let i = -1;
    for (let px = 0; px < width; px++) {
      const lon = (e.xmin + (px + 0.5) * dx) * perMetre;
      if (!(lon >= -180 && lon <= 180)) {
        row[px] = OFF_MAP;
        continue;
      }
      if (j < 0) {
        row[px] = OFF_GRID;
        continue;
      }
      let l = lon;
      if (periodic) l = west + ((((lon - west) % 360) + 360) % 360);
      // longitude grows along the row: step on from the last cell instead of searching anew
      if (i >= 0 && l >= lonEdges[i] && l <= lonEdges[i + 1]) {
        row[px] = j * nx + i;
        continue;
      }
      if (i >= 0 && i + 1 < nx && l >= lonEdges[i + 1] && l <= lonEdges[i + 2]) {
        i++;
        row[px] = j * nx + i;
        continue;
      }
      i = findInterval(lonEdges, l);
      row[px] = i < 0 ? OFF_GRID : j * nx + i;
    }
  }
  return out;
}
