/**
 * Full precision against netCDF4-python (Debian's python3-netcdf4): float64, int64 and uint32 data and
 * packed data decode to exactly the doubles netCDF4-python gives, in the type it gives (CF 1.10 §8.1 for
 * float data packed with double attributes, where netCDF4-python stays in single precision: see
 * tests/fixtures/precision/make_precision.py), and numeric attributes keep their stored type.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fieldFromDataset } from '../../../app/cf/open-field.js';
import { openDataset } from '../../../app/io/open.js';
import { fieldStats } from '../../../app/cf/inspect.js';

const DIR = join(__dirname, '..', '..', 'fixtures', 'precision');
const expected = JSON.parse(readFileSync(join(DIR, 'expected.json'), 'utf8')) as Record<
  string,
  Record<string, { decoded: string; values: (number | null)[]; attr_types: Record<string, string> }>
>;
const NUMPY_TO_OURS: Record<string, 'f4' | 'f8'> = {
  float32: 'f4', float64: 'f8',
  // netCDF4-python keeps unpacked integers as integers; 32- and 64-bit ones need doubles to stay exact
  int64: 'f8', uint32: 'f8',
};

for (const file of Object.keys(expected)) {
  describe(`${file}: values exactly as netCDF4-python decodes them`, () => {
    for (const [name, exp] of Object.entries(expected[file])) {
      it(`${name} (${exp.decoded})`, async () => {
        const ds = await openDataset(join(DIR, file));
        try {
          const v = ds.variables.find((x) => x.name === name)!;
          for (const [key, type] of Object.entries(exp.attr_types)) expect(v.attrTypes?.[key]).toBe(type);
          const f = await fieldFromDataset(ds, name);
          expect(f.dtype).toBe(NUMPY_TO_OURS[exp.decoded]);
          const level = await f.readLevelExact!(0, 0);
          expect(level).toBeInstanceOf(f.dtype === 'f8' ? Float64Array : Float32Array);
          expect(Array.from(level, (x) => (Number.isNaN(x) ? null : x))).toEqual(exp.values);
          // the statistics `inspect` reports are taken in the same precision
          const valid = exp.values.filter((x): x is number => x !== null);
          const stats = await fieldStats(f);
          expect(stats.min).toBe(Math.min(...valid));
          expect(stats.max).toBe(Math.max(...valid));
        } finally {
          await ds.close();
        }
      });
    }
  });
}
