import type { FieldSource } from '../cf/field.js';
import type { ParsedUnits } from '../cf/units.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import { basename, dirname } from 'node:path';
import { encodeValues, encodingAttributes, floatEncoding } from '../cf/encode.js';
import { createNetcdf, type NetcdfWriter, type WriteVariable } from '../io/netcdf-writer.js';
import { openOutputSet } from '../output/output-set.js';
import type { Attributes } from '../io/types.js';
import { convertLevel } from '../ocean/convert.js';
import type { RemapMethod } from './csr.js';
import { regridField, type RegriddedField } from './field.js';

/** NaN is written as NetCDF's default fill value for floats, declared as _FillValue (app/cf/encode.ts). */
const ENCODING = floatEncoding('f4');

export interface WriteRegriddedOptions {
  method: RemapMethod;
  coverage: number;
  vertical: 'overlap' | 'linear';
  /** convert to these units (null: keep the source's) */
  units: ParsedUnits | null;
  oxygen: boolean;
  cacheDir: string | null;
  targetFile: string;
  history: string;
  progress?: (done: number, total: number) => void;
}

export interface RegridSummary {
  out: string;
  source: string;
  target: string;
  variable: string;
  units: string;
  grid: string;
  method: RemapMethod;
  vertical: 'overlap' | 'linear' | 'none';
  coverageThreshold: number;
  levels: number;
  times: number;
  weights: { origin: RegriddedField['weightOrigin']; entries: number };
  validTarget: number;
  totalTarget: number;
  note?: string;
}

/**
 * Regrid a field onto a grid and write it, level by level, as a CF NetCDF file with the variable
 * and its covered fraction, through an output set (app/output): the file at `outPath` is complete or unchanged.
 */
