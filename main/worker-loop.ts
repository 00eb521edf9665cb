/**
 * The body of a pooled worker thread: runs the service entries the parent sends, one job at a time as the pool
 * hands them out, and reports progress, the result or the error of each. Kept apart from main/worker.ts so that
 * a test can run it with a table of its own.
 */
import type { MessagePort } from 'node:worker_threads';
import type { ServiceEntry } from '../app/services/types.js';
import { StillwaterError } from '../app/errors.js';
import { describeSchemaError, toWireError } from './dispatch.js';
import { PathGuard } from './path-guard.js';
import type { FromWorker, ToWorker } from './worker-protocol.js';

/** Buffers of typed arrays in the result, moved rather than copied back to the parent. */
function transferables(v: unknown, out: Set<ArrayBuffer> = new Set(), depth = 0): Set<ArrayBuffer> {
  if (depth > 6 || v === null || typeof v !== 'object') return out;
  if (ArrayBuffer.isView(v)) {
    const b = v.buffer;
    if (b instanceof ArrayBuffer && v.byteLength === b.byteLength) out.add(b);
    return out;
  }
  for (const x of Array.isArray(v) ? v : Object.values(v as Record<string, unknown>)) transferables(x, out, depth + 1);
  return out;
}

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
            post({ type: 'done', jobId: job.jobId, result }, [...transferables(result)]);
          } catch (e) {
            post({ type: 'error', jobId: job.jobId, error: toWireError(e) });
          }
        },
        (e: unknown) => post({ type: 'error', jobId: job.jobId, error: toWireError(e) }),
      )
      .finally(() => running.delete(job.jobId));
  });
}
