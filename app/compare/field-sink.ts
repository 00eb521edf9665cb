/** Where the fields of a comparison go when they are kept (model on the common grid, and model − reference). */
import type { Grid } from '../grid/types.js';

export interface FieldSinkInfo {
  run: string;
  variable: string;
  units: string;
  grid: Grid;
}

export interface LevelSink {
  /** `reference` is the reference's level k on the same grid (for sinks that draw it too) */
  write(k: number, model: Float32Array, difference: Float32Array, reference?: Float32Array): Promise<void>;
  close(): Promise<void>;
  abort(): Promise<void>;
}

export type FieldSinkFactory = (info: FieldSinkInfo) => Promise<LevelSink>;
