import { makeCurvilinearGrid } from '../../../app/grid/curvilinear.js';
import type { HorizontalGrid } from '../../../app/grid/types.js';

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;

export interface RotatedSpec {
  /** geographic latitude of the grid's own north pole direction (o_lat_p of PROJ's ob_tran), degrees */
  poleLat: number;
  /** longitude added after the rotation (lon_0 of PROJ's ob_tran), degrees */
  lon0: number;
  /** cell size in rotated longitude and latitude, degrees */
  spacing: number;
  /** offset of the rotated cell edges from multiples of the spacing, degrees (longitude, latitude) */
  offset: [number, number];
}

/**
 * Rotated longitude/latitude to geographic, as PROJ's `+proj=ob_tran +o_proj=longlat +o_lon_p=0`
 * computes it (a rotation about the y axis by 90° − o_lat_p, then lon_0 added); the fixture script
 * make_pole_grids.py checks these against pyproj and the tests compare the corners.
 */
export function rotatedToGeographic(rlon: number, rlat: number, s: RotatedSpec): [number, number] {
  const lr = rlon * RAD, pr = rlat * RAD;
  const x = Math.cos(pr) * Math.cos(lr), y = Math.cos(pr) * Math.sin(lr), z = Math.sin(pr);
  const a = (90 - s.poleLat) * RAD;
  const x2 = x * Math.cos(a) - z * Math.sin(a);
  const z2 = x * Math.sin(a) + z * Math.cos(a);
  const lon = Math.atan2(y, x2) * DEG + s.lon0;
  const lat = Math.asin(Math.max(-1, Math.min(1, z2))) * DEG;
  return [((lon + 540) % 360) - 180, lat];
}

/**
 * Rotated cell edges: longitudes offset + k·spacing over one turn starting at the offset − 180;
 * latitudes the multiples of the spacing shifted by the offset, with ±90 closing the first and last rows.
 */
export function rotatedEdges(s: RotatedSpec): { lon: number[]; lat: number[] } {
  const lon: number[] = [];
  const nLon = Math.round(360 / s.spacing);
  for (let k = 0; k <= nLon; k++) lon.push(s.offset[0] - 180 + k * s.spacing);
  const lat = [-90];
  for (let k = Math.ceil((-90 - s.offset[1]) / s.spacing); s.offset[1] + k * s.spacing < 90; k++) {
    const e = s.offset[1] + k * s.spacing;
    if (e > -90) lat.push(e);
  }
  lat.push(90);
  return { lon, lat };
}

/** A global grid regular in rotated coordinates, its corners rotated to geographic ones. */
export function rotatedGrid(s: RotatedSpec): HorizontalGrid {
  const { lon: le, lat: pe } = rotatedEdges(s);
  const nx = le.length - 1, ny = pe.length - 1;
  const n = nx * ny;
  const lon = new Float64Array(n), lat = new Float64Array(n);
  const cLon = new Float64Array(4 * n), cLat = new Float64Array(4 * n);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const c = j * nx + i;
      const corners: [number, number][] = [[le[i], pe[j]], [le[i + 1], pe[j]], [le[i + 1], pe[j + 1]], [le[i], pe[j + 1]]];
      corners.forEach(([u, v], q) => ([cLon[4 * c + q], cLat[4 * c + q]] = rotatedToGeographic(u, v, s)));
      [lon[c], lat[c]] = rotatedToGeographic(0.5 * (le[i] + le[i + 1]), 0.5 * (pe[j] + pe[j + 1]), s);
    }
  }
  return makeCurvilinearGrid(lon, lat, nx, ny, { lon: cLon, lat: cLat });
}
