/**
 * The spin-up for the workbench: follow a run through its snapshots (heavy: in a worker), the one-line
 * verdict for the banner on the scores view, and reading a spinup.json written by the command line.
 * Thin over app/spinup; every file a recipe names passes ctx.resolvePath. Output types: app/spinup/types.ts.
 * Results are kept in ctx.cacheDir keyed by the request and the files' sizes and times, so the banner of the
 * scores view costs one computation per recipe state, not one per visit.
 */
import { readFile } from 'node:fs/promises';
import { z } from 'zod';
import { StillwaterError } from '../errors.js';
import { recipeFiles } from '../recipe/recipe-files.js';
import { recipeToJson } from '../recipe/index.js';
import type { Recipe } from '../recipe/types.js';
import { recipeOfCall } from './recipe-guard.js';
import { spinupFromRecipe } from '../spinup/run-spinup.js';
import type { SpinupResult, SpinupSummary } from '../spinup/types.js';
import { cacheKey, readCachedResult, restoreNaN, writeCachedResult } from '../spinup/result-cache.js';
import { spinupFromJson } from '../spinup/write-output.js';
import { entry, type ServiceContext, type ServiceEntry } from './types.js';
import { checkParsingHere } from '../io/parsing-thread.js';
import type { Session } from '../session/session.js';
import { untilCancelled } from '../session/session.js';
import type { TaskContext } from '../session/background.js';
import { sessionStore } from '../session/store.js';

/** The open session a call names, if it names one. */
const sessionOf = (input: { session?: string }): Session | undefined => (input.session !== undefined ? sessionStore.get(input.session) : undefined);

const spinupInput = z.object({
  /** an open workbench session whose recipe is followed */
  session: z.string().min(1).optional(),
  /** or the recipe as JSON (an object), with runs[].snapshots: [{file, year}] */
  recipe: z.unknown().optional(),
  /** and the folder that relative paths in the recipe are taken from */
  baseDir: z.string().min(1).optional(),
  /** label of the run to follow (default: the first run that lists snapshots) */
  run: z.string().optional(),
  /** recipe variable keys to follow (default: the run's variables that the first snapshot holds) */
  variables: z.array(z.string()).optional(),
  /** settled below this drift, per cent of the mean per 1000 years (default 0.1) */
  threshold: z.number().positive().optional(),
  /** drift measured over the last N model years (default: last 10 % of the series, at least 3 snapshots) */
  tailYears: z.number().positive().optional(),
  /** score every snapshot against the reference (default true) */
  skill: z.boolean().optional(),
});

type SpinupInput = z.infer<typeof spinupInput>;


/** Results of this thread, so that the banner asks again for free (keyed like the disk cache). */
const recent = new Map<string, SpinupResult>();
const RECENT_MAX = 8;


/** Where results are looked up and what computes one: the same for a request and for work computed ahead. */
interface Follow {
  recipe: Recipe;
  input: SpinupInput;
  cacheDir: string;
  skill: boolean;
  progress?: (fraction: number, message: string) => void;
}

async function keysOf(f: Follow): Promise<{ key: string; alsoAnswers: string[] }> {
  const files = recipeFiles(f.recipe).map((x) => x.file);
  // keyed by what is followed, whether the recipe came from a session or as JSON
  const { input } = f;
  const asked = { recipe: recipeToJson(f.recipe), baseDir: f.recipe.baseDir, run: input.run, variables: input.variables, threshold: input.threshold, tailYears: input.tailYears };
  const keyOf = (withSkill: boolean) => cacheKey({ ...asked, skill: withSkill }, files);
  const key = await keyOf(f.skill);
  // a result with skill also answers a request without it
  return { key, alsoAnswers: f.skill ? [] : [await keyOf(true)] };
}

async function cached(cacheDir: string, keys: string[]): Promise<SpinupResult | undefined> {
  for (const k of keys) {
    const hit = recent.get(k) ?? (await readCachedResult(cacheDir, k));
    if (hit) return hit;
  }
  return undefined;
}

