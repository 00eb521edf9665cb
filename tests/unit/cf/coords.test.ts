import { describe, expect, it } from 'vitest';
import { MemoryDataset, type MemoryVariable } from '../../../app/io/memory-dataset.js';
import type { Attributes, RawArray, RawDimension } from '../../../app/io/types.js';
import { fieldFromDataset } from '../../../app/cf/open-field.js';
import { coordinateRole } from '../../../app/cf/coords.js';
import { StillwaterError } from '../../../app/errors.js';

// Coordinate discovery per CF 1.10 §4 (axis, units, standard_name, positive) and §5 (coordinates attribute).
function mv(name: string, dims: string[], shape: number[], data: RawArray, attrs: Attributes = {}): MemoryVariable {
  const dtype = data instanceof Float32Array ? 'f4' : data instanceof Int16Array ? 'i2' : 'f8';
  return { name, dims, shape, dtype, attrs, data };
}
function dims(list: [string, number][]): RawDimension[] {
  return list.map(([name, size]) => ({ name, size, unlimited: false }));
}
const f64 = (a: number[]) => Float64Array.from(a);

async function errorOf(p: Promise<unknown>): Promise<StillwaterError> {
  try {
    await p;
  } catch (e) {
    return e as StillwaterError;
  }
  throw new Error('no error');
}

describe('coordinate roles', () => {
  const role = (attrs: Attributes, name = 'c', d = ['c']) => coordinateRole({ name, dims: d, shape: [2], dtype: 'f8', attrs });
  it('units spellings of longitude and latitude (CF 1.10 §4.1)', () => {
    for (const u of ['degrees_east', 'degree_east', 'degree_E', 'degrees_E', 'degreeE', 'degreesE']) expect(role({ units: u })).toBe('lon');
    for (const u of ['degrees_north', 'degree_north', 'degree_N', 'degrees_N', 'degreeN', 'degreesN']) expect(role({ units: u })).toBe('lat');
  });
  it('standard_name, axis, positive and time units', () => {
    expect(role({ standard_name: 'latitude' })).toBe('lat');
    expect(role({ axis: 'Z', units: 'm' })).toBe('vertical');
    expect(role({ positive: 'down', units: 'm' })).toBe('vertical');
    expect(role({ units: 'days since 1850-01-01' })).toBe('time');
    expect(role({ units: 'degrees', axis: 'X' }, 'x')).toBe('lon');
  });
  it('rotated-pole axes are not geographic (CF 1.10 §5.6)', () => {
    expect(role({ standard_name: 'grid_longitude', units: 'degrees', axis: 'X' })).toBeUndefined();
  });
  it('names as the last resort', () => {
    expect(role({}, 'lon')).toBe('lon');
    expect(role({}, 'nav_lat', ['y', 'x'])).toBe('lat');
    expect(role({ units: 'm' }, 'deptht')).toBe('vertical');
    expect(role({ units: 'mmol m-3' }, 'lon')).toBeUndefined();
  });
});

