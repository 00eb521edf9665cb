import { StillwaterError, isStillwaterError } from '../errors.js';
import type { FieldSource } from '../cf/field-source.js';
import type { Grid, HorizontalGrid } from '../grid/types.js';
import { gridDifference } from './grid-match.js';
import { checkSnapshotList } from './snapshot-list.js';
import { snapshotSums } from './snapshot-sums.js';
import type { LayerSpec } from '../regions/layers.js';
import type { Region } from '../regions/region.js';
import { cellsWhere } from '../regions/region.js';
import type { SnapshotSpec, SnapshotSums, TracerSpec } from './types.js';

/** One opened snapshot file: fields are read lazily, level by level. */
export interface SnapshotHandle {
  /** throws StillwaterError E_VARIABLE when the file has no such variable */
  field(variable: string, units?: string): Promise<FieldSource>;
  /** whether the file holds a variable, from its header alone (optional: lets the first pass skip building grids) */
  has?(variable: string): boolean;
  close(): Promise<void>;
}

export type SnapshotOpener = (file: string) => Promise<SnapshotHandle>;

export interface SeriesInput {
  snapshots: SnapshotSpec[];
  /** name of the list for error sentences, e.g. "runs[0].snapshots" */
  listName: string;
  tracers: TracerSpec[];
  /** regions on the snapshots' grid; default: one region "global" with every cell */
  regions?: (grid: HorizontalGrid) => Promise<Region[]>;
  layers: LayerSpec[];
  open: SnapshotOpener;
  progress?: (fraction: number, message: string) => void;
  signal?: AbortSignal;
  /** awaited between snapshots and tracers: work computed ahead lets the requests of a screen go first */
  pause?: () => Promise<void>;
}

export interface TracerInfo {
  spec: TracerSpec;
  field: Pick<FieldSource, 'units' | 'grid'>;
}

export interface SeriesSums {
  snapshots: SnapshotSpec[];
  tracers: TracerInfo[];
  regions: string[];
  layers: LayerSpec[];
  grid: Grid;
  /** [snapshot][tracer][region][layer] */
  sums: SnapshotSums[][][][];
}

export async function globalRegion(grid: HorizontalGrid): Promise<Region[]> {
  return [{ name: 'global', source: 'built-in', cells: cellsWhere(grid.nx * grid.ny, () => true) }];
}

function missingVariable(s: SnapshotSpec, tracer: TracerSpec, held?: string): StillwaterError {
  return new StillwaterError('E_VARIABLE', `${s.file}: the snapshot at model year ${s.year}${s.origin ? ` (${s.origin})` : ''} has no variable '${tracer.variable}'${held ? ` (${held})` : ''}.`, {
    file: s.file,
    variable: tracer.variable,
    path: s.origin,
  });
}

async function openField(h: SnapshotHandle, s: SnapshotSpec, tracer: TracerSpec, units: string | undefined): Promise<FieldSource> {
  try {
    return await h.field(tracer.variable, units);
  } catch (e) {
    if (isStillwaterError(e) && e.code === 'E_VARIABLE') throw missingVariable(s, tracer, /\((variables: [^)]*)\)/.exec(e.message)?.[1]);
    throw e;
  }
}

/**
 * Snapshots listed without a model year take it from the file's CF time axis: a file with several time
 * steps becomes one snapshot per step. A year given for a file with several time steps is ambiguous.
 */
export async function expandSnapshots(specs: SnapshotSpec[], firstTracer: TracerSpec, open: SnapshotOpener): Promise<SnapshotSpec[]> {
  const out: SnapshotSpec[] = [];
  for (const s of specs) {
    const h = await open(s.file);
    try {
      const f = await openField(h, { ...s, year: Number.isFinite(s.year) ? s.year : NaN }, firstTracer, firstTracer.units);
      if (Number.isFinite(s.year)) {
        if (f.nt > 1 && s.timeIndex === undefined) {
          throw new StillwaterError('E_INPUT', `${s.file}: the file holds ${f.nt} time steps but ${s.origin ?? 'its snapshot'} gives one model year; leave out the year to use the file's time axis.`, {
            file: s.file,
            path: s.origin,
          });
        }
        out.push(s);
      } else if (f.time && f.time.values.length === f.nt) {
        f.time.values.forEach((v, i) => out.push({ file: s.file, year: v.yearFraction, timeIndex: i, origin: `${s.origin ?? s.file}, time step ${i + 1}` }));
      } else {
        out.push(s); // no year and no time axis: the list check says so
      }
    } finally {
      await h.close();
    }
  }
  return out;
}

