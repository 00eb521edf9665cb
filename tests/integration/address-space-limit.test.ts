import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

// Issue 16, item 10: batch schedulers often cap address space (`ulimit -v`); WebAssembly's trap handler
// reserves about 10 GB per memory, so without care every command exits 1 there. The commands must work
// under `ulimit -v 4000000` (4 000 000 KiB) and give the same answers as without the limit.
const root = join(__dirname, '../..');
const dir = mkdtempSync(join(tmpdir(), 'sw-ulimit-'));

function run(limited: boolean, ...args: string[]) {
  const quoted = args.map((a) => `'${a.replace(/'/g, `'\\''`)}'`).join(' ');
  const cmd = `${limited ? 'ulimit -v 4000000 && ' : ''}exec '${process.execPath}' main/launch.mjs ${quoted}`;
  const r = spawnSync('/bin/bash', ['-c', cmd], { cwd: root, encoding: 'utf8', timeout: 180_000 });
  return { code: r.status, signal: r.signal, stdout: r.stdout, stderr: r.stderr };
}

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'main/build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(b.stderr);
  const m = spawnSync('/usr/bin/python3', [join(root, 'tests/fixtures/regrid/make_cli_files.py'), dir], { encoding: 'utf8' });
  if (m.status !== 0) throw new Error(m.stderr);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('under ulimit -v 4000000', () => {
  it('inspect --stats reads a NetCDF-4 file (the HDF5 library in WebAssembly, on its own thread) as without the limit', () => {
    const file = join(root, 'tests/fixtures/io/python_nc4.nc');
    const limited = run(true, 'inspect', file, '--stats', '--json');
    expect(limited.stderr).toBe('');
    expect(limited.code).toBe(0);
    const free = run(false, 'inspect', file, '--stats', '--json');
    expect(free.code).toBe(0);
    expect(JSON.parse(limited.stdout)).toEqual(JSON.parse(free.stdout));
  });

  it('regrid runs its WebAssembly kernels', () => {
    const out = join(dir, 'po4.nc');
    const r = run(true, 'regrid', '--source', join(dir, 'source.nc'), '--var', 'po4', '--target', join(dir, 'target.nc'), '--out', out, '--cache-dir', join(dir, 'cache'), '--json');
    expect(r.stderr).not.toMatch(/internal fault|Out of memory/);
    expect(r.code).toBe(0);
  });
});
