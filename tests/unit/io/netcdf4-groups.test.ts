/**
 * NetCDF-4 groups against netCDF4-python (tests/fixtures/groups/make_groups.py): every group is read,
 * nested ones too; a variable is named by its path; its dimensions are the ones netCDF4-python resolves
 * (a group's own dimension shadows its parent's, a nested group without dimensions sees its parents');
 * raw values equal netCDF4-python's exactly.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openField } from '../../../app/cf/open-field.js';
import { runComparison } from '../../../app/compare/run.js';
import { MAX_GROUP_DEPTH, MAX_GROUPS } from '../../../app/io/netcdf4-metadata.js';
import { openDataset } from '../../../app/io/open.js';
import { validateRecipe } from '../../../app/recipe/validate.js';
import { findVariable } from '../../../app/io/types.js';
import { plain } from './expected.js';

const DIR = join(__dirname, '..', '..', 'fixtures', 'groups');
const FILE = join(DIR, 'groups_nc4.nc');
interface Expected {
  dims: string[];
  dim_groups: string[];
  shape: number[];
  dtype: string;
  data: number[];
}
const expected = JSON.parse(readFileSync(join(DIR, 'expected_groups.json'), 'utf8')) as Record<string, Expected>;
/** our name of an object at an HDF5 path: plain in the root group, the full path inside a group */
const ourName = (group: string, name: string): string => (group === '/' ? name : `${group}/${name}`);

