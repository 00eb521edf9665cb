/**
 * What the reference libraries read from tests/fixtures/io/*: written by
 * tests/fixtures/io/make_fixtures.py from netCDF4-python (auto mask/scale off: raw values)
 * and GDAL's Python bindings.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { copySlab } from '../../../app/io/slab.js';

export const FIXTURES = join(__dirname, '..', '..', 'fixtures', 'io');

export type Num = number | 'NaN';
export interface ExpectedVariable {
  dims: string[];
  shape: number[];
  dtype: string;
  attrs: Record<string, string | Num[]>;
  data: Num[];
}
export interface ExpectedNc {
  file_format: string;
  dimensions: { name: string; size: number; unlimited: boolean }[];
  attrs: Record<string, string | Num[]>;
  variables: Record<string, ExpectedVariable>;
}
export interface ExpectedTif {
  width: number;
  height: number;
  geotransform: number[];
  epsg: number;
  geographic: boolean;
  dtype: string;
  bands: { nodata: number | null; data: Num[] }[];
}

const all = JSON.parse(readFileSync(join(FIXTURES, 'expected.json'), 'utf8')) as Record<string, unknown>;
export function expectedNc(name: string): ExpectedNc {
  return all[name] as ExpectedNc;
}
export function expectedTif(name: string): ExpectedTif {
  return all[name] as ExpectedTif;
}
export function fixture(name: string): string {
  return join(FIXTURES, name);
}

/** Plain numbers of a typed array (NaN spelled as in expected.json). */
export function plain(a: ArrayLike<number | bigint>): Num[] {
  return Array.from(a as ArrayLike<number>, (x) => (Number.isNaN(Number(x)) ? 'NaN' : Number(x)));
}

/** The expected values of a hyperslab, cut from the whole expected array. */
export function expectedSlab(v: ExpectedVariable, start: number[], count: number[]): Num[] {
  const whole = Float64Array.from(v.data, (x) => (x === 'NaN' ? NaN : x));
  return plain(copySlab(whole, v.shape, start, count));
}
