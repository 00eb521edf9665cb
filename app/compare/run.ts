/**
 * A comparison from a validated recipe: for each variable, open the reference and the runs, bring them onto
 * the common grid and into the table's units, then stream the levels once, feeding every run's statistics
 * for all regions × layers at the same time. Memory: a few levels per run.
 */
import { statSync } from 'node:fs';
import { parseUnits, type ParsedUnits } from '../cf/units.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import { parseExpression } from '../ocean/expression.js';
import type { Recipe } from '../recipe/types.js';
import { layerLabel } from '../regions/layers.js';
import type { Region } from '../regions/region.js';
import { multiTracerCost } from '../stats/cost.js';
import { log10Values } from '../stats/log-space.js';
import { skillFromMoments } from '../stats/skill.js';
import { PairAccumulator } from './accumulate.js';
import { commonGridFor, sameHorizontal } from './common-grid.js';
import { densityProvider } from './density.js';
import type { FieldSinkFactory, LevelSink } from './field-sink.js';
import { derivedReader, onGrid, openSpec, plainReader, referenceUnitsOf, type LevelReader, type ReaderContext } from './level-reader.js';
import { loadRegions, prefixed } from './load-regions.js';
import { makeRow, type SkillRow } from './rows.js';

export interface CompareOptions {
  cacheDir?: string;
  onProgress?: (fraction: number, message: string) => void;
  signal?: AbortSignal;
  /** keep the fields: called once per run × variable, then fed level by level */
  keepFields?: FieldSinkFactory;
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
}

export interface RunCost {
  run: string;
  /** Σ over variables of global full-depth RMSE / |reference global mean|; null if any term is undefined */
  cost: number | null;
  terms: { variable: string; term: number | null }[];
}

export interface ComparisonResult {
  rows: SkillRow[];
  costs: RunCost[];
  variables: VariableInfo[];
  inputs: InputFile[];
}

function tableUnits(u: ParsedUnits): string {
  return u.kind === 'other' ? u.text.trim() : u.canonical;
}

