/**
 * Runs one call from the screen against the service table, whichever transport carried it:
 * finds the entry, validates the input against its schema, runs it (heavy entries in a worker thread),
 * publishes progress, honours cancellation, and turns every outcome into a CallReply.
 */
import { EventEmitter } from 'node:events';
import type { z } from 'zod';
import { StillwaterError, isStillwaterError } from '../app/errors.js';
import type { ServiceContext, ServiceEntry } from '../app/services/types.js';
import type { CallReply, ProgressEvent, WireError } from '../contract/transport.js';
import type { PathGuard } from './path-guard.js';
import type { WorkerJob } from './worker-protocol.js';

/** A heavy entry's call as the worker pool takes it. */
export interface HeavyJob extends WorkerJob {
  /** the session the call opens, uses or closes (sessions live on the thread that opened them) */
  session?: { mode: 'open' | 'use' | 'close'; id?: string };
  /** stop the thread after this long (entries that parse untrusted headers) */
  deadlineMs?: number;
}

/** Runs a heavy entry elsewhere (main/workers.ts); resolves with the result or rejects with the error. */
export type HeavyRunner = (job: HeavyJob, hooks: { progress: (fraction: number, message: string) => void; signal: AbortSignal }) => Promise<unknown>;

export interface DispatcherOptions {
  table: ServiceEntry[];
  guard: PathGuard;
  cacheDir: string;
  /** absent: heavy entries run in this thread too (tests, or where workers are unavailable) */
  heavy?: HeavyRunner;
  /** multiplies every entry's deadline (tests with damaged files need not wait the full time) */
  deadlineScale?: number;
}

/** Describe the first schema problem in one sentence, naming the input path. */
export function describeSchemaError(name: string, error: z.ZodError): string {
  const issue = error.issues[0];
  const where = issue && issue.path.length ? 'input.' + issue.path.map(String).join('.') : 'input';
  return `${name}: ${where}: ${issue ? issue.message : 'invalid'}.`.replace(/\.\.$/, '.');
}

export function toWireError(e: unknown): WireError {
  if (isStillwaterError(e)) return e.toJSON();
  if (e instanceof Error && e.name === 'AbortError') return { code: 'E_CANCELLED', message: 'The work was cancelled.' };
  return { code: 'E_INTERNAL', message: `Internal fault: ${e instanceof Error ? e.message : String(e)}` };
}

/** Where a heavy call must run: a session's calls on its thread; a recipe-based entry called without a session anywhere. */
function sessionOfCall(entry: ServiceEntry, input: unknown): Pick<HeavyJob, 'session'> {
  const id = (input as { session?: unknown } | null)?.session;
  if (!entry.session || (entry.session !== 'open' && typeof id !== 'string')) return {};
  return { session: { mode: entry.session, ...(typeof id === 'string' ? { id } : {}) } };
}

const JOB_ID = /^[A-Za-z0-9_.:-]{1,80}$/;

export class Dispatcher {
  /** emits 'progress' with a ProgressEvent */
  readonly events = new EventEmitter();
  private readonly running = new Map<string, AbortController>();

  constructor(private readonly opts: DispatcherOptions) {
    this.events.setMaxListeners(100);
  }

  get roots(): string[] {
    return this.opts.guard.roots;
  }

  private publish(e: ProgressEvent): void {
    this.events.emit('progress', e);
  }

  /** Stop a running job. Returns false when no such job runs. */
  cancel(jobId: string): boolean {
    const c = this.running.get(jobId);
    if (!c) return false;
    c.abort();
    return true;
  }

  async call(name: unknown, rawInput: unknown, rawJobId: unknown): Promise<CallReply> {
    if (typeof name !== 'string') return { ok: false, error: { code: 'E_INPUT', message: 'A service name must be text.' } };
    const entry = this.opts.table.find((e) => e.name === name);
    if (!entry) return { ok: false, error: { code: 'E_INPUT', message: `There is no service '${name}'.` } };
    const jobId = typeof rawJobId === 'string' && JOB_ID.test(rawJobId) ? rawJobId : `job-${Math.random().toString(36).slice(2)}`;
    const parsed = entry.input.safeParse(rawInput);
    if (!parsed.success) return { ok: false, error: { code: 'E_INPUT', message: describeSchemaError(name, parsed.error) } };
    if (this.running.has(jobId)) return { ok: false, error: { code: 'E_INPUT', message: `Job '${jobId}' is already running.` } };

    const controller = new AbortController();
    this.running.set(jobId, controller);
    let lastFraction = -1;
    let lastTime = 0;
    const progress = (fraction: number, message: string): void => {
      // at most ~20 events a second, but always the first and every change of message at the end
      const now = Date.now();
      if (fraction < 1 && now - lastTime < 50 && fraction - lastFraction < 0.05) return;
      lastTime = now;
      lastFraction = fraction;
      this.publish({ jobId, service: name, fraction: Math.max(0, Math.min(1, fraction)), message, state: 'running' });
    };
    const finish = (state: ProgressEvent['state'], message: string): void => {
      if (entry.heavy) this.publish({ jobId, service: name, fraction: 1, message, state });
    };
    try {
      if (entry.heavy) this.publish({ jobId, service: name, fraction: 0, message: entry.summary, state: 'running' });
      let result: unknown;
      if (entry.heavy && this.opts.heavy) {
        result = await this.opts.heavy(
          {
            name,
            input: rawInput,
            jobId,
            roots: this.opts.guard.roots,
            granted: this.opts.guard.grantedPaths(),
            cacheDir: this.opts.cacheDir,
            ...sessionOfCall(entry, parsed.data),
            ...(entry.deadlineSeconds !== undefined ? { deadlineMs: entry.deadlineSeconds * 1000 * (this.opts.deadlineScale ?? 1) } : {}),
          },
          { progress, signal: controller.signal },
        );
      } else {
        const ctx: ServiceContext = {
          resolvePath: (p) => this.opts.guard.resolve(p),
          roots: this.opts.guard.roots,
          cacheDir: this.opts.cacheDir,
          progress,
          signal: controller.signal,
        };
        result = await raceAbort(entry.run(parsed.data, ctx), controller.signal);
      }
      if (controller.signal.aborted) throw cancelled();
      finish('done', 'done');
      return { ok: true, result };
    } catch (e) {
      const error = controller.signal.aborted ? cancelled().toJSON() : toWireError(e);
      finish(error.code === 'E_CANCELLED' ? 'cancelled' : 'failed', error.message);
      return { ok: false, error };
    } finally {
      this.running.delete(jobId);
    }
  }
}

export function cancelled(): StillwaterError {
  return new StillwaterError('E_CANCELLED', 'The work was cancelled.');
}

/** Settle as soon as the signal aborts, even when the work itself does not look at the signal. */
function raceAbort<T>(work: Promise<T>, signal: AbortSignal): Promise<T> {
  if (signal.aborted) return Promise.reject(cancelled());
  return new Promise<T>((resolvePromise, reject) => {
    const onAbort = (): void => reject(cancelled());
    signal.addEventListener('abort', onAbort, { once: true });
    work.then(
      (v) => {
        signal.removeEventListener('abort', onAbort);
        resolvePromise(v);
      },
      (e) => {
        signal.removeEventListener('abort', onAbort);
        reject(e);
      },
    );
  });
}