describe('NetCDF-4 groups read as netCDF4-python reads them', () => {
  it('lists every group, nested too, and every variable by its path, with nothing left unread', async () => {
    const ds = await openDataset(FILE);
    expect(ds.groups).toEqual(['/', '/bgc', '/phys', '/bgc/deep']);
    expect(ds.notes).toEqual([]);
    const names = Object.keys(expected).map((p) => ourName(p.slice(0, p.lastIndexOf('/')) || '/', p.slice(p.lastIndexOf('/') + 1)));
    expect(ds.variables.map((v) => v.name).sort()).toEqual(names.sort());
    await ds.close();
  });

  it('resolves each dimension to the group netCDF4-python resolves it to, with its size', async () => {
    const ds = await openDataset(FILE);
    for (const [path, e] of Object.entries(expected)) {
      const v = findVariable(ds, path);
      expect(v, path).toBeDefined();
      expect(v!.dims, path).toEqual(e.dims.map((d, i) => ourName(e.dim_groups[i], d)));
      expect(v!.shape, path).toEqual(e.shape);
      v!.dims.forEach((d, i) => expect(ds.dimensions.find((x) => x.name === d)?.size, `${path} ${d}`).toBe(e.shape[i]));
    }
    // /bgc shadows the root's depth(3) with its own depth(2); /bgc/deep/o2 takes /bgc's (make_groups.py)
    expect(findVariable(ds, '/bgc/deep/o2')?.dims[0]).toBe('/bgc/depth');
    expect(findVariable(ds, '/phys/temp')?.dims[0]).toBe('depth');
    await ds.close();
  });

  it('reads the raw values of every variable by path equal to netCDF4-python\'s (exact)', async () => {
    const ds = await openDataset(FILE);
    for (const [path, e] of Object.entries(expected)) {
      expect(findVariable(ds, path)?.dtype, path).toBe(e.dtype);
      expect(plain(await ds.read(path)), path).toEqual(e.data);
    }
    // the same variable by its other spellings, and a slab of it
    expect(plain(await ds.read('bgc/deep/no3'))).toEqual(expected['/bgc/deep/no3'].data);
    expect(plain(await ds.read('/sst'))).toEqual(expected['/sst'].data);
    expect(plain(await ds.read('/bgc/chl', [1, 0, 0], [1, 1, 3]))).toEqual(expected['/bgc/chl'].data.slice(24, 27));
    await ds.close();
  });

  it('opens a field by path on its group\'s depth axis and the root\'s lat/lon, CF-decoded', async () => {
    const chl = await openField(FILE, '/bgc/chl');
    expect(chl.grid.vertical?.centres ? Array.from(chl.grid.vertical.centres) : null).toEqual([10, 100]);
    expect(chl.grid.horizontal.nx * chl.grid.horizontal.ny).toBe(24);
    // level 1, first cell holds the _FillValue -999 (make_groups.py): missing; the rest as stored
    const level1 = await chl.readLevel(0, 1);
    expect(Number.isNaN(level1[0])).toBe(true);
    expect(Array.from(level1.slice(1))).toEqual(expected['/bgc/chl'].data.slice(25, 48).map((x) => Math.fround(x)));
    await chl.close?.();
    // packing: value = raw * scale_factor + add_offset (CF 1.10 §8.1), float32 attributes: float32 result
    const no3 = await openField(FILE, '/bgc/deep/no3');
    const raw = expected['/bgc/deep/no3'].data;
    const level0 = await no3.readLevel(0, 0);
    expect(Array.from(level0)).toEqual(raw.slice(0, 24).map((r) => Math.fround(Math.fround(r * Math.fround(0.01)) + 20)));
    await no3.close?.();
  });

  it('an unknown group path is one sentence naming the file and the path', async () => {
    await expect(openField(FILE, '/bgx/chl')).rejects.toMatchObject({
      code: 'E_VARIABLE',
      message: `${FILE}, variable '/bgx/chl': there is no group '/bgx' in this file (its groups: /bgc, /phys, /bgc/deep).`,
    });
    const ds = await openDataset(FILE);
    await expect(ds.read('/bgc/nothere/chl')).rejects.toMatchObject({ code: 'E_VARIABLE', message: expect.stringMatching(/there is no group '\/bgc\/nothere'/) });
    await expect(ds.read('/bgc/nothing')).rejects.toMatchObject({ code: 'E_VARIABLE', message: expect.stringMatching(/there is no variable '\/bgc\/nothing'/) });
    await ds.close();
  });

  it('a recipe names variables by path: the same variable against itself compares every valid cell with no bias', async () => {
    const recipe = validateRecipe(
      { reference: { label: 'R', file: 'groups_nc4.nc', variables: { chl: '/bgc/chl' } }, runs: [{ label: 'A', file: 'groups_nc4.nc', variables: { chl: 'bgc/chl' } }] },
      DIR,
    );
    const cacheDir = mkdtempSync(join(tmpdir(), 'sw-groups-'));
    const { rows } = await runComparison(recipe, { cacheDir }).finally(() => rmSync(cacheDir, { recursive: true, force: true }));
    const all = rows.find((r) => r.region === 'global' && r.layer === 'all')!;
    // make_groups.py: 2 levels x 4 x 6 cells, one holding the _FillValue
    expect(all.n).toBe(47);
    expect(all.bias).toBe(0);
    expect(all.model_mean).toBe(all.ref_mean);
  });

  it('a recipe naming an unknown group fails with one sentence naming the file and the path', async () => {
    const recipe = validateRecipe(
      { reference: { label: 'R', file: 'groups_nc4.nc', variables: { chl: '/bgc/chl' } }, runs: [{ label: 'A', file: 'groups_nc4.nc', variables: { chl: '/bcg/chl' } }] },
      DIR,
    );
    await expect(runComparison(recipe)).rejects.toMatchObject({
      code: 'E_VARIABLE',
      message: expect.stringMatching(/groups_nc4\.nc, variable '\/bcg\/chl': there is no group '\/bcg' in this file \(its groups: \/bgc, \/phys, \/bgc\/deep\)\.$/),
    });
  });

  it('groups nested beyond the depth limit are not read, and the notes say which', async () => {
    const ds = await openDataset(join(DIR, 'deep_nc4.nc'));
    const path = (n: number): string => Array.from({ length: n }, (_, i) => `/g${i + 1}`).join('');
    expect(ds.groups).toHaveLength(1 + MAX_GROUP_DEPTH);
    // make_groups.py writes v = [level, -level] at every level
    expect(plain(await ds.read(`${path(MAX_GROUP_DEPTH)}/v`))).toEqual([MAX_GROUP_DEPTH, -MAX_GROUP_DEPTH]);
    expect(ds.notes).toEqual([`groups nested deeper than ${MAX_GROUP_DEPTH} levels or beyond the first ${MAX_GROUPS} are not read: ${path(MAX_GROUP_DEPTH + 1)}.`]);
    await expect(ds.read(`${path(MAX_GROUP_DEPTH + 1)}/v`)).rejects.toMatchObject({ code: 'E_VARIABLE', message: expect.stringContaining(`there is no group '${path(MAX_GROUP_DEPTH + 1)}'`) });
    await ds.close();
  });
});
