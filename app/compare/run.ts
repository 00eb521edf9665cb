/**
 * A comparison from a validated recipe: for each variable, open the reference and the runs, bring them onto
 * the common grid and into the table's units, then stream the levels once, feeding every run's
 * statistics for all regions × layers at the same time. Memory: a few levels per run.
 */
import { statSync } from 'node:fs';
import type { FieldSource } from '../cf/field.js';
import { openField } from '../cf/open-field.js';
import { parseUnits, type ParsedUnits } from '../cf/units.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import type { Recipe, VariableSource } from '../recipe/types.js';
import { regridField } from '../regrid/field.js';
import { layerLabel } from '../regions/layers.js';
import type { Region } from '../regions/region.js';
import { log10Values } from '../stats/log-space.js';
import { multiTracerCost } from '../stats/cost.js';
import { skillFromMoments } from '../stats/skill.js';
import { PairAccumulator } from './accumulate.js';
import { commonGridFor, sameGrid, sameHorizontal } from './common-grid.js';
import { densityProvider, type DensityProvider } from './density.js';
import type { FieldSinkFactory, LevelSink } from './field-sink.js';
import { makeLevelConverter, type LevelConverter } from './level-units.js';
import { loadRegions, prefixed } from './load-regions.js';
import { readLevelAt, timeIndex } from './read-level.js';
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
  /** how each source was brought into the table's units, if it was */
  conversions: { source: string; note: string }[];
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

interface Opened {
  label: string;
  spec: VariableSource;
  field: FieldSource;
  onGrid: FieldSource;
  t: number | 'mean';
  convert: LevelConverter | null;
}

async function open(spec: VariableSource): Promise<FieldSource> {
  return prefixed(spec.path, () => openField(spec.file, spec.name, spec.units ? { units: spec.units } : undefined));
}

function checkTime(src: FieldSource, t: number | 'mean', spec: VariableSource): void {
  if (t !== 'mean' && (t < 0 || t >= src.nt)) {
    throw new StillwaterError('E_RECIPE', `${spec.path}.time: step ${t} is outside the file's ${src.nt} time steps.`, { path: `${spec.path}.time` });
  }
}

function tableUnits(u: ParsedUnits): string {
  return u.kind === 'other' ? u.text.trim() : u.canonical;
}

