/**
 * The body of a pooled worker thread: runs the service entries the parent sends, one job at a time as the pool
 * hands them out, and reports progress, the result or the error of each. Kept apart from main/worker.ts so that
 * a test can run it with a table of its own.
 */
import type { MessagePort } from 'node:worker_threads';
import type { ServiceEntry } from '../app/services/types.js';
import { StillwaterError } from '../app/errors.js';
import { requestEnded, requestStarted } from '../app/session/background.js';
import { describeSchemaError, toWireError } from './dispatch.js';
import { PathGuard } from './path-guard.js';
import type { FromWorker, ToWorker } from './worker-protocol.js';

export function serveWorker(table: ServiceEntry[], port: MessagePort): void {
  const running = new Map<string, AbortController>();
  const post = (m: FromWorker, transfer: ArrayBuffer[] = []): void => port.postMessage(m, transfer);
  port.on('message', (m: ToWorker) => {
    if (m.type === 'cancel') {
      running.get(m.jobId)?.abort();
      return;
    }
    const { job } = m;
    const controller = new AbortController();
    running.set(job.jobId, controller);
    // work computed ahead for the sessions of this thread waits while a request is served
    requestStarted();
    const run = async (): Promise<unknown> => {
      const entry = table.find((e) => e.name === job.name);
      if (!entry) throw new StillwaterError('E_INPUT', `There is no service '${job.name}'.`);
      const parsed = entry.input.safeParse(job.input);
      if (!parsed.success) throw new StillwaterError('E_INPUT', describeSchemaError(job.name, parsed.error));
      const guard = new PathGuard(job.roots, process.cwd(), job.granted);
      return entry.run(parsed.data, {
        resolvePath: (p) => guard.resolve(p),
        roots: guard.roots,
        cacheDir: job.cacheDir,
        progress: (fraction, message) => post({ type: 'progress', jobId: job.jobId, fraction, message }),
        signal: controller.signal,
      });
    };
    run()
      .then(
        (result) => {
          try {
            // copied, not moved: the thread lives on and its sessions keep the arrays they handed out (grid, cached levels)
            post({ type: 'done', jobId: job.jobId, result });
          } catch (e) {
            post({ type: 'error', jobId: job.jobId, error: toWireError(e) });
          }
        },
        (e: unknown) => post({ type: 'error', jobId: job.jobId, error: toWireError(e) }),
      )
      .finally(() => {
        running.delete(job.jobId);
        requestEnded();
      });
  });
}
