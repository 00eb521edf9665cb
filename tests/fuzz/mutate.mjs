// Mutants of a file for the fuzzing tests: a fixed seed and an index give the same mutant on every run.
// Kinds: bit flips, random bytes, truncation, header-sized fields set to extremes (both byte orders),
// a copied range (duplicated structures), and an offset field pointing back into the file (loops).

/** mulberry32: a small, well-mixed 32-bit generator (common practice for reproducible fuzzing). */
export function rng(seed) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const EXTREMES_32 = [0x00000000, 0xffffffff, 0x7fffffff, 0x80000000, 0x00000001, 0x0000ffff, 0x00010000];
const EXTREMES_64 = [0n, 0xffffffffffffffffn, 0x7fffffffffffffffn, 0x100000000n, 0xffffffffn, 0x20000000000000n];

export const KINDS = ['flip', 'bytes', 'truncate', 'extreme32', 'extreme64', 'copy', 'pointer'];

/** The `index`-th mutant of `bytes` under `seed`: { kind, bytes, where }. */
export function mutant(bytes, seed, index) {
  const r = rng((seed * 0x9e3779b1 + index * 0x85ebca6b) >>> 0);
  const int = (n) => Math.floor(r() * n);
  const out = Uint8Array.from(bytes);
  const view = new DataView(out.buffer);
  const kind = KINDS[index % KINDS.length];
  // most structure sits in the first kilobytes; aim there three times out of four
  const at = (width) => {
    const span = r() < 0.75 ? Math.min(out.length, 4096) : out.length;
    return Math.max(0, Math.min(out.length - width, int(span)));
  };
  let where = 0;
  switch (kind) {
    case 'flip': {
      const n = 1 + int(4);
      for (let k = 0; k < n; k++) {
        where = at(1);
        out[where] ^= 1 << int(8);
      }
      break;
    }
    case 'bytes': {
      where = at(1);
      const n = 1 + int(8);
      for (let k = 0; k < n && where + k < out.length; k++) out[where + k] = int(256);
      break;
    }
    case 'truncate':
      where = int(out.length);
      return { kind, where, bytes: out.subarray(0, where) };
    case 'extreme32': {
      where = at(4) & ~3;
      view.setUint32(where, EXTREMES_32[int(EXTREMES_32.length)], r() < 0.5);
      break;
    }
    case 'extreme64': {
      where = at(8) & ~3;
      if (where + 8 <= out.length) view.setBigUint64(where, EXTREMES_64[int(EXTREMES_64.length)], r() < 0.5);
      break;
    }
    case 'copy': {
      const len = 1 + int(64);
      const from = int(Math.max(1, out.length - len));
      where = at(len);
      out.copyWithin(where, from, from + len);
      break;
    }
    case 'pointer': {
      // an 8- or 4-byte little-endian offset (HDF5, TIFF) or big-endian (NetCDF classic) to somewhere in the file
      const target = int(out.length) & ~7;
      where = at(8) & ~3;
      const little = r() < 0.7;
      if (r() < 0.5 && where + 8 <= out.length) view.setBigUint64(where, BigInt(target), little);
      else view.setUint32(where, target, little);
      break;
    }
  }
  return { kind, where, bytes: out };
}
