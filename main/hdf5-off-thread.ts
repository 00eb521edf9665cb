/**
 * The HDF5 library on a thread of its own with a deadline per call (see hdf5-library.ts for why).
 * One thread per process, started on the first NetCDF-4 file; a call past its deadline terminates it,
 * and every file it held is refused from then on. The library's memory only grows (a damaged file can make
 * it take hundreds of megabytes), so a thread whose memory passed a bound is retired once no file is open on
 * it, and the next file starts a fresh one.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { StillwaterError } from '../app/errors.js';
import { useHdf5Library, type Hdf5Library, type Hdf5Opened, type Hdf5Ranges } from '../app/io/hdf5-library.js';
import { DeadlineWorker } from './deadline-worker.js';
import type { Hdf5Closed, Hdf5Request } from './hdf5-worker.js';

/** Opening reads only metadata: a healthy file takes well under a second. */
const OPEN_DEADLINE_MS = 20_000;
/** The library's own slicing of one level (compressed with a filter we do not undo ourselves). */
const SLICE_DEADLINE_MS = 120_000;
/** A thread whose library memory passed this is retired when its last file closes (it starts at 18 MiB). */
const HEAP_BOUND_BYTES = 256 * 1024 * 1024;

export class OffThreadHdf5 implements Hdf5Library {
  private readonly worker: DeadlineWorker;
  /** each handle with the thread generation that opened it (a terminated thread loses its files) */
  private readonly handles = new Map<number, { remote: number; generation: number; file: string }>();
  private next = 1;
  /** calls on their way: a thread is never retired under one */
  private calls = 0;

  constructor(workerFile: string, private readonly heapBound = HEAP_BOUND_BYTES) {
    this.worker = new DeadlineWorker(workerFile, { workerData: { stillwater: 'hdf5-library' } });
  }

  /** Threads started so far (a new one after a deadline, or after retiring a swollen one). */
  get threadsStarted(): number {
    return this.worker.generation;
  }

  async open(path: string): Promise<Hdf5Opened> {
    const opened = await this.run<Hdf5Opened>({ op: 'open', path }, OPEN_DEADLINE_MS, { file: path });
    const handle = this.next++;
    this.handles.set(handle, { remote: opened.handle, generation: this.worker.generation, file: path });
    return { ...opened, handle };
  }

  async slice(handle: number, h5path: string, ranges: Hdf5Ranges, subject: { file: string; variable: string }): Promise<unknown> {
    const h = this.live(handle, subject.file);
    return this.run({ op: 'slice', handle: h.remote, h5path, ranges, subject }, SLICE_DEADLINE_MS, subject);
  }

  async close(handle: number): Promise<void> {
    const h = this.handles.get(handle);
    this.handles.delete(handle);
    if (!h || h.generation !== this.worker.generation) return;
    const closed = await this.run<Hdf5Closed>({ op: 'close', handle: h.remote }, OPEN_DEADLINE_MS, { file: h.file });
    const inUse = this.calls > 0 || [...this.handles.values()].some((o) => o.generation === this.worker.generation);
    if (closed.heapBytes > this.heapBound && !inUse) await this.worker.close();
  }

  private live(handle: number, file: string): { remote: number } {
    const h = this.handles.get(handle);
    if (!h || h.generation !== this.worker.generation) {
      throw new StillwaterError('E_FORMAT', `${file}: can no longer be read, because reading another damaged HDF5 file had to be stopped.`, { file });
    }
    return h;
  }

  private async run<T>(request: Hdf5Request, deadlineMs: number, subject: { file: string; variable?: string }): Promise<T> {
    this.calls++;
    try {
      return await this.worker.call<T>(request, { deadlineMs, subject });
    } finally {
      this.calls--;
    }
  }
}

/** Route this thread's HDF5 library calls to a thread with deadlines, when the bundle is there. */
export function useHdf5OffThread(distDir: string): void {
  const file = join(distDir, 'hdf5-worker.mjs');
  if (existsSync(file)) useHdf5Library(new OffThreadHdf5(file));
}
