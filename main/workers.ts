/**
 * Heavy service entries run on a bounded pool of worker threads, so that neither the Electron main process nor
 * the browser-mode server stops answering: as many threads as the machine has cores, one job a thread at a
 * time, a queue of limited length behind them and a "busy" sentence beyond it.
 *
 * Threads live on between jobs: a workbench session stays on the thread that opened it and every call naming
 * it is queued for that thread, where such calls may run side by side (one waiting for work the session
 * computes must not hold up the next). A job with a deadline (headers of untrusted files) that passes it, and a
 * cancelled job that does not stop within a short grace, get their thread terminated (code looping inside
 * WebAssembly cannot be stopped any other way); the sessions on that thread are gone and say so when asked.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { StillwaterError, type ErrorCode } from '../app/errors.js';
import { addressSpaceLimit } from './address-space.mjs';
import type { HeavyJob, HeavyRunner } from './dispatch.js';
import { cancelled } from './dispatch.js';
import { projectRoot } from './static-files.js';
import type { FromWorker, ToWorker } from './worker-protocol.js';

/** How long a cancelled job may take to stop by itself before its thread is terminated. */
const GRACE_MS = 1500;

const GIB = 1024 ** 3;
/**
 * Address space one pooled thread may take: its own V8 isolate and the HDF5 library's thread below it, whose
 * WebAssembly memory V8 reserves whole when the trap handler is off (as it is under a limit). Measured as
 * VmSize in /proc/PID/status, Node 20, `stillwater serve` under `ulimit -v 8000000`: 1.17 GiB alone, +0.60 GiB
 * for a pooled thread, +0.01 GiB for its regridding kernels, +2.60 GiB for its HDF5 thread.
 */
const THREAD_ADDRESS_SPACE = 3.5 * GIB;
/** The serving process itself, with room for a stopped thread's successor while it starts. */
const PROCESS_ADDRESS_SPACE = 1.5 * GIB;

/**
 * Threads for the pool: the cores of this machine, but no more than fit under an address-space limit
 * (`ulimit -v`, common on batch schedulers), where one thread too many aborts the whole process; at least one.
 */
export function poolSize(cores = availableParallelism(), limit = addressSpaceLimit()): number {
  if (limit === undefined) return Math.max(1, cores);
  return Math.max(1, Math.min(cores, Math.floor((limit - PROCESS_ADDRESS_SPACE) / THREAD_ADDRESS_SPACE)));
}

export function defaultWorkerFile(): string {
  return join(projectRoot(), 'dist', 'worker.mjs');
}

export interface PoolOptions {
  /** threads at most (default: poolSize(), the cores of this machine as far as the address space allows) */
  size?: number;
  /** jobs waiting at most beyond those running (default 64) */
  queueLimit?: number;
}

interface Hooks {
  progress: (fraction: number, message: string) => void;
  signal: AbortSignal;
}

interface Queued {
  job: HeavyJob;
  hooks: Hooks;
  /** the thread a session call must run on */
  slot: Slot | null;
  resolve(v: unknown): void;
  reject(e: unknown): void;
}

interface Slot {
  worker: Worker | null;
  /** jobs running on this thread: one, or several calls that use its sessions */
  running: Set<Queued>;
  /** sessions opened on this thread */
  sessions: Set<string>;
  /** end a running job: deadline or cancellation grace (either stops the thread) */
  timers: Map<Queued, NodeJS.Timeout>;
}

/**
 * Calls that use a session may run on its thread beside each other (at most this many): a call waiting for work
 * the session computes (skill rows, a spin-up) must not hold up the next level of the map. The thread's event loop
 * interleaves them; work computed ahead waits for them (app/session/background.ts).
 */
const SESSION_CALLS_AT_ONCE = 4;

const usesSession = (q: Queued): boolean => q.job.session?.mode === 'use';

function sessionGone(id: string): StillwaterError {
  return new StillwaterError('E_INPUT', `The workbench session '${id}' is no longer open; open the recipe again.`);
}

