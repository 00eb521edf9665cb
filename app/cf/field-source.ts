import type { Grid } from '../grid/types.js';
import type { FileGrid } from './file-grid.js';
import type { ParsedUnits } from './units.js';

/** One decoded time coordinate value. */
export interface DecodedTime {
  /** value in the file's units */
  value: number;
  /** ISO-like date text in the file's calendar, e.g. "0001-07-16T12:00:00" */
  iso: string;
  /** year as a fractional number in the file's calendar (for spin-up axes) */
  yearFraction: number;
}

export interface TimeAxis {
  name: string;
  units: string;
  calendar: string;
  values: DecodedTime[];
  /** the steps' CF bounds in the file's units, [start, end] per step (absent when the file has none) */
  bounds?: Float64Array;
  /** the bounds are CF climatology bounds (CF 1.10 §7.4): a step is a time of year over many years */
  climatology?: boolean;
}

/**
 * A CF-decoded variable on its grid, read lazily one horizontal level at a time.
 * Values are in the file's units (after packing), NaN where missing or outside valid range.
 */
export interface FieldSource {
  file: string;
  variable: string;
  units: ParsedUnits;
  standardName?: string;
  longName?: string;
  grid: Grid;
  /** number of time steps (1 when there is no time dimension) */
  nt: number;
  time: TimeAxis | null;
  /**
   * The type decoded values have in full: Float64 where the stored or unpacked type needs it, as CF 1.10
   * §8.1 and netCDF4-python decide (doubles, 32- and 64-bit integers, packing attributes in double).
   * Absent: single precision (fields computed in memory).
   */
  dtype?: 'f4' | 'f8';
  /** one horizontal level (ny * nx), row-major, longitude fastest, latitude increasing, in single precision (what computations use) */
  readLevel(t: number, k: number): Promise<Float32Array>;
  /** the same level in the field's full `dtype` (what reports of values and exact outputs use) */
  readLevelExact?(t: number, k: number): Promise<Float32Array | Float64Array>;
  /** the grid's coordinates as the file stores them (names, order, types, attributes, bounds), read on request */
  fileGrid?(): Promise<FileGrid>;
  /** release the file behind the field (set by openField; absent for fields over a caller's dataset) */
  close?(): Promise<void>;
}