async function compute(f: Follow, key: string, signal: AbortSignal, pause?: () => Promise<void>): Promise<SpinupResult> {
  const hit = await cached(f.cacheDir, [key]);
  if (hit) return hit;
  const { input } = f;
  const result = await spinupFromRecipe(f.recipe, {
    run: input.run,
    variables: input.variables,
    settings: {
      ...(input.threshold !== undefined ? { thresholdPercentPerKyr: input.threshold } : {}),
      ...(input.tailYears !== undefined ? { tailYears: input.tailYears } : {}),
    },
    skill: f.skill,
    cacheDir: f.cacheDir,
    signal,
    pause,
    progress: f.progress,
  });
  recent.set(key, result);
  if (recent.size > RECENT_MAX) recent.delete(recent.keys().next().value!);
  await writeCachedResult(f.cacheDir, key, result);
  return result;
}

/**
 * The spin-up of a recipe: from this thread's recent results or the disk, else computed. In a workbench session
 * it is computed once, with skill, as a task of the session (perhaps already under way since the recipe was
 * opened), so that the banner of the scores view and the spin-up view share one computation.
 */
async function follow(recipe: Recipe, input: SpinupInput, ctx: ServiceContext, skill: boolean, session?: Session, hurry = true): Promise<SpinupResult> {
  const asked: Follow = { recipe, input, cacheDir: ctx.cacheDir, skill, progress: (f, m) => ctx.progress(f, m) };
  const { key, alsoAnswers } = await keysOf(asked);
  const hit = await cached(ctx.cacheDir, [key, ...alsoAnswers]);
  if (hit) return hit;
  if (!session) return compute(asked, key, ctx.signal);
  const shared: Follow = { ...asked, skill: true };
  const sharedKey = skill ? key : alsoAnswers[0];
  const work = (task: TaskContext) => compute(shared, sharedKey, task.signal, task.pause);
  const key2 = `spinup\u0000${sharedKey}`;
  return untilCancelled(hurry ? session.background.want(key2, work) : session.background.later(key2, work), ctx.signal);
}

/** Once a session's screen has its first map: the spin-up of each run that lists snapshots, computed ahead (with skill, as the view asks). */
export function spinupAhead(session: Session, cacheDir: string): void {
  for (const run of session.recipe.runs) {
    if (!run.snapshots?.length) continue;
    const f: Follow = { recipe: session.recipe, input: { run: run.label }, cacheDir, skill: true };
    void keysOf(f)
      .then(({ key }) => session.background.ahead(`spinup\u0000${key}`, (task) => compute(f, key, task.signal, task.pause)))
      .catch(() => undefined);
  }
}

export const spinupServices: ServiceEntry[] = [
  entry({
    name: 'spinup.run',
    summary: 'Follow a run through its spin-up snapshots: series, drift rates, first-order fits, verdicts, skill over spin-up time.',
    input: spinupInput,
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<SpinupResult> {
      return follow(recipeOfCall(input, ctx), input, ctx, input.skill !== false, sessionOf(input));
    },
  }),
  entry({
    name: 'spinup.verdict',
    summary: 'Has the run settled? One summary for the banner on the scores view; null when the run lists no snapshots.',
    input: spinupInput.omit({ variables: true, skill: true }),
    heavy: true,
    session: 'use',
    async run(input, ctx): Promise<SpinupSummary | null> {
      const recipe = recipeOfCall(input, ctx);
      const run = input.run !== undefined ? recipe.runs.find((r) => r.label === input.run) : recipe.runs.find((r) => r.snapshots?.length);
      if (!run?.snapshots?.length) return null;
      // the banner waits its turn: the skill rows on the same screen come first
      return (await follow(recipe, { ...input, run: run.label }, ctx, false, sessionOf(input), false)).summary;
    },
  }),
  entry({
    name: 'spinup.open',
    summary: 'Read a spinup.json written by `stillwater spinup` (snake_case keys; files from before that change read too).',
    input: z.object({ path: z.string() }),
    // a file from outside: parsed on a worker thread, never on the one that serves the screen
    heavy: true,
    async run(input, ctx): Promise<SpinupResult> {
      const path = ctx.resolvePath(input.path);
      checkParsingHere(path);
      let json: unknown;
      try {
        json = spinupFromJson(JSON.parse(await readFile(path, 'utf8')));
      } catch (e) {
        throw new StillwaterError('E_FILE', `${path}: cannot read it as spin-up results (${(e as Error).message}).`, { file: path });
      }
      const r = json as Partial<SpinupResult>;
      if (!r || !Array.isArray(r.tracks) || !Array.isArray(r.years) || !r.summary) {
        throw new StillwaterError('E_FORMAT', `${path}: this is not a spinup.json (no tracks, years and summary).`, { file: path });
      }
      return restoreNaN(r as SpinupResult);
    },
  }),
];