/** What a job reads, for the deadline's sentence: the file or recipe it names. */
function subjectOf(input: unknown): string {
  if (input && typeof input === 'object') {
    const o = input as Record<string, unknown>;
    for (const k of ['path', 'file', 'recipe']) if (typeof o[k] === 'string') return (o[k] as string).slice(0, 300);
  }
  return 'the file';
}

export class WorkerPool {
  private readonly slots: Slot[];
  private readonly queue: Queued[] = [];
  private readonly home = new Map<string, Slot>();
  private readonly queueLimit: number;

  constructor(private readonly workerFile: string = defaultWorkerFile(), opts: PoolOptions = {}) {
    const size = Math.max(1, Math.floor(opts.size ?? poolSize()));
    this.slots = Array.from({ length: size }, () => ({ worker: null, running: new Set<Queued>(), sessions: new Set<string>(), timers: new Map<Queued, NodeJS.Timeout>() }));
    this.queueLimit = opts.queueLimit ?? 64;
  }

  /** The runner the dispatcher calls for heavy entries. */
  get runner(): HeavyRunner {
    return (job, hooks) => this.run(job, hooks);
  }

  /** threads it may run at once */
  get size(): number {
    return this.slots.length;
  }

  get threads(): number {
    return this.slots.filter((s) => s.worker).length;
  }

  get waiting(): number {
    return this.queue.length;
  }

  run(job: HeavyJob, hooks: Hooks): Promise<unknown> {
    if (!existsSync(this.workerFile)) {
      return Promise.reject(new StillwaterError('E_INTERNAL', `${this.workerFile}: the worker bundle is missing; run npm run build.`));
    }
    if (hooks.signal.aborted) return Promise.reject(cancelled());
    let slot: Slot | null = null;
    if (job.session && job.session.mode !== 'open') {
      const id = job.session.id ?? '';
      slot = this.home.get(id) ?? null;
      if (!slot) return job.session.mode === 'close' ? Promise.resolve({ closed: false }) : Promise.reject(sessionGone(id));
    }
    if (this.queue.length >= this.queueLimit) {
      return Promise.reject(new StillwaterError('E_BUSY', `The workbench is busy (${this.queue.length} jobs waiting); try again when some have finished.`));
    }
    return new Promise((resolve, reject) => {
      const q: Queued = { job, hooks, slot, resolve, reject };
      this.queue.push(q);
      hooks.signal.addEventListener(
        'abort',
        () => {
          const i = this.queue.indexOf(q);
          if (i >= 0) {
            this.queue.splice(i, 1);
            reject(cancelled());
          } else this.cancelRunning(q);
        },
        { once: true },
      );
      this.pump();
    });
  }

  /** Terminate every thread; jobs still queued or running are refused. */
  async close(): Promise<void> {
    for (const q of this.queue.splice(0)) q.reject(cancelled());
    await Promise.all(this.slots.map((s) => this.stop(s, cancelled())));
  }

  /**
   * Hand queued jobs to threads, in order: a session's calls only to its own thread, beside other calls that use
   * sessions there; other jobs to an idle thread, the one holding fewest sessions first.
   */
  private pump(): void {
    for (let i = 0; i < this.queue.length; ) {
      const q = this.queue[i];
      const slot = q.slot ? (this.canJoin(q.slot, q) ? q.slot : null) : (this.slots.filter((s) => s.running.size === 0).sort((a, b) => a.sessions.size - b.sessions.size)[0] ?? null);
      if (!slot) {
        i++;
        continue;
      }
      this.queue.splice(i, 1);
      this.start(slot, q);
    }
  }

  private canJoin(slot: Slot, q: Queued): boolean {
    if (slot.running.size === 0) return true;
    return usesSession(q) && slot.running.size < SESSION_CALLS_AT_ONCE && [...slot.running].every(usesSession);
  }

