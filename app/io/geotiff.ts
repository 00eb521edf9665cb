import { fileError } from '../errors.js';
import type { ByteSource } from './byte-source.js';
import type { RawDataset } from './types.js';

// Placeholder until the GeoTIFF reader lands.
export async function openGeoTiff(_source: ByteSource, path: string): Promise<RawDataset> {
  throw fileError('E_FORMAT', path, 'GeoTIFF files cannot be read yet.');
}
