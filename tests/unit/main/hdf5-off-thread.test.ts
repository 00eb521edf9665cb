// The HDF5 library on a thread of its own (issue 16, items 1, 2 and 10): its memory only grows, so a thread
// whose memory passed a bound is retired once no file is open on it, never under an open file or a call on
// its way; below the bound one thread serves every file. Files: committed netCDF4-python fixtures
// (tests/fixtures/io/make_fixtures.py).
import { build } from 'esbuild';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { OffThreadHdf5 } from '../../../main/hdf5-off-thread.js';

const IO = join(__dirname, '..', '..', 'fixtures', 'io');
const A = join(IO, 'python_nc4.nc');
const B = join(IO, 'chunks_nc4.nc');
let workerFile: string;

beforeAll(async () => {
  workerFile = join(__dirname, '..', '..', '..', 'dist', 'test', `hdf5-worker-${process.pid}.mjs`);
  await build({
    entryPoints: [join(__dirname, '..', '..', '..', 'main', 'hdf5-worker.ts')],
    outfile: workerFile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    packages: 'external',
    logLevel: 'error',
    banner: { js: "import { createRequire as __swRequire } from 'node:module'; const require = __swRequire(import.meta.url);" },
  });
});

/** Read the first variable of an opened file through the library (any hyperslab will do). */
async function readSomething(lib: OffThreadHdf5, handle: number, file: string, h5path: string): Promise<unknown> {
  return lib.slice(handle, h5path, null, { file, variable: h5path });
}

describe('the HDF5 library thread', () => {
  it('retires a thread past its memory bound only when its last file closes', async () => {
    const lib = new OffThreadHdf5(workerFile, 1); // every thread is past a bound of 1 byte
    const a = await lib.open(A);
    const b = await lib.open(B);
    expect(lib.threadsStarted).toBe(1);
    await lib.close(a.handle);
    // b is still open: the thread stays, and b is still read
    const first = b.meta.variables[0];
    expect(await readSomething(lib, b.handle, B, first.h5path)).toBeTruthy();
    expect(lib.threadsStarted).toBe(1);
    await lib.close(b.handle);
    // the last file closed: the next file is opened on a fresh thread
    const c = await lib.open(A);
    expect(lib.threadsStarted).toBe(2);
    await lib.close(c.handle);
  });

  it('keeps one thread for every file while its memory stays under the bound', async () => {
    const lib = new OffThreadHdf5(workerFile);
    for (let i = 0; i < 3; i++) {
      const f = await lib.open(i % 2 ? A : B);
      await lib.close(f.handle);
    }
    expect(lib.threadsStarted).toBe(1); // an idle thread does not keep the process alive (it is unref'd)
  });
});
