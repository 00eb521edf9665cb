/**
 * The views' way to the view services: every call is a tracked job (the status line shows it and can
 * cancel it) and results that are asked for again are kept (a bounded cache, newest last).
 */
import type { ComparisonResult } from '../app/compare/run.js';
import type { LevelData, ProfileData, SectionData, SectionKind, SessionInfo, TableFormat, TableText } from '../contract/view-types.js';
import { PromiseCache } from '../app/promise-cache.js';
import { call, cancel, newJobId, type ProgressEvent } from './bridge.js';

export interface Job {
  id: string;
  label: string;
  fraction: number;
  message: string;
}

const jobs = new Map<string, Job>();
const jobListeners = new Set<() => void>();

export function onJobs(cb: () => void): void {
  jobListeners.add(cb);
}

export function runningJobs(): Job[] {
  return [...jobs.values()];
}

function jobsChanged(): void {
  for (const cb of jobListeners) cb();
}

/** Call a service as a job that the status line shows. */
export async function tracked<T>(label: string, name: string, input: unknown): Promise<T> {
  const id = newJobId();
  const job: Job = { id, label, fraction: 0, message: '' };
  jobs.set(id, job);
  jobsChanged();
  try {
    return await call<T>(name, input, {
      jobId: id,
      onProgress: (e: ProgressEvent) => {
        job.fraction = e.fraction;
        job.message = e.message;
        jobsChanged();
      },
    });
  } finally {
    jobs.delete(id);
    jobsChanged();
  }
}

export async function cancelAll(): Promise<void> {
  await Promise.all([...jobs.keys()].map((id) => cancel(id)));
}

const levels = new PromiseCache<LevelData>(40);
const sections = new PromiseCache<SectionData>(12);
const profiles = new PromiseCache<ProfileData>(12);
const skills = new PromiseCache<ComparisonResult>(4);

export function clearCaches(): void {
  levels.clear();
  sections.clear();
  profiles.clear();
  skills.clear();
}

export function openSession(recipePath: string): Promise<SessionInfo> {
  clearCaches();
  return tracked('Opening recipe', 'view.open', { recipe: recipePath });
}

export function getLevel(session: string, variable: string, run: string, layer: string): Promise<LevelData> {
  return levels.get(JSON.stringify([session, variable, run, layer]), () =>
    tracked(`Loading ${variable}, ${run}`, 'view.level', { session, variable, run, layer }),
  );
}

export function getSection(session: string, variable: string, run: string, kind: SectionKind, at: number, region: string): Promise<SectionData> {
  return sections.get(JSON.stringify([session, variable, run, kind, at, region]), () =>
    tracked(`Section of ${variable}`, 'view.section', { session, variable, run, kind, at, region }),
  );
}

export function getProfile(session: string, variable: string, region: string): Promise<ProfileData> {
  return profiles.get(JSON.stringify([session, variable, region]), () =>
    tracked(`Profile of ${variable}`, 'view.profile', { session, variable, region }),
  );
}

/** The recipe of a session as JSON with its folder (what the recipe-based services take). */
export function sessionRecipe(session: string): Promise<{ recipe: unknown; baseDir: string }> {
  return call('view.recipe', { session });
}

type RecipeJson = {
  reference: { variables: Record<string, unknown> };
  runs: { variables: Record<string, unknown> }[];
  options?: { derived?: Record<string, { expression: string }>; density?: unknown; units?: Record<string, string>; logStats?: string[] };
};

/**
 * The recipe cut down to what one variable's rows need: that variable, the inputs of a derived one, and the
 * temperature and salinity that the density conversion reads. The rows come out the same, sooner.
 */
export function recipeFor(recipe: unknown, variable: string): unknown {
  const r = JSON.parse(JSON.stringify(recipe)) as RecipeJson;
  const keep = new Set([variable]);
  const derived = r.options?.derived?.[variable];
  if (derived) for (const key of Object.keys(r.reference.variables)) if (new RegExp(`\\b${key}\\b`).test(derived.expression)) keep.add(key);
  const density = r.options?.density as { fields?: { temperature: string; salinity: string } } | undefined;
  if (density?.fields) {
    keep.add(density.fields.temperature);
    keep.add(density.fields.salinity);
  }
  const pick = (vars: Record<string, unknown>): Record<string, unknown> => Object.fromEntries(Object.entries(vars).filter(([k]) => keep.has(k)));
  r.reference.variables = pick(r.reference.variables);
  for (const run of r.runs) run.variables = pick(run.variables);
  if (r.options?.derived) r.options.derived = derived ? { [variable]: derived } : {};
  if (r.options?.units) r.options.units = pick(r.options.units) as Record<string, string>;
  if (r.options?.logStats) r.options.logStats = r.options.logStats.filter((k) => keep.has(k));
  return r;
}

/**
 * Skill rows (compare.run, in a worker): of one variable, or of the whole recipe when `variable` is null;
 * kept per session until it changes.
 */
export function getSkill(session: string, variable: string | null = null): Promise<ComparisonResult> {
  return skills.get(`${session}|${variable ?? '*'}`, async () => {
    const { recipe, baseDir } = await sessionRecipe(session);
    return tracked(variable ? `Computing skill scores of ${variable}` : 'Computing skill scores of every variable', 'compare.run', {
      recipe: variable ? recipeFor(recipe, variable) : recipe,
      baseDir,
    });
  });
}

export function getTable(result: ComparisonResult, recipePath: string | null, format: TableFormat): Promise<TableText> {
  return tracked(`Writing ${format}`, 'view.table', { result, recipePath, format });
}

const regionCells = new PromiseCache<{ region: string; cells: Int32Array }>(16);

/** The common grid's cells of one region of the session (crop to region, region statistics). */
export function getRegionCells(session: string, region: string): Promise<{ region: string; cells: Int32Array }> {
  return regionCells.get(JSON.stringify([session, region]), () => call('view.region', { session, region }));
}
