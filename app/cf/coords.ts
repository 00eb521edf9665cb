/**
 * Coordinate discovery (CF 1.10 §4 and §5): which variables give a data variable's longitude, latitude,
 * vertical and time coordinates. Evidence, strongest first: `units` (degrees_east / degrees_north and their
 * spellings, "<unit> since <date>"), `standard_name`, `axis`, `positive`, the `coordinates` attribute, and
 * variable or dimension names as the last resort.
 */
import { attrString, type RawDataset, type RawVariable } from '../io/types.js';
import { baseName, findReferenced } from '../io/variable-path.js';
import { isTimeUnits } from './time.js';

export type Role = 'lon' | 'lat' | 'vertical' | 'time';

const LON_UNITS = /^degrees?_?(east|e)$/i;
const LAT_UNITS = /^degrees?_?(north|n)$/i;
const LON_NAMES = /^(nav_)?(lon|long|longitude|glam[tuvf]?|lon_rho|xlon|geolon(_t)?|tlon(g)?|ulon(g)?)$/i;
const LAT_NAMES = /^(nav_)?(lat|latitude|gphi[tuvf]?|lat_rho|xlat|geolat(_t)?|tlat|ulat)$/i;
const VERTICAL_NAMES = /^(depth|deptht|depthu|depthv|depthw|lev|level|levels|z|zt|zlev|st_ocean|sw_ocean|nav_lev|olevel|height|altitude)$/i;
const TIME_NAMES = /^(time|t|times|date)$/i;
const VERTICAL_STANDARD = new Set(['depth', 'height', 'altitude', 'depth_below_geoid', 'height_above_geoid']);
const LENGTH_UNITS = /^(m|meters?|metres?|cm|centimeters?|centimetres?|km|kilometers?|kilometres?|mm)$/i;

/** The role a variable plays as a coordinate, or undefined. */
export function coordinateRole(v: RawVariable): Role | undefined {
  const units = (attrString(v.attrs, 'units') ?? '').trim();
  const standard = (attrString(v.attrs, 'standard_name') ?? '').trim().toLowerCase();
  const axis = (attrString(v.attrs, 'axis') ?? '').trim().toUpperCase();
  const positive = (attrString(v.attrs, 'positive') ?? '').trim().toLowerCase();
  // rotated-pole axes are not geographic longitude and latitude: the 2-D ones in `coordinates` are
  if (standard === 'grid_longitude' || standard === 'grid_latitude' || standard === 'projection_x_coordinate' || standard === 'projection_y_coordinate') return undefined;
  if (LON_UNITS.test(units) || standard === 'longitude') return 'lon';
  if (LAT_UNITS.test(units) || standard === 'latitude') return 'lat';
  if (isTimeUnits(units) || standard === 'time' || axis === 'T') return 'time';
  if (VERTICAL_STANDARD.has(standard) || axis === 'Z' || positive === 'up' || positive === 'down') return 'vertical';
  const degrees = /^degrees?$/i.test(units);
  // names inside NetCDF-4 groups are paths: the group is no evidence, the name within it is
  const own = baseName(v.name);
  if (axis === 'X' && (degrees || LON_NAMES.test(own))) return 'lon';
  if (axis === 'Y' && (degrees || LAT_NAMES.test(own))) return 'lat';
  // last resort: the name (a coordinate variable's name is its dimension's name)
  const names = [own];
  if (names.some((n) => LON_NAMES.test(n)) && (units === '' || degrees)) return 'lon';
  if (names.some((n) => LAT_NAMES.test(n)) && (units === '' || degrees)) return 'lat';
  if (names.some((n) => VERTICAL_NAMES.test(n)) && (units === '' || LENGTH_UNITS.test(units))) return 'vertical';
  if (names.some((n) => TIME_NAMES.test(n)) && units === '') return undefined; // a time without units cannot be decoded
  return undefined;
}

export interface Discovered {
  lon?: RawVariable;
  lat?: RawVariable;
  vertical?: RawVariable;
  time?: RawVariable;
}

/**
 * The coordinates of `data`: coordinate variables of its dimensions, variables its `coordinates`
 * attribute names, and other 1-D/2-D longitude/latitude variables whose dimensions are all the data's.
 */
export function discoverCoordinates(ds: RawDataset, data: RawVariable): Discovered {
  const found: Discovered = {};
  const candidates: RawVariable[] = [];
  const seen = new Set<string>();
  const add = (v: RawVariable | undefined): void => {
    if (v && v !== data && !seen.has(v.name)) {
      seen.add(v.name);
      candidates.push(v);
    }
  };
  // 1. coordinate variables: 1-D, named like one of the data's dimensions
  for (const d of data.dims) add(ds.variables.find((v) => v.name === d && v.dims.length === 1 && v.dims[0] === d));
  // 2. the coordinates attribute
  for (const name of (attrString(data.attrs, 'coordinates') ?? '').split(/\s+/).filter(Boolean)) add(findReferenced(ds.variables, data, name));
  // 3. any other variable on a subset of the data's dimensions (files that forget the coordinates attribute)
  for (const v of ds.variables) if (v.dims.length > 0 && v.dims.length <= 2 && v.dims.every((d) => data.dims.includes(d))) add(v);

  for (const v of candidates) {
    if (!v.dims.every((d) => data.dims.includes(d))) continue;
    const role = coordinateRole(v);
    if (!role) continue;
    if (role === 'time' || role === 'vertical') {
      if (v.dims.length !== 1) continue;
      if (!found[role]) found[role] = v;
      continue;
    }
    const current = found[role];
    // prefer 1-D coordinate variables (rectilinear) over 2-D ones; the first of each kind wins
    if (!current || (current.dims.length === 2 && v.dims.length === 1 && isCoordinateVariable(v))) found[role] = v;
  }
  // a rectilinear pair needs two 1-D variables; a 2-D and a 1-D do not make a grid: prefer the 2-D pair then
  if (found.lon && found.lat && found.lon.dims.length !== found.lat.dims.length) {
    const two = (role: 'lon' | 'lat'): RawVariable | undefined =>
      candidates.find((v) => v.dims.length === 2 && coordinateRole(v) === role && v.dims.every((d) => data.dims.includes(d)));
    const lon2 = two('lon');
    const lat2 = two('lat');
    if (lon2 && lat2) {
      found.lon = lon2;
      found.lat = lat2;
    }
  }
  return found;
}

function isCoordinateVariable(v: RawVariable): boolean {
  return v.dims.length === 1 && v.dims[0] === v.name;
}

/** Names of variables that serve as coordinates or bounds somewhere in the dataset (not data to inspect). */
export function auxiliaryNames(ds: RawDataset): Set<string> {
  const names = new Set<string>();
  for (const v of ds.variables) {
    if (v.dims.length === 1 && v.dims[0] === v.name) names.add(v.name);
    for (const key of ['coordinates', 'bounds', 'climatology', 'cell_measures', 'grid_mapping']) {
      const a = attrString(v.attrs, key);
      if (!a) continue;
      for (const part of a.split(/\s+/)) {
        // cell_measures reads "area: cell_area": the names after the colons
        if (!part || part.endsWith(':')) continue;
        names.add(findReferenced(ds.variables, v, part)?.name ?? part);
      }
    }
  }
  for (const v of ds.variables) if (coordinateRole(v) && v.dims.length <= 2 && !names.has(v.name) && isCoordinateLike(v)) names.add(v.name);
  return names;
}

function isCoordinateLike(v: RawVariable): boolean {
  const role = coordinateRole(v);
  return role === 'lon' || role === 'lat' || role === 'time' || (role === 'vertical' && v.dims.length === 1);
}
