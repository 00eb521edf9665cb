/**
 * Run work on a worker thread that can be stopped: each call has a deadline, and a call that passes it
 * terminates the thread (code inside WebAssembly, such as the HDF5 library, cannot be interrupted any other
 * way) and is refused with one sentence. The next call starts a fresh thread, but only once the stopped one
 * has exited: a thread holding the HDF5 library keeps about 2.6 GiB of address space reserved until then, and
 * under `ulimit -v` two such threads at once do not fit (V8 then aborts the whole process).
 *
 * Reusable by anything that hands untrusted parsing off the calling thread: the command line's HDF5 library
 * calls and the server's pool both use it.
 *
 * The worker side answers each request { id, request } with { id, ok: true, value } or
 * { id, ok: false, error: { code, message, file?, variable?, path? } } (see serveDeadlineRequests).
 */
import { Worker, type ResourceLimits } from 'node:worker_threads';
import { StillwaterError, type ErrorCode, type ErrorSubject } from '../app/errors.js';

export interface DeadlineWorkerOptions {
  /** data the worker reads from workerData when it starts (must be an object; see main/workers.ts) */
  workerData?: Record<string, unknown>;
  /** V8 heap limits of the thread (WebAssembly memory is outside these) */
  resourceLimits?: ResourceLimits;
}

export interface CallOptions {
  /** milliseconds the call may take before the thread is terminated */
  deadlineMs: number;
  /** what the call does, for the sentence: "could not be read within 20 s" is said of this subject */
  subject?: ErrorSubject;
  /** transfer these buffers to the worker instead of copying them */
  transfer?: ArrayBuffer[];
  signal?: AbortSignal;
}

/** An error as it crosses the thread boundary. */
export interface WorkerError {
  code: string;
  message: string;
  file?: string;
  variable?: string;
  path?: string;
}

type Reply = { id: number; ok: true; value: unknown } | { id: number; ok: false; error: WorkerError };

interface Pending {
  /** the thread serving the call: only its own end refuses the call */
  worker: Worker;
  subject?: ErrorSubject;
  resolve(value: unknown): void;
  reject(e: unknown): void;
}

export class DeadlineWorker {
  private worker: Worker | undefined;
  private nextId = 1;
  private readonly pending = new Map<number, Pending>();
  private started = 0;
  /** threads started and not yet exited, and the most there ever were at once */
  private alive = 0;
  private peak = 0;
  /** settles when the last stopped thread has exited (its address space is released only then) */
  private exited: Promise<void> = Promise.resolve();

  constructor(private readonly workerFile: string | URL, private readonly options: DeadlineWorkerOptions = {}) {}

  /** Send one request; resolves with the worker's value or rejects with a StillwaterError. */
  async call<T>(request: unknown, opts: CallOptions): Promise<T> {
    if (!this.worker) await this.exited;
    const worker = this.thread();
    const id = this.nextId++;
    return new Promise<T>((resolve, reject) => {
      const stopFor = (why: StillwaterError): void => this.stop(worker, id, why);
      const onAbort = (): void => stopFor(new StillwaterError('E_CANCELLED', 'The work was cancelled.', opts.subject));
      if (opts.signal?.aborted) {
        reject(new StillwaterError('E_CANCELLED', 'The work was cancelled.', opts.subject));
        return;
      }
      const timer = setTimeout(() => stopFor(overDeadline(opts)), opts.deadlineMs);
      const done = (): void => {
        clearTimeout(timer);
        opts.signal?.removeEventListener('abort', onAbort);
        this.pending.delete(id);
        if (this.servedBy(worker).length === 0) worker.unref();
      };
      this.pending.set(id, {
        worker,
        subject: opts.subject,
        resolve: (v) => {
          done();
          resolve(v as T);
        },
        reject: (e) => {
          done();
          reject(e);
        },
      });
      opts.signal?.addEventListener('abort', onAbort, { once: true });
      worker.ref();
      worker.postMessage({ id, request }, opts.transfer ?? []);
    });
  }

  /** How many threads have been started: files or state held by an earlier thread are gone. */
  get generation(): number {
    return this.started;
  }

  /** The most threads that were ever alive at once (1: a new thread never overlapped a stopped one). */
  get peakThreads(): number {
    return this.peak;
  }

  /** Terminate the thread (if any); calls in flight are refused with E_CANCELLED. */
  async close(): Promise<void> {
    const w = this.worker;
    if (w) this.stop(w, -1, new StillwaterError('E_CANCELLED', 'The work was cancelled.'));
    await this.exited;
  }

