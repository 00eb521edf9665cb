/** A line from a recipe: which line, which variable, then sample the reference and every run along it. */
import type { Recipe } from '../recipe/types.js';
import type { DepthRange } from './column-mean.js';
import type { LonLat } from './great-circle.js';
import { lineReport, type LineResult } from './line-report.js';
import { columnMeansCsv, columnMeansJson, sectionCsv, sectionJson } from './line-output.js';
import type { PointMethod } from './location-weights.js';
import { prepareFields, type PreparedFields } from './recipe-fields.js';
import { DEFAULT_SPACING_KM, sampleGreatCircles, sampleMeridian, sampleParallel, type SampledLine } from './sample-path.js';
import { jsonText } from '../output/json-keys.js';
import { writeOutputFiles } from '../output/output-set.js';

/** Which line: waypoints joined by great circles, a meridian, or a parallel. */
export type LineSpec =
  | { kind: 'waypoints'; points: LonLat[] }
  | { kind: 'meridian'; lon: number; lat0?: number; lat1?: number }
  | { kind: 'parallel'; lat: number; lon0?: number; lon1?: number };

export interface LineRequest {
  variable: string;
  line: LineSpec;
  spacingKm?: number;
  depthRange?: DepthRange;
  method?: PointMethod;
  cacheDir?: string;
  progress?: (fraction: number, message: string) => void;
  /** the fields to sample, when the caller has them open already (a workbench session); else opened here */
  fields?: () => Promise<PreparedFields>;
}

export interface LineRun extends LineResult {
  notes: string[];
}

export function sampleLine(spec: LineSpec, spacingKm = DEFAULT_SPACING_KM): SampledLine {
  if (spec.kind === 'waypoints') return sampleGreatCircles(spec.points, spacingKm);
  if (spec.kind === 'meridian') return sampleMeridian(spec.lon, spec.lat0 ?? -90, spec.lat1 ?? 90, spacingKm);
  return sampleParallel(spec.lat, spec.lon0 ?? -180, spec.lon1 ?? 180, spacingKm);
}

export async function runLine(recipe: Recipe, req: LineRequest): Promise<LineRun> {
  const line = sampleLine(req.line, req.spacingKm);
  const fields = await (req.fields ? req.fields() : prepareFields(recipe, req.variable, { cacheDir: req.cacheDir }));
  try {
    const result = await lineReport(fields.reference, fields.runs, line, { method: req.method, range: req.depthRange, progress: req.progress });
    return { ...result, variable: req.variable, units: fields.units.text, notes: fields.notes };
  } finally {
    await fields.close();
  }
}

export const LINE_FILES = ['section.csv', 'section.json', 'column-means.csv', 'column-means.json'] as const;

/** section.csv, section.json, column-means.csv, column-means.json in `dir`, as one output set. */
export async function writeLineFiles(dir: string, r: LineRun): Promise<string[]> {
  const withNotes = (o: Record<string, unknown>) => jsonText({ ...o, notes: r.notes });
  return writeOutputFiles(dir, [
    { name: 'section.csv', data: sectionCsv(r) },
    { name: 'section.json', data: withNotes({ ...sectionJson(r), skill: r.skill }) },
    { name: 'column-means.csv', data: columnMeansCsv(r) },
    { name: 'column-means.json', data: withNotes(columnMeansJson(r)) },
  ]);
}
