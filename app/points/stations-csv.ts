/**
 * Station observations from CSV text.
 *
 * Format (our own):
 *   # units: mmol m-2 d-1          optional comment line naming the units of `value`
 *   # variable: PO4                optional comment line naming the recipe variable the values are of
 *   id,longitude,latitude,depth,value,time
 *   A1,-25.5,10.0,seafloor,0.31,2019-04-02
 *   A2,-25.5,10.0,150,0.12,
 *
 * - A header row is required; column names are case-insensitive and may come in any order:
 *   longitude (or lon), latitude (or lat), depth (or depth_m), value (or observed) are required;
 *   id (or station), time (or date) and units are optional.
 * - depth is metres, positive down, or the word `seafloor` (the bottom wet cell of the column).
 * - Units come from a `# units: ...` comment line, or from a `units` column (every row the same).
 * - Lines starting with `#` and blank lines are skipped; fields may be double-quoted.
 * Malformed rows are refused with their line number; nothing is skipped silently.
 */
import { StillwaterError } from '../errors.js';

export interface Stations {
  file: string;
  n: number;
  id: string[];
  lon: Float64Array;
  lat: Float64Array;
  /** metres, positive down; NaN where the station is at the seafloor */
  depth: Float64Array;
  /** 1 where the depth was given as `seafloor` */
  seafloor: Uint8Array;
  value: Float64Array;
  time: string[];
  /** 1-based line number of each station in the file */
  line: Int32Array;
  /** units of `value` as written, or undefined when the file does not say */
  units?: string;
  /** the recipe variable the values are of (a `# variable: NAME` line), when the file says */
  variable?: string;
}

const ALIASES: Record<string, string[]> = {
  lon: ['longitude', 'lon'],
  lat: ['latitude', 'lat'],
  depth: ['depth', 'depth_m'],
  value: ['value', 'observed'],
  id: ['id', 'station'],
  time: ['time', 'date'],
  units: ['units'],
};
const REQUIRED = ['lon', 'lat', 'depth', 'value'] as const;

/** Split one CSV line; double quotes group a field and "" is a literal quote. */
export function splitCsvLine(line: string): string[] {
  const out: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cur += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') {
      out.push(cur.trim());
      cur = '';
    } else cur += ch;
  }
  out.push(cur.trim());
  return out;
}

export function parseStations(text: string, file: string): Stations {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  let units: string | undefined;
  let variable: string | undefined;
  let header: Record<string, number> | null = null;
  let width = 0;
  const id: string[] = [];
  const time: string[] = [];
  const lon: number[] = [];
  const lat: number[] = [];
  const depth: number[] = [];
  const seafloor: number[] = [];
  const value: number[] = [];
  const lineNo: number[] = [];
  let unitsFromColumn: string | undefined;

  const bad = (ln: number, sentence: string): StillwaterError =>
    new StillwaterError('E_INPUT', `${file} line ${ln}: ${sentence}`, { file });

  for (let i = 0; i < lines.length; i++) {
    const ln = i + 1;
    const raw = lines[i].trim();
    if (raw === '') continue;
    if (raw.startsWith('#')) {
      const m = /^#\s*units\s*[:=]\s*(.+)$/i.exec(raw);
      if (m) units = m[1].trim();
      // the name is the first word; words after it are a comment (the demo's file says what its data are)
      const v = /^#\s*variable\s*[:=]\s*(\S+)/i.exec(raw);
      if (v) variable = v[1];
      continue;
    }
    const fields = splitCsvLine(raw);
    if (!header) {
      header = {};
      width = fields.length;
      fields.forEach((name, col) => {
        const key = Object.keys(ALIASES).find((k) => ALIASES[k].includes(name.toLowerCase()));
        if (key && header) {
          if (key in header) throw bad(ln, `the column '${name}' appears twice in the header.`);
          header[key] = col;
        }
      });
      const missing = REQUIRED.filter((k) => !(k in header!));
      if (missing.length > 0) {
        throw bad(ln, `the header lacks the column${missing.length > 1 ? 's' : ''} ${missing.map((k) => ALIASES[k][0]).join(', ')} (expected longitude, latitude, depth, value and optionally id, time, units).`);
      }
      continue;
    }
    if (fields.length !== width) throw bad(ln, `expected ${width} fields as in the header, found ${fields.length}.`);
    const num = (key: 'lon' | 'lat' | 'value', label: string): number => {
      const s = fields[header![key]];
      const v = s === '' ? NaN : Number(s);
      if (!Number.isFinite(v)) throw bad(ln, `${label} '${s}' is not a number.`);
      return v;
    };
    const x = num('lon', 'longitude');
    const y = num('lat', 'latitude');
    if (y < -90 || y > 90) throw bad(ln, `latitude ${y} lies outside -90..90.`);
    if (x < -180 || x > 360) throw bad(ln, `longitude ${x} lies outside -180..360.`);
    const ds = fields[header.depth];
    let z = NaN;
    let atFloor = 0;
    if (ds.toLowerCase() === 'seafloor') atFloor = 1;
    else {
      z = ds === '' ? NaN : Number(ds);
      if (!Number.isFinite(z)) throw bad(ln, `depth '${ds}' is neither metres nor the word seafloor.`);
      if (z < 0) throw bad(ln, `depth ${z} is negative; depths are metres below the surface, positive down.`);
    }
    const v = num('value', 'value');
    if ('units' in header) {
      const u = fields[header.units];
      if (u !== '') {
        if (unitsFromColumn !== undefined && u !== unitsFromColumn) {
          throw bad(ln, `units '${u}' differ from '${unitsFromColumn}' on earlier rows; one file holds one quantity in one unit.`);
        }
        unitsFromColumn = u;
      }
    }
    id.push('id' in header ? fields[header.id] : String(lon.length + 1));
    time.push('time' in header ? fields[header.time] : '');
    lon.push(x);
    lat.push(y);
    depth.push(z);
    seafloor.push(atFloor);
    value.push(v);
    lineNo.push(ln);
  }
  if (!header) throw new StillwaterError('E_INPUT', `${file}: the file is empty (no header and no stations).`, { file });
  if (lon.length === 0) throw new StillwaterError('E_INPUT', `${file}: the file has a header but no stations.`, { file });
  if (units !== undefined && unitsFromColumn !== undefined && units !== unitsFromColumn) {
    throw new StillwaterError('E_INPUT', `${file}: the units line says '${units}' but the units column says '${unitsFromColumn}'.`, { file });
  }
  return {
    file,
    n: lon.length,
    id,
    lon: Float64Array.from(lon),
    lat: Float64Array.from(lat),
    depth: Float64Array.from(depth),
    seafloor: Uint8Array.from(seafloor),
    value: Float64Array.from(value),
    time,
    line: Int32Array.from(lineNo),
    units: units ?? unitsFromColumn,
    ...(variable !== undefined ? { variable } : {}),
  };
}
