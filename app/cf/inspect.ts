/**
 * What a file holds, CF-decoded: dimensions, variables with their units and names, the grid and time axis
 * of its data variables and, on request, each data variable's decoded min, max, mean and count of valid
 * values (computed level by level, so memory stays bounded).
 * Every data variable with two or more dimensions should sit on a grid we can build, with units we know.
 * One that does not gets its problem (one sentence) in the report; when none of them does, the first
 * problem is thrown as bad input, since then the file is of no use to a comparison.
 */
import { isStillwaterError, type StillwaterError } from '../errors.js';
import { openDataset } from '../io/open.js';
import { attrString, type DatasetFormat, type RawDataset, type RawVariable } from '../io/types.js';
import { auxiliaryNames } from './coords.js';
import { decodeValues } from './decode.js';
import type { FieldSource } from './field-source.js';
import { fieldFromDataset } from './open-field.js';

export interface ValueStats {
  min: number | null;
  max: number | null;
  /** plain mean of the valid values (not area-weighted) */
  mean: number | null;
  /** number of valid (non-missing) values */
  count: number;
  /** number of values looked at */
  total: number;
}

export interface GridSummary {
  /** the data variable whose grid this is */
  variable: string;
  kind: 'rectilinear' | 'curvilinear';
  nx: number;
  ny: number;
  nz: number;
  lon: [number, number];
  lat: [number, number];
  /** level centres, metres positive down */
  depth: [number, number] | null;
  periodic: boolean;
  boundsDerived: boolean;
  /** data variables on this same grid */
  variables: string[];
}

export interface TimeSummary {
  variable: string;
  calendar: string;
  units: string;
  first: string;
  last: string;
  count: number;
}

export interface VariableSummary {
  name: string;
  dims: string[];
  shape: number[];
  dtype: string;
  units: string | null;
  standard_name: string | null;
  long_name: string | null;
  /** data (what a comparison would read) or coordinate (coordinates, bounds, grid mappings) */
  role: 'data' | 'coordinate';
  /** why a data variable cannot be used as a field (no grid, unknown units, ...), one sentence */
  problem?: string;
  stats?: ValueStats;
}

export interface InspectReport {
  file: string;
  format: DatasetFormat;
  dimensions: { name: string; size: number; unlimited: boolean }[];
  /** the grid of the data variables (the first one found when they sit on several grids) */
  grid: GridSummary | null;
  /** further grids, when data variables sit on more than one */
  otherGrids: GridSummary[];
  time: TimeSummary | null;
  variables: VariableSummary[];
  /** NetCDF-4 groups read ('/' alone for other formats); variables inside groups are named by path */
  groups: string[];
  /** what the reader could not read or had to guess (groups beyond its limits, unnamed dimensions) */
  notes: string[];
}

export interface InspectOptions {
  stats?: boolean;
  /** progress per variable, fraction 0..1 */
  progress?: (fraction: number, message: string) => void;
}

export async function inspectFile(path: string, opts: InspectOptions = {}): Promise<InspectReport> {
  const ds = await openDataset(path);
  try {
    return await inspectDataset(ds, opts);
  } finally {
    await ds.close().catch(() => undefined);
  }
}

function isDataVariable(v: RawVariable, aux: Set<string>): boolean {
  return !aux.has(v.name) && v.dtype !== 'char' && v.dtype !== 'string';
}

