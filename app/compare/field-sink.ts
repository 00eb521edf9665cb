/** Where the fields of a comparison go when they are kept (model on the common grid, and model − reference). */
import type { Grid } from '../grid/types.js';

export interface FieldSinkInfo {
  run: string;
  variable: string;
  units: string;
  grid: Grid;
  /**
   * The periods the comparison reports (annual, then months and seasons when the recipe asks for them).
   * A sink that keeps more than the year says so with writePeriod.
   */
  periods?: readonly string[];
}

export interface LevelSink {
  /** `reference` is the reference's level k on the same grid (for sinks that draw it too) */
  write(k: number, model: Float32Array, difference: Float32Array, reference?: Float32Array): Promise<void>;
  /** level k of period p (an index into FieldSinkInfo.periods); when present, called for every period instead of write */
  writePeriod?(k: number, p: number, model: Float32Array, difference: Float32Array): Promise<void>;
  close(): Promise<void>;
  abort(): Promise<void>;
}

export type FieldSinkFactory = (info: FieldSinkInfo) => Promise<LevelSink>;
