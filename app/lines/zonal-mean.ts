/**
 * The zonal mean of a basin: per level and latitude row of the common grid, the area-weighted mean over
 * the basin's cells in that row, for the reference and every run, and run minus reference over the cells
 * where both have values (slices.ts zonalMeans). Read level by level.
 */
import { StillwaterError } from '../errors.js';
import { loadRegions } from '../compare/load-regions.js';
import { BUILT_IN_REGIONS } from '../regions/basins.js';
import type { Recipe, ResolvedRegion } from '../recipe/types.js';
import { zonalMeans } from './slices.js';
import type { NamedField } from './line-report.js';
import { prepareFields } from './recipe-fields.js';
import { csvTable, type CsvCell } from '../output/csv.js';
import { dataNumber } from '../output/number-format.js';

export interface ZonalSection {
  label: string;
  role: 'reference' | 'run' | 'difference';
  /** [k * ny + j] */
  values: Float32Array;
}

export interface ZonalResult {
  variable: string;
  units: string;
  basin: string;
  lat: Float64Array;
  depthCentres: Float64Array;
  depthEdges: Float64Array;
  fields: ZonalSection[];
  notes: string[];
}

/** The basin's cells on the grid: a built-in basin, or a region of the recipe by name. */
async function basinMask(recipe: Recipe, name: string, grid: Parameters<typeof loadRegions>[1]): Promise<Uint8Array> {
  const builtIn = (BUILT_IN_REGIONS as readonly string[]).includes(name);
  const specs: ResolvedRegion[] = builtIn ? [{ kind: 'built-in', name }] : recipe.regions.filter((r) => r.kind !== 'built-in');
  const regions = await loadRegions(specs, grid);
  const region = regions.find((r) => r.name === name);
  if (!region) {
    const names = [...BUILT_IN_REGIONS, ...regions.map((r) => r.name)].join(', ');
    throw new StillwaterError('E_INPUT', `--zonal-mean ${name}: no basin or recipe region has that name (there are: ${names}).`);
  }
  const mask = new Uint8Array(grid.nx * grid.ny);
  for (const c of region.cells) mask[c] = 1;
  return mask;
}

export async function zonalMeanOfBasin(fields: { reference: NamedField; runs: NamedField[] }, mask: Uint8Array): Promise<ZonalSection[]> {
  const g = fields.reference.field.grid;
  const h = g.horizontal;
  if (h.kind !== 'rectilinear' || !h.axes) {
    throw new StillwaterError('E_GRID', 'A zonal mean needs a latitude-longitude common grid; set options.commonGrid to a regular grid in the recipe.');
  }
  const nz = g.vertical?.nz ?? 1;
  const { nx, ny } = h;
  const ref = new Float32Array(nz * ny);
  const runs = fields.runs.map(() => new Float32Array(nz * ny));
  const diffs = fields.runs.map(() => new Float32Array(nz * ny));
  for (let k = 0; k < nz; k++) {
    const r = await fields.reference.field.readLevel(0, k);
    ref.set(zonalMeans([r], [r], h.area, mask, nx, ny).reference, k * ny);
    for (let q = 0; q < fields.runs.length; q++) {
      const m = await fields.runs[q].field.readLevel(0, k);
      runs[q].set(zonalMeans([m], [m], h.area, mask, nx, ny).model, k * ny);
      diffs[q].set(zonalMeans([m], [r], h.area, mask, nx, ny).difference, k * ny);
    }
  }
  return [
    { label: fields.reference.label, role: 'reference', values: ref },
    ...fields.runs.map((f, q) => ({ label: f.label, role: 'run' as const, values: runs[q] })),
    ...fields.runs.map((f, q) => ({ label: `${f.label} minus reference`, role: 'difference' as const, values: diffs[q] })),
  ];
}

export async function runZonalMean(recipe: Recipe, variable: string, basin: string, cacheDir?: string): Promise<ZonalResult> {
  const fields = await prepareFields(recipe, variable, { cacheDir });
  try {
    const h = fields.grid.horizontal;
    const mask = await basinMask(recipe, basin, h);
    const sections = await zonalMeanOfBasin(fields, mask);
    const v = fields.grid.vertical;
    return {
      variable,
      units: fields.units.text,
      basin,
      lat: h.axes ? h.axes.lat : new Float64Array(0),
      depthCentres: v ? v.centres : Float64Array.of(0),
      depthEdges: v ? v.edges : Float64Array.of(0, 0),
      fields: sections,
      notes: fields.notes,
    };
  } finally {
    await fields.close();
  }
}

/** zonal.csv: one row per latitude and level with a value in some field. */
export function zonalCsv(r: ZonalResult): string {
  const ny = r.lat.length;
  const rows: CsvCell[][] = [];
  for (let k = 0; k < r.depthCentres.length; k++) {
    for (let j = 0; j < ny; j++) {
      const i = k * ny + j;
      if (!r.fields.some((f) => f.values[i] === f.values[i])) continue;
      rows.push([dataNumber(r.lat[j], 9), dataNumber(r.depthCentres[k], 7), ...r.fields.map((f) => dataNumber(f.values[i], 7))]);
    }
  }
  return csvTable(['lat', 'depth_m', ...r.fields.map((f) => f.label)], rows);
}

/** zonal.json: values[level][latitude] per field. */
export function zonalJson(r: ZonalResult): Record<string, unknown> {
  const ny = r.lat.length;
  return {
    variable: r.variable,
    units: r.units,
    basin: r.basin,
    lat: Array.from(r.lat),
    depth_m: Array.from(r.depthCentres),
    depth_edges_m: Array.from(r.depthEdges),
    fields: r.fields.map((f) => ({
      label: f.label,
      role: f.role,
      values: Array.from({ length: r.depthCentres.length }, (_, k) => Array.from(f.values.subarray(k * ny, (k + 1) * ny), (v) => dataNumber(v, 7))),
    })),
    notes: r.notes,
  };
}
