/**
 * The HDF5 library on a thread of its own with a deadline per call (see hdf5-library.ts for why).
 * One thread per process, started on the first NetCDF-4 file; a call past its deadline terminates it,
 * and every file it held is refused from then on.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { StillwaterError } from '../app/errors.js';
import { useHdf5Library, type Hdf5Library, type Hdf5Opened, type Hdf5Ranges } from '../app/io/hdf5-library.js';
import { DeadlineWorker } from './deadline-worker.js';
import type { Hdf5Request } from './hdf5-worker.js';

/** Opening reads only metadata: a healthy file takes well under a second. */
const OPEN_DEADLINE_MS = 20_000;
/** The library's own slicing of one level (compressed with a filter we do not undo ourselves). */
const SLICE_DEADLINE_MS = 120_000;

class OffThreadHdf5 implements Hdf5Library {
  private readonly worker: DeadlineWorker;
  /** each handle with the thread generation that opened it (a terminated thread loses its files) */
  private readonly handles = new Map<number, { remote: number; generation: number; file: string }>();
  private next = 1;

  constructor(workerFile: string) {
    this.worker = new DeadlineWorker(workerFile, { workerData: { stillwater: 'hdf5-library' } });
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
    await this.run({ op: 'close', handle: h.remote }, OPEN_DEADLINE_MS, { file: h.file });
  }

  private live(handle: number, file: string): { remote: number } {
    const h = this.handles.get(handle);
    if (!h || h.generation !== this.worker.generation) {
      throw new StillwaterError('E_FORMAT', `${file}: can no longer be read, because reading another damaged HDF5 file had to be stopped.`, { file });
    }
    return h;
  }

  private run<T>(request: Hdf5Request, deadlineMs: number, subject: { file: string; variable?: string }): Promise<T> {
    return this.worker.call<T>(request, { deadlineMs, subject });
  }
}

/** Route this thread's HDF5 library calls to a thread with deadlines, when the bundle is there. */
export function useHdf5OffThread(distDir: string): void {
  const file = join(distDir, 'hdf5-worker.mjs');
  if (existsSync(file)) useHdf5Library(new OffThreadHdf5(file));
}
