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
import { BackgroundQueue } from './background.js';
import { joinComparisons } from '../compare/join.js';

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
  /**
   * skill rows of one variable (every variable: null, joined from the variables'), computed once per session
   * state and shared by every view that shows them (Scores, Diagram); a cancelled call leaves the work going on
   */
  skill(variable: string | null, opts: { signal?: AbortSignal; onProgress?: (fraction: number, message: string) => void }): Promise<ComparisonResult>;
  /** work computed ahead in this thread between requests, and asked for by them (app/session/background.ts) */
  background: BackgroundQueue;
  /** once the screen has its first map: the skill rows of that variable, then of the others, computed ahead */
  startAhead(variable: string): void;
  /** after a level was served: the same level of the other runs and the neighbouring levels, read ahead */
  readAhead(variable: string, run: string, k: number, period?: Period): void;
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
  const background = new BackgroundQueue();

  /** the comparison of one variable alone: the very rows the whole recipe's comparison gives it */
  const skillOf = (variable: string, onProgress?: (fraction: number, message: string) => void): Promise<ComparisonResult> =>
    background.want(`skill\u0000${variable}`, (task) => runComparison({ ...recipe, variables: [variable] }, { cacheDir, onProgress, signal: task.signal, pause: task.pause }));
  const aheadSkill = (variable: string): void =>
    background.ahead(`skill\u0000${variable}`, (task) => runComparison({ ...recipe, variables: [variable] }, { cacheDir, signal: task.signal, pause: task.pause }));

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
      if (variable !== null) {
        if (!recipe.variables.includes(variable)) throw new StillwaterError('E_INPUT', `The recipe compares no variable '${variable}'.`, { variable });
        return untilCancelled(skillOf(variable, opts.onProgress), opts.signal);
      }
      let p = skills.get('all');
      if (!p) {
        p = (async () => {
          const parts: ComparisonResult[] = [];
          for (const [i, v] of recipe.variables.entries()) {
            opts.onProgress?.(i / recipe.variables.length, `${v}: skill rows`);
            parts.push(await skillOf(v));
          }
          return joinComparisons(recipe.runs.map((r) => r.label), parts);
        })();
        skills.set('all', p);
        p.catch(() => skills.delete('all'));
      }
      return untilCancelled(p, opts.signal);
    },
    background,
    startAhead(variable) {
      if (closed) return;
      if (recipe.variables.includes(variable)) aheadSkill(variable);
      for (const v of recipe.variables) aheadSkill(v);
    },
    readAhead(variable, run, k, period = 'annual') {
      if (closed) return;
      const runsOf = (v: string): string[] => info.variables.find((x) => x.key === v)?.runs ?? [];
      // the likeliest next asks first: another run, a neighbouring depth, then another variable at this depth
      const wanted: [string, string, number][] = [
        ...runsOf(variable).filter((r) => r !== run).map((r): [string, string, number] => [variable, r, k]),
        [variable, run, k + 1],
        [variable, run, k - 1],
        ...recipe.variables.filter((v) => v !== variable && runsOf(v).length).map((v): [string, string, number] => [v, runsOf(v).includes(run) ? run : runsOf(v)[0], k]),
      ];
      // one task per level served, its reads one after another, each after the requests of the moment
      background.soon(`ahead\u0000${variable}\u0000${run}\u0000${k}\u0000${period}`, async (task) => {
        for (const [v, r, kk] of wanted) {
          if (kk < 0 || kk >= info.grid.nz) continue;
          await task.pause();
          if (task.signal.aborted) return;
          try {
            const pair = await session.pair(v);
            const slot = pair.runs.find((x) => x.label === r);
            if (!slot) continue;
            const source: Source = { label: r, role: 'run', levels: await slot.open() };
            await task.pause();
            await Promise.all([session.level(pair, source, kk, period), session.level(pair, { label: recipe.reference.label, role: 'ref', levels: pair.reference }, kk, period)]);
          } catch {
            // reading ahead costs only time: the request itself will say what is wrong
          }
        }
      });
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
    background.close();
    const all = [...pairs.values()];
    pairs.clear();
    skills.clear();
    for (const p of all) await p.then((x) => x.close()).catch(() => undefined);
  };
  return session;
}

/** The shared work's result, or E_CANCELLED as soon as this caller cancels (the work goes on for the others). */
export function untilCancelled<T>(p: Promise<T>, signal?: AbortSignal): Promise<T> {
  if (!signal) return p;
  return new Promise<T>((resolve, reject) => {
    const stop = (): void => reject(new StillwaterError('E_CANCELLED', 'The work was cancelled.'));
    if (signal.aborted) return stop();
    signal.addEventListener('abort', stop, { once: true });
    p.then(resolve, reject).finally(() => signal.removeEventListener('abort', stop));
  });
}