  private thread(): Worker {
    if (this.worker) return this.worker;
    const worker = new Worker(this.workerFile, {
      workerData: this.options.workerData ?? { stillwater: 'deadline-worker' },
      resourceLimits: this.options.resourceLimits,
    });
    this.started++;
    this.alive++;
    this.peak = Math.max(this.peak, this.alive);
    worker.unref();
    worker.on('message', (m: Reply) => {
      const p = this.pending.get(m.id);
      if (!p) return;
      if (m.ok) p.resolve(m.value);
      else p.reject(fromWorkerError(m.error));
    });
    const fail = (why: (p: Pending) => StillwaterError): void => {
      if (this.worker === worker) this.worker = undefined;
      for (const p of this.servedBy(worker)) p.reject(why(p));
    };
    worker.on('error', (e: Error & { code?: string }) =>
      fail((p) =>
        e.code === 'ERR_WORKER_OUT_OF_MEMORY'
          ? new StillwaterError('E_FORMAT', `${p.subject?.file ?? 'The input'}: reading it needs more memory than allowed (the file may be damaged).`, p.subject)
          : new StillwaterError('E_INTERNAL', `A worker thread failed: ${e.message}`),
      ),
    );
    const gone = new Promise<void>((resolve) =>
      worker.once('exit', (code) => {
        this.alive--;
        fail(() => new StillwaterError('E_INTERNAL', `A worker thread stopped (exit ${code}) before answering.`));
        resolve();
      }),
    );
    const before = this.exited;
    this.exited = Promise.all([before, gone]).then(() => undefined);
    this.worker = worker;
    return worker;
  }

  /**
   * Terminate `worker`: call `id` is refused with `why`, the other calls it was serving with a sentence of
   * their own (their thread had to go, their input may be fine).
   */
  private stop(worker: Worker, id: number, why: StillwaterError): void {
    if (this.worker === worker) this.worker = undefined;
    const own = this.pending.get(id);
    own?.reject(why);
    for (const p of this.servedBy(worker)) {
      p.reject(
        why.code === 'E_CANCELLED' && id < 0
          ? why
          : new StillwaterError('E_CANCELLED', `${p.subject?.file ?? 'The input'}: its reading was stopped together with that of another file.`, p.subject),
      );
    }
    void worker.terminate();
  }

  private servedBy(worker: Worker): Pending[] {
    return [...this.pending.values()].filter((p) => p.worker === worker);
  }
}

/** One request on a thread of its own, terminated afterwards whatever happens. */
export async function runInWorkerWithDeadline<T>(
  workerFile: string | URL, request: unknown, opts: CallOptions & DeadlineWorkerOptions,
): Promise<T> {
  const w = new DeadlineWorker(workerFile, opts);
  try {
    return await w.call<T>(request, opts);
  } finally {
    await w.close();
  }
}

function overDeadline(opts: CallOptions): StillwaterError {
  const seconds = Math.round(opts.deadlineMs / 100) / 10;
  const what = opts.subject?.file ?? 'the input';
  return new StillwaterError('E_FORMAT', `${what}: could not be read within ${seconds} s (the file may be damaged).`, opts.subject);
}

function fromWorkerError(e: WorkerError): StillwaterError {
  return new StillwaterError(e.code as ErrorCode, e.message, { file: e.file, variable: e.variable, path: e.path });
}

/** The StillwaterError fields of anything thrown inside a worker, for the trip back. */
export function toWorkerError(e: unknown): WorkerError {
  if (e instanceof StillwaterError) return { code: e.code, message: e.message, ...e.subject };
  return { code: 'E_INTERNAL', message: `internal fault: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}` };
}

/**
 * The worker side: answer each { id, request } with the handler's value (buffers of typed arrays in
 * `transfer(value)` are moved, not copied) or its error.
 */
export function serveDeadlineRequests(
  port: import('node:worker_threads').MessagePort,
  handle: (request: unknown) => Promise<unknown>,
  transfer: (value: unknown) => ArrayBuffer[] = () => [],
): void {
  port.on('message', (m: { id: number; request: unknown }) => {
    handle(m.request).then(
      (value) => {
        try {
          port.postMessage({ id: m.id, ok: true, value } satisfies Reply, transfer(value));
        } catch (e) {
          port.postMessage({ id: m.id, ok: false, error: toWorkerError(e) } satisfies Reply);
        }
      },
      (e: unknown) => port.postMessage({ id: m.id, ok: false, error: toWorkerError(e) } satisfies Reply),
    );
  });
}
