/**
 * NetCDF-4 / HDF5 reader against files written by ncgen (-k nc4, -k nc7) from CDL and by
 * netCDF4-python (deflate + shuffle, chunked, int16 packed, _FillValue, missing_value, a group),
 * with expected values read by netCDF4-python (raw, no CF decoding); see tests/fixtures/io/make_fixtures.py.
 */
import { describe, expect, it } from 'vitest';
import type { Netcdf4Dataset } from '../../../app/io/netcdf4.js';
import { openDataset } from '../../../app/io/open.js';
import { expectedNc, expectedSlab, fixture, plain } from './expected.js';

const CASES = ['netcdf4_ncgen', 'netcdf4_classic_ncgen', 'python_nc4', 'chunks_nc4'];

describe.each(CASES)('%s.nc read as netCDF4-python reads it', (name) => {
  const exp = expectedNc(name);

  it('has the dimensions (in NetCDF order) and global attributes', async () => {
    const ds = await openDataset(fixture(`${name}.nc`));
    expect(ds.format).toBe('netcdf4-hdf5');
    // the root group's dimensions (those of other groups are named by path: netcdf4-groups.test.ts)
    expect(ds.dimensions.filter((d) => !d.name.startsWith('/'))).toEqual(exp.dimensions);
    expect(ds.attrs).toEqual(exp.attrs);
    await ds.close();
  });

  it('has every root-group variable with dims, shape, dtype, attributes and raw values', async () => {
    const ds = await openDataset(fixture(`${name}.nc`));
    const routes: Record<string, string> = {};
    const root = ds.variables.filter((v) => !v.name.startsWith('/'));
    expect(root.map((v) => v.name).sort()).toEqual(Object.keys(exp.variables).sort());
    for (const v of root) {
      const e = exp.variables[v.name];
      expect({ name: v.name, dims: v.dims, shape: v.shape, dtype: v.dtype, attrs: v.attrs }).toEqual({
        name: v.name, dims: e.dims, shape: e.shape, dtype: e.dtype, attrs: e.attrs,
      });
      expect(plain(await ds.read(v.name)), v.name).toEqual(e.data);
      routes[v.name] = (await (ds as Netcdf4Dataset).readRoute(v.name)) ?? '';
    }
    await ds.close();
    // every layout these writers produce is read by our own chunk reader, not by the library fallback
    expect(Object.values(routes).filter((r) => r !== 'chunked' && r !== 'contiguous')).toEqual([]);
  });
});

describe('NetCDF-4 hyperslabs', () => {
  it.each([
    ['o2', [2, 1, 0, 0], [1, 1, 6, 8]],
    ['o2', [0, 2, 1, 3], [3, 2, 4, 5]],
    ['po4', [1, 0, 0, 0], [1, 4, 6, 8]],
    ['mask2d', [2, 1], [3, 6]],
  ] as [string, number[], number[]][])('python_nc4 %s[%j + %j] equals the same cut of netCDF4-python values', async (v, start, count) => {
    const ds = await openDataset(fixture('python_nc4.nc'));
    expect(plain(await ds.read(v, start, count))).toEqual(expectedSlab(expectedNc('python_nc4').variables[v], start, count));
    await ds.close();
  });

  it.each([
    ['field', [1, 2, 3], [3, 4, 5]], // crosses chunk edges of a (2, 3, 4)-chunked, filtered variable
    ['field', [4, 6, 8], [1, 1, 1]], // the partial corner chunk
    ['plain', [2, 0, 0], [1, 7, 9]], // contiguous layout
    ['unfiltered', [0, 3, 2], [5, 3, 4]], // chunked without filters
  ] as [string, number[], number[]][])('chunks_nc4 %s[%j + %j] equals the same cut of netCDF4-python values', async (v, start, count) => {
    const ds = await openDataset(fixture('chunks_nc4.nc'));
    expect(plain(await ds.read(v, start, count))).toEqual(expectedSlab(expectedNc('chunks_nc4').variables[v], start, count));
    await ds.close();
  });

  it('reads level after level of the same chunks (cache) with the same values', async () => {
    const ds = await openDataset(fixture('chunks_nc4.nc'));
    const e = expectedNc('chunks_nc4').variables.field;
    for (let z = 0; z < 5; z++) expect(plain(await ds.read('field', [z, 0, 0], [1, 7, 9]))).toEqual(expectedSlab(e, [z, 0, 0], [1, 7, 9]));
    await ds.close();
  });

  it('reads whole-chunk levels one after the other (read ahead on the thread pool) with the same values', async () => {
    const ds = await openDataset(fixture('python_nc4.nc'));
    const e = expectedNc('python_nc4').variables.o2;
    for (let t = 0; t < 3; t++) {
      for (let k = 0; k < 4; k++) {
        expect(plain(await ds.read('o2', [t, k, 0, 0], [1, 1, 6, 8]))).toEqual(expectedSlab(e, [t, k, 0, 0], [1, 1, 6, 8]));
      }
    }
    await ds.close();
  });

  it('reads chunks and contiguous data itself, without the HDF5 library', async () => {
    const py = (await openDataset(fixture('python_nc4.nc'))) as Netcdf4Dataset;
    expect(await py.readRoute('o2')).toBe('chunked');
    expect(await py.readRoute('lat')).toBe('contiguous');
    await py.close();
    const ch = (await openDataset(fixture('chunks_nc4.nc'))) as Netcdf4Dataset;
    expect(await ch.readRoute('field')).toBe('chunked');
    expect(await ch.readRoute('plain')).toBe('contiguous');
    expect(await ch.readRoute('unfiltered')).toBe('chunked');
    await ch.close();
  });

  it('reads the group /extra too, by path, with no note of anything unread', async () => {
    const ds = await openDataset(fixture('python_nc4.nc'));
    expect(ds.notes).toEqual([]);
    expect(ds.groups).toEqual(['/', '/extra']);
    // make_fixtures.py writes inner = [1, 2] on the group's own dimension n
    expect(ds.variables.find((v) => v.name === '/extra/inner')?.dims).toEqual(['/extra/n']);
    expect(plain(await ds.read('/extra/inner'))).toEqual([1, 2]);
    await ds.close();
  });

  it('returns the unlimited dimension as unlimited with its current length', async () => {
    const ds = await openDataset(fixture('python_nc4.nc'));
    expect(ds.dimensions.find((d) => d.name === 'time')).toEqual({ name: 'time', size: 3, unlimited: true });
    await ds.close();
  });
});
