import { fileError } from '../errors.js';
import type { ByteSource } from './byte-source.js';
import type { RawDataset } from './types.js';

// Placeholder until the HDF5 reader lands (next commit).
export async function openNetcdf4(_source: ByteSource, path: string): Promise<RawDataset> {
  throw fileError('E_FORMAT', path, 'NetCDF-4/HDF5 files cannot be read yet.');
}
