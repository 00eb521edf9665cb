/**
 * A comparison from a validated recipe: for each variable, open the pair (the reference and the runs on the
 * common grid, in the table's units: open-pair.ts), stream the levels once, feeding every run's statistics
 * for all regions × layers at the same time, then turn them into skill rows. Memory: a few levels per run.
 */
import { statSync } from 'node:fs';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import type { Recipe } from '../recipe/types.js';
import { layerLabel } from '../regions/layers.js';
import type { Region } from '../regions/region.js';
import { multiTracerCost } from '../stats/cost.js';
import { log10Values } from '../stats/log-space.js';
import { skillFromMoments } from '../stats/skill.js';
import { PairAccumulator } from './accumulate.js';
import { sameHorizontal } from './common-grid.js';
import type { FieldSinkFactory, LevelSink } from './field-sink.js';
import { loadRegions } from './load-regions.js';
import { openPair } from './open-pair.js';
import { makeRow, type CycleRow, type SkillRow } from './rows.js';
import { ALL_PERIODS, MONTH_NAMES, periodLevel, periodsFor, type Period } from '../time/periods.js';
import { CycleCorrelationAccumulator } from './cycle-accumulate.js';
import { cycleRow } from './cycle-rows.js';
import type { SourceLevels } from './open-pair.js';

export interface CompareOptions {
  cacheDir?: string;
  onProgress?: (fraction: number, message: string) => void;
  signal?: AbortSignal;
  /** keep the fields: called once per run × variable, then fed level by level */
  keepFields?: FieldSinkFactory;
  /** called once a variable's rows are complete (before the next variable is opened), e.g. to draw its figures */
  onVariable?: (info: VariableInfo, rows: SkillRow[]) => Promise<void>;
  /** awaited before each variable and each level: work computed ahead lets the requests of a screen go first */
  pause?: () => Promise<void>;
}

export interface InputFile {
  path: string;
  size: number;
  mtime: string;
}

export interface VariableInfo {
  variable: string;
  units: string;
  grid: { nx: number; ny: number; nz: number; kind: string };
  /** the expression, for a derived variable */
  expression?: string;
  /** how each source was brought into the table's units, if it was */
  conversions: { source: string; note: string }[];
  /** sources regridded to the common grid */
  regridded: string[];
  /** how each source's time steps were reduced, where there was more than one step */
  time?: { source: string; note: string }[];
}

export interface RunCost {
  run: string;
  /** Σ over variables of global full-depth RMSE / |reference global mean|; null if any term is undefined */
  cost: number | null;
  terms: { variable: string; term: number | null }[];
}

export interface ComparisonResult {
  rows: SkillRow[];
  /** seasonal-cycle numbers per run × variable × region × layer, when the recipe asks for monthly rows */
  cycles?: CycleRow[];
  costs: RunCost[];
  variables: VariableInfo[];
  inputs: InputFile[];
}

