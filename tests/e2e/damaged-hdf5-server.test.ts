// The freeze case of issue 16 (items 1 and 2) with real damaged files, through `stillwater serve` as a person
// starts it: tests/fixtures/hostile/make_looping_hdf5.py writes them with netCDF4-python and damages one
// structure each (HDF5 File Format Specification 3.0, "Global Heap" and "Version 1 B-trees").
// - global_heap_loop.nc makes the HDF5 library itself never return from opening the file: while it is being
//   described, the page and light calls still answer, the describe call comes back as one sentence when its
//   deadline passes, and the server still serves and stops on SIGTERM.
// - chunk_btree_loop.nc has a chunk B-tree node that points back at itself: its header describes normally,
//   and reading its data is refused in one sentence instead of looping.
// No timing is asserted: a frozen server never answers, so each wait has a generous limit as a timeout only.
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { decodeWire } from '../../contract/wire.js';
import { raw } from '../unit/main/helpers.js';
import { PROJECT, prepare, startServe, type Served } from './harness.js';

const HOSTILE = join(PROJECT, 'tests', 'fixtures', 'hostile');
let served: Served;

beforeAll(async () => {
  await prepare();
  served = await startServe(['--root', HOSTILE]);
});

afterAll(async () => {
  await served?.stop();
});

const api = (name: string, input: unknown) =>
  raw(served.port, { method: 'POST', path: `/api/${name}`, headers: { 'content-type': 'application/json', 'x-stillwater-token': served.token }, body: JSON.stringify({ input }) });

/** The value of `work`, or a failure once `ms` have passed (a frozen server never answers). */
function within<T>(ms: number, what: string, work: Promise<T>): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const limit = new Promise<never>((_, reject) => (timer = setTimeout(() => reject(new Error(`${what}: no answer within ${ms} ms`)), ms)));
  return Promise.race([work, limit]).finally(() => clearTimeout(timer));
}

function refusal(body: Buffer): { code: string; message: string } {
  return (JSON.parse(body.toString()) as { error: { code: string; message: string } }).error;
}

describe('a NetCDF-4 file that makes the HDF5 library loop', () => {
  it('is described on another thread: the page answers meanwhile, and the call comes back as one sentence', async () => {
    const file = join(HOSTILE, 'global_heap_loop.nc');
    let describeDone = false;
    const describing = api('files.describe', { path: file }).then((r) => {
      describeDone = true;
      return r;
    });
    // the page and a light call, answered while the library is still looping
    const page = await within(5_000, 'GET /', raw(served.port, { path: '/', headers: { 'x-stillwater-token': served.token } }));
    expect(page.status).toBe(200);
    expect(page.body.toString()).toContain('<title>Stillwater</title>');
    const roots = await within(5_000, 'files.roots', api('files.roots', {}));
    expect(roots.status).toBe(200);
    expect(describeDone).toBe(false);
    // the describe call's deadline (20 s) ends it with one sentence naming the file
    const r = await within(80_000, 'files.describe', describing);
    const e = refusal(r.body);
    expect(e.code).toBe('E_FORMAT');
    expect(e.message).toBe(`${file}: could not be read within 20 s (the file may be damaged).`);
    expect(e.message).not.toMatch(/\n/);
    // and the server goes on serving heavy calls on a fresh thread
    const healthy = await within(60_000, 'files.describe again', api('files.describe', { path: join(HOSTILE, 'chunk_btree_loop.nc') }));
    expect((decodeWire(healthy.body) as { format: string }).format).toMatch(/netcdf-?4/i);
  }, 150_000);
});

describe('a NetCDF-4 file whose chunk B-tree points back at itself', () => {
  it('describes from its header, and reading its data is refused in one sentence', async () => {
    const file = join(HOSTILE, 'chunk_btree_loop.nc');
    const described = decodeWire((await within(60_000, 'files.describe', api('files.describe', { path: file }))).body) as { variables: { name: string }[] };
    expect(described.variables.map((v) => v.name)).toContain('o2');
    const r = await within(60_000, 'cf.inspect', api('cf.inspect', { path: file, stats: true }));
    const e = refusal(r.body);
    expect(e.code).toBe('E_FORMAT');
    expect(e.message).toMatch(/chunk index is damaged \(the chunk B-tree reaches node \d+ twice\)/);
    expect(e.message).toContain('chunk_btree_loop.nc');
  }, 150_000);
});

describe('stopping', () => {
  it('stops on SIGTERM even while a damaged file is being read', async () => {
    void api('files.describe', { path: join(HOSTILE, 'global_heap_loop.nc') }).catch(() => undefined);
    await within(5_000, 'GET /', raw(served.port, { path: '/', headers: { 'x-stillwater-token': served.token } }));
    await within(15_000, 'SIGTERM', served.stop());
    expect(served.process.exitCode ?? served.process.signalCode).not.toBeNull();
  }, 60_000);
});
