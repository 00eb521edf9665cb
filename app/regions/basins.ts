/**
 * Built-in approximate ocean basins, drawn with our own boundary lines (documented in BASINS.md).
 * Every point of the sphere belongs to exactly one of the five basins, so every wet cell of any grid
 * does too; "global" is their union.
 */
import { pointInPolygon, wrapLon } from './polygon.js';

export const BASIN_NAMES = ['atlantic', 'pacific', 'indian', 'southern', 'arctic'] as const;
export type BasinName = (typeof BASIN_NAMES)[number];
export const BUILT_IN_REGIONS = ['global', ...BASIN_NAMES] as const;
export type BuiltInRegion = (typeof BUILT_IN_REGIONS)[number];

/** Southern Ocean: everything south of this latitude. */
export const SOUTHERN_LIMIT = -35;
/** Arctic: everything at or north of this latitude, plus Hudson Bay (HUDSON_BOX). */
export const ARCTIC_LIMIT = 66;
/** Hudson Bay and James Bay: [west, east, south] in degrees; the box reaches up to ARCTIC_LIMIT. */
export const HUDSON_BOX = [-96, -76, 51] as const;

/**
 * Atlantic, between SOUTHERN_LIMIT and ARCTIC_LIMIT: west side through the Americas (Andes, the Central
 * American isthmus, Mexico, the North American interior), east side through Africa, Suez, the Near East.
 * Flat [lon, lat] pairs, counter-clockwise. Its southern edge lies below SOUTHERN_LIMIT on purpose.
 */
export const ATLANTIC_OUTLINE = [
  -68, -36, 20, -36, 20, -10, 25, 0, 30, 20, 32.3, 30.5, 36, 32, 60, 36, 60, 67, -96, 67, -96, 50, -100, 45, -106, 32, -104, 26,
  -98, 20, -94.5, 17, -91, 15.5, -88, 14.5, -86, 12.5, -84.5, 10.5, -83, 9, -81, 8.6, -79.7, 9.1, -77.4, 7.6, -75, 5, -75, -5,
  -68, -20,
];

/**
 * Indian, between SOUTHERN_LIMIT and Asia: west side shared with the Atlantic through Africa and Suez,
 * north through the Near East and Asia, east side along the Malay peninsula, Sumatra, Java and the Lesser
 * Sunda islands to Timor, then across northern Australia to 147°E at the Southern Ocean line.
 */
export const INDIAN_OUTLINE = [
  20, -36, 147, -36, 134, -14, 131, -11.2, 125, -9.3, 121, -8.6, 116.3, -8.6, 114, -7.9, 110, -7.3, 106.5, -6.7, 104, -3.5,
  103.5, 1.6, 101, 5.5, 99, 10, 100, 20, 100, 36, 60, 36, 36, 32, 32.3, 30.5, 30, 20, 25, 0, 20, -10,
];

/** The basin of one point (degrees); the Pacific is what no other line claims. */
export function basinOf(lon: number, lat: number): BasinName {
  if (lat < SOUTHERN_LIMIT) return 'southern';
  if (lat >= ARCTIC_LIMIT) return 'arctic';
  const x = wrapLon(lon);
  if (lat >= HUDSON_BOX[2] && x >= HUDSON_BOX[0] && x <= HUDSON_BOX[1]) return 'arctic';
  if (pointInPolygon(x, lat, [ATLANTIC_OUTLINE])) return 'atlantic';
  if (pointInPolygon(x, lat, [INDIAN_OUTLINE])) return 'indian';
  return 'pacific';
}

/** Basin index (position in BASIN_NAMES) of every cell centre. */
export function basinIndex(lon: ArrayLike<number>, lat: ArrayLike<number>): Uint8Array {
  const out = new Uint8Array(lon.length);
  for (let c = 0; c < lon.length; c++) out[c] = BASIN_NAMES.indexOf(basinOf(lon[c], lat[c]));
  return out;
}

/** Cells (indices) of one built-in region on a grid given by its cell centres. */
export function builtInRegionCells(name: BuiltInRegion, lon: ArrayLike<number>, lat: ArrayLike<number>, index?: Uint8Array): Int32Array {
  if (name === 'global') {
    const all = new Int32Array(lon.length);
    for (let c = 0; c < all.length; c++) all[c] = c;
    return all;
  }
  const idx = index ?? basinIndex(lon, lat);
  const b = BASIN_NAMES.indexOf(name);
  let n = 0;
  for (let c = 0; c < idx.length; c++) if (idx[c] === b) n++;
  const cells = new Int32Array(n);
  n = 0;
  for (let c = 0; c < idx.length; c++) if (idx[c] === b) cells[n++] = c;
  return cells;
}

export function isBuiltInRegion(name: string): name is BuiltInRegion {
  return (BUILT_IN_REGIONS as readonly string[]).includes(name);
}
