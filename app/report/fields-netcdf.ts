/**
 * Kept fields as CF NetCDF (classic 64-bit offset, via app/io/netcdf-writer.ts): for each run × variable the
 * model on the common grid and the difference model − reference; when the recipe asks for months or seasons,
 * every period reported (a `period` dimension first, labelled by `period_name`). The files are staged in an output set
 * (app/output) and placed with the tables only when the whole comparison has succeeded.
 */
import { encodeValues, encodingAttributes, floatEncoding } from '../cf/encode.js';
import type { FieldSinkFactory, FieldSinkInfo, LevelSink } from '../compare/field-sink.js';
import { createNetcdf, type WriteHeader } from '../io/netcdf-writer.js';
import type { OutputSet } from '../output/output-set.js';

const ENCODING = floatEncoding('f4');

export function slug(s: string): string {
  return s.replace(/[^A-Za-z0-9._-]+/g, '_').replace(/^_+|_+$/g, '') || 'x';
}

export function fieldsFileName(run: string, variable: string): string {
  return `fields_${slug(run)}_${slug(variable)}.nc`;
}

function header(info: FieldSinkInfo): WriteHeader {
  const h = info.grid.horizontal;
  const v = info.grid.vertical;
  const rect = h.kind === 'rectilinear' && h.axes;
  const yx = rect ? ['lat', 'lon'] : ['y', 'x'];
  const periods = keptPeriods(info);
  const dims = [
    ...(periods ? [{ name: 'period', size: periods.length }, { name: 'period_strlen', size: PERIOD_STRLEN }] : []),
    ...(v ? [{ name: 'depth', size: v.nz }] : []),
    { name: yx[0], size: h.ny },
    { name: yx[1], size: h.nx },
    { name: 'nv', size: 2 },
  ];
  const dataDims = [...(periods ? ['period'] : []), ...(v ? ['depth'] : []), ...yx];
  // labels of the periods are an auxiliary coordinate (CF 1.10 §6.1)
  const coords = [periods ? 'period_name' : '', rect ? '' : v ? 'depth lat lon' : 'lat lon'].filter(Boolean).join(' ');
  const variables: WriteHeader['variables'] = [];
  if (periods) {
    variables.push({
      name: 'period_name', dims: ['period', 'period_strlen'], dtype: 'char',
      attrs: { long_name: 'period of the year: annual, a month (JAN..DEC) or a season (DJF, MAM, JJA, SON), averaged with month-length weights' },
    });
  }
  if (rect) {
    variables.push(
      { name: 'lon', dims: ['lon'], dtype: 'f8', attrs: { standard_name: 'longitude', units: 'degrees_east', axis: 'X', bounds: 'lon_bnds' } },
      { name: 'lon_bnds', dims: ['lon', 'nv'], dtype: 'f8' },
      { name: 'lat', dims: ['lat'], dtype: 'f8', attrs: { standard_name: 'latitude', units: 'degrees_north', axis: 'Y', bounds: 'lat_bnds' } },
      { name: 'lat_bnds', dims: ['lat', 'nv'], dtype: 'f8' },
    );
  } else {
    variables.push(
      { name: 'lon', dims: ['y', 'x'], dtype: 'f8', attrs: { standard_name: 'longitude', units: 'degrees_east' } },
      { name: 'lat', dims: ['y', 'x'], dtype: 'f8', attrs: { standard_name: 'latitude', units: 'degrees_north' } },
    );
  }
  if (v) {
    variables.push(
      { name: 'depth', dims: ['depth'], dtype: 'f8', attrs: { standard_name: 'depth', units: 'm', positive: 'down', axis: 'Z', bounds: 'depth_bnds' } },
      { name: 'depth_bnds', dims: ['depth', 'nv'], dtype: 'f8' },
    );
  }
  const name = slug(info.variable);
  variables.push(
    { name, dims: dataDims, dtype: 'f4', attrs: { long_name: `${info.variable} of ${info.run} on the common grid`, units: info.units, ...encodingAttributes(ENCODING), coordinates: coords } },
    { name: `${name}_minus_reference`, dims: dataDims, dtype: 'f4', attrs: { long_name: `${info.variable}: ${info.run} minus the reference`, units: info.units, ...encodingAttributes(ENCODING), coordinates: coords } },
  );
  for (const x of variables) if (x.attrs && x.attrs.coordinates === '') delete x.attrs.coordinates;
  return { dimensions: dims, attrs: { Conventions: 'CF-1.10', title: `${info.variable}: ${info.run} on the common grid`, source: 'stillwater compare' }, variables };
}

