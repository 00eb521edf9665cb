/**
 * The views' way to the view services: every call is a tracked job (the status line shows it and can
 * cancel it) and results that are asked for again are kept (a bounded cache, newest last).
 */
import type { ComparisonResult } from '../app/compare/run.js';
import type { LevelData, ProfileCycleData, ProfileData, ViewPeriod, SectionData, SectionKind, SessionInfo, TableFormat, TableText } from '../contract/view-types.js';
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
  cycles.clear();
  skills.clear();
}

/** The session this page has open, closed on the server when another replaces it or the page goes. */
let openId: string | null = null;

function closeOnServer(id: string | null): void {
  if (id) void call('view.close', { session: id }, { keepalive: true }).catch(() => undefined);
}

if (typeof addEventListener === 'function') addEventListener('pagehide', () => closeOnServer(openId));

export async function openSession(recipePath: string): Promise<SessionInfo> {
  clearCaches();
  const info = await tracked<SessionInfo>('Opening recipe', 'view.open', { recipe: recipePath });
  if (openId !== info.session) closeOnServer(openId);
  openId = info.session;
  return info;
}

export function getLevel(session: string, variable: string, run: string, layer: string, period: ViewPeriod = 'annual'): Promise<LevelData> {
  return levels.get(JSON.stringify([session, variable, run, layer, period]), () =>
    tracked(`Loading ${variable}, ${run}${period === 'annual' ? '' : `, ${period}`}`, 'view.level', { session, variable, run, layer, period }),
  );
}

export function getSection(session: string, variable: string, run: string, kind: SectionKind, at: number, region: string, period: ViewPeriod = 'annual'): Promise<SectionData> {
  return sections.get(JSON.stringify([session, variable, run, kind, at, region, period]), () =>
    tracked(`Section of ${variable}`, 'view.section', { session, variable, run, kind, at, region, period }),
  );
}

export function getProfile(session: string, variable: string, region: string, period: ViewPeriod = 'annual'): Promise<ProfileData> {
  return profiles.get(JSON.stringify([session, variable, region, period]), () =>
    tracked(`Profile of ${variable}`, 'view.profile', { session, variable, region, period }),
  );
}

const cycles = new PromiseCache<ProfileCycleData>(12);

/** The monthly cycle of a region's mean over a depth choice (month × depth), of one run and the reference. */
export function getProfileCycle(session: string, variable: string, run: string, region: string, layer: string): Promise<ProfileCycleData> {
  return cycles.get(JSON.stringify([session, variable, run, region, layer]), () =>
    tracked(`Monthly cycle of ${variable}`, 'view.profileCycle', { session, variable, run, region, layer }),
  );
}

/**
 * Skill rows of one variable, or of the whole recipe when `variable` is null: computed once in the session's
 * worker (view.skill) and kept here per session until it changes.
 */
export function getSkill(session: string, variable: string | null = null): Promise<ComparisonResult> {
  return skills.get(`${session}|${variable ?? '*'}`, () =>
    tracked(variable ? `Computing skill scores of ${variable}` : 'Computing skill scores of every variable', 'view.skill', { session, variable }),
  );
}

export function getTable(result: ComparisonResult, recipePath: string | null, format: TableFormat): Promise<TableText> {
  return tracked(`Writing ${format}`, 'view.table', { result, recipePath, format });
}

const regionCells = new PromiseCache<{ region: string; cells: Int32Array }>(16);

/** The common grid's cells of one region of the session (crop to region, region statistics). */
export function getRegionCells(session: string, region: string): Promise<{ region: string; cells: Int32Array }> {
  return regionCells.get(JSON.stringify([session, region]), () => call('view.region', { session, region }));
}
