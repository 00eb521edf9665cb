/**
 * Heavy service entries run in worker threads so that neither the Electron main process nor the browser-mode
 * server stops answering. One thread a job: weight caches live on disk, so a fresh thread loses little, and a
 * cancelled job that does not stop in time can simply be terminated.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { StillwaterError } from '../app/errors.js';
import type { HeavyRunner } from './dispatch.js';
import { cancelled } from './dispatch.js';
import { projectRoot } from './static-files.js';
import type { FromWorker, ToWorker } from './worker-protocol.js';

/** How long a cancelled job may take to stop by itself before its thread is terminated. */
const GRACE_MS = 1500;

export function defaultWorkerFile(): string {
  return join(projectRoot(), 'dist', 'worker.mjs');
}

export function workerRunner(workerFile: string = defaultWorkerFile()): HeavyRunner {
  return (job, hooks) =>
    new Promise<unknown>((resolveJob, reject) => {
      if (!existsSync(workerFile)) {
        reject(new StillwaterError('E_INTERNAL', `${workerFile}: the worker bundle is missing; run npm run build.`));
        return;
      }
      if (hooks.signal.aborted) {
        reject(cancelled());
        return;
      }
      // workerData must be an object: the `web-worker` package (under geotiff) destructures it when loaded
      // off the main thread, and treats an object without its own `mod` key as a main thread.
      const worker = new Worker(workerFile, { workerData: { stillwater: 'service-job' } });
      let settled = false;
      let killTimer: NodeJS.Timeout | undefined;
      const settle = (fn: () => void): void => {
        if (settled) return;
        settled = true;
        if (killTimer) clearTimeout(killTimer);
        hooks.signal.removeEventListener('abort', onAbort);
        void worker.terminate();
        fn();
      };
      const onAbort = (): void => {
        worker.postMessage({ type: 'cancel' } satisfies ToWorker);
        killTimer = setTimeout(() => settle(() => reject(cancelled())), GRACE_MS);
      };
      hooks.signal.addEventListener('abort', onAbort, { once: true });
      worker.on('message', (m: FromWorker) => {
        if (m.type === 'progress') hooks.progress(m.fraction, m.message);
        else if (m.type === 'done') settle(() => (hooks.signal.aborted ? reject(cancelled()) : resolveJob(m.result)));
        else settle(() => reject(new StillwaterError(m.error.code as StillwaterError['code'], m.error.message, { file: m.error.file, variable: m.error.variable, path: m.error.path })));
      });
      worker.on('error', (e) => settle(() => reject(new StillwaterError('E_INTERNAL', `A worker thread failed: ${e.message}`))));
      worker.on('exit', (code) => settle(() => reject(hooks.signal.aborted ? cancelled() : new StillwaterError('E_INTERNAL', `A worker thread stopped (exit ${code}) before finishing.`))));
      worker.postMessage({ type: 'run', job } satisfies ToWorker);
    });
}
