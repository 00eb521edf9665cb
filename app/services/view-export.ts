/**
 * The field on the screen as a file to download (issue 14, "data out"): a horizontal slice on the common lat-lon
 * grid as CSV (one row a cell with a value) or as CF NetCDF (classic 64-bit offset, coordinates with bounds, the
 * depth interval as a scalar coordinate, the fill value of app/cf/encode). The screen sends what it shows; nothing
 * is read from disk, and the NetCDF is staged in a private temporary folder that is removed afterwards.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { z } from 'zod';
import { encodeValues, encodingAttributes, floatEncoding } from '../cf/encode.js';
import { StillwaterError } from '../errors.js';
import { createNetcdf } from '../io/netcdf-writer.js';
import { csvTable } from '../output/csv.js';
import { slug } from '../report/fields-netcdf.js';
import { entry, type ServiceEntry } from './types.js';

const MAX_CELLS = 16_000_000;

/** A typed array as the wire delivers it, or a plain array of numbers (copied into the wanted type). */
const numbers = <T extends Float32Array | Float64Array>(make: (a: ArrayLike<number>) => T) =>
  z.custom<ArrayLike<number>>((v) => ArrayBuffer.isView(v) || (Array.isArray(v) && v.every((x) => typeof x === 'number' || x === null)), { error: 'must be an array of numbers' }).transform((v) => make(Array.from(v as ArrayLike<number>, (x) => (x === null ? NaN : x))));

const sliceInput = z.object({
  format: z.enum(['csv', 'netcdf']),
  variable: z.string().min(1).max(200),
  /** what the values are: "remin-short (L = 200 m)", "remin-short minus Demo climatology" */
  label: z.string().min(1).max(400),
  units: z.string().max(200),
  lonEdges: numbers((a) => Float64Array.from(a)),
  latEdges: numbers((a) => Float64Array.from(a)),
  /** the slice's depth interval in metres, or null for the bottom or a 2-D field */
  depth: z.tuple([z.number().finite(), z.number().finite()]).nullable(),
  depthLabel: z.string().max(200),
  values: numbers((a) => Float32Array.from(a)),
});

export type SliceExport = z.infer<typeof sliceInput>;

export interface ExportedFile {
  fileName: string;
  mime: string;
  data: Uint8Array;
}

function check(s: SliceExport): { nx: number; ny: number } {
  const nx = s.lonEdges.length - 1;
  const ny = s.latEdges.length - 1;
  if (nx < 1 || ny < 1 || nx * ny > MAX_CELLS) throw new StillwaterError('E_INPUT', `The field to export has ${nx} × ${ny} cells; between 1 and ${MAX_CELLS} are allowed.`);
  if (s.values.length !== nx * ny) throw new StillwaterError('E_INPUT', `The field to export has ${s.values.length} values for ${nx} × ${ny} cells.`);
  return { nx, ny };
}

/** One row a cell with a value: cell centre, cell bounds, the value (missing cells are left out). */
export function sliceCsv(s: SliceExport): string {
  const { nx, ny } = check(s);
  const rows: (string | number)[][] = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const v = s.values[j * nx + i];
      if (v !== v) continue;
      rows.push([0.5 * (s.lonEdges[i] + s.lonEdges[i + 1]), 0.5 * (s.latEdges[j] + s.latEdges[j + 1]), s.lonEdges[i], s.lonEdges[i + 1], s.latEdges[j], s.latEdges[j + 1], v]);
    }
  }
  return csvTable(['lon', 'lat', 'lon_min', 'lon_max', 'lat_min', 'lat_max', `${slug(s.variable)} (${s.units})`], rows);
}

export async function sliceNetcdf(s: SliceExport): Promise<Uint8Array> {
  const { nx, ny } = check(s);
  const enc = floatEncoding('f4');
  const name = slug(s.variable);
  const dir = await mkdtemp(join(tmpdir(), 'stillwater-export-'));
  try {
    const path = join(dir, 'slice.nc');
    const w = await createNetcdf(path, {
      dimensions: [
        { name: 'lat', size: ny },
        { name: 'lon', size: nx },
        { name: 'nv', size: 2 },
      ],
      attrs: { Conventions: 'CF-1.10', title: `${s.variable}: ${s.label}, ${s.depthLabel}`, source: 'stillwater workbench (the field on the screen)' },
      variables: [
        { name: 'lon', dims: ['lon'], dtype: 'f8', attrs: { standard_name: 'longitude', units: 'degrees_east', axis: 'X', bounds: 'lon_bnds' } },
        { name: 'lon_bnds', dims: ['lon', 'nv'], dtype: 'f8' },
        { name: 'lat', dims: ['lat'], dtype: 'f8', attrs: { standard_name: 'latitude', units: 'degrees_north', axis: 'Y', bounds: 'lat_bnds' } },
        { name: 'lat_bnds', dims: ['lat', 'nv'], dtype: 'f8' },
        ...(s.depth ? [{ name: 'depth', dims: [], dtype: 'f8' as const, attrs: { standard_name: 'depth', units: 'm', positive: 'down', axis: 'Z', bounds: 'depth_bnds' } }, { name: 'depth_bnds', dims: ['nv'], dtype: 'f8' as const }] : []),
        { name, dims: ['lat', 'lon'], dtype: 'f4', attrs: { long_name: `${s.variable}: ${s.label}, ${s.depthLabel}`, units: s.units, ...encodingAttributes(enc), ...(s.depth ? { coordinates: 'depth' } : {}) } },
      ],
    });
    try {
      const bounds = (e: Float64Array): Float64Array => {
        const b = new Float64Array(2 * (e.length - 1));
        for (let i = 0; i + 1 < e.length; i++) {
          b[2 * i] = e[i];
          b[2 * i + 1] = e[i + 1];
        }
        return b;
      };
      const centres = (e: Float64Array): Float64Array => Float64Array.from({ length: e.length - 1 }, (_, i) => 0.5 * (e[i] + e[i + 1]));
      await w.write('lon', centres(s.lonEdges));
      await w.write('lon_bnds', bounds(s.lonEdges));
      await w.write('lat', centres(s.latEdges));
      await w.write('lat_bnds', bounds(s.latEdges));
      if (s.depth) {
        await w.write('depth', Float64Array.of(0.5 * (s.depth[0] + s.depth[1])));
        await w.write('depth_bnds', Float64Array.from(s.depth));
      }
      await w.write(name, encodeValues(s.values, enc) as Float32Array);
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

export const viewExportServices: ServiceEntry[] = [
  entry({
    name: 'view.export-slice',
    summary: 'The horizontal slice on the screen as CSV or CF NetCDF bytes to download.',
    input: sliceInput,
    async run(input): Promise<ExportedFile> {
      const base = `stillwater-${slug(input.variable)}-${slug(input.label)}-${slug(input.depthLabel)}`;
      if (input.format === 'csv') return { fileName: `${base}.csv`, mime: 'text/csv', data: new TextEncoder().encode(sliceCsv(input)) };
      return { fileName: `${base}.nc`, mime: 'application/x-netcdf', data: await sliceNetcdf(input) };
    },
  }),
];