export async function runComparison(recipe: Recipe, opts: CompareOptions = {}): Promise<ComparisonResult> {
  const rows: SkillRow[] = [];
  const variables: VariableInfo[] = [];
  const inputs = new Map<string, InputFile>();
  const noteFile = (path: string) => {
    if (inputs.has(path)) return;
    const st = statSync(path);
    inputs.set(path, { path, size: st.size, mtime: st.mtime.toISOString() });
  };
  const costTerms = recipe.runs.map(() => [] as { variable: string; rmse: number | null; refMean: number | null }[]);
  const regionCache: { grid: Grid; regions: Region[] }[] = [];
  /** the table units of a reference variable: the recipe's choice, or the reference file's */
  const referenceUnits = referenceUnitsOf(recipe);

  for (let vi = 0; vi < recipe.variables.length; vi++) {
    if (opts.signal?.aborted) throw new StillwaterError('E_CANCELLED', 'The comparison was cancelled.');
    const variable = recipe.variables[vi];
    const derived = recipe.options.derived[variable];
    opts.onProgress?.(vi / recipe.variables.length, `${variable}: opening and regridding`);
    const readers: LevelReader[] = [];
    let densityClose: (() => Promise<void>) | null = null;
    let unowned: { close?(): Promise<void> } | null = null;
    try {
      // the common grid follows the reference field (of the first input, for a derived variable)
      const gridKey = derived ? parseExpression(derived.expression).variables[0] : variable;
      const gridSpec = recipe.reference.variables[gridKey];
      const refField = await openSpec(gridSpec);
      unowned = refField;
      const grid = commonGridFor(recipe.options.commonGrid, refField.grid);
      const density = densityProvider(recipe, grid, async (spec) => onGrid(await openSpec(spec), spec, { grid, options: recipe.options, cacheDir: opts.cacheDir }));
      densityClose = () => density.close();
      const ctx: ReaderContext = { grid, options: recipe.options, cacheDir: opts.cacheDir, densityNote: density.note, noteFile };
      let target: ParsedUnits;
      let ref: LevelReader;
      unowned = null;
      if (derived) {
        await refField.close?.();
        target = await prefixed(`options.derived.${variable}.units`, async () => parseUnits(derived.units));
        ref = await derivedReader(variable, derived.expression, recipe.reference, referenceUnits, ctx);
      } else {
        target = recipe.options.units[variable] ? await referenceUnits(variable) : refField.units;
        ref = await plainReader(variable, gridSpec, target, ctx, refField);
      }
      readers.push(ref);
      const info: VariableInfo = {
        variable,
        units: tableUnits(target),
        grid: { nx: grid.horizontal.nx, ny: grid.horizontal.ny, nz: grid.vertical?.nz ?? 1, kind: grid.horizontal.kind },
        ...(derived ? { expression: derived.expression } : {}),
        conversions: ref.conversions.map((note) => ({ source: recipe.reference.label, note })),
        regridded: ref.regridded ? [recipe.reference.label] : [],
      };
      const runs: { index: number; label: string; reader: LevelReader }[] = [];
      for (let ri = 0; ri < recipe.runs.length; ri++) {
        const run = recipe.runs[ri];
        let reader: LevelReader;
        if (derived) {
          const needs = parseExpression(derived.expression).variables;
          if (!needs.every((k) => run.variables[k])) continue;
          reader = await derivedReader(variable, derived.expression, run, referenceUnits, ctx);
        } else {
          const spec = run.variables[variable];
          if (!spec) continue;
          reader = await plainReader(variable, spec, target, ctx);
        }
        readers.push(reader);
        runs.push({ index: ri, label: run.label, reader });
        for (const note of reader.conversions) info.conversions.push({ source: run.label, note });
        if (reader.regridded) info.regridded.push(run.label);
      }

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
      const accs = runs.map(() => new PairAccumulator(regions, recipe.layers, grid.vertical, area, tol));
      const logAccs = wantLog ? runs.map(() => new PairAccumulator(regions, recipe.layers, grid.vertical, area, tol)) : [];
      const sinks: (LevelSink | null)[] = [];
      try {
        for (const r of runs) sinks.push(opts.keepFields ? await opts.keepFields({ run: r.label, variable, units: info.units, grid }) : null);
        const nz = grid.vertical?.nz ?? 1;
        const needRho = readers.some((r) => r.needsDensity);
        let refLog: Float32Array | undefined;
        let modelLog: Float32Array | undefined;
        for (let k = 0; k < nz; k++) {
          if (opts.signal?.aborted) throw new StillwaterError('E_CANCELLED', 'The comparison was cancelled.');
          const rho = needRho ? await density.level(k) : undefined;
          const refLevel = await ref.read(k, rho);
          if (wantLog) refLog = log10Values(refLevel, refLog);
          for (let q = 0; q < runs.length; q++) {
            const model = await runs[q].reader.read(k, rho);
            accs[q].addLevel(k, model, refLevel);
            if (wantLog) {
              modelLog = log10Values(model, modelLog);
              logAccs[q].addLevel(k, modelLog, refLog!);
            }
            const sink = sinks[q];
            if (sink) {
              const diff = new Float32Array(model.length);
              for (let c = 0; c < diff.length; c++) diff[c] = model[c] - refLevel[c];
              await sink.write(k, model, diff);
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
        const cells = accs[q].results();
        const logCells = wantLog ? logAccs[q].results() : null;
        cells.forEach((cell, i) => {
          const layer = recipe.layers[cell.layer];
          const ctxRow = {
            run: r.label,
            variable,
            region: regions[cell.region].name,
            layer: layerLabel(layer),
            units: info.units,
            weightUnits: layer.kind === 'bottom' ? 'm2' : weightUnits,
          };
          rows.push(makeRow(ctxRow, cell, logCells ? logCells[i] : undefined));
        });
        // the cost is always over the whole grid and the full depth, whether or not "global" was asked for
        const s = skillFromMoments(accs[q].globalFullDepth());
        costTerms[r.index].push({ variable, rmse: s.rmse, refMean: s.ref_mean });
      });
      variables.push(info);
    } finally {
      await unowned?.close?.().catch(() => undefined);
      for (const r of readers) await r.close();
      await densityClose?.();
    }
  }
  const costs = recipe.runs.map((run, i) => ({ run: run.label, ...multiTracerCost(costTerms[i]) }));
  return { rows, costs, variables, inputs: [...inputs.values()] };
}