function cancelled(signal?: AbortSignal): void {
  if (signal?.aborted) throw new StillwaterError('E_CANCELLED', 'The spin-up analysis was cancelled.');
}

/**
 * Volume-weighted sums of every tracer x region x layer for every snapshot. A first pass reads every
 * snapshot's header and refuses bad input before any data is read: a missing variable, another grid, a
 * time step outside the file (it builds the grid of the first tracer only; the others are checked for
 * presence, and their grids and units in the second pass, which compares arrays and costs nothing).
 * The second pass reads level by level; memory holds one level. Results are only returned, never
 * written, so a refusal in either pass leaves nothing behind.
 */
export async function seriesSums(input: SeriesInput): Promise<SeriesSums> {
  const { tracers, layers, open } = input;
  if (tracers.length === 0) throw new StillwaterError('E_INPUT', `${input.listName}: no tracer to follow was named.`, { path: input.listName });
  const snapshots = await expandSnapshots(input.snapshots, tracers[0], open);
  checkSnapshotList(snapshots, input.listName);

  const infos: TracerInfo[] = [];
  let grid: Grid | null = null;
  let firstFile = '';
  /** the same units and grid as the first snapshot, and the time step present */
  const check = (f: FieldSource, s: SnapshotSpec, j: number): void => {
    const subject = { file: s.file, variable: tracers[j].variable, path: s.origin };
    const where = `${s.file}: variable '${tracers[j].variable}' of the snapshot at model year ${s.year}`;
    if (!infos[j]) infos[j] = { spec: tracers[j], field: { units: f.units, grid: f.grid } };
    else if (f.units.canonical !== infos[j].field.units.canonical || f.units.factor !== infos[j].field.units.factor) {
      throw new StillwaterError('E_UNITS', `${where} is in '${f.units.text}' but in '${infos[j].field.units.text}' in ${firstFile}; all snapshots of a run must use the same units.`, subject);
    }
    if (!grid) {
      grid = f.grid;
      firstFile = s.file;
    } else {
      const diff = gridDifference(grid, f.grid);
      if (diff) throw new StillwaterError('E_GRID', `${where} is on another grid than ${firstFile} (${diff}); all snapshots of a run must share one grid.`, subject);
    }
    const t = s.timeIndex ?? 0;
    if (t >= f.nt) throw new StillwaterError('E_INPUT', `${s.file}: time step ${t + 1} was asked for, but variable '${tracers[j].variable}' has ${f.nt}.`, subject);
  };

  // pass 1: headers only
  for (let i = 0; i < snapshots.length; i++) {
    const s = snapshots[i];
    await input.pause?.();
    cancelled(input.signal);
    const h = await open(s.file);
    try {
      for (let j = 0; j < tracers.length; j++) {
        if (i > 0 && j > 0 && h.has) {
          if (!h.has(tracers[j].variable)) throw missingVariable(s, tracers[j]);
          continue;
        }
        check(await openField(h, s, tracers[j], tracers[j].units), s, j);
      }
    } finally {
      await h.close();
    }
  }
  if (!grid) throw new StillwaterError('E_INTERNAL', 'no grid after reading the snapshot headers');
  const theGrid: Grid = grid;

  const regions = await (input.regions ?? globalRegion)(theGrid.horizontal);
  // pass 2: data, level by level
  const sums: SnapshotSums[][][][] = [];
  for (let i = 0; i < snapshots.length; i++) {
    const s = snapshots[i];
    cancelled(input.signal);
    input.progress?.(i / snapshots.length, `snapshot ${i + 1} of ${snapshots.length}: model year ${s.year}`);
    const h = await open(s.file);
    try {
      const perTracer: SnapshotSums[][][] = [];
      for (let j = 0; j < infos.length; j++) {
        await input.pause?.();
        cancelled(input.signal);
        const f = await openField(h, s, infos[j].spec, infos[j].spec.units);
        check(f, s, j);
        perTracer.push(await snapshotSums(f, s.timeIndex ?? 0, regions, layers));
      }
      sums.push(perTracer);
    } finally {
      await h.close();
    }
  }
  input.progress?.(1, `${snapshots.length} snapshots read`);
  return { snapshots, tracers: infos, regions: regions.map((r) => r.name), layers, grid: theGrid, sums };
}
