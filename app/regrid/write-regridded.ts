import type { FieldSource } from '../cf/field-source.js';
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
import { regridField, type RegriddedField } from './regrid-field.js';
import { outputGridFromFile, ownOutputGrid } from './output-grid.js';
import type { FileGrid } from '../cf/file-grid.js';

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
  /** the target's coordinates as its file stores them: the output is written on that grid as the file has it */
  targetFileGrid?: FileGrid;
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
  const og = (opts.targetFileGrid && outputGridFromFile(opts.targetFileGrid, target, v)) || ownOutputGrid(target, v);
  const dims: { name: string; size: number }[] = [];
  const lead: string[] = [];
  if (src.time) {
    dims.push({ name: 'time', size: src.nt });
    lead.push('time');
  }
  if (og.zDim) lead.push(og.zDim);
  dims.push(...og.dimensions.filter((d) => d.name !== 'time'));

  const vars: WriteVariable[] = [];
  if (src.time) vars.push({ name: 'time', dims: ['time'], dtype: 'f8', attrs: { standard_name: 'time', units: src.time.units, calendar: src.time.calendar, axis: 'T' } });
  vars.push(...og.variables.filter((x) => x.name !== 'time'));
  const unitsText = opts.units ? opts.units.text : src.units.text;
  const dataDims = [...lead, og.yDim, og.xDim];
  // a variable inside a NetCDF-4 group is named by its path; the output is flat
  const dataName = uniqueName(src.variable.split('/').filter(Boolean).pop() ?? src.variable, vars.map((x) => x.name));
  const dataAttrs: Attributes = { units: unitsText, ...encodingAttributes(ENCODING) };
  if (src.standardName) dataAttrs.standard_name = src.standardName;
  if (src.longName) dataAttrs.long_name = src.longName;
  if (og.coordinates) dataAttrs.coordinates = og.coordinates;
  dataAttrs.regrid_method = opts.method + (r.verticalMethod !== 'none' ? `; vertical ${r.verticalMethod}` : '');
  if (opts.method === 'conservative') dataAttrs.cell_methods = 'area: mean';
  const coverageName = uniqueName(`${dataName}_coverage`, vars.map((x) => x.name).concat(dataName));
  const coverageAttrs: Attributes = {
    units: '1',
    long_name: `fraction of the target cell covered by valid values of ${src.variable}`,
    valid_range: [0, 1],
    ...encodingAttributes(ENCODING),
  };
  if (og.coordinates) coverageAttrs.coordinates = og.coordinates;
  vars.push({ name: dataName, dims: dataDims, dtype: 'f4', attrs: dataAttrs });
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
    if (src.time) await writer.write('time', Float64Array.from(src.time.values.map((x) => x.value)));
    await og.writeCoordinates(writer);
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
        const start = [...(src.time ? [t] : []), ...(og.zDim ? [og.levelIndex(k)] : []), 0, 0];
        await writer.write(dataName, encodeValues(og.toFileOrder(values), ENCODING), start);
        await writer.write(coverageName, og.toFileOrder(level.coverage), start);
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
