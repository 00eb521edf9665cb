import { StillwaterError } from '../errors.js';
import type { Attributes, RawArray, RawDataset, RawDimension, RawVariable } from './types.js';
import { checkSlab, copySlab } from './slab.js';

export interface MemoryVariable extends RawVariable {
  data: RawArray;
}

/** A dataset held in memory: for tests and for fields computed by the tool itself. */
export class MemoryDataset implements RawDataset {
  readonly format = 'memory' as const;
  constructor(
    readonly path: string,
    readonly dimensions: RawDimension[],
    readonly variables: MemoryVariable[],
    readonly attrs: Attributes = {},
  ) {}

  async read(name: string, start?: number[], count?: number[]): Promise<RawArray> {
    const v = this.variables.find((x) => x.name === name);
    if (!v) throw new StillwaterError('E_VARIABLE', `${this.path}: there is no variable '${name}'.`, { file: this.path, variable: name });
    const { s, c } = checkSlab(this.path, v, start, count);
    return copySlab(v.data, v.shape, s, c);
  }

  async close(): Promise<void> {}
}