export async function runComparison(recipe: Recipe, opts: CompareOptions = {}): Promise<ComparisonResult> {
  const rows: SkillRow[] = [];
  const cycles: CycleRow[] = [];
  const asked = periodsFor(recipe.options.periods);
  const monthly = asked.length > 1;
  // with monthly rows every period is accumulated: the cycle numbers need the months even when only seasons are reported
  const periods: readonly Period[] = monthly ? ALL_PERIODS : ['annual'];
  const variables: VariableInfo[] = [];
  const inputs = new Map<string, InputFile>();
  const noteFile = (path: string) => {
    if (inputs.has(path)) return;
    const st = statSync(path);
    inputs.set(path, { path, size: st.size, mtime: st.mtime.toISOString() });
  };
  const costTerms = recipe.runs.map(() => [] as { variable: string; rmse: number | null; refMean: number | null }[]);
  const regionCache: { grid: Grid; regions: Region[] }[] = [];

  for (let vi = 0; vi < recipe.variables.length; vi++) {
    if (opts.signal?.aborted) throw new StillwaterError('E_CANCELLED', 'The comparison was cancelled.');
    const variable = recipe.variables[vi];
    await opts.pause?.();
    opts.onProgress?.(vi / recipe.variables.length, `${variable}: opening and regridding`);
    const firstRow = rows.length;
    const pair = await openPair(recipe, variable, { cacheDir: opts.cacheDir, noteFile, monthlyRows: monthly });
    try {
      const { grid, reference: ref } = pair;
      const runs = await pair.openRuns();
      const info: VariableInfo = {
        variable,
        units: pair.unitsText,
        grid: { nx: grid.horizontal.nx, ny: grid.horizontal.ny, nz: grid.vertical?.nz ?? 1, kind: grid.horizontal.kind },
        ...(pair.expression !== undefined ? { expression: pair.expression } : {}),
        conversions: [ref, ...runs].flatMap((src) => src.conversions.map((note) => ({ source: src.label, note }))),
        regridded: [ref, ...runs].filter((src) => src.regridded).map((src) => src.label),
        time: [ref, ...runs].filter((src) => src.timeNote).map((src) => ({ source: src.label, note: src.timeNote! })),
      };

      let cached = regionCache.find((c) => sameHorizontal(c.grid.horizontal, grid.horizontal));
      if (!cached) {
        cached = { grid, regions: await loadRegions(recipe.regions, grid.horizontal) };
        regionCache.push(cached);
        for (const r of recipe.regions) if (r.kind !== 'built-in') noteFile(r.file);
      }
      const regions = cached.regions;
      const area = grid.horizontal.area;
      const tol = recipe.options.bottomTolerance;
      const wantLog = recipe.options.logStats.includes(variable);
      const newAccs = () => periods.map(() => new PairAccumulator(regions, recipe.layers, grid.vertical, area, tol));
      const accs = runs.map(newAccs);
      const logAccs = wantLog ? runs.map(newAccs) : [];
      const cycleAccs = monthly ? runs.map(() => new CycleCorrelationAccumulator(regions, recipe.layers, grid.vertical, area)) : [];
      const sinks: (LevelSink | null)[] = [];
      try {
        for (const r of runs) sinks.push(opts.keepFields ? await opts.keepFields({ run: r.label, variable, units: info.units, grid, periods: asked }) : null);
        const nz = grid.vertical?.nz ?? 1;
        for (let k = 0; k < nz; k++) {
          await opts.pause?.();
          if (opts.signal?.aborted) throw new StillwaterError('E_CANCELLED', 'The comparison was cancelled.');
          const refLevels = await readPeriods(ref, k, periods);
          const refLogs = wantLog ? refLevels.levels.map((x) => log10Values(x)) : [];
          for (let q = 0; q < runs.length; q++) {
            if (q > 0) await opts.pause?.();
            const modelLevels = await readPeriods(runs[q], k, periods);
            periods.forEach((_, p) => {
              accs[q][p].addLevel(k, modelLevels.levels[p], refLevels.levels[p]);
              if (wantLog) logAccs[q][p].addLevel(k, log10Values(modelLevels.levels[p]), refLogs[p]);
            });
            if (monthly) cycleAccs[q].addLevel(k, modelLevels.months!, refLevels.months!);
            // the fields kept: every period asked where the sink keeps periods, else the year's
            const sink = sinks[q];
            if (sink?.writePeriod) {
              for (let a = 0; a < asked.length; a++) {
                const p = periods.indexOf(asked[a]);
                await sink.writePeriod(k, a, modelLevels.levels[p], difference(modelLevels.levels[p], refLevels.levels[p]));
              }
            } else if (sink) {
              await sink.write(k, modelLevels.levels[0], difference(modelLevels.levels[0], refLevels.levels[0]), refLevels.levels[0]);
            }
          }
          opts.onProgress?.((vi + (k + 1) / nz) / recipe.variables.length, `${variable}: level ${k + 1} of ${nz}`);
        }
        for (const s of sinks) await s?.close();
      } catch (e) {
        for (const s of sinks) await s?.abort().catch(() => undefined);
        throw e;
      }

      const weightUnits = grid.vertical ? 'm3' : 'm2';
      runs.forEach((r, q) => {
        const byPeriod = new Map<Period, SkillRow[]>();
        periods.forEach((period, p) => {
          const cells = accs[q][p].results();
          const logCells = wantLog ? logAccs[q][p].results() : null;
          byPeriod.set(
            period,
            cells.map((cell, i) => {
              const layer = recipe.layers[cell.layer];
              const ctxRow = {
                run: r.label,
                variable,
                region: regions[cell.region].name,
                layer: layerLabel(layer),
                period,
                units: info.units,
                weightUnits: layer.kind === 'bottom' ? 'm2' : weightUnits,
              };
              return makeRow(ctxRow, cell, logCells ? logCells[i] : undefined);
            }),
          );
        });
        // rows by region × layer, then period, as asked
        const annualCells = accs[q][0].results();
        annualCells.forEach((cell, i) => {
          for (const period of asked) rows.push(byPeriod.get(period)![i]);
          if (monthly) {
            const isBottom = recipe.layers[cell.layer].kind === 'bottom';
            const monthRows = MONTH_NAMES.map((m) => byPeriod.get(m)![i]);
            cycles.push(cycleRow(monthRows, isBottom ? null : cycleAccs[q].result(cell.region, cell.layer)));
          }
        });
        // the cost is always over the whole grid and the full depth, whether or not "global" was asked for
        const s = skillFromMoments(accs[q][0].globalFullDepth());
        costTerms[pair.runs[q].index].push({ variable, rmse: s.rmse, refMean: s.ref_mean });
      });
      variables.push(info);
      await opts.onVariable?.(info, rows.slice(firstRow));
    } finally {
      await pair.close();
    }
  }
  const costs = recipe.runs.map((run, i) => ({ run: run.label, ...multiTracerCost(costTerms[i]) }));
  return { rows, ...(monthly ? { cycles } : {}), costs, variables, inputs: [...inputs.values()] };
}

function difference(model: Float32Array, reference: Float32Array): Float32Array {
  const d = new Float32Array(model.length);
  for (let c = 0; c < d.length; c++) d[c] = model[c] - reference[c];
  return d;
}

/** One level of a source for each period: the year alone, or (monthly) its 12 months and every period from them. */
async function readPeriods(src: SourceLevels, k: number, periods: readonly Period[]): Promise<{ levels: Float32Array[]; months: Float32Array[] | null }> {
  if (periods.length === 1) return { levels: [await src.level(k)], months: null };
  const months = await src.months(k);
  const w = src.monthWeights!;
  return { levels: periods.map((p) => periodLevel(months, w, p)), months };
}
