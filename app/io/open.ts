/**
 * One entry for every format we read: look at the first bytes, hand over to the reader.
 * The caller never names the format.
 */
import { fileError, StillwaterError } from '../errors.js';
import { FileSource, type ByteSource } from './byte-source.js';
import { sniffMagic } from './magic.js';
import { Netcdf3Dataset } from './netcdf3.js';
import type { RawDataset } from './types.js';

export async function openDataset(path: string): Promise<RawDataset> {
  let source: FileSource;
  try {
    source = await FileSource.open(path);
  } catch (e) {
    if (e instanceof StillwaterError) throw e;
    throw fileError('E_FILE', path, `cannot be opened for reading (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}).`);
  }
  try {
    return await openSource(source, path);
  } catch (e) {
    await source.close().catch(() => undefined);
    throw e;
  }
}

/** Open from any ByteSource (memory, file, ranged remote later). The dataset owns the source. */
export async function openSource(source: ByteSource, path = source.name): Promise<RawDataset> {
  if (source.size === 0) throw fileError('E_FORMAT', path, 'the file is empty.');
  const head = await source.read(0, Math.min(8, source.size));
  const kind = sniffMagic(head);
  switch (kind) {
    case 'cdf':
      return Netcdf3Dataset.open(source, path);
    case 'hdf5': {
      const { openNetcdf4 } = await import('./netcdf4.js');
      return openNetcdf4(source, path);
    }
    case 'tiff': {
      const { openGeoTiff } = await import('./geotiff.js');
      return openGeoTiff(source, path);
    }
    default:
      throw fileError('E_FORMAT', path, 'this is not a NetCDF, HDF5 or GeoTIFF file (its first bytes match none of these formats).');
  }
}
