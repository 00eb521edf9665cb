/**
 * The demo model's curvilinear grid: about 2°, a smooth distortion of a regular grid that vanishes at the
 * poles (so rows are not parallels and columns not meridians), from 80°S to the North Pole. Corners come
 * from the same mapping, so the cell bounds written to the file are exact.
 */
const RAD = Math.PI / 180;

export const MODEL_NX = 180;
export const MODEL_NY = 85;
const ETA_SOUTH = -80;

function map(xi: number, eta: number): [number, number] {
  const lon = xi + 1.6 * Math.sin(2 * eta * RAD) * Math.cos(xi * RAD);
  const lat = eta + 0.9 * Math.cos(eta * RAD) * Math.sin(2 * xi * RAD);
  return [lon, lat];
}

export interface ModelGridArrays {
  lon: Float64Array;
  lat: Float64Array;
  /** ny * nx * 4, counter-clockwise: (i-,j-), (i+,j-), (i+,j+), (i-,j+) */
  lonBounds: Float64Array;
  latBounds: Float64Array;
}

export function modelGrid(): ModelGridArrays {
  const nx = MODEL_NX;
  const ny = MODEL_NY;
  const dxi = 360 / nx;
  const deta = (90 - ETA_SOUTH) / ny;
  const lon = new Float64Array(nx * ny);
  const lat = new Float64Array(nx * ny);
  const lonBounds = new Float64Array(nx * ny * 4);
  const latBounds = new Float64Array(nx * ny * 4);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const c = j * nx + i;
      const xi0 = -180 + i * dxi;
      const eta0 = ETA_SOUTH + j * deta;
      [lon[c], lat[c]] = map(xi0 + dxi / 2, eta0 + deta / 2);
      const corners: [number, number][] = [
        map(xi0, eta0),
        map(xi0 + dxi, eta0),
        map(xi0 + dxi, eta0 + deta),
        map(xi0, eta0 + deta),
      ];
      corners.forEach(([x, y], q) => {
        lonBounds[c * 4 + q] = x;
        latBounds[c * 4 + q] = Math.min(90, y);
      });
    }
  }
  return { lon, lat, lonBounds, latBounds };
}

/** Layer edges of the demo model (20 layers to 6000 m). */
export const MODEL_DEPTH_EDGES = [0, 10, 20, 30, 50, 75, 100, 150, 200, 300, 400, 500, 700, 1000, 1500, 2000, 2500, 3000, 4000, 5000, 6000];

/** Standard depth levels of the demo climatology (33 levels, metres). */
export const REFERENCE_LEVELS = [
  0, 10, 20, 30, 50, 75, 100, 125, 150, 200, 250, 300, 400, 500, 600, 700, 800, 900, 1000, 1100, 1200, 1300, 1400, 1500, 1750, 2000,
  2500, 3000, 3500, 4000, 4500, 5000, 5500,
];