export async function runComparison(recipe: Recipe, opts: CompareOptions = {}): Promise<ComparisonResult> {
  const rows: SkillRow[] = [];
  const variables: VariableInfo[] = [];
  const inputs = new Map<string, InputFile>();
  const note = (path: string) => {
    if (inputs.has(path)) return;
    const st = statSync(path);
    inputs.set(path, { path, size: st.size, mtime: st.mtime.toISOString() });
  };
  const costTerms = recipe.runs.map(() => [] as { variable: string; rmse: number | null; refMean: number | null }[]);
  const regionCache: { grid: Grid; regions: Region[] }[] = [];
  const total = recipe.variables.length;

  for (let vi = 0; vi < recipe.variables.length; vi++) {
    const variable = recipe.variables[vi];
    const refSpec = recipe.reference.variables[variable];
    if (!refSpec) {
      throw new StillwaterError('E_RECIPE', `options.derived.${variable}: derived variables are computed by app/ocean/expression.ts, which this build lacks.`, { path: `options.derived.${variable}` });
    }
    const toClose: FieldSource[] = [];
    try {
      const refField = await open(refSpec);
      toClose.push(refField);
      note(refSpec.file);
      const grid = commonGridFor(recipe.options.commonGrid, refField.grid);
      const regrid = async (src: FieldSource, spec: VariableSource): Promise<FieldSource> => {
        if (sameGrid(src.grid, grid)) return src;
        if ((src.grid.vertical === null) !== (grid.vertical === null)) {
          throw new StillwaterError('E_GRID', `${spec.path}: '${spec.name}' in ${spec.file} is ${src.grid.vertical ? '3-D' : '2-D'} but the common grid is ${grid.vertical ? '3-D' : '2-D'}.`, { path: spec.path });
        }
        return prefixed(spec.path, () => regridField(src, grid, { method: recipe.options.method, coverage: recipe.options.coverage, cacheDir: opts.cacheDir }));
      };
      const info: VariableInfo = {
        variable,
        units: '',
        grid: { nx: grid.horizontal.nx, ny: grid.horizontal.ny, nz: grid.vertical?.nz ?? 1, kind: grid.horizontal.kind },
        conversions: [],
        regridded: [],
      };
      const wanted = recipe.options.units[variable];
      const target = wanted ? await prefixed(`options.units.${variable}`, async () => parseUnits(wanted)) : refField.units;
      info.units = tableUnits(target);
      const density: DensityProvider = densityProvider(recipe, grid, regrid);
      const prepare = async (label: string, spec: VariableSource, field: FieldSource): Promise<Opened> => {
        const onGrid = await regrid(field, spec);
        if (onGrid !== field) info.regridded.push(label);
        const t = timeIndex(onGrid, spec.time);
        checkTime(onGrid, t, spec);
        const convert = makeLevelConverter(field.units, target, `${spec.path} ('${spec.name}' in ${spec.file})`);
        if (convert) info.conversions.push({ source: label, note: convert.describe(density.note) });
        return { label, spec, field, onGrid, t, convert };
      };
      const ref = await prepare(recipe.reference.label, refSpec, refField);
      const runs: { index: number; opened: Opened }[] = [];
      for (let ri = 0; ri < recipe.runs.length; ri++) {
        const spec = recipe.runs[ri].variables[variable];
        if (!spec) continue;
        const field = await open(spec);
        toClose.push(field);
        note(spec.file);
        runs.push({ index: ri, opened: await prepare(recipe.runs[ri].label, spec, field) });
      }

      let cached = regionCache.find((c) => sameHorizontal(c.grid.horizontal, grid.horizontal));
      if (!cached) {
        cached = { grid, regions: await loadRegions(recipe.regions, grid.horizontal) };
        regionCache.push(cached);
        for (const r of recipe.regions) if (r.kind !== 'built-in') note(r.file);
      }
      const regions = cached.regions;
      const area = grid.horizontal.area;
      const wantLog = recipe.options.logStats.includes(variable);
      const accs = runs.map(() => new PairAccumulator(regions, recipe.layers, grid.vertical, area, recipe.options.bottomTolerance));
      const logAccs = wantLog ? runs.map(() => new PairAccumulator(regions, recipe.layers, grid.vertical, area, recipe.options.bottomTolerance)) : [];
      const sinks: (LevelSink | null)[] = [];
      try {
        for (const r of runs) {
          sinks.push(opts.keepFields ? await opts.keepFields({ run: r.opened.label, variable, units: info.units, grid }) : null);
        }
        const nz = grid.vertical?.nz ?? 1;
        const needRho = [ref, ...runs.map((r) => r.opened)].some((o) => o.convert?.needsDensity);
        let refLog: Float32Array | undefined;
        let modelLog: Float32Array | undefined;
        for (let k = 0; k < nz; k++) {
          if (opts.signal?.aborted) throw new StillwaterError('E_CANCELLED', 'The comparison was cancelled.');
          const rho = needRho ? await density.level(k) : undefined;
          const refLevel = await readLevelAt(ref.onGrid, ref.t, k);
          ref.convert?.apply(refLevel, rho);
          if (wantLog) refLog = log10Values(refLevel, refLog);
          for (let q = 0; q < runs.length; q++) {
            const o = runs[q].opened;
            const model = await readLevelAt(o.onGrid, o.t, k);
            o.convert?.apply(model, rho);
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
          opts.onProgress?.((vi + (k + 1) / nz) / total, `${variable}: level ${k + 1} of ${nz}`);
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
          rows.push(
            makeRow(
              {
                run: r.opened.label,
                variable,
                region: regions[cell.region].name,
                layer: layerLabel(layer),
                units: info.units,
                weightUnits: layer.kind === 'bottom' ? 'm2' : weightUnits,
              },
              cell,
              logCells ? logCells[i] : undefined,
            ),
          );
        });
        // the cost is always over the whole grid and full depth, whether or not "global" was asked for
        const s = skillFromMoments(accs[q].globalFullDepth());
        costTerms[r.index].push({ variable, rmse: s.rmse, refMean: s.ref_mean });
      });
      variables.push(info);
    } finally {
      for (const f of toClose) await f.close?.().catch(() => undefined);
    }
  }
  const costs = recipe.runs.map((run, i) => ({ run: run.label, ...multiTracerCost(costTerms[i]) }));
  return { rows, costs, variables, inputs: [...inputs.values()] };
}

