/**
 * Longitude and latitude of a projected raster's cell centres and corners: pixel edges and centres in the
 * projection from the geotransform, then the inverse projection (proj4) on the raster's own ellipsoid.
 * Corners are computed once per grid vertex and shared by the four cells that meet there, so neighbouring
 * cells close exactly. They come as CF 2-D bounds (ny, nx, 4), counter-clockwise in the projection's x/y
 * (and so on the Earth, since these projections keep orientation).
 */
import proj4 from 'proj4';
import type { GeoTransform } from './geotiff-transform.js';
import { lonLatOnSameEllipsoid } from './geotiff-crs.js';

export interface ProjectedLonLat {
  /** ny * nx centre longitudes and latitudes, degrees, row by row as the raster is stored */
  lon: Float64Array;
  lat: Float64Array;
  /** ny * nx * 4 corner longitudes and latitudes */
  lonBounds: Float64Array;
  latBounds: Float64Array;
}

export function projectedLonLat(proj4def: string, t: GeoTransform, nx: number, ny: number, pixelIsPoint: boolean): ProjectedLonLat {
  const inverse = proj4(proj4def, lonLatOnSameEllipsoid(proj4def));
  const shift = pixelIsPoint ? 0 : 0.5;
  const toLonLat = (x: number, y: number): [number, number] => {
    const p = inverse.forward([x, y]) as number[];
    return [p[0], p[1]];
  };
  const lon = new Float64Array(nx * ny);
  const lat = new Float64Array(nx * ny);
  for (let j = 0; j < ny; j++) {
    const y = t.y.origin + (j + shift) * t.y.step;
    for (let i = 0; i < nx; i++) {
      [lon[j * nx + i], lat[j * nx + i]] = toLonLat(t.x.origin + (i + shift) * t.x.step, y);
    }
  }
  // vertex (jj, ii) lies at raster coordinate (ii + shift - 0.5, jj + shift - 0.5)
  const W = nx + 1;
  const vLon = new Float64Array((ny + 1) * W);
  const vLat = new Float64Array((ny + 1) * W);
  for (let jj = 0; jj <= ny; jj++) {
    const y = t.y.origin + (jj + shift - 0.5) * t.y.step;
    for (let ii = 0; ii <= nx; ii++) {
      [vLon[jj * W + ii], vLat[jj * W + ii]] = toLonLat(t.x.origin + (ii + shift - 0.5) * t.x.step, y);
    }
  }
  // counter-clockwise in x/y: low x low y, high x low y, high x high y, low x high y
  const [iLo, iHi] = t.x.step > 0 ? [0, 1] : [1, 0];
  const [jLo, jHi] = t.y.step > 0 ? [0, 1] : [1, 0];
  const order: [number, number][] = [[jLo, iLo], [jLo, iHi], [jHi, iHi], [jHi, iLo]];
  const lonBounds = new Float64Array(nx * ny * 4);
  const latBounds = new Float64Array(nx * ny * 4);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const c = (j * nx + i) * 4;
      for (let q = 0; q < 4; q++) {
        const v = (j + order[q][0]) * W + i + order[q][1];
        lonBounds[c + q] = vLon[v];
        latBounds[c + q] = vLat[v];
      }
    }
  }
  return { lon, lat, lonBounds, latBounds };
}
