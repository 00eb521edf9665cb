/**
 * Messages between main/workers.ts (the pool, in the parent) and main/worker.ts (a pooled worker thread).
 * A thread lives on between jobs, so the workbench sessions it opened stay with it; every message names its job.
 */
import type { WireError } from '../contract/transport.js';

export interface WorkerJob {
  name: string;
  input: unknown;
  jobId: string;
  roots: string[];
  granted: string[];
  cacheDir: string;
}

export type ToWorker = { type: 'run'; job: WorkerJob } | { type: 'cancel'; jobId: string };

export type FromWorker =
  | { type: 'progress'; jobId: string; fraction: number; message: string }
  | { type: 'done'; jobId: string; result: unknown }
  | { type: 'error'; jobId: string; error: WireError };
