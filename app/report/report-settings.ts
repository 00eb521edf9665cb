/**
 * The recipe's `report` section with every default filled in and every name checked against the rest of the
 * recipe, so that a wrong name stops the report before anything is read or written.
 */
import { isAbsolute, resolve } from 'node:path';
import { existsSync } from 'node:fs';
import { StillwaterError } from '../errors.js';
import type { FigureWidth } from '../figures/page.js';
import type { LineSpec } from '../lines/run-line.js';
import type { Recipe } from '../recipe/types.js';
import { BASIN_NAMES, BUILT_IN_REGIONS } from '../regions/basins.js';
import type { LayerSpec } from '../regions/layers.js';
import type { ProjectionId } from '../render/projections.js';

export interface ReportLine {
  name: string;
  spec: LineSpec;
  /** recipe path, for messages */
  path: string;
}

export interface ReportSettings {
  variables: string[];
  mapLayers: LayerSpec[];
  lines: ReportLine[];
  zonalBasins: string[];
  differenceLimits: Record<string, number>;
  figureWidth: FigureWidth;
  projection: ProjectionId;
  stations: { file: string; variable: string }[];
  spinup: boolean;
}

/** Default map layers: the bottom and three depth layers (upper ocean, thermocline, deep ocean; common practice). */
export const DEFAULT_MAP_LAYERS: LayerSpec[] = [
  { kind: 'bottom' },
  { kind: 'interval', top: 0, bottom: 100 },
  { kind: 'interval', top: 100, bottom: 1000 },
  { kind: 'interval', top: 1000, bottom: 6000 },
];

/** Built-in lines: one meridian through each of the three ocean basins that span the tropics, shore to ice edge. */
export const BUILT_IN_LINES: Record<string, { title: string; spec: LineSpec }> = {
  atlantic: { title: 'Atlantic, 25°W', spec: { kind: 'meridian', lon: -25, lat0: -60, lat1: 63 } },
  pacific: { title: 'Pacific, 150°W', spec: { kind: 'meridian', lon: -150, lat0: -65, lat1: 57 } },
  indian: { title: 'Indian, 80°E', spec: { kind: 'meridian', lon: 80, lat0: -60, lat1: 5 } },
};

function recipeError(path: string, sentence: string): StillwaterError {
  return new StillwaterError('E_RECIPE', `${path}: ${sentence}`, { path });
}

/** `regionNames`: the names of the recipe's own regions (mask flags, GeoJSON features) once loaded, for zonal basins. */
export function reportSettings(recipe: Recipe, regionNames: string[] = []): ReportSettings {
  const r = recipe.report ?? {};
  const known = recipe.variables;
  const variables = r.variables ?? known;
  variables.forEach((v, i) => {
    if (!known.includes(v)) throw recipeError(`report.variables[${i}]`, `no such variable '${v}' in the recipe (it has: ${known.join(', ')}).`);
  });
  for (const v of Object.keys(r.differenceLimits ?? {})) {
    if (!known.includes(v)) throw recipeError(`report.differenceLimits.${v}`, `no such variable '${v}' in the recipe (it has: ${known.join(', ')}).`);
  }
  const lines: ReportLine[] = (r.lines ?? Object.keys(BUILT_IN_LINES)).map((l, i) => {
    const path = `report.lines[${i}]`;
    if (typeof l === 'string') {
      const b = BUILT_IN_LINES[l];
      if (!b) throw recipeError(path, `no built-in line '${l}' (there are: ${Object.keys(BUILT_IN_LINES).join(', ')}); draw your own with {name, meridian}, {name, parallel} or {name, waypoints}.`);
      return { name: b.title, spec: b.spec, path };
    }
    if ('meridian' in l) return { name: l.name, spec: { kind: 'meridian', lon: l.meridian, lat0: l.latRange?.[0], lat1: l.latRange?.[1] }, path };
    if ('parallel' in l) return { name: l.name, spec: { kind: 'parallel', lat: l.parallel, lon0: l.lonRange?.[0], lon1: l.lonRange?.[1] }, path };
    return { name: l.name, spec: { kind: 'waypoints', points: l.waypoints.map(([lon, lat]) => ({ lon, lat })) }, path };
  });
  const basinsKnown = [...BUILT_IN_REGIONS, ...regionNames];
  const zonalBasins = r.zonalBasins ?? [...BASIN_NAMES];
  zonalBasins.forEach((b, i) => {
    if (!basinsKnown.includes(b)) throw recipeError(`report.zonalBasins[${i}]`, `no basin or recipe region named '${b}' (there are: ${basinsKnown.join(', ')}).`);
  });
  const stations = (r.stations ?? []).map((s, i) => {
    const file = isAbsolute(s.file) ? s.file : resolve(recipe.baseDir, s.file);
    if (!existsSync(file)) throw recipeError(`report.stations[${i}].file`, `no such file '${file}'.`);
    if (!known.includes(s.variable)) throw recipeError(`report.stations[${i}].variable`, `no such variable '${s.variable}' in the recipe.`);
    return { file, variable: s.variable };
  });
  return {
    variables,
    mapLayers: (r.mapLayers ?? null)?.map((l): LayerSpec => (Array.isArray(l) ? { kind: 'interval', top: l[0], bottom: l[1] } : { kind: l })) ?? DEFAULT_MAP_LAYERS,
    lines,
    zonalBasins,
    differenceLimits: r.differenceLimits ?? {},
    figureWidth: r.figureWidth ?? 'double',
    projection: r.projection ?? 'plate',
    stations,
    spinup: r.spinup ?? true,
  };
}