  private thread(slot: Slot): Worker {
    if (slot.worker) return slot.worker;
    // workerData must be an object: the `web-worker` package (under geotiff) destructures it when loaded
    // off the main thread, and treats an object without its own `mod` key as a main thread.
    const worker = new Worker(this.workerFile, { workerData: { stillwater: 'service-pool' } });
    slot.worker = worker;
    worker.on('message', (m: FromWorker) => {
      const q = [...slot.running].find((r) => r.job.jobId === m.jobId);
      if (!q) return;
      if (m.type === 'progress') q.hooks.progress(m.fraction, m.message);
      else if (m.type === 'done') this.finish(slot, q, () => this.settled(slot, q, m.result));
      else {
        const e = m.error;
        this.finish(slot, q, () => q.reject(new StillwaterError(e.code as ErrorCode, e.message, { file: e.file, variable: e.variable, path: e.path })));
      }
    });
    const lost = (why: string): void => {
      if (slot.worker !== worker) return;
      void this.stop(slot, new StillwaterError('E_INTERNAL', why));
    };
    worker.on('error', (e) => lost(`A worker thread failed: ${e.message}`));
    worker.on('exit', (code) => lost(`A worker thread stopped (exit ${code}) before finishing.`));
    return worker;
  }

  private start(slot: Slot, q: Queued): void {
    slot.running.add(q);
    const worker = this.thread(slot);
    worker.ref();
    const { job } = q;
    if (job.deadlineMs !== undefined) {
      const seconds = Math.round(job.deadlineMs / 100) / 10;
      slot.timers.set(q, setTimeout(() => {
        const subject = subjectOf(job.input);
        void this.stop(slot, new StillwaterError('E_FORMAT', `${subject}: could not be read within ${seconds} s (the file may be damaged).`, { file: subject }));
      }, job.deadlineMs));
    }
    const { session: _session, deadlineMs: _deadline, ...toWorker } = job;
    worker.postMessage({ type: 'run', job: toWorker } satisfies ToWorker);
  }

  private settled(slot: Slot, q: Queued, result: unknown): void {
    if (q.hooks.signal.aborted) return q.reject(cancelled());
    const mode = q.job.session?.mode;
    const id = (result as { session?: unknown } | null)?.session;
    if ((mode === 'open' || mode === 'use') && typeof id === 'string') {
      slot.sessions.add(id);
      this.home.set(id, slot);
    }
    if (mode === 'close' && q.job.session?.id) {
      slot.sessions.delete(q.job.session.id);
      this.home.delete(q.job.session.id);
    }
    q.resolve(result);
  }

  private finish(slot: Slot, q: Queued, settle: () => void): void {
    if (!slot.running.has(q)) return;
    clearTimeout(slot.timers.get(q));
    slot.timers.delete(q);
    slot.running.delete(q);
    if (slot.running.size === 0) slot.worker?.unref();
    settle();
    this.pump();
  }

  private cancelRunning(q: Queued): void {
    const slot = this.slots.find((s) => s.running.has(q));
    if (!slot?.worker) return;
    slot.worker.postMessage({ type: 'cancel', jobId: q.job.jobId } satisfies ToWorker);
    clearTimeout(slot.timers.get(q));
    slot.timers.set(q, setTimeout(() => void this.stop(slot, cancelled()), GRACE_MS));
  }

  /** Terminate a slot's thread: its jobs are refused with `why`, its sessions are forgotten, queued calls for them refused. */
  private async stop(slot: Slot, why: StillwaterError): Promise<void> {
    const worker = slot.worker;
    slot.worker = null;
    for (const t of slot.timers.values()) clearTimeout(t);
    slot.timers.clear();
    const running = [...slot.running];
    slot.running.clear();
    for (const id of slot.sessions) this.home.delete(id);
    slot.sessions.clear();
    for (let i = this.queue.length - 1; i >= 0; i--) {
      const w = this.queue[i];
      if (w.slot === slot) {
        this.queue.splice(i, 1);
        if (w.job.session?.mode === 'close') w.resolve({ closed: false });
        else w.reject(sessionGone(w.job.session?.id ?? ''));
      }
    }
    for (const q of running) q.reject(q.hooks.signal.aborted ? cancelled() : why);
    if (worker) await worker.terminate().catch(() => undefined);
    this.pump();
  }
}
