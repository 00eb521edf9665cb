// Browser mode on a shared machine (issue 16, items 10 and 11): under `ulimit -v 8000000` (8 000 000 KiB, a
// common batch-scheduler cap) the server must keep serving while a session regrids levels and NetCDF-4 files
// are described side by side. Each thread that loaded the HDF5 library reserved its 2.3 GiB of WebAssembly
// memory and each regridding kernel 4 GiB (the trap handler is off under a limit), and one thread too many
// aborted the whole process ("Failed to reserve virtual memory for CodeRange").
import { spawn, type ChildProcess } from 'node:child_process';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { decodeWire } from '../../contract/wire.js';
import type { SessionInfo } from '../../contract/view-types.js';
import { raw } from '../unit/main/helpers.js';
import { PROJECT, SAMPLE_DATA, prepare } from './harness.js';

const IO = join(PROJECT, 'tests', 'fixtures', 'io');
let child: ChildProcess;
let port = 0;
let token = '';
let stderr = '';

beforeAll(async () => {
  await prepare();
  const cmd = `ulimit -v 8000000 && exec '${process.execPath}' main/launch.mjs serve --port 0 --root '${SAMPLE_DATA}' --root '${IO}'`;
  child = spawn('/bin/bash', ['-c', cmd], { cwd: PROJECT, stdio: ['ignore', 'pipe', 'pipe'] });
  child.stderr!.on('data', (b: Buffer) => (stderr += b.toString()));
  const url = await new Promise<string>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (b: Buffer) => {
      out += b.toString();
      const line = out.split('\n').find((l) => l.startsWith('http://'));
      if (line) resolve(line.trim());
    });
    child.on('exit', (code, signal) => reject(new Error(`serve ended (${signal ?? code}) before printing its address: ${stderr}`)));
  });
  const u = new URL(url);
  port = Number(u.port);
  token = u.searchParams.get('token') ?? '';
}, 120_000);

afterAll(async () => {
  if (child && child.exitCode === null && child.signalCode === null) {
    const gone = new Promise((r) => child.once('exit', r));
    child.kill('SIGTERM');
    await gone;
  }
});

const api = (name: string, input: unknown) =>
  raw(port, { method: 'POST', path: `/api/${name}`, headers: { 'content-type': 'application/json', 'x-stillwater-token': token }, body: JSON.stringify({ input }) });

describe('stillwater serve under ulimit -v 8000000', () => {
  it('regrids a session and describes NetCDF-4 files side by side, and is still serving', async () => {
    const opened = decodeWire((await api('view.open', { recipe: join(SAMPLE_DATA, 'demo-recipe.json') })).body) as SessionInfo;
    expect(opened.session).toBeTruthy();
    const variable = opened.variables[0];
    const levels = opened.layers.filter((l) => l.kind === 'level').slice(0, 3);
    const work = [
      ...levels.map((l) => api('view.level', { session: opened.session, variable: variable.key, run: variable.runs[0], layer: l.id })),
      ...['python_nc4.nc', 'chunks_nc4.nc', 'netcdf4_ncgen.nc'].map((f) => api('files.describe', { path: join(IO, f) })),
    ];
    const replies = await Promise.all(work);
    for (const r of replies) {
      expect(r.status).toBe(200);
      expect(r.headers['content-type']).toMatch(/x-stillwater-wire/); // an answer, not a refusal
    }
    expect((await raw(port, { path: '/', headers: { 'x-stillwater-token': token } })).status).toBe(200);
    expect(child.exitCode).toBeNull();
    expect(child.signalCode).toBeNull();
    expect(stderr).not.toMatch(/Fatal process OOM|internal fault/);
    // the pool was sized to what fits (one thread under this limit), and said so where that is fewer than the cores
    if (availableParallelism() > 1) expect(stderr).toMatch(/serve: 1 worker thread for \d+ cores, as many as fit under this process's address-space limit\./);
  }, 180_000);
});
