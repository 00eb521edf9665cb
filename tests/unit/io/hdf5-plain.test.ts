/**
 * HDF5 files that are not NetCDF-4, written by the HDF5 library itself (through h5wasm; see
 * tests/fixtures/io/make_hdf5.mjs): they open when they hold datasets, with a note that their
 * dimensions have no names; values equal those handed to the HDF5 library when writing.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Netcdf4Dataset } from '../../../app/io/netcdf4.js';
import { openDataset } from '../../../app/io/open.js';
import { fixture, plain } from './expected.js';

const expected = JSON.parse(readFileSync(fixture('expected_hdf5.json'), 'utf8')) as Record<string, { shape: number[]; dtype: string; data: number[] }>;

describe('plain HDF5 (no dimension scales, newest file format)', () => {
  it('opens, names each unnamed dimension after its dataset and says so', async () => {
    const ds = await openDataset(fixture('plain_hdf5.h5'));
    const grid = ds.variables.find((v) => v.name === 'grid');
    expect(grid?.dims).toEqual(['grid_dim0', 'grid_dim1']);
    expect(grid?.note).toMatch(/without names/);
    expect(grid?.attrs).toEqual({ long_name: 'a plain HDF5 grid' });
    expect(ds.attrs).toEqual({ title: 'plain HDF5, not NetCDF-4' });
    expect(ds.notes?.some((n) => n.includes('/grid') && n.includes('without names'))).toBe(true);
    await ds.close();
  });

  it('reads every dataset with the values written, through whatever index the file uses', async () => {
    const ds = (await openDataset(fixture('plain_hdf5.h5'))) as Netcdf4Dataset;
    for (const [name, e] of Object.entries(expected)) {
      const v = ds.variables.find((x) => x.name === name);
      expect(v?.shape).toEqual(e.shape);
      expect(v?.dtype).toBe(e.dtype);
      expect(plain(await ds.read(name)), `${name} via ${await ds.readRoute(name)}`).toEqual(e.data);
    }
    // the deflated 2x3 chunks of 'grid' sit behind a fixed-array index (newest file format): read by us
    expect(await ds.readRoute('grid')).toBe('chunked');
    expect(plain(await ds.read('grid', [1, 2], [2, 3]))).toEqual([1 * 6 + 2, 1 * 6 + 3, 1 * 6 + 4, 2 * 6 + 2, 2 * 6 + 3, 2 * 6 + 4].map((i) => i * 0.5 - 3));
    await ds.close();
  });

  it('an HDF5 file with nothing usable: one E_FORMAT sentence naming the file', async () => {
    const path = fixture('groups_only.h5');
    await expect(openDataset(path)).rejects.toMatchObject({
      code: 'E_FORMAT',
      message: expect.stringMatching(new RegExp(`^${path.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}: this HDF5 file holds no datasets we can read`)),
    });
  });
});
