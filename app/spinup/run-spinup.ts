import type { ParsedUnits } from '../cf/units.js';
import { StillwaterError } from '../errors.js';
import { loadRegions } from '../compare/load-regions.js';
import type { Recipe, SourceSpec } from '../recipe/types.js';
import type { LayerSpec } from '../regions/layers.js';
import { findVariable } from '../io/types.js';
import { openDataset } from '../io/open.js';
import { buildResult } from './build-result.js';
import { openSnapshot } from './open-snapshot.js';
import { seriesSums, type SnapshotOpener } from './series.js';
import { skillOverTime } from './skill-over-time.js';
import { DEFAULT_SETTINGS, type SnapshotSpec, type SpinupResult, type SpinupSettings, type TracerSpec } from './types.js';

export interface SpinupOptions {
  /** label of the run to follow; default: the first run that lists snapshots */
  run?: string;
  /** recipe variable keys to follow; default: the run's variables that the first snapshot holds */
  variables?: string[];
  /** snapshots that replace the run's list (e.g. from the command line) */
  snapshots?: SnapshotSpec[];
  settings?: Partial<SpinupSettings>;
  /** score every snapshot against the reference (default true) */
  skill?: boolean;
  cacheDir?: string;
  progress?: (fraction: number, message: string) => void;
  signal?: AbortSignal;
  /** awaited between steps: work computed ahead lets the requests of a screen go first */
  pause?: () => Promise<void>;
  open?: SnapshotOpener;
}

/** The whole column first: the global full-depth inventory is what a drift check looks at first. */
export function withWholeColumn(layers: LayerSpec[]): LayerSpec[] {
  return layers.some((l) => l.kind === 'all') ? layers : [{ kind: 'all' }, ...layers];
}

export function chooseRun(recipe: Recipe, label: string | undefined, haveSnapshots: boolean): SourceSpec {
  if (label !== undefined) {
    const run = recipe.runs.find((r) => r.label === label);
    if (!run) throw new StillwaterError('E_INPUT', `The recipe has no run '${label}' (runs: ${recipe.runs.map((r) => `'${r.label}'`).join(', ')}).`);
    return run;
  }
  if (haveSnapshots) return recipe.runs[0];
  const run = recipe.runs.find((r) => r.snapshots && r.snapshots.length > 0);
  if (!run) throw new StillwaterError('E_RECIPE', 'runs: no run lists snapshots (runs[].snapshots: [{file, year}]), so there is no spin-up to follow.', { path: 'runs' });
  return run;
}

/** Tracers to follow: the named recipe keys, or every variable of the run that the first snapshot holds. */
async function chooseTracers(recipe: Recipe, run: SourceSpec, first: SnapshotSpec, wanted?: string[]): Promise<{ tracers: TracerSpec[]; skipped: string[] }> {
  const keyed = (key: string): TracerSpec => {
    const v = run.variables[key];
    return { name: key, variable: v?.name ?? key, units: v?.units };
  };
  if (wanted && wanted.length) {
    return { tracers: wanted.map(keyed), skipped: [] };
  }
  const keys = Object.keys(run.variables).length ? Object.keys(run.variables) : Object.keys(recipe.reference.variables);
  const ds = await openDataset(first.file);
  try {
    const tracers = keys.map(keyed).filter((t) => findVariable(ds, t.variable));
    const skipped = keys.filter((k) => !tracers.some((t) => t.name === k));
    if (tracers.length === 0) {
      throw new StillwaterError('E_VARIABLE', `${first.file}: the first snapshot holds none of the run's variables (${keys.map((k) => keyed(k).variable).join(', ')}).`, { file: first.file });
    }
    return { tracers, skipped };
  } finally {
    await ds.close();
  }
}

/**
 * Units of the tracers that are concentrations (per volume or per mass): their skill is scored in them, as a
 * per-volume run against a per-mass reference would otherwise show its drift and its skill in two units.
 */
function concentrationUnits(tracers: { spec: TracerSpec; field: { units: ParsedUnits } }[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const t of tracers) if (t.field.units.kind === 'amount_per_volume' || t.field.units.kind === 'amount_per_mass') out[t.spec.name] = t.field.units.canonical;
  return out;
}

/** Follow one run of a recipe through its spin-up snapshots: series, drift, fits, verdicts, skill over time. */
export async function spinupFromRecipe(recipe: Recipe, opts: SpinupOptions = {}): Promise<SpinupResult> {
  const settings: SpinupSettings = { ...DEFAULT_SETTINGS, nominalDensity: recipe.options.nominalDensity, ...opts.settings };
  const run = chooseRun(recipe, opts.run, !!opts.snapshots);
  const listName = opts.snapshots ? '--snapshots' : `${run.path}.snapshots`;
  const snapshots: SnapshotSpec[] = opts.snapshots ?? (run.snapshots ?? []).map((s, i) => ({ file: s.file, year: s.year ?? NaN, origin: `${run.path}.snapshots[${i}]` }));
  if (snapshots.length === 0) throw new StillwaterError('E_RECIPE', `${listName}: run '${run.label}' lists no snapshots.`, { path: listName });
  const { tracers, skipped } = await chooseTracers(recipe, run, snapshots[0], opts.variables);
  const wantSkill = opts.skill !== false;
  const stage = (from: number, to: number) => (f: number, m: string) => opts.progress?.(from + (to - from) * f, m);
  const layers = withWholeColumn(recipe.layers);
  const series = await seriesSums({
    snapshots,
    listName,
    tracers,
    layers,
    regions: (grid) => loadRegions(recipe.regions, grid),
    open: opts.open ?? openSnapshot,
    progress: stage(0, wantSkill ? 0.5 : 1),
    signal: opts.signal,
    pause: opts.pause,
  });
  const skill = wantSkill
    ? await skillOverTime({ recipe, run, snapshots: series.snapshots, tracers, layers, trackUnits: concentrationUnits(series.tracers), cacheDir: opts.cacheDir, progress: stage(0.5, 1), signal: opts.signal, pause: opts.pause })
    : [];
  const result = buildResult(run.label, series, settings, skill);
  if (skipped.length) result.notes.push(`Not followed (absent from the first snapshot): ${skipped.join(', ')}.`);
  return result;
}

/** Follow snapshot files without a recipe: the whole ocean and the whole column, no skill. */
export async function spinupFromFiles(snapshots: SnapshotSpec[], variables: string[], opts: SpinupOptions & { label?: string; layers?: LayerSpec[] } = {}): Promise<SpinupResult> {
  if (variables.length === 0) throw new StillwaterError('E_INPUT', 'Name the variables to follow (--variables po4,o2).');
  const settings: SpinupSettings = { ...DEFAULT_SETTINGS, ...opts.settings };
  const series = await seriesSums({
    snapshots,
    listName: '--snapshots',
    tracers: variables.map((v) => ({ name: v, variable: v })),
    layers: withWholeColumn(opts.layers ?? []),
    open: opts.open ?? openSnapshot,
    progress: opts.progress,
    signal: opts.signal,
  });
  return buildResult(opts.label ?? 'snapshots', series, settings);
}