describe('fieldFromDataset on in-memory datasets', () => {
  it('(depth, lat, lon) with a height coordinate positive up, descending, and a singleton extra dimension', async () => {
    const ds = new MemoryDataset('mem.nc', dims([['one', 1], ['z', 2], ['lat', 2], ['lon', 3]]), [
      mv('z', ['z'], [2], f64([-50, -10]), { standard_name: 'height', units: 'm' }),
      mv('lat', ['lat'], [2], f64([-10, 10]), { units: 'degrees_north' }),
      mv('lon', ['lon'], [3], f64([0, 120, 240]), { units: 'degrees_east' }),
      mv('v', ['one', 'z', 'lat', 'lon'], [1, 2, 2, 3], Float32Array.from([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]), { units: 'mmol m-3' }),
    ]);
    const f = await fieldFromDataset(ds, 'v');
    expect(Array.from(f.grid.vertical!.centres)).toEqual([10, 50]);
    expect(Array.from(await f.readLevel(0, 0))).toEqual([7, 8, 9, 10, 11, 12]); // 10 m is the file's second level
    expect(f.nt).toBe(1);
    expect(f.time).toBeNull();
  });

  it('(lon, lat) order is transposed to rows of latitude', async () => {
    const ds = new MemoryDataset('mem.nc', dims([['lon', 3], ['lat', 2]]), [
      mv('lat', ['lat'], [2], f64([-10, 10]), { units: 'degrees_north' }),
      mv('lon', ['lon'], [3], f64([0, 120, 240]), { units: 'degrees_east' }),
      mv('v', ['lon', 'lat'], [3, 2], Float32Array.from([1, 2, 3, 4, 5, 6]), { units: 'K' }),
    ]);
    const f = await fieldFromDataset(ds, 'v');
    expect(Array.from(await f.readLevel(0, 0))).toEqual([1, 3, 5, 2, 4, 6]);
  });

  it('2-D coordinates found without a coordinates attribute; no vertical axis', async () => {
    const ds = new MemoryDataset('mem.nc', dims([['t', 2], ['y', 2], ['x', 2]]), [
      mv('t', ['t'], [2], f64([0, 1]), { units: 'days since 2000-01-01', calendar: '360_day' }),
      mv('nav_lon', ['y', 'x'], [2, 2], f64([0, 2, 0.5, 2.5])),
      mv('nav_lat', ['y', 'x'], [2, 2], f64([0, -0.5, 2, 1.5])),
      mv('v', ['t', 'y', 'x'], [2, 2, 2], Float32Array.from([1, 2, 3, 4, 5, 6, 7, 8]), { units: '1' }),
    ]);
    const f = await fieldFromDataset(ds, 'v');
    expect(f.grid.horizontal.kind).toBe('curvilinear');
    expect(f.grid.horizontal.boundsDerived).toBe(true);
    expect(Array.from(await f.readLevel(1, 0))).toEqual([5, 6, 7, 8]);
    expect(f.time!.values[1].iso).toBe('2000-01-02T00:00:00');
  });

  it('a variable without coordinates: one sentence naming file and variable (E_COORDS)', async () => {
    const ds = new MemoryDataset('/data/run.nc', dims([['a', 2], ['b', 2]]), [mv('v', ['a', 'b'], [2, 2], Float32Array.from([1, 2, 3, 4]))]);
    const e = await errorOf(fieldFromDataset(ds, 'v'));
    expect(e.code).toBe('E_COORDS');
    expect(e.message).toBe("/data/run.nc, variable 'v': has no longitude and latitude coordinates (dimensions: a, b); CF asks for coordinate variables or a 'coordinates' attribute.");
  });

  it('non-monotonic latitude and a non-singleton unknown dimension are E_COORDS', async () => {
    const base = [
      mv('lat', ['lat'], [3], f64([0, 10, 5]), { units: 'degrees_north' }),
      mv('lon', ['lon'], [2], f64([0, 10]), { units: 'degrees_east' }),
    ];
    const ds = new MemoryDataset('m.nc', dims([['lat', 3], ['lon', 2], ['band', 2]]), [
      ...base,
      mv('v', ['lat', 'lon'], [3, 2], new Float32Array(6), { units: '1' }),
      mv('w', ['band', 'lon'], [2, 2], new Float32Array(4), { units: '1' }),
    ]);
    const e = await errorOf(fieldFromDataset(ds, 'v'));
    expect(e.code).toBe('E_COORDS');
    expect(e.message).toMatch(/m\.nc, variable 'v': its latitude 'lat' is not monotonic \(it breaks at index 2\)/);
  });

  it('unknown units and a missing variable name the file and variable', async () => {
    const ds = new MemoryDataset('m.nc', dims([['lat', 1], ['lon', 1]]), [
      mv('lat', ['lat'], [1], f64([0]), { units: 'degrees_north' }),
      mv('lon', ['lon'], [1], f64([0]), { units: 'degrees_east' }),
      mv('v', ['lat', 'lon'], [1, 1], new Float32Array(1), { units: 'xyz' }),
    ]);
    const u = await errorOf(fieldFromDataset(ds, 'v'));
    expect([u.code, u.message]).toEqual(['E_UNITS', "m.nc, variable 'v': unknown units 'xyz'."]);
    const m = await errorOf(fieldFromDataset(ds, 'nope'));
    expect(m.code).toBe('E_VARIABLE');
    expect(m.message).toContain("there is no variable 'nope'");
  });

  it('readLevel reads one slab per call, never the whole variable', async () => {
    const ds = new MemoryDataset('m.nc', dims([['z', 3], ['lat', 2], ['lon', 2]]), [
      mv('z', ['z'], [3], f64([5, 15, 25]), { units: 'm', positive: 'down' }),
      mv('lat', ['lat'], [2], f64([0, 1]), { units: 'degrees_north' }),
      mv('lon', ['lon'], [2], f64([0, 1]), { units: 'degrees_east' }),
      mv('v', ['z', 'lat', 'lon'], [3, 2, 2], new Float32Array(12), { units: 'm' }),
    ]);
    const f = await fieldFromDataset(ds, 'v');
    const counts: number[][] = [];
    const read = ds.read.bind(ds);
    ds.read = async (name, start, count) => {
      counts.push(count ?? []);
      return read(name, start, count);
    };
    await f.readLevel(0, 2);
    expect(counts).toEqual([[1, 2, 2]]);
    await expect(f.readLevel(0, 3)).rejects.toThrow(/has no level 3/);
  });
});
