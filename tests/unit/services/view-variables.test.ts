/**
 * view.variables (what the sources panel offers for pairing) lists the data variables of every NetCDF-4
 * group by path; checked against the variables netCDF4-python reads from tests/fixtures/groups
 * (make_groups.py writes expected_groups.json).
 */
import { readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { ServiceContext } from '../../../app/services/types.js';
import { viewsServices } from '../../../app/services/views.js';
import { PathGuard } from '../../../main/path-guard.js';

const DIR = join(__dirname, '..', '..', 'fixtures', 'groups');
const expected = JSON.parse(readFileSync(join(DIR, 'expected_groups.json'), 'utf8')) as Record<string, { dims: string[] }>;

function ctx(): ServiceContext {
  const g = new PathGuard([DIR]);
  return { resolvePath: (p) => g.resolve(p), roots: g.roots, cacheDir: tmpdir(), progress: () => undefined, signal: new AbortController().signal };
}

describe('view.variables on a file with nested groups', () => {
  it('offers every variable of two or more dimensions, inside groups by path', async () => {
    const svc = viewsServices.find((e) => e.name === 'view.variables')!;
    const got = (await svc.run({ file: join(DIR, 'groups_nc4.nc') }, ctx())) as { name: string; units: string }[];
    // root-group names stay plain (sst); the others are netCDF4-python's group paths
    const want = Object.entries(expected).filter(([, e]) => e.dims.length >= 2).map(([p]) => (p.lastIndexOf('/') === 0 ? p.slice(1) : p));
    expect(got.map((v) => v.name).sort()).toEqual(want.sort());
    expect(got.find((v) => v.name === '/bgc/chl')?.units).toBe('mg m-3');
  });
});
