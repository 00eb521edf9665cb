import { describe, expect, it } from 'vitest';
import { MemoryDataset, type MemoryVariable } from '../../../app/io/memory-dataset.js';
import type { Attributes, RawArray } from '../../../app/io/types.js';
import { inspectDataset } from '../../../app/cf/inspect.js';

function mv(name: string, dims: string[], shape: number[], data: RawArray, attrs: Attributes = {}): MemoryVariable {
  return { name, dims, shape, dtype: data instanceof Float32Array ? 'f4' : 'f8', attrs, data };
}
const coords = [
  mv('lat', ['lat'], [2], Float64Array.from([10, -10]), { units: 'degrees_north' }),
  mv('lon', ['lon'], [2], Float64Array.from([0, 180]), { units: 'degrees_east' }),
];

describe('inspectDataset', () => {
  it('stats are over decoded values: fill values excluded, packing applied (CF 1.10 §2.5.1, §8.1)', async () => {
    const ds = new MemoryDataset('m.nc', [{ name: 'lat', size: 2, unlimited: false }, { name: 'lon', size: 2, unlimited: false }], [
      ...coords,
      mv('v', ['lat', 'lon'], [2, 2], Float32Array.from([1, 2, -99, 5]), { units: 'degC', _FillValue: [-99], scale_factor: [2], add_offset: [1] }),
    ]);
    const r = await inspectDataset(ds, { stats: true });
    const v = r.variables.find((x) => x.name === 'v')!;
    expect(v.stats).toEqual({ min: 3, max: 11, mean: (3 + 5 + 11) / 3, count: 3, total: 4 });
    expect(r.grid).toMatchObject({ kind: 'rectilinear', nx: 2, ny: 2, nz: 1, lat: [-10, 10], lon: [0, 180] });
    expect(r.variables.find((x) => x.name === 'lat')!.role).toBe('coordinate');
  });
  it('a variable off the grid is reported with its problem when another one is usable', async () => {
    const ds = new MemoryDataset('m.nc', [{ name: 'lat', size: 2, unlimited: false }, { name: 'lon', size: 2, unlimited: false }, { name: 'k', size: 2, unlimited: false }], [
      ...coords,
      mv('good', ['lat', 'lon'], [2, 2], Float32Array.from([1, 2, 3, 4]), { units: 'm' }),
      mv('odd', ['k', 'lon'], [2, 2], Float32Array.from([1, 2, 3, NaN]), { units: 'm' }),
    ]);
    const r = await inspectDataset(ds, { stats: true });
    const odd = r.variables.find((x) => x.name === 'odd')!;
    expect(odd.problem).toMatch(/m\.nc, variable 'odd': has no longitude and latitude coordinates/);
    expect(odd.stats).toMatchObject({ count: 3, total: 4, max: 3 });
    expect(r.grid!.variables).toEqual(['good']);
  });
  it('when no data variable is usable, the first problem is bad input', async () => {
    const ds = new MemoryDataset('m.nc', [{ name: 'lat', size: 2, unlimited: false }, { name: 'lon', size: 2, unlimited: false }], [
      ...coords,
      mv('v', ['lat', 'lon'], [2, 2], Float32Array.from([1, 2, 3, 4]), { units: 'xyz' }),
    ]);
    await expect(inspectDataset(ds)).rejects.toThrow("m.nc, variable 'v': unknown units 'xyz'.");
  });
});
