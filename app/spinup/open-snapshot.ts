import { fieldFromDataset } from '../cf/open-field.js';
import { openDataset } from '../io/open.js';
import { findVariable } from '../io/types.js';
import type { SnapshotHandle } from './series.js';

/** A snapshot file opened once; every tracer's field is read lazily from the same dataset. */
export async function openSnapshot(file: string): Promise<SnapshotHandle> {
  const ds = await openDataset(file);
  return {
    field: (variable, units) => fieldFromDataset(ds, variable, units ? { units } : {}),
    has: (variable) => findVariable(ds, variable) !== undefined,
    close: () => ds.close(),
  };
}
