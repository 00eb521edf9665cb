import { StillwaterError, isStillwaterError } from '../errors.js';
import type { FieldSource } from '../cf/field.js';
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

async function openField(h: SnapshotHandle, s: SnapshotSpec, tracer: TracerSpec, units: string | undefined): Promise<FieldSource> {
  try {
    return await h.field(tracer.variable, units);
  } catch (e) {
    if (isStillwaterError(e) && e.code === 'E_VARIABLE') {
      throw new StillwaterError('E_VARIABLE', `${s.file}: the snapshot at model year ${s.year}${s.origin ? ` (${s.origin})` : ''} has no variable '${tracer.variable}' (${e.message})`, {
        file: s.file,
        variable: tracer.variable,
        path: s.origin,
      });
    }
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

/**
 * Volume-weighted sums of every tracer x region x layer for every snapshot. A first pass opens every
 * snapshot's header (cheap) and refuses bad input before any data is read: a missing variable, another
 * grid, a time step outside the file. The second pass reads level by level; memory holds one level.
 */
export async function seriesSums(input: SeriesInput): Promise<SeriesSums> {
  const { tracers, layers, open } = input;
  if (tracers.length === 0) throw new StillwaterError('E_INPUT', `${input.listName}: no tracer to follow was named.`, { path: input.listName });
  const snapshots = await expandSnapshots(input.snapshots, tracers[0], open);
  checkSnapshotList(snapshots, input.listName);

  // pass 1: headers only
  const infos: TracerInfo[] = [];
  let grid: Grid | null = null;
  let firstFile = '';
  for (const s of snapshots) {
    input.signal?.throwIfAborted();
    const h = await open(s.file);
    try {
      for (let j = 0; j < tracers.length; j++) {
        const f = await openField(h, s, tracers[j], tracers[j].units);
        if (!infos[j]) infos[j] = { spec: tracers[j], field: { units: f.units, grid: f.grid } };
        else if (f.units.canonical !== infos[j].field.units.canonical || f.units.factor !== infos[j].field.units.factor) {
          throw new StillwaterError('E_UNITS', `${s.file}: variable '${tracers[j].variable}' of the snapshot at model year ${s.year} is in '${f.units.text}' but in '${infos[j].field.units.text}' in ${firstFile}; all snapshots of a run must use the same units.`, {
            file: s.file,
            variable: tracers[j].variable,
            path: s.origin,
          });
        }
        if (!grid) {
          grid = f.grid;
          firstFile = s.file;
        } else {
          const diff = gridDifference(grid, f.grid);
          if (diff) {
            throw new StillwaterError('E_GRID', `${s.file}: variable '${tracers[j].variable}' of the snapshot at model year ${s.year} is on another grid than ${firstFile} (${diff}); all snapshots of a run must share one grid.`, {
              file: s.file,
              variable: tracers[j].variable,
              path: s.origin,
            });
          }
        }
        const t = s.timeIndex ?? 0;
        if (t >= f.nt) {
          throw new StillwaterError('E_INPUT', `${s.file}: time step ${t + 1} was asked for, but variable '${tracers[j].variable}' has ${f.nt}.`, { file: s.file, path: s.origin });
        }
      }
    } finally {
      await h.close();
    }
  }
  if (!grid) throw new StillwaterError('E_INTERNAL', 'no grid after reading the snapshot headers');

  const regions = await (input.regions ?? globalRegion)(grid.horizontal);
  // pass 2: data, level by level
  const sums: SnapshotSums[][][][] = [];
  for (let i = 0; i < snapshots.length; i++) {
    const s = snapshots[i];
    input.signal?.throwIfAborted();
    input.progress?.(i / snapshots.length, `snapshot ${i + 1} of ${snapshots.length}: model year ${s.year}`);
    const h = await open(s.file);
    try {
      const perTracer: SnapshotSums[][][] = [];
      for (const info of infos) {
        const f = await openField(h, s, info.spec, info.spec.units);
        perTracer.push(await snapshotSums(f, s.timeIndex ?? 0, regions, layers));
      }
      sums.push(perTracer);
    } finally {
      await h.close();
    }
  }
  input.progress?.(1, `${snapshots.length} snapshots read`);
  return { snapshots, tracers: infos, regions: regions.map((r) => r.name), layers, grid, sums };
}
