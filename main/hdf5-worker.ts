/**
 * Entry of the HDF5 library's own thread (dist/hdf5-worker.mjs): serves hdf5-library.ts calls, so that a
 * damaged file that makes the library loop can be stopped by terminating this thread.
 */
import { parentPort } from 'node:worker_threads';
import type { Hdf5Ranges } from '../app/io/hdf5-library.js';
import { serveDeadlineRequests } from './deadline-worker.js';

export type Hdf5Request =
  | { op: 'open'; path: string }
  | { op: 'slice'; handle: number; h5path: string; ranges: Hdf5Ranges; subject: { file: string; variable: string } }
  | { op: 'close'; handle: number };

/** What a close answers: the library's memory afterwards, so that the caller can retire a swollen thread. */
export interface Hdf5Closed {
  heapBytes: number;
}

// The library prints diagnostics through console.error, bound when its module loads: silence it first.
// What went wrong reaches the caller as one sentence instead.
console.error = () => undefined;
console.warn = () => undefined;

async function start(): Promise<void> {
  const { InProcessHdf5 } = await import('../app/io/hdf5-library.js');
  const lib = new InProcessHdf5();
  if (!parentPort) return;
  serveDeadlineRequests(
    parentPort,
    async (r) => {
      const req = r as Hdf5Request;
      if (req.op === 'open') return lib.open(req.path);
      if (req.op === 'slice') return lib.slice(req.handle, req.h5path, req.ranges, req.subject);
      await lib.close(req.handle);
      return { heapBytes: await lib.heapBytes() } satisfies Hdf5Closed;
    },
    (value) => (ArrayBuffer.isView(value) && value.buffer instanceof ArrayBuffer && value.byteLength === value.buffer.byteLength ? [value.buffer] : []),
  );
}

void start();
