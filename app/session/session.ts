/**
 * A workbench session: a recipe opened on one common grid, its pairs opened (app/compare/open-pair.ts) when a
 * view first asks for a variable, their levels kept in a bounded cache so that a change of depth is fast,
 * its regions, and the skill rows of each variable computed once and shared by every view that shows them.
 */
import { randomUUID } from 'node:crypto';
import { commonGridFor } from '../compare/common-grid.js';
import { openPair, type OpenedPair, type SourceLevels } from '../compare/open-pair.js';
import { loadRegions } from '../compare/load-regions.js';
import { runComparison, type ComparisonResult } from '../compare/run.js';
import { openSpec } from '../compare/level-reader.js';
import { StillwaterError } from '../errors.js';
import type { Grid } from '../grid/types.js';
import { PromiseCache } from '../promise-cache.js';
import type { Recipe } from '../recipe/types.js';
import type { Region } from '../regions/region.js';
import type { SessionInfo } from '../../contract/view-types.js';
import { periodLevel, type Period } from '../time/periods.js';
import { checkPeriod, recipeIsMonthly } from './periods.js';
import { sessionInfo } from './session-info.js';

const LEVEL_CACHE_BYTES = 512 * 1024 * 1024;

/** A source of a pair with the label the cache and the messages use. */
export interface Source {
  label: string;
  role: 'ref' | 'run';
  levels: SourceLevels;
}

export interface Session {
  id: string;
  recipePath: string;
  recipe: Recipe;
  grid: Grid;
  info: SessionInfo;
  cacheDir: string;
  /** when a call last used it (for closing idle sessions) */
  lastUsed: number;
  pair(variable: string): Promise<OpenedPair>;
  /** one level of one source on the common grid, in the pair's units, for a period of the year (cached) */
  level(pair: OpenedPair, source: Source, k: number, period?: Period): Promise<Float32Array>;
  regions(): Promise<Region[]>;
  /** skill rows of one variable (every variable: null), computed once per session state */
  skill(variable: string | null, opts: { signal?: AbortSignal; onProgress?: (fraction: number, message: string) => void }): Promise<ComparisonResult>;
  /** the same session on an edited recipe: levels of the variables not named stay cached */
  reopen(recipe: Recipe, changed: string): Promise<Session>;
  close(): Promise<void>;
}

export async function openSession(recipe: Recipe, recipePath: string, cacheDir: string, opts: { id?: string; modified?: boolean; levels?: PromiseCache<Float32Array> } = {}): Promise<Session> {
  const first = recipe.variables.find((v) => recipe.reference.variables[v]);
  if (!first) throw new StillwaterError('E_RECIPE', `${recipePath}: reference.variables: the reference has no variables to compare.`, { path: 'reference.variables' });
  const refField = await openSpec(recipe.reference.variables[first]);
  let grid: Grid;
  try {
    grid = commonGridFor(recipe.options.commonGrid, refField.grid);
  } finally {
    await refField.close?.();
  }
  const id = opts.id ?? randomUUID();
  const info = await sessionInfo(recipe, recipePath, grid, id, opts.modified ?? false);
  const pairs = new Map<string, Promise<OpenedPair>>();
  const skills = new Map<string, Promise<ComparisonResult>>();
  const levels = opts.levels ?? new PromiseCache<Float32Array>(LEVEL_CACHE_BYTES, (a) => a.byteLength);
  let regions: Promise<Region[]> | null = null;
  let closed = false;

  const session: Session = {
    id,
    recipePath,
    recipe,
    grid,
    info,
    cacheDir,
    lastUsed: Date.now(),
    pair(variable) {
      if (closed) throw new StillwaterError('E_INPUT', `The workbench session '${id}' is no longer open; open the recipe again.`);
      let p = pairs.get(variable);
      if (!p) {
        // a recipe that compares months reads every source as 12 months, as its skill rows do
        p = openPair(recipe, variable, { cacheDir, grid, monthlyRows: recipeIsMonthly(recipe) });
        pairs.set(variable, p);
        p.catch(() => pairs.delete(variable));
      }
      return p;
    },
    level(pair, source, k, period = 'annual') {
      if (period === 'annual') return levels.get(`${pair.variable}\u0000${source.label}\u0000${source.role}\u0000${k}`, () => source.levels.level(k));
      checkPeriod(recipe, period);
      return levels.get(`${pair.variable}\u0000${source.label}\u0000${source.role}\u0000${k}\u0000${period}`, async () => {
        const weights = source.levels.monthWeights;
        if (!weights) throw new StillwaterError('E_INTERNAL', `${source.label}: '${pair.variable}' was opened without its months.`);
        const months = await source.levels.months(k);
        const out = periodLevel(months, weights, period);
        // a single month is the reader's own array, which it keeps for the next periods: the cache gets a copy
        return months.includes(out) ? out.slice() : out;
      });
    },
    regions() {
      if (!regions) {
        regions = loadRegions(recipe.regions, grid.horizontal);
        regions.catch(() => (regions = null));
      }
      return regions;
    },
    skill(variable, opts) {
      const key = variable ?? '\u0000all';
      let p = skills.get(key);
      if (!p) {
        if (variable !== null && !recipe.variables.includes(variable)) throw new StillwaterError('E_INPUT', `The recipe compares no variable '${variable}'.`, { variable });
        // the comparison of this variable alone: the same rows as the whole recipe's, sooner
        p = runComparison(variable === null ? recipe : { ...recipe, variables: [variable] }, { cacheDir, ...opts });
        skills.set(key, p);
        p.catch(() => skills.delete(key));
      }
      return p;
    },
    async reopen(next, changed) {
      levels.clear(`${changed}\u0000`);
      const fresh = await openSession(next, session.recipePath, cacheDir, { id, modified: true, levels });
      await closePairs();
      return fresh;
    },
    async close() {
      closed = true;
      levels.clear();
      await closePairs();
    },
  };
  const closePairs = async (): Promise<void> => {
    const all = [...pairs.values()];
    pairs.clear();
    skills.clear();
    for (const p of all) await p.then((x) => x.close()).catch(() => undefined);
  };
  return session;
}
