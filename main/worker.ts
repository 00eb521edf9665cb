/** Entry of a worker thread (dist/worker.mjs): serves the whole service table for one heavy job. */
import { parentPort } from 'node:worker_threads';
import { serviceTable } from '../app/service.js';
import { serveWorker } from './worker-loop.js';

if (parentPort) serveWorker(serviceTable, parentPort);
