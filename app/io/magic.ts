/** What the first bytes of a file say it is. */
export type FileKind = 'cdf' | 'hdf5' | 'tiff' | 'unknown';

const HDF5_SIGNATURE = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];

export function sniffMagic(head: Uint8Array): FileKind {
  if (head.length >= 4 && head[0] === 0x43 && head[1] === 0x44 && head[2] === 0x46 && [1, 2, 5].includes(head[3])) return 'cdf';
  if (head.length >= 8 && HDF5_SIGNATURE.every((b, i) => head[i] === b)) return 'hdf5';
  if (head.length >= 4) {
    const ii = head[0] === 0x49 && head[1] === 0x49 && ((head[2] === 42 && head[3] === 0) || (head[2] === 43 && head[3] === 0));
    const mm = head[0] === 0x4d && head[1] === 0x4d && head[2] === 0 && (head[3] === 42 || head[3] === 43);
    if (ii || mm) return 'tiff';
  }
  return 'unknown';
}