export async function writeRegridded(src: FieldSource, target: Grid, outPath: string, opts: WriteRegriddedOptions): Promise<RegridSummary> {
  const r = await regridField(src, target, { method: opts.method, coverage: opts.coverage, vertical: opts.vertical, cacheDir: opts.cacheDir });
  const h = target.horizontal;
  const v = r.grid.vertical;
  const rect = h.kind === 'rectilinear' && !!h.axes;
  const yDim = rect ? 'lat' : 'y', xDim = rect ? 'lon' : 'x';
  const dims: { name: string; size: number }[] = [];
  const lead: string[] = [];
  if (src.time) {
    dims.push({ name: 'time', size: src.nt });
    lead.push('time');
  }
  if (v) {
    dims.push({ name: 'depth', size: v.nz });
    lead.push('depth');
  }
  dims.push({ name: yDim, size: h.ny }, { name: xDim, size: h.nx }, { name: 'nv', size: 2 });
  if (!rect) dims.push({ name: 'nv4', size: 4 });

  const vars: WriteVariable[] = [];
  if (src.time) vars.push({ name: 'time', dims: ['time'], dtype: 'f8', attrs: { standard_name: 'time', units: src.time.units, calendar: src.time.calendar, axis: 'T' } });
  if (v) {
    vars.push({ name: 'depth', dims: ['depth'], dtype: 'f8', attrs: { standard_name: 'depth', units: 'm', positive: 'down', axis: 'Z', bounds: 'depth_bnds' } });
    vars.push({ name: 'depth_bnds', dims: ['depth', 'nv'], dtype: 'f8', attrs: { units: 'm' } });
  }
  if (rect) {
    vars.push({ name: 'lat', dims: ['lat'], dtype: 'f8', attrs: { standard_name: 'latitude', units: 'degrees_north', axis: 'Y', bounds: 'lat_bnds' } });
    vars.push({ name: 'lat_bnds', dims: ['lat', 'nv'], dtype: 'f8', attrs: { units: 'degrees_north' } });
    vars.push({ name: 'lon', dims: ['lon'], dtype: 'f8', attrs: { standard_name: 'longitude', units: 'degrees_east', axis: 'X', bounds: 'lon_bnds' } });
    vars.push({ name: 'lon_bnds', dims: ['lon', 'nv'], dtype: 'f8', attrs: { units: 'degrees_east' } });
  } else {
    vars.push({ name: 'lat', dims: ['y', 'x'], dtype: 'f8', attrs: { standard_name: 'latitude', units: 'degrees_north', bounds: 'lat_bnds' } });
    vars.push({ name: 'lat_bnds', dims: ['y', 'x', 'nv4'], dtype: 'f8', attrs: { units: 'degrees_north' } });
    vars.push({ name: 'lon', dims: ['y', 'x'], dtype: 'f8', attrs: { standard_name: 'longitude', units: 'degrees_east', bounds: 'lon_bnds' } });
    vars.push({ name: 'lon_bnds', dims: ['y', 'x', 'nv4'], dtype: 'f8', attrs: { units: 'degrees_east' } });
  }
  const unitsText = opts.units ? opts.units.text : src.units.text;
  const dataDims = [...lead, yDim, xDim];
  const dataAttrs: Attributes = { units: unitsText, ...encodingAttributes(ENCODING) };
  if (src.standardName) dataAttrs.standard_name = src.standardName;
  if (src.longName) dataAttrs.long_name = src.longName;
  if (!rect) dataAttrs.coordinates = 'lat lon';
  dataAttrs.regrid_method = opts.method + (r.verticalMethod !== 'none' ? `; vertical ${r.verticalMethod}` : '');
  if (opts.method === 'conservative') dataAttrs.cell_methods = 'area: mean';
  const coverageName = uniqueName(`${src.variable}_coverage`, vars.map((x) => x.name).concat(src.variable));
  const coverageAttrs: Attributes = {
    units: '1',
    long_name: `fraction of the target cell covered by valid values of ${src.variable}`,
    valid_range: [0, 1],
    ...encodingAttributes(ENCODING),
  };
  if (!rect) coverageAttrs.coordinates = 'lat lon';
  vars.push({ name: src.variable, dims: dataDims, dtype: 'f4', attrs: dataAttrs });
  vars.push({ name: coverageName, dims: dataDims, dtype: 'f4', attrs: coverageAttrs });

  const globalAttrs: Attributes = {
    Conventions: 'CF-1.10',
    title: `${src.variable} regridded onto the grid of ${opts.targetFile}`,
    source: src.file,
    history: `${new Date().toISOString()}: ${opts.history}`,
    regrid_coverage_threshold: [opts.coverage],
  };

  let note: string | undefined;
  const set = await openOutputSet(dirname(outPath));
  let writer: NetcdfWriter;
  try {
    writer = await createNetcdf(set.stagedPath(basename(outPath)), { dimensions: dims, attrs: globalAttrs, variables: vars });
  } catch (e) {
    await set.discard();
    throw e;
  }
  try {
    await writeCoordinates(writer, src, target, r.grid.vertical, rect);
    const nz = v ? v.nz : 1;
    const total = src.nt * nz;
    let valid = 0;
    for (let t = 0; t < src.nt; t++) {
      for (let k = 0; k < nz; k++) {
        const level = await r.readLevelWithCoverage(t, k);
        let values = level.values;
        if (opts.units) {
          const conv = convertLevel(values, src.units, opts.units, { variable: src.variable, oxygen: opts.oxygen });
          values = conv.values;
          note ??= conv.note;
        }
        for (let i = 0; i < values.length; i++) if (values[i] === values[i]) valid++;
        const start = [...(src.time ? [t] : []), ...(v ? [k] : []), 0, 0];
        await writer.write(src.variable, encodeValues(values, ENCODING), start);
        await writer.write(coverageName, level.coverage, start);
        opts.progress?.(t * nz + k + 1, total);
      }
    }
    if (r.stats.sourceValid === 0) {
      throw new StillwaterError('E_INPUT', `${src.file}, variable '${src.variable}': every value is missing, so there is nothing to regrid.`, { file: src.file, variable: src.variable });
    }
    await writer.close();
    await set.commit();
    return {
      out: outPath,
      source: src.file,
      target: opts.targetFile,
      variable: src.variable,
      units: unitsText,
      grid: `${h.kind} ${h.nx} x ${h.ny}${v ? ` x ${v.nz} levels` : ''}`,
      method: opts.method,
      vertical: r.verticalMethod,
      coverageThreshold: opts.coverage,
      levels: nz,
      times: src.nt,
      weights: { origin: r.weightOrigin, entries: r.weightEntries },
      validTarget: valid,
      totalTarget: total * h.nx * h.ny,
      ...(note ? { note } : {}),
    };
  } catch (e) {
    await writer.abort().catch(() => undefined);
    await set.discard();
    throw e;
  }
}

function uniqueName(name: string, taken: string[]): string {
  let n = name;
  while (taken.includes(n)) n += '_';
  return n;
}

async function writeCoordinates(w: NetcdfWriter, src: FieldSource, target: Grid, vertical: Grid['vertical'], rect: boolean): Promise<void> {
  const h = target.horizontal;
  if (src.time) await w.write('time', Float64Array.from(src.time.values.map((x) => x.value)));
  if (vertical) {
    await w.write('depth', vertical.centres);
    const b = new Float64Array(2 * vertical.nz);
    for (let k = 0; k < vertical.nz; k++) [b[2 * k], b[2 * k + 1]] = [vertical.edges[k], vertical.edges[k + 1]];
    await w.write('depth_bnds', b);
  }
  if (rect) {
    const ax = h.axes!;
    await w.write('lat', ax.lat);
    await w.write('lon', ax.lon);
    await w.write('lat_bnds', pairs(ax.latEdges));
    await w.write('lon_bnds', pairs(ax.lonEdges));
  } else {
    await w.write('lat', h.lat);
    await w.write('lon', h.lon);
    await w.write('lat_bnds', h.cornerLat);
    await w.write('lon_bnds', h.cornerLon);
  }
}

function pairs(edges: Float64Array): Float64Array {
  const n = edges.length - 1;
  const out = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) [out[2 * i], out[2 * i + 1]] = [edges[i], edges[i + 1]];
  return out;
}
