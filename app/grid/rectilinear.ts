import { StillwaterError } from '../errors.js';
import { EARTH_RADIUS_M, type HorizontalGrid } from './types.js';

const RAD = Math.PI / 180;

/** Exact area of a lat-lon cell on a sphere: R² Δλ (sin φ2 − sin φ1). */
export function latLonCellArea(lon1: number, lon2: number, lat1: number, lat2: number, radius = EARTH_RADIUS_M): number {
  return radius * radius * Math.abs(lon2 - lon1) * RAD * Math.abs(sinDiff(lat1, lat2));
}

/**
 * sin(b) − sin(a) = 2 cos((a+b)/2) sin((b−a)/2) for degrees a, b: accurate when they are close and near
 * the poles, where the plain difference loses digits (the cell areas and the regridding overlaps use it
 * alike, so a fully covered cell has a coverage of 1 to rounding).
 */
export function sinDiff(aDeg: number, bDeg: number): number {
  return 2 * Math.cos(0.5 * (aDeg + bDeg) * RAD) * Math.sin(0.5 * (bDeg - aDeg) * RAD);
}

/** A regular or irregular lat-lon grid from its cell edges (increasing, degrees). */
export function makeRectilinearGrid(lonEdges: Float64Array, latEdges: Float64Array, boundsDerived = false, radius = EARTH_RADIUS_M): HorizontalGrid {
  checkIncreasing(lonEdges, 'longitude edges');
  checkIncreasing(latEdges, 'latitude edges');
  const nx = lonEdges.length - 1;
  const ny = latEdges.length - 1;
  const lon1 = new Float64Array(nx);
  const lat1 = new Float64Array(ny);
  for (let i = 0; i < nx; i++) lon1[i] = 0.5 * (lonEdges[i] + lonEdges[i + 1]);
  for (let j = 0; j < ny; j++) lat1[j] = 0.5 * (latEdges[j] + latEdges[j + 1]);
  const n = nx * ny;
  const lon = new Float64Array(n);
  const lat = new Float64Array(n);
  const cornerLon = new Float64Array(n * 4);
  const cornerLat = new Float64Array(n * 4);
  const area = new Float64Array(n);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const c = j * nx + i;
      lon[c] = lon1[i];
      lat[c] = lat1[j];
      const w = lonEdges[i], e = lonEdges[i + 1], s = latEdges[j], nn = latEdges[j + 1];
      cornerLon.set([w, e, e, w], c * 4);
      cornerLat.set([s, s, nn, nn], c * 4);
      area[c] = latLonCellArea(w, e, s, nn, radius);
    }
  }
  const span = lonEdges[nx] - lonEdges[0];
  return {
    kind: 'rectilinear',
    nx,
    ny,
    lon,
    lat,
    cornerLon,
    cornerLat,
    axes: { lon: lon1, lat: lat1, lonEdges, latEdges },
    boundsDerived,
    periodic: Math.abs(span - 360) < 1e-6,
    area,
  };
}

/** A regular global grid of dLon × dLat degrees, starting at lon0 (default -180). */
export function makeRegularGrid(dLon: number, dLat: number, lon0 = -180): HorizontalGrid {
  const nx = Math.round(360 / dLon);
  const ny = Math.round(180 / dLat);
  const lonEdges = new Float64Array(nx + 1);
  const latEdges = new Float64Array(ny + 1);
  for (let i = 0; i <= nx; i++) lonEdges[i] = lon0 + (i * 360) / nx;
  for (let j = 0; j <= ny; j++) latEdges[j] = -90 + (j * 180) / ny;
  return makeRectilinearGrid(lonEdges, latEdges);
}

function checkIncreasing(a: Float64Array, what: string): void {
  if (a.length < 2) throw new StillwaterError('E_GRID', `A grid needs at least two ${what}.`);
  for (let i = 1; i < a.length; i++) {
    if (!(a[i] > a[i - 1])) throw new StillwaterError('E_GRID', `The ${what} must increase strictly (index ${i}).`);
  }
}
