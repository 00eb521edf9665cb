/**
 * Lines and stations for the workbench: a transect through waypoints (clicked on the map or typed),
 * a meridian or parallel section, with the column means along it; stations from a CSV compared with the
 * reference and the runs. Every file goes through ctx.resolvePath.
 */
import { z } from 'zod';
import { runPoints, stationProblems } from '../points/run-points.js';
import type { Stations } from '../points/stations-csv.js';
import { besideRecipe, guardFile, recipeOfCall } from './recipe-guard.js';
import { lineInput, recipeJson, sampleLineOfCall } from './line-sampling.js';
import type { SkillNumbers } from '../stats/weighted.js';
import { entry, type ServiceEntry } from './types.js';

const pointsInput = z.object({
  ...recipeJson,
  variable: z.string().min(1),
  stations: z.string().min(1),
  method: z.enum(['trilinear', 'nearest']).optional(),
});


export interface LineFieldView {
  label: string;
  role: 'reference' | 'run' | 'difference';
  /** level-major [k * n + s] */
  values: Float32Array;
  columnMean: Float64Array;
}

export interface LineData {
  variable: string;
  units: string;
  kind: string;
  lon: Float64Array;
  lat: Float64Array;
  distanceKm: Float64Array;
  waypoints: { lon: number; lat: number; distanceKm: number }[];
  depthCentres: Float64Array;
  depthEdges: Float64Array;
  seafloorM: Float64Array;
  depthRange: [number, number];
  fields: LineFieldView[];
  skill: ({ label: string } & SkillNumbers)[];
  notes: string[];
}

export interface StationsData {
  file: string;
  units: string | null;
  id: string[];
  lon: Float64Array;
  lat: Float64Array;
  depth: Float64Array;
  seafloor: Uint8Array;
  value: Float64Array;
}

export interface PointsData {
  variable: string;
  units: string;
  method: string;
  spansDecades: boolean;
  stations: StationsData;
  sources: { label: string; role: string; model: Float64Array; status: string[]; skill: SkillNumbers; log10: SkillNumbers; counts: Record<string, number> }[];
  /** one sentence per station some source could not sample */
  problems: string[];
  notes: string[];
}

function stationsData(st: Stations): StationsData {
  return { file: st.file, units: st.units ?? null, id: st.id, lon: st.lon, lat: st.lat, depth: st.depth, seafloor: st.seafloor, value: st.value };
}

export const linesServices: ServiceEntry[] = [
  entry({
    name: 'line.sample',
    summary: 'The reference, every run and their differences along a line (waypoints, meridian or parallel), with the seafloor and column means.',
    input: lineInput,
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<LineData> {
      const r = await sampleLineOfCall(input, ctx);
      return {
        variable: r.variable,
        units: r.units,
        kind: r.line.kind,
        lon: r.line.lon,
        lat: r.line.lat,
        distanceKm: r.line.distanceKm,
        waypoints: r.line.waypoints.map((p, i) => ({ lon: p.lon, lat: p.lat, distanceKm: r.line.waypointKm[i] })),
        depthCentres: r.depth.centres,
        depthEdges: r.depth.edges,
        seafloorM: r.seafloorM,
        depthRange: [r.range.top, r.range.bottom],
        fields: [
          { ...r.reference, role: 'reference' as const },
          ...r.runs.map((s) => ({ ...s, role: 'run' as const })),
          ...r.differences.map((s) => ({ ...s, role: 'difference' as const })),
        ],
        skill: r.skill,
        notes: r.notes,
      };
    },
  }),
  entry({
    name: 'points.compare',
    summary: 'The reference and every run sampled at station observations: values, per-station status and statistics (also of log10 values).',
    input: pointsInput,
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<PointsData> {
      const recipe = recipeOfCall(input, ctx);
      const stationsFile = guardFile({ file: besideRecipe(recipe, input.stations), path: 'stations' }, ctx);
      const r = await runPoints(recipe, {
        variable: input.variable,
        stationsFile,
        method: input.method,
        cacheDir: ctx.cacheDir,
        progress: (f, m) => ctx.progress(f, m),
      });
      const st = r.stations;
      return {
        variable: r.variable,
        units: r.units,
        method: r.method,
        spansDecades: r.spansDecades,
        stations: stationsData(st),
        sources: r.sources.map((s) => ({
          label: s.label,
          role: s.role,
          model: s.samples.model,
          status: s.samples.status,
          skill: s.skill.stats,
          log10: s.skill.log10,
          counts: s.skill.counts,
        })),
        problems: stationProblems(r),
        notes: r.notes,
      };
    },
  }),
];
