/**
 * A small gridded data set (a section, a profile, the fields along a line) written two ways: CSV with '# '
 * header lines (what, units, period, where) and one row per cell with its coordinates and bounds, and CF NetCDF
 * (classic 64-bit offset; coordinate variables with bounds where they exist, auxiliary coordinates, the CF fill
 * value of app/cf/encode, units on every variable). Both come from one description, so they cannot disagree.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { encodeValues, encodingAttributes, floatEncoding } from '../cf/encode.js';
import { StillwaterError } from '../errors.js';
import { createNetcdf, type WriteVariable } from '../io/netcdf-writer.js';
import type { Attributes } from '../io/types.js';
import { CSV_EOL, csvTable, type CsvCell } from './csv.js';

/** A coordinate: a variable along one or more dimensions, with its bounds when the cells have edges. */
export interface DataCoord {
  name: string;
  dims: string[];
  values: Float64Array;
  attrs: Attributes;
  /** cell edges along the coordinate's one dimension (n + 1), written as NAME_bnds (n, 2); a scalar coordinate's two edges as NAME_bnds (2) */
  edges?: ArrayLike<number>;
  /** the CSV column heading (with units) */
  csv: string;
}

/** A data variable: values in C order over `dims`, NaN for missing. */
export interface DataField {
  name: string;
  dims: string[];
  values: ArrayLike<number>;
  units: string;
  longName: string;
  /** the CSV column heading; null keeps the field out of the CSV (it has other dimensions than the table) */
  csv: string | null;
}

export interface DataSet {
  title: string;
  /** '# key: value' lines at the top of the CSV, and global attributes of the NetCDF (snake_case keys) */
  header: [string, string][];
  dimensions: { name: string; size: number }[];
  coords: DataCoord[];
  fields: DataField[];
  /** the CSV's dimensions, slowest first: one row per combination where some CSV field has a value */
  table: string[];
}

const MAX_VALUES = 16_000_000;

function sizeOf(ds: DataSet, dims: string[]): number {
  return dims.reduce((n, d) => n * (ds.dimensions.find((x) => x.name === d)?.size ?? NaN), 1);
}

/** Every array must fit its dimensions: a mismatch is a fault of the caller, said in one sentence. */
export function checkDataSet(ds: DataSet): void {
  for (const d of ds.dimensions) if (!(Number.isInteger(d.size) && d.size >= 1)) throw new StillwaterError('E_INPUT', `The data to export has no values along '${d.name}'.`);
  for (const v of [...ds.coords, ...ds.fields]) {
    const n = sizeOf(ds, v.dims);
    if (!(n <= MAX_VALUES)) throw new StillwaterError('E_INPUT', `The data to export has ${n} values in '${v.name}'; at most ${MAX_VALUES} are allowed.`);
    if (v.values.length !== n) throw new StillwaterError('E_INTERNAL', `'${v.name}' has ${v.values.length} values for ${n} cells.`);
  }
  for (const c of ds.coords) if (c.edges && (c.dims.length > 1 || c.edges.length !== c.values.length + 1)) throw new StillwaterError('E_INTERNAL', `'${c.name}' has ${c.edges.length} edges for ${c.values.length} cells.`);
}

