/**
 * Land from the Natural Earth shapes that the `world-atlas` package ships (public domain), rasterised by
 * scanlines: a cell is land when its centre lies inside the land polygons (even-odd rule, so lakes cut
 * out of the land stay water). Used for the demo scenario; never fetched at run time.
 */
import { createRequire } from 'node:module';
import { feature } from 'topojson-client';
import type { Topology, GeometryObject } from 'topojson-specification';
import type { MultiPolygon, Polygon, Feature, FeatureCollection } from 'geojson';

export type LandResolution = '110m' | '50m';

export function loadLandRings(resolution: LandResolution = '50m'): number[][][] {
  const require = createRequire(import.meta.url);
  const topo = require(`world-atlas/land-${resolution}.json`) as Topology<{ land: GeometryObject }>;
  const geo = feature(topo, topo.objects.land) as Feature | FeatureCollection;
  const features = 'features' in geo ? geo.features : [geo];
  const rings: number[][][] = [];
  for (const f of features) {
    const g = f.geometry as Polygon | MultiPolygon;
    const polys = g.type === 'Polygon' ? [g.coordinates] : g.coordinates;
    for (const p of polys) for (const r of p) rings.push(r);
  }
  return rings;
}

/**
 * Land mask (1 = land) on a regular grid whose cell centres are lon0 + (i + 0.5) dLon, -90 + (j + 0.5) dLat,
 * row-major with longitude fastest and latitude increasing.
 */
export function rasteriseLand(rings: number[][][], nx: number, ny: number, lon0 = -180): Uint8Array {
  const dLon = 360 / nx;
  const dLat = 180 / ny;
  const crossings: number[][] = Array.from({ length: ny }, () => []);
  const addEdge = (x1: number, y1: number, x2: number, y2: number): void => {
    if (y1 === y2) return;
    const lo = Math.min(y1, y2);
    const hi = Math.max(y1, y2);
    // rows whose centre latitude c satisfies lo <= c < hi
    const jStart = Math.max(0, Math.ceil((lo + 90) / dLat - 0.5));
    const jEnd = Math.min(ny - 1, Math.ceil((hi + 90) / dLat - 0.5) - 1);
    for (let j = jStart; j <= jEnd; j++) {
      const c = -90 + (j + 0.5) * dLat;
      crossings[j].push(x1 + ((c - y1) / (y2 - y1)) * (x2 - x1));
    }
  };
  for (const ring of rings) {
    // Edges that jump across the antimeridian are not drawn across the map; instead the ring's stretches
    // along the map's east and west borders are closed by vertical edges there (through the pole for a
    // ring that encircles it, as Antarctica does).
    const seam: number[] = [];
    let meanLat = 0;
    for (let e = 0; e + 1 < ring.length; e++) {
      const [x1, y1] = ring[e];
      const [x2, y2] = ring[e + 1];
      meanLat += y1;
      if (Math.abs(x2 - x1) > 180) {
        const x2u = x2 + (x1 > x2 ? 360 : -360);
        const border = x1 > x2 ? 180 : -180;
        seam.push(y1 + ((border - x1) / (x2u - x1)) * (y2 - y1));
      } else addEdge(x1, y1, x2, y2);
    }
    if (seam.length % 2 === 1) seam.push(meanLat < 0 ? -90 : 90);
    seam.sort((a, b) => a - b);
    for (let m = 0; m + 1 < seam.length; m += 2) {
      addEdge(-180, seam[m], -180, seam[m + 1]);
      addEdge(180, seam[m], 180, seam[m + 1]);
    }
  }
  const mask = new Uint8Array(nx * ny);
  for (let j = 0; j < ny; j++) {
    const xs = crossings[j].sort((a, b) => a - b);
    for (let m = 0; m + 1 < xs.length; m += 2) {
      const iStart = Math.max(0, Math.ceil((xs[m] - lon0) / dLon - 0.5));
      const iEnd = Math.min(nx - 1, Math.ceil((xs[m + 1] - lon0) / dLon - 0.5) - 1);
      for (let i = iStart; i <= iEnd; i++) mask[j * nx + i] = 1;
    }
  }
  return mask;
}
