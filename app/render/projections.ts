/**
 * The map projections the views offer, all through proj4 on a sphere of the GRS 80 mean radius.
 * Each carries its projected extent so that the screen can lay out a canvas with the right aspect.
 */
import proj4 from 'proj4';
import { StillwaterError } from '../errors.js';
import { EARTH_RADIUS_M } from '../grid/types.js';

export type ProjectionId = 'plate' | 'equal-earth' | 'north-polar' | 'south-polar';

export interface ProjectionInfo {
  id: ProjectionId;
  /** what the chooser shows */
  label: string;
  /** proj4 definition (also what pyproj is given in the fixture script) */
  definition: string;
  /** polar views show only latitudes poleward of this (degrees, signed); null for world views */
  latitudeLimit: number | null;
}

const R = EARTH_RADIUS_M;

export const PROJECTIONS: readonly ProjectionInfo[] = [
  { id: 'plate', label: 'Equirectangular', definition: `+proj=eqc +lon_0=0 +R=${R} +units=m +no_defs`, latitudeLimit: null },
  { id: 'equal-earth', label: 'Equal Earth (equal area)', definition: `+proj=eqearth +lon_0=0 +R=${R} +units=m +no_defs`, latitudeLimit: null },
  { id: 'north-polar', label: 'North polar stereographic', definition: `+proj=stere +lat_0=90 +lon_0=0 +k=1 +R=${R} +units=m +no_defs`, latitudeLimit: 40 },
  { id: 'south-polar', label: 'South polar stereographic', definition: `+proj=stere +lat_0=-90 +lon_0=0 +k=1 +R=${R} +units=m +no_defs`, latitudeLimit: -40 },
];

export function projectionInfo(id: string): ProjectionInfo {
  const p = PROJECTIONS.find((x) => x.id === id);
  if (!p) throw new StillwaterError('E_INPUT', `Unknown map projection '${id}'; choose one of ${PROJECTIONS.map((x) => x.id).join(', ')}.`);
  return p;
}

export interface Extent {
  xmin: number;
  xmax: number;
  ymin: number;
  ymax: number;
}

/** A projection ready to use: forward and inverse on degrees and metres, and its extent. */
export interface MapProjection {
  info: ProjectionInfo;
  extent: Extent;
  /** [x, y] in metres, or null where the point does not belong to this view */
  forward(lon: number, lat: number): [number, number] | null;
  /** [lon, lat] in degrees, or null where (x, y) lies off the view (off the globe or beyond the latitude limit) */
  inverse(x: number, y: number): [number, number] | null;
}

const D2R = Math.PI / 180;

/** proj4's projection object itself: radians in, metres out. Both ends are on the same sphere, so no datum step. */
interface RawProjection {
  forward(p: { x: number; y: number }): { x: number; y: number } | null | undefined;
  inverse(p: { x: number; y: number }): { x: number; y: number } | null | undefined;
}

export function makeProjection(id: ProjectionId): MapProjection {
  const info = projectionInfo(id);
  // the projection object without proj4's per-point wrapper (array handling, datum checks): several times faster
  // for the pixel lookup, and the same numbers (the fixture test holds it against pyproj)
  const raw = new (proj4.Proj as unknown as new (def: string) => RawProjection)(info.definition);
  const limit = info.latitudeLimit;
  const inView = (lat: number): boolean => (limit === null ? true : limit > 0 ? lat >= limit : lat <= limit);
  const rawForward = (lon: number, lat: number): [number, number] => {
    const p = raw.forward({ x: lon * D2R, y: lat * D2R });
    return p ? [p.x, p.y] : [NaN, NaN];
  };
  const rawInverse = (x: number, y: number): [number, number] => {
    const q = raw.inverse({ x, y });
    return q ? [q.x / D2R, q.y / D2R] : [NaN, NaN];
  };

  // extent: world views from the equator and central meridian (just inside the poles and the
  // antimeridian, where proj4's round trips are exact); polar views a square around the limit circle
  let extent: Extent;
  if (limit === null) {
    const east = rawForward(180 - 1e-9, 0)[0];
    const north = rawForward(0, 90 - 1e-9)[1];
    extent = { xmin: -east, xmax: east, ymin: -north, ymax: north };
  } else {
    const [x, y] = rawForward(0, limit);
    const r = Math.hypot(x, y);
    extent = { xmin: -r, xmax: r, ymin: -r, ymax: r };
  }
  // a tolerance for the round-trip check that tells points on the globe from points off it
  const tol = 1e-6 * (extent.xmax - extent.xmin);

  return {
    info,
    extent,
    forward(lon, lat) {
      if (!(lat >= -90 && lat <= 90) || !inView(lat)) return null;
      const p = rawForward(lon, lat);
      return Number.isFinite(p[0]) && Number.isFinite(p[1]) ? p : null;
    },
    inverse(x, y) {
      const [lon, lat] = rawInverse(x, y);
      if (!Number.isFinite(lon) || !Number.isFinite(lat) || lat < -90 || lat > 90) return null;
      if (!inView(lat)) return null;
      // proj4 clamps some points that lie off the globe onto its edge: a round trip exposes them
      const back = rawForward(lon, lat);
      if (!(Math.abs(back[0] - x) <= tol && Math.abs(back[1] - y) <= tol)) return null;
      return [lon, lat];
    },
  };
}
