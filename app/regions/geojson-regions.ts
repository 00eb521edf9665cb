/**
 * User regions from GeoJSON (RFC 7946): each Polygon or MultiPolygon feature becomes one region, named by
 * a property (default "name"); a cell belongs to it when its centre lies inside (holes respected).
 */
import { readFile } from 'node:fs/promises';
import { StillwaterError } from '../errors.js';
import { checkParsingHere } from '../io/parsing-thread.js';
import type { HorizontalGrid } from '../grid/types.js';
import { pointInPolygon, wrapLon, type Ring } from './polygon.js';
import { cellsWhere, type Region } from './region.js';

export interface NamedPolygons {
  name: string;
  /** polygons, each a list of rings (outer first), each ring flat [lon, lat, ...] */
  polygons: Ring[][];
}

type Json = unknown;

function isObj(x: Json): x is Record<string, Json> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

function ringOf(coords: Json, where: string): Float64Array {
  if (!Array.isArray(coords) || coords.length < 3) throw new Error(`${where}: a ring needs at least three positions`);
  const out = new Float64Array(coords.length * 2);
  coords.forEach((p, i) => {
    if (!Array.isArray(p) || typeof p[0] !== 'number' || typeof p[1] !== 'number') throw new Error(`${where}: position ${i} is not [lon, lat]`);
    out[2 * i] = p[0];
    out[2 * i + 1] = p[1];
  });
  return out;
}

function polygonsOf(geom: Json, where: string): Ring[][] {
  if (!isObj(geom)) throw new Error(`${where}: no geometry`);
  if (geom.type === 'Polygon' && Array.isArray(geom.coordinates)) return [geom.coordinates.map((r, i) => ringOf(r, `${where}, ring ${i}`))];
  if (geom.type === 'MultiPolygon' && Array.isArray(geom.coordinates)) {
    return geom.coordinates.map((poly, p) => {
      if (!Array.isArray(poly)) throw new Error(`${where}: polygon ${p} is not a list of rings`);
      return poly.map((r, i) => ringOf(r, `${where}, polygon ${p}, ring ${i}`));
    });
  }
  throw new Error(`${where}: geometry type ${String(geom.type)} is not Polygon or MultiPolygon`);
}

/** Named polygons from parsed GeoJSON; `file` is only for messages. */
export function parseGeoJsonRegions(json: Json, file: string, nameProperty = 'name'): NamedPolygons[] {
  try {
    const features: Json[] = isObj(json) && json.type === 'FeatureCollection' && Array.isArray(json.features)
      ? json.features
      : isObj(json) && json.type === 'Feature'
        ? [json]
        : isObj(json) && (json.type === 'Polygon' || json.type === 'MultiPolygon')
          ? [{ type: 'Feature', properties: { [nameProperty]: 'polygon' }, geometry: json }]
          : [];
    if (features.length === 0) throw new Error('no Polygon or MultiPolygon features');
    return features.map((f, i) => {
      if (!isObj(f)) throw new Error(`feature ${i} is not an object`);
      const props = isObj(f.properties) ? f.properties : {};
      const raw = props[nameProperty];
      const name = typeof raw === 'string' || typeof raw === 'number' ? String(raw) : `feature ${i}`;
      return { name, polygons: polygonsOf(f.geometry, `feature ${i}`) };
    });
  } catch (e) {
    throw new StillwaterError('E_FORMAT', `${file}: not usable GeoJSON regions (${(e as Error).message}).`, { file });
  }
}

/** True when (lon, lat) lies in any of the polygons, trying the longitude as given and shifted by ±360. */
export function inPolygons(lon: number, lat: number, polygons: Ring[][]): boolean {
  const x = wrapLon(lon);
  for (const rings of polygons) {
    if (pointInPolygon(x, lat, rings) || pointInPolygon(x + 360, lat, rings) || pointInPolygon(x - 360, lat, rings)) return true;
  }
  return false;
}

export function regionsFromPolygons(named: NamedPolygons[], grid: HorizontalGrid, source: string): Region[] {
  const n = grid.nx * grid.ny;
  return named.map((p) => ({ name: p.name, source, cells: cellsWhere(n, (c) => inPolygons(grid.lon[c], grid.lat[c], p.polygons)) }));
}

export async function loadGeoJsonRegions(file: string, grid: HorizontalGrid, nameProperty = 'name', only?: string[]): Promise<Region[]> {
  checkParsingHere(file);
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch {
    throw new StillwaterError('E_FILE', `${file}: cannot read the GeoJSON file.`, { file });
  }
  let json: Json;
  try {
    json = JSON.parse(text);
  } catch {
    throw new StillwaterError('E_FORMAT', `${file}: not valid JSON.`, { file });
  }
  let named = parseGeoJsonRegions(json, file, nameProperty);
  if (only && only.length) {
    for (const w of only) {
      if (!named.some((p) => p.name === w)) throw new StillwaterError('E_INPUT', `${file}: no feature with ${nameProperty} '${w}'.`, { file });
    }
    named = named.filter((p) => only.includes(p.name));
  }
  return regionsFromPolygons(named, grid, file);
}
