import { runComparison } from '../compare/run.js';
import type { Recipe, SourceSpec, VariableSource } from '../recipe/types.js';
import type { LayerSpec } from '../regions/layers.js';
import type { SkillPoint, SnapshotSpec, TracerSpec } from './types.js';

export interface SkillOverTimeInput {
  recipe: Recipe;
  run: SourceSpec;
  snapshots: SnapshotSpec[];
  /** tracers by recipe variable key (`name`) and in-file name (`variable`) */
  tracers: TracerSpec[];
  /** layers to score (default: the recipe's) */
  layers?: LayerSpec[];
  /**
   * units of each followed tracer (by recipe key), as its snapshots hold it: skill of a concentration is given
   * in these, so that the figure's deviation and skill axes of one tracer share units
   */
  trackUnits?: Record<string, string>;
  cacheDir?: string;
  progress?: (fraction: number, message: string) => void;
  signal?: AbortSignal;
  pause?: () => Promise<void>;
}

/**
 * The compare statistics of every snapshot against the reference, by the compare helper itself: each
 * snapshot becomes one run of a recipe derived from the person's (same reference, regions, layers, common
 * grid and options), so the numbers are exactly those `stillwater compare` would give for that file.
 * Only tracers the reference holds are scored.
 */
export async function skillOverTime(input: SkillOverTimeInput): Promise<SkillPoint[]> {
  const { recipe, run } = input;
  const scored = input.tracers.filter((t) => recipe.reference.variables[t.name]);
  if (scored.length === 0) return [];
  const labelOf = (s: SnapshotSpec, i: number): string => `${run.label} @ model year ${s.year} #${i}`;
  const runs: SourceSpec[] = input.snapshots.map((s, i) => {
    const variables: Record<string, VariableSource> = {};
    for (const t of scored) {
      variables[t.name] = {
        file: s.file,
        name: t.variable,
        units: t.units,
        time: s.timeIndex,
        path: s.origin ?? `${run.path}.snapshots[${i}]`,
      };
    }
    return { label: labelOf(s, i), variables, path: s.origin ?? `${run.path}.snapshots[${i}]` };
  });
  const units = { ...recipe.options.units };
  for (const t of scored) if (input.trackUnits?.[t.name]) units[t.name] = input.trackUnits[t.name];
  const derived: Recipe = { ...recipe, runs, layers: input.layers ?? recipe.layers, variables: scored.map((t) => t.name), options: { ...recipe.options, units } };
  const result = await runComparison(derived, { cacheDir: input.cacheDir, onProgress: input.progress, signal: input.signal, pause: input.pause });
  const yearOf = new Map(runs.map((r, i) => [r.label, input.snapshots[i].year]));
  return result.rows.map((row) => ({ ...row, run: run.label, year: yearOf.get(row.run) ?? NaN }));
}