/** CSV: '# ' lines, then one row per cell of the table's dimensions where some field has a value. */
export function dataSetCsv(ds: DataSet): string {
  checkDataSet(ds);
  const fields = ds.fields.filter((f) => f.csv !== null);
  for (const f of fields) if (f.dims.join() !== ds.table.join()) throw new StillwaterError('E_INTERNAL', `'${f.name}' is not on the table's dimensions.`);
  const sizes = ds.table.map((d) => sizeOf(ds, [d]));
  // coordinates along one table dimension (centre, then its bounds)
  const cols: { heading: string[]; at: (idx: number[]) => CsvCell[] }[] = [];
  for (const c of ds.coords) {
    if (c.dims.length !== 1) continue;
    const axis = ds.table.indexOf(c.dims[0]);
    if (axis < 0) continue;
    const e = c.edges;
    cols.push({
      heading: e ? [c.csv, `${c.name}_min`, `${c.name}_max`] : [c.csv],
      at: (idx) => (e ? [c.values[idx[axis]], Math.min(e[idx[axis]], e[idx[axis] + 1]), Math.max(e[idx[axis]], e[idx[axis] + 1])] : [c.values[idx[axis]]]),
    });
  }
  const rows: CsvCell[][] = [];
  const total = sizes.reduce((a, b) => a * b, 1);
  const idx = new Array<number>(sizes.length).fill(0);
  for (let flat = 0; flat < total; flat++) {
    let r = flat;
    for (let a = sizes.length - 1; a >= 0; a--) {
      idx[a] = r % sizes[a];
      r = Math.floor(r / sizes[a]);
    }
    if (!fields.some((f) => f.values[flat] === f.values[flat])) continue;
    // values as the NetCDF stores them (single precision), so the two files agree to the last digit
    rows.push([...cols.flatMap((c) => c.at(idx)), ...fields.map((f) => Math.fround(f.values[flat]))]);
  }
  const head = ds.header.map(([k, v]) => `# ${k}: ${v.replace(/[\r\n]+/g, ' ')}`).join(CSV_EOL) + CSV_EOL;
  return head + csvTable([...cols.flatMap((c) => c.heading), ...fields.map((f) => f.csv!)], rows);
}

/** CF NetCDF bytes, staged in a private temporary folder that is removed afterwards. */
export async function dataSetNetcdf(ds: DataSet): Promise<Uint8Array> {
  checkDataSet(ds);
  const enc = floatEncoding('f4');
  const bounded = ds.coords.filter((c) => c.edges);
  const variables: WriteVariable[] = [];
  for (const c of ds.coords) {
    variables.push({ name: c.name, dims: c.dims, dtype: 'f8', attrs: { ...c.attrs, ...(c.edges ? { bounds: `${c.name}_bnds` } : {}) } });
    if (c.edges) variables.push({ name: `${c.name}_bnds`, dims: [...c.dims, 'nv'], dtype: 'f8' });
  }
  for (const f of ds.fields) variables.push({ name: f.name, dims: f.dims, dtype: 'f4', attrs: { long_name: f.longName, units: f.units, ...encodingAttributes(enc), ...auxiliary(ds, f) } });
  const dir = await mkdtemp(join(tmpdir(), 'stillwater-export-'));
  try {
    const path = join(dir, 'data.nc');
    const attrs: Attributes = { Conventions: 'CF-1.10', title: ds.title, source: 'stillwater workbench (the data on the screen)' };
    for (const [k, v] of ds.header) attrs[k.replace(/[^A-Za-z0-9_]+/g, '_')] = v;
    const w = await createNetcdf(path, { dimensions: [...ds.dimensions, ...(bounded.length ? [{ name: 'nv', size: 2 }] : [])], attrs, variables });
    try {
      for (const c of ds.coords) {
        await w.write(c.name, c.values);
        if (c.edges) {
          const b = new Float64Array(2 * c.values.length);
          for (let i = 0; i < c.values.length; i++) {
            b[2 * i] = c.edges[i];
            b[2 * i + 1] = c.edges[i + 1];
          }
          await w.write(`${c.name}_bnds`, b);
        }
      }
      for (const f of ds.fields) await w.write(f.name, encodeValues(f.values, enc) as Float32Array);
      await w.close();
    } catch (e) {
      await w.abort();
      throw e;
    }
    return new Uint8Array(await readFile(path));
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

/** CF `coordinates`: scalar coordinates, and longitudes and latitudes along another dimension (a line's samples). */
function auxiliary(ds: DataSet, f: DataField): Attributes {
  const lonLat = (c: DataCoord) => c.attrs.standard_name === 'longitude' || c.attrs.standard_name === 'latitude';
  const names = ds.coords.filter((c) => c.dims.length === 0 || (lonLat(c) && !(c.dims.length === 1 && c.dims[0] === c.name) && c.dims.every((d) => f.dims.includes(d)))).map((c) => c.name);
  return names.length ? { coordinates: names.join(' ') } : {};
}
