/** Waypoints as people type them: "lon,lat;lon,lat;..." in degrees. */
import { StillwaterError } from '../errors.js';
import type { LonLat } from './great-circle.js';

/** Check one waypoint; `where` names it in the sentence (e.g. "--path waypoint 2"). */
export function checkWaypoint(p: LonLat, where: string): void {
  if (!Number.isFinite(p.lon) || !Number.isFinite(p.lat)) {
    throw new StillwaterError('E_INPUT', `${where}: longitude and latitude must be numbers.`);
  }
  if (p.lat < -90 || p.lat > 90) {
    throw new StillwaterError('E_INPUT', `${where}: latitude ${p.lat} lies outside -90..90 degrees north.`);
  }
  if (p.lon < -180 || p.lon > 360) {
    throw new StillwaterError('E_INPUT', `${where}: longitude ${p.lon} lies outside -180..360 degrees east.`);
  }
}

/** Check a list of waypoints: at least two, each in range. */
export function checkWaypoints(points: LonLat[], where = 'path'): void {
  if (points.length < 2) {
    throw new StillwaterError('E_INPUT', `${where}: a line needs at least two waypoints, got ${points.length}.`);
  }
  points.forEach((p, i) => checkWaypoint(p, `${where} waypoint ${i + 1}`));
}

/** Parse "lon,lat;lon,lat;..." (whitespace allowed) into checked waypoints. */
export function parseWaypoints(text: string, where = '--path'): LonLat[] {
  const parts = text
    .split(';')
    .map((s) => s.trim())
    .filter((s) => s.length > 0);
  const points = parts.map((part, i) => {
    const xy = part.split(',').map((s) => s.trim());
    if (xy.length !== 2 || xy.some((s) => s === '' || !Number.isFinite(Number(s)))) {
      throw new StillwaterError('E_INPUT', `${where} waypoint ${i + 1} '${part}' is not "lon,lat" in degrees.`);
    }
    return { lon: Number(xy[0]), lat: Number(xy[1]) };
  });
  checkWaypoints(points, where);
  return points;
}

/** Parse "a,b" into two finite numbers (depth ranges, latitude ranges...). */
export function parseRange(text: string, where: string): [number, number] {
  const xy = text.split(',').map((s) => s.trim());
  if (xy.length !== 2 || xy.some((s) => s === '' || !Number.isFinite(Number(s)))) {
    throw new StillwaterError('E_INPUT', `${where} '${text}' is not two numbers "a,b".`);
  }
  return [Number(xy[0]), Number(xy[1])];
}
