/** Entry of a pooled worker thread (dist/worker.mjs): serves the whole service table, job after job. */
import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parentPort } from 'node:worker_threads';
import { serviceTable } from '../app/service.js';
import { useHdf5OffThread } from './hdf5-off-thread.js';
import { serveWorker } from './worker-loop.js';
import { allowBackground } from '../app/session/background.js';

// a job's HDF5 library calls run on a thread of their own with a deadline (dist/hdf5-worker.mjs beside this bundle)
useHdf5OffThread(dirname(fileURLToPath(import.meta.url)));
if (parentPort) {
  // a pooled thread computes a session's skill rows and spin-up ahead, in the time between requests
  allowBackground();
  serveWorker(serviceTable, parentPort);
}