export async function inspectDataset(ds: RawDataset, opts: InspectOptions = {}): Promise<InspectReport> {
  const aux = auxiliaryNames(ds);
  const grids: GridSummary[] = [];
  let time: TimeSummary | null = null;
  const fields = new Map<string, FieldSource>();
  // data variables with the most dimensions first: their grid is the file's grid
  const data = ds.variables.filter((v) => isDataVariable(v, aux));
  const problems = new Map<string, StillwaterError>();
  for (const v of [...data].sort((a, b) => b.dims.length - a.dims.length)) {
    if (v.dims.length < 2) continue;
    let field: FieldSource;
    try {
      field = await fieldFromDataset(ds, v.name);
    } catch (e) {
      if (isStillwaterError(e) && e.isBadInput) {
        problems.set(v.name, e);
        continue;
      }
      throw e;
    }
    fields.set(v.name, field);
    const g = gridSummary(field);
    const same = grids.find((x) => sameGrid(x, g));
    if (same) same.variables.push(v.name);
    else grids.push(g);
    if (!time && field.time && field.time.values.length > 0) {
      const values = field.time.values;
      time = {
        variable: field.time.name,
        calendar: field.time.calendar,
        units: field.time.units,
        first: values[0].iso,
        last: values[values.length - 1].iso,
        count: values.length,
      };
    }
  }
  if (problems.size > 0 && fields.size === 0) throw problems.values().next().value!;
  const variables: VariableSummary[] = ds.variables.map((v) => ({
    name: v.name,
    dims: v.dims,
    shape: v.shape,
    dtype: v.dtype,
    units: attrString(v.attrs, 'units') ?? null,
    standard_name: attrString(v.attrs, 'standard_name') ?? null,
    long_name: attrString(v.attrs, 'long_name') ?? null,
    role: isDataVariable(v, aux) ? 'data' : 'coordinate',
    ...(problems.has(v.name) ? { problem: problems.get(v.name)!.message } : {}),
  }));
  if (opts.stats) {
    const todo = variables.filter((x) => x.role === 'data');
    for (const [n, summary] of todo.entries()) {
      opts.progress?.(n / todo.length, `statistics of ${summary.name}`);
      const field = fields.get(summary.name);
      summary.stats = field ? await fieldStats(field) : await slabStats(ds, ds.variables.find((x) => x.name === summary.name)!);
    }
    opts.progress?.(1, 'statistics done');
  }
  return {
    file: ds.path,
    format: ds.format,
    dimensions: ds.dimensions.map((d) => ({ name: d.name, size: d.size, unlimited: d.unlimited })),
    grid: grids[0] ?? null,
    otherGrids: grids.slice(1),
    time,
    variables,
    groups: ds.groups ? [...ds.groups] : ['/'],
    notes: [...(ds.notes ?? [])],
  };
}

function range(a: ArrayLike<number>): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < a.length; i++) {
    if (a[i] < lo) lo = a[i];
    if (a[i] > hi) hi = a[i];
  }
  return [lo, hi];
}

function gridSummary(f: FieldSource): GridSummary {
  const h = f.grid.horizontal;
  const v = f.grid.vertical;
  return {
    variable: f.variable,
    kind: h.kind,
    nx: h.nx,
    ny: h.ny,
    nz: v ? v.nz : 1,
    lon: range(h.lon),
    lat: range(h.lat),
    depth: v ? range(v.centres) : null,
    periodic: h.periodic,
    boundsDerived: h.boundsDerived || (v ? v.boundsDerived : false),
    variables: [f.variable],
  };
}

function sameGrid(a: GridSummary, b: GridSummary): boolean {
  // a 2-D field on the horizontal grid of a 3-D one shares its grid
  const vertical = a.depth === null || b.depth === null || (a.nz === b.nz && String(a.depth) === String(b.depth));
  return a.kind === b.kind && a.nx === b.nx && a.ny === b.ny && a.lon.join() === b.lon.join() && a.lat.join() === b.lat.join() && vertical;
}

class Accumulator {
  min = Infinity;
  max = -Infinity;
  sum = 0;
  count = 0;
  total = 0;
  add(a: ArrayLike<number>): void {
    this.total += a.length;
    for (let i = 0; i < a.length; i++) {
      const x = a[i];
      if (Number.isNaN(x)) continue;
      if (x < this.min) this.min = x;
      if (x > this.max) this.max = x;
      this.sum += x;
      this.count++;
    }
  }
  result(): ValueStats {
    const any = this.count > 0;
    return { min: any ? this.min : null, max: any ? this.max : null, mean: any ? this.sum / this.count : null, count: this.count, total: this.total };
  }
}

/** Min, max, mean and count over every level of every time step, one level at a time, in the field's full precision. */
export async function fieldStats(f: FieldSource): Promise<ValueStats> {
  const acc = new Accumulator();
  const nz = f.grid.vertical ? f.grid.vertical.nz : 1;
  const read = f.readLevelExact ?? f.readLevel;
  for (let t = 0; t < f.nt; t++) for (let k = 0; k < nz; k++) acc.add(await read.call(f, t, k));
  return acc.result();
}

/** Variables off any grid: decoded one slab along their first dimension at a time. */
async function slabStats(ds: RawDataset, v: RawVariable): Promise<ValueStats> {
  const acc = new Accumulator();
  if (v.shape.length <= 1) {
    acc.add(decodeValues(v, await ds.read(v.name)));
    return acc.result();
  }
  const count = [1, ...v.shape.slice(1)];
  for (let i = 0; i < v.shape[0]; i++) {
    const start = v.shape.map((_, d) => (d === 0 ? i : 0));
    acc.add(decodeValues(v, await ds.read(v.name, start, count)));
  }
  return acc.result();
}
