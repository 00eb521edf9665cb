// The folder browser and file description services. files.describe is checked against `ncdump -h`
// (Debian netcdf-bin, Unidata's reference tool) on committed fixtures: same dimensions, variables, types,
// dimension order and units.
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, realpathSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { filesServices, type FileDescription, type FolderListing } from '../../../app/services/files.js';
import type { ServiceContext } from '../../../app/services/types.js';
import { PathGuard } from '../../../main/path-guard.js';

const fixtures = join(__dirname, '..', '..', 'fixtures', 'io');

function ctxFor(roots: string[]): ServiceContext {
  const g = new PathGuard(roots);
  return { resolvePath: (p) => g.resolve(p), roots: g.roots, cacheDir: tmpdir(), progress: () => undefined, signal: new AbortController().signal };
}
const svc = (name: string) => filesServices.find((e) => e.name === name)!;

const CDL_TYPES: Record<string, string> = { double: 'f8', float: 'f4', short: 'i2', byte: 'i1', int: 'i4', char: 'char', ubyte: 'u1', ushort: 'u2', uint: 'u4', int64: 'i8', uint64: 'u8' };

/** Dimensions and variables as ncdump -h prints them. */
function ncdumpHeader(file: string) {
  const text = execFileSync('ncdump', ['-h', file], { encoding: 'utf8' });
  const dims = new Map<string, number>();
  const vars = new Map<string, { dtype: string; dims: string[]; units?: string }>();
  let section = '';
  for (const line of text.split('\n')) {
    if (/^(dimensions|variables):/.test(line)) section = line.replace(':', '').trim();
    else if (/^\/\/ global/.test(line)) section = 'global';
    else if (section === 'dimensions') {
      const m = /^\s+(\S+) = (UNLIMITED ; \/\/ \((\d+) currently\)|(\d+) ;)/.exec(line);
      if (m) dims.set(m[1], Number(m[3] ?? m[4]));
    } else if (section === 'variables') {
      const v = /^\t(\w+) (\w+)(?:\(([^)]*)\))? ;/.exec(line);
      if (v) vars.set(v[2], { dtype: CDL_TYPES[v[1]], dims: v[3] ? v[3].split(',').map((s) => s.trim()) : [] });
      const u = /^\t\t(\w+):units = "([^"]*)" ;/.exec(line);
      if (u) vars.get(u[1])!.units = u[2];
    }
  }
  return { dims, vars };
}

describe('files.describe', () => {
  for (const f of ['classic_cdf1.nc', 'offset64_cdf2.nc', 'cdf5.nc']) {
    it(`agrees with ncdump -h on ${f}`, async () => {
      const d = (await svc('files.describe').run({ path: join(fixtures, f) }, ctxFor([fixtures]))) as FileDescription;
      const ref = ncdumpHeader(join(fixtures, f));
      expect(new Map(d.dimensions.map((x) => [x.name, x.size]))).toEqual(ref.dims);
      expect(d.variables.map((v) => v.name).sort()).toEqual([...ref.vars.keys()].sort());
      for (const v of d.variables) {
        const r = ref.vars.get(v.name)!;
        expect(v.dtype, v.name).toBe(r.dtype);
        expect(v.dims, v.name).toEqual(r.dims);
        expect(v.units, v.name).toBe(r.units ?? '');
      }
    });
  }
  it('marks coordinate variables', async () => {
    const d = (await svc('files.describe').run({ path: join(fixtures, 'classic_cdf1.nc') }, ctxFor([fixtures]))) as FileDescription;
    expect(d.variables.filter((v) => v.coordinate).map((v) => v.name).sort()).toEqual(['depth', 'lat', 'lon', 'time']);
    expect(d.title).toBe('io reader fixture');
  });
  it('refuses a file outside the allowed folders and names a missing one', async () => {
    const other = mkdtempSync(join(tmpdir(), 'sw-files-'));
    await expect(svc('files.describe').run({ path: join(fixtures, 'classic_cdf1.nc') }, ctxFor([other]))).rejects.toMatchObject({ code: 'E_FILE' });
    await expect(svc('files.describe').run({ path: join(other, 'absent.nc') }, ctxFor([other]))).rejects.toThrow(/absent\.nc: no such file/);
  });
});

describe('files.list', () => {
  const top = realpathSync(mkdtempSync(join(tmpdir(), 'sw-list-')));
  mkdirSync(join(top, 'zeta'));
  mkdirSync(join(top, 'alpha'));
  writeFileSync(join(top, 'b.nc'), 'x');
  writeFileSync(join(top, 'a.csv'), 'x');
  writeFileSync(join(top, '.hidden'), 'x');
  it('lists the roots when no folder is given', async () => {
    const l = (await svc('files.list').run({}, ctxFor([top]))) as FolderListing;
    expect(l.entries.map((e) => e.path)).toEqual([top]);
  });
  it('lists folders first, then files, by name, without hidden ones, with their kinds', async () => {
    const l = (await svc('files.list').run({ folder: top }, ctxFor([top]))) as FolderListing;
    expect(l.entries.map((e) => e.name)).toEqual(['alpha', 'zeta', 'a.csv', 'b.nc']);
    expect(l.entries.map((e) => e.kind)).toEqual(['folder', 'folder', 'table', 'dataset']);
    expect(l.parent).toBeNull();
  });
  it('gives the parent while it is still allowed', async () => {
    const l = (await svc('files.list').run({ folder: join(top, 'alpha') }, ctxFor([top]))) as FolderListing;
    expect(l.parent).toBe(top);
  });
  it('says so when the folder is a file', async () => {
    await expect(svc('files.list').run({ folder: join(top, 'b.nc') }, ctxFor([top]))).rejects.toThrow(/not a folder/);
  });
});
