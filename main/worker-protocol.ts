/** Messages between main/workers.ts (the parent) and main/worker.ts (a worker thread running one job). */
import type { WireError } from '../contract/transport.js';

export interface WorkerJob {
  name: string;
  input: unknown;
  jobId: string;
  roots: string[];
  granted: string[];
  cacheDir: string;
}

export type ToWorker = { type: 'run'; job: WorkerJob } | { type: 'cancel' };

export type FromWorker =
  | { type: 'progress'; fraction: number; message: string }
  | { type: 'done'; result: unknown }
  | { type: 'error'; error: WireError };
