/**
 * NetCDF classic reader (CDF-1, CDF-2, CDF-5) against files written by ncgen (netcdf-bin) from CDL
 * and by netCDF4-python, with expected values read by netCDF4-python (raw, no CF decoding);
 * see tests/fixtures/io/make_fixtures.py.
 */
import { describe, expect, it } from 'vitest';
import { openDataset } from '../../../app/io/open.js';
import { expectedNc, expectedSlab, fixture, plain } from './expected.js';

const CASES: [string, string][] = [
  ['classic_cdf1', 'netcdf3-classic'],
  ['offset64_cdf2', 'netcdf3-64bit-offset'],
  ['cdf5', 'netcdf3-cdf5'],
  ['lone_record', 'netcdf3-classic'],
  ['python_classic', 'netcdf3-classic'],
  ['python_cdf5', 'netcdf3-cdf5'],
];

describe.each(CASES)('%s.nc read as netCDF4-python reads it', (name, format) => {
  const exp = expectedNc(name);

  it('has the format, dimensions and global attributes', async () => {
    const ds = await openDataset(fixture(`${name}.nc`));
    expect(ds.format).toBe(format);
    expect(ds.dimensions).toEqual(exp.dimensions);
    expect(ds.attrs).toEqual(exp.attrs);
    await ds.close();
  });

  it('has every variable with its dims, shape, dtype, attributes and raw values', async () => {
    const ds = await openDataset(fixture(`${name}.nc`));
    expect(ds.variables.map((v) => v.name).sort()).toEqual(Object.keys(exp.variables).sort());
    for (const v of ds.variables) {
      const e = exp.variables[v.name];
      expect({ name: v.name, dims: v.dims, shape: v.shape, dtype: v.dtype, attrs: v.attrs }).toEqual({
        name: v.name, dims: e.dims, shape: e.shape, dtype: e.dtype, attrs: e.attrs,
      });
      expect(plain(await ds.read(v.name)), v.name).toEqual(e.data);
    }
    await ds.close();
  });
});

describe('hyperslabs of record variables (interleaved records)', () => {
  const exp = expectedNc('classic_cdf1');
  const temp = exp.variables.temp;
  const slabs: [number[], number[]][] = [
    [[1, 2, 0, 0], [1, 1, 4, 5]], // one level: one contiguous range
    [[0, 1, 0, 0], [2, 2, 4, 5]], // across records
    [[1, 0, 1, 2], [1, 3, 2, 3]], // an inner box
    [[0, 0, 3, 4], [2, 3, 1, 1]], // one column through all records
  ];
  it.each(slabs)('temp[%j + %j] equals the same cut of netCDF4-python values', async (start, count) => {
    const ds = await openDataset(fixture('classic_cdf1.nc'));
    expect(plain(await ds.read('temp', start, count))).toEqual(expectedSlab(temp, start, count));
    await ds.close();
  });

  it('reads the int16 record variable sst per record (CDF-5 too)', async () => {
    for (const name of ['classic_cdf1', 'cdf5']) {
      const ds = await openDataset(fixture(`${name}.nc`));
      const e = expectedNc(name).variables.sst;
      expect(plain(await ds.read('sst', [1, 0, 0], [1, 4, 5]))).toEqual(expectedSlab(e, [1, 0, 0], [1, 4, 5]));
      await ds.close();
    }
  });

  it('returns typed arrays of the stored type (CDF-5 unsigned and 64-bit types)', async () => {
    const ds = await openDataset(fixture('cdf5.nc'));
    expect(await ds.read('ub')).toBeInstanceOf(Uint8Array);
    expect(await ds.read('us')).toBeInstanceOf(Uint16Array);
    expect(await ds.read('ui')).toBeInstanceOf(Uint32Array);
    expect(await ds.read('u64')).toBeInstanceOf(BigUint64Array);
    expect(await ds.read('temp', [0, 0, 0, 0], [1, 1, 1, 1])).toBeInstanceOf(Float32Array);
    await ds.close();
    const py = await openDataset(fixture('python_cdf5.nc'));
    expect(await py.read('big')).toBeInstanceOf(BigInt64Array);
    expect(plain(await py.read('big', [2, 0], [1, 2]))).toEqual([-(2 ** 53) + 1, -1]);
    await py.close();
  });

  it('reports an unknown variable and a slab outside the shape in one sentence', async () => {
    const ds = await openDataset(fixture('classic_cdf1.nc'));
    await expect(ds.read('nope')).rejects.toMatchObject({ code: 'E_VARIABLE', message: expect.stringContaining("'nope'") });
    await expect(ds.read('temp', [0, 0, 0, 0], [3, 1, 1, 1])).rejects.toMatchObject({ code: 'E_INPUT' });
    await ds.close();
  });
});
