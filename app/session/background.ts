/**
 * Work a session does before anyone asks for it (skill rows, the spin-up), in the thread that holds the session,
 * without delaying the requests it serves: every step of background work first waits until no request is being
 * served here (`pause`). Work a request waits for is urgent and goes on at once. Tasks run one after another in
 * the order they were queued; a request for a task not yet started starts it at once.
 *
 * Only threads that serve requests one after another turn it on (main/worker.ts, through `allowBackground`);
 * elsewhere (the command line, tests) nothing is computed ahead and every task starts when asked for.
 */
import { StillwaterError } from '../errors.js';

let serving = 0;
/** requests that wait for work computed ahead without hurrying it (they are not served meanwhile) */
let parked = 0;
let allowed = false;
const waiting: (() => void)[] = [];

/** This thread may compute ahead: the pooled worker threads of the workbench. */
export function allowBackground(): void {
  allowed = true;
}

export function backgroundAllowed(): boolean {
  return allowed;
}

/** A request starts being served on this thread. */
export function requestStarted(): void {
  serving++;
}

/** A request was answered: waiting background steps go on when none is left. */
export function requestEnded(): void {
  serving = Math.max(0, serving - 1);
  if (idle()) wakeAll();
}

const idle = (): boolean => serving <= parked;

function wakeAll(): void {
  for (const w of waiting.splice(0)) w();
}

/** Resolves once no request is being served (or at once when `urgent()`), always after one turn of the event loop. */
export function pauseForRequests(urgent: () => boolean): Promise<void> {
  return new Promise((resolve) => {
    const go = (): void => {
      if (idle() || urgent()) resolve();
      else waiting.push(go);
    };
    setImmediate(go);
  });
}

/** What a task's work gets: the pause to await between steps, and a signal set when the session closes. */
export interface TaskContext {
  pause: () => Promise<void>;
  signal: AbortSignal;
}

interface Task<T> {
  key: string;
  urgent: boolean;
  started: boolean;
  promise: Promise<T>;
  start(): void;
  /** refuse those waiting for a task that will not run (the session closed before it started) */
  fail(e: unknown): void;
}

/** The background tasks of one session: keyed, computed once, run one after another. */
export class BackgroundQueue {
  private readonly tasks = new Map<string, Task<unknown>>();
  private readonly queued: Task<unknown>[] = [];
  private running = false;
  private readonly controller = new AbortController();

  /** The task's result, computed now (urgent) when it is not already done or under way. */
  want<T>(key: string, work: (ctx: TaskContext) => Promise<T>): Promise<T> {
    const t = this.task(key, work);
    t.urgent = true;
    if (!t.started) {
      this.queued.splice(this.queued.indexOf(t), 1);
      t.start();
    }
    wakeAll();
    return t.promise;
  }

  /**
   * The task's result, without hurrying it: it keeps its place among the work computed ahead, and the request
   * that waits for it does not hold that work up (a banner that can wait while the table is computed).
   * Where nothing is computed ahead, it is computed now.
   */
  async later<T>(key: string, work: (ctx: TaskContext) => Promise<T>): Promise<T> {
    if (!allowed) return this.want(key, work);
    const t = this.task(key, work);
    this.next();
    parked++;
    wakeAll();
    try {
      return await t.promise;
    } finally {
      parked--;
    }
  }

  /** Queue a task to be computed ahead (only where background work is allowed); its failures are forgotten. */
  ahead<T>(key: string, work: (ctx: TaskContext) => Promise<T>): void {
    if (!allowed || this.controller.signal.aborted || this.tasks.has(key)) return;
    this.task(key, work);
    this.next();
  }

  /** A small task (reading a level ahead) started now beside the queue; it should await `pause` before each step. */
  soon<T>(key: string, work: (ctx: TaskContext) => Promise<T>): void {
    if (!allowed || this.controller.signal.aborted || this.tasks.has(key)) return;
    const t = this.task(key, work);
    this.queued.splice(this.queued.indexOf(t), 1);
    t.start();
  }

  /** Whether a task is known (done, running or queued). */
  has(key: string): boolean {
    return this.tasks.has(key);
  }

  /** Forget every task (the session closed): running ones stop at their next pause. */
  close(): void {
    this.controller.abort();
    for (const t of this.queued.splice(0)) t.fail(new StillwaterError('E_CANCELLED', 'The workbench session was closed.'));
    this.tasks.clear();
    wakeAll();
  }

  private task<T>(key: string, work: (ctx: TaskContext) => Promise<T>): Task<T> {
    const known = this.tasks.get(key) as Task<T> | undefined;
    if (known) return known;
    let resolve!: (v: T) => void;
    let reject!: (e: unknown) => void;
    const promise = new Promise<T>((res, rej) => {
      resolve = res;
      reject = rej;
    });
    const signal = this.controller.signal;
    const t: Task<T> = {
      key,
      urgent: false,
      started: false,
      promise,
      fail: (e) => reject(e),
      start: () => {
        t.started = true;
        const pause = async (): Promise<void> => {
          await pauseForRequests(() => t.urgent || signal.aborted);
        };
        work({ pause, signal }).then(resolve, (e: unknown) => {
          // a failed task is asked again next time
          if (this.tasks.get(key) === t) this.tasks.delete(key);
          reject(e);
        });
      },
    };
    // nobody may be waiting for a task computed ahead: its failure must not go unhandled
    promise.catch(() => undefined);
    this.tasks.set(key, t as Task<unknown>);
    this.queued.push(t as Task<unknown>);
    return t;
  }

  private next(): void {
    if (this.running) return;
    const t = this.queued.shift();
    if (!t) return;
    this.running = true;
    t.start();
    void t.promise
      .catch(() => undefined)
      .then(() => {
        this.running = false;
        this.next();
      });
  }
}
