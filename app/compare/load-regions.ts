/** The recipe's regions as cell lists of the common grid: built-in basins, NetCDF flag masks, GeoJSON polygons. */
import { openField } from '../cf/open-field.js';
import { StillwaterError } from '../errors.js';
import type { HorizontalGrid } from '../grid/types.js';
import { openDataset } from '../io/open.js';
import { findVariable } from '../io/types.js';
import { basinIndex, builtInRegionCells, type BuiltInRegion } from '../regions/basins.js';
import { flagTable, regionsFromFlags } from '../regions/flag-regions.js';
import { loadGeoJsonRegions } from '../regions/geojson-regions.js';
import type { Region } from '../regions/region.js';
import type { ResolvedRegion } from '../recipe/types.js';

export async function loadRegions(specs: ResolvedRegion[], grid: HorizontalGrid): Promise<Region[]> {
  let basins: Uint8Array | undefined;
  const out: Region[] = [];
  for (const spec of specs) {
    if (spec.kind === 'built-in') {
      if (spec.name !== 'global') basins ??= basinIndex(grid.lon, grid.lat);
      out.push({ name: spec.name, source: 'built-in', cells: builtInRegionCells(spec.name as BuiltInRegion, grid.lon, grid.lat, basins) });
    } else if (spec.kind === 'geojson') {
      out.push(...(await prefixed(spec.path, () => loadGeoJsonRegions(spec.file, grid, spec.property, spec.features))));
    } else {
      out.push(...(await prefixed(spec.path, () => loadMaskRegions(spec.file, spec.variable, grid, spec.flags))));
    }
  }
  const seen = new Set<string>();
  for (const r of out) {
    if (seen.has(r.name)) throw new StillwaterError('E_RECIPE', `regions: the region name '${r.name}' occurs twice.`, { path: 'regions' });
    seen.add(r.name);
  }
  return out;
}

async function loadMaskRegions(file: string, variable: string, grid: HorizontalGrid, flags?: string[]): Promise<Region[]> {
  const ds = await openDataset(file);
  let attrs;
  try {
    const v = findVariable(ds, variable);
    if (!v) throw new StillwaterError('E_VARIABLE', `${file}: there is no variable '${variable}'.`, { file, variable });
    attrs = v.attrs;
  } finally {
    await ds.close();
  }
  const table = flagTable(attrs.flag_values, attrs.flag_meanings, file, variable);
  const field = await openField(file, variable);
  try {
    const values = await field.readLevel(0, 0);
    return regionsFromFlags(values, field.grid.horizontal, table, grid, file, flags);
  } finally {
    await field.close?.();
  }
}

/** Run `f`, putting the recipe path in front of a bad-input sentence. */
export async function prefixed<T>(path: string, f: () => Promise<T>): Promise<T> {
  try {
    return await f();
  } catch (e) {
    if (e instanceof StillwaterError && e.isBadInput) throw new StillwaterError(e.code, `${path}: ${e.message}`, { ...e.subject, path });
    throw e;
  }
}
