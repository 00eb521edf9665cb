/**
 * The few superblock facts the chunk reader needs (HDF5 File Format Specification, section II.A):
 * where addresses are counted from and how wide offsets and lengths are.
 */
import type { ByteSource } from '../byte-source.js';

export interface Superblock {
  version: number;
  sizeOfOffsets: number;
  sizeOfLengths: number;
  baseAddress: number;
}

const SIGNATURE = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];

/** Superblock at byte 0 (or after a user block at 512, 1024, ...); undefined when none is found. */
export async function readSuperblock(source: ByteSource): Promise<Superblock | undefined> {
  for (let at = 0; at + 48 <= source.size; at = at === 0 ? 512 : at * 2) {
    const b = await source.read(at, 48);
    if (!SIGNATURE.every((x, i) => b[i] === x)) continue;
    const v = new DataView(b.buffer, b.byteOffset, b.byteLength);
    const version = b[8];
    const widths = version <= 1 ? [b[13], b[14]] : [b[9], b[10]];
    // a damaged width is not ours to guess: the library reads (or refuses) such a file
    if (!widths.every((w) => w === 2 || w === 4 || w === 8)) return undefined;
    if (version <= 1) {
      const sizeOfOffsets = b[13];
      const sizeOfLengths = b[14];
      // v0: 24 bytes of fixed fields (+4 for v1), then the base address
      const baseAt = version === 0 ? 24 : 28;
      return { version, sizeOfOffsets, sizeOfLengths, baseAddress: readUint(v, baseAt, sizeOfOffsets) };
    }
    const sizeOfOffsets = b[9];
    const sizeOfLengths = b[10];
    return { version, sizeOfOffsets, sizeOfLengths, baseAddress: readUint(v, 12, sizeOfOffsets) };
  }
  return undefined;
}

/** Little-endian unsigned integer of 1..8 bytes (HDF5 stores its own structures little-endian). */
export function readUint(v: DataView, at: number, size: number): number {
  switch (size) {
    case 1: return v.getUint8(at);
    case 2: return v.getUint16(at, true);
    case 4: return v.getUint32(at, true);
    case 8: {
      const lo = v.getUint32(at, true);
      const hi = v.getUint32(at + 4, true);
      if (hi === 0xffffffff && lo === 0xffffffff) return UNDEFINED_ADDRESS;
      return hi * 2 ** 32 + lo;
    }
    default: {
      let x = 0;
      for (let i = size - 1; i >= 0; i--) x = x * 256 + v.getUint8(at + i);
      return x;
    }
  }
}

/** The "undefined address" (all bits set): storage never allocated. */
export const UNDEFINED_ADDRESS = -1;