const PERIOD_STRLEN = 8;

/** The periods a file keeps: those the comparison reports when there is more than the year, else none (no period dimension). */
function keptPeriods(info: FieldSinkInfo): readonly string[] | null {
  return info.periods && info.periods.length > 1 ? info.periods : null;
}

function periodNames(periods: readonly string[]): Uint8Array {
  const out = new Uint8Array(periods.length * PERIOD_STRLEN);
  periods.forEach((p, i) => out.set(new TextEncoder().encode(p.slice(0, PERIOD_STRLEN)), i * PERIOD_STRLEN));
  return out;
}

function bounds(edges: Float64Array): Float64Array {
  const out = new Float64Array((edges.length - 1) * 2);
  for (let i = 0; i + 1 < edges.length; i++) {
    out[2 * i] = edges[i];
    out[2 * i + 1] = edges[i + 1];
  }
  return out;
}

/** Non-finite values (NaN, and ±Infinity that CF has no use for) are written as the fill value. */
function filled(a: Float32Array): Float32Array | Float64Array {
  return encodeValues(a.map((x) => (Number.isFinite(x) ? x : NaN)), ENCODING);
}

/** A sink factory writing each run × variable as a file of the output set. */
export function netcdfFieldSinks(set: OutputSet): FieldSinkFactory {
  const used = new Set<string>();
  const factory: FieldSinkFactory = async (info) => {
    // two runs whose labels differ only in punctuation would share a name: number the later one
    let name0 = fieldsFileName(info.run, info.variable);
    for (let i = 2; used.has(name0); i++) name0 = fieldsFileName(`${info.run}_${i}`, info.variable);
    used.add(name0);
    const file = set.stagedPath(name0);
    const w = await createNetcdf(file, header(info));
    const h = info.grid.horizontal;
    const v = info.grid.vertical;
    const periods = keptPeriods(info);
    try {
      if (h.kind === 'rectilinear' && h.axes) {
        await w.write('lon', h.axes.lon);
        await w.write('lon_bnds', bounds(h.axes.lonEdges));
        await w.write('lat', h.axes.lat);
        await w.write('lat_bnds', bounds(h.axes.latEdges));
      } else {
        await w.write('lon', h.lon);
        await w.write('lat', h.lat);
      }
      if (v) {
        await w.write('depth', v.centres);
        await w.write('depth_bnds', bounds(v.edges));
      }
      if (periods) await w.write('period_name', periodNames(periods));
    } catch (e) {
      await w.abort();
      throw e;
    }
    const name = slug(info.variable);
    const sink: LevelSink = {
      async write(k, model, difference) {
        const start = v ? [k, 0, 0] : [0, 0];
        await w.write(name, filled(model), start);
        await w.write(`${name}_minus_reference`, filled(difference), start);
      },
      ...(periods
        ? {
            async writePeriod(k: number, p: number, model: Float32Array, difference: Float32Array) {
              const start = v ? [p, k, 0, 0] : [p, 0, 0];
              await w.write(name, filled(model), start);
              await w.write(`${name}_minus_reference`, filled(difference), start);
            },
          }
        : {}),
      close: () => w.close(),
      abort: () => w.abort(),
    };
    return sink;
  };
  return factory;
}
