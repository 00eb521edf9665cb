import { fileError } from '../errors.js';
import { DTYPE_SIZE } from './dtype.js';
import type { RawArray, RawVariable } from './types.js';

/**
 * Most bytes one read may ask for. A level of a 0.1° global grid in float64 is 52 MB; a damaged shape asking
 * for more is refused before anything is allocated.
 */
export const MAX_SLAB_BYTES = 1024 * 1024 * 1024;

/** Validate start/count against a variable's shape, filling defaults. */
export function checkSlab(file: string, v: RawVariable, start?: number[], count?: number[]): { s: number[]; c: number[] } {
  const s = start ?? v.shape.map(() => 0);
  const c = count ?? v.shape.map((n, i) => n - s[i]);
  if (s.length !== v.shape.length || c.length !== v.shape.length) {
    throw fileError('E_INPUT', file, `a slab needs ${v.shape.length} start and count values.`, v.name);
  }
  for (let i = 0; i < s.length; i++) {
    if (s[i] < 0 || c[i] < 0 || s[i] + c[i] > v.shape[i]) {
      throw fileError('E_INPUT', file, `slab [${s}]+[${c}] lies outside the shape [${v.shape}].`, v.name);
    }
  }
  const bytes = c.reduce((a, b) => a * b, 1) * (DTYPE_SIZE[v.dtype] ?? 8);
  if (bytes > MAX_SLAB_BYTES) {
    throw fileError('E_FORMAT', file, `one read of shape [${c}] would take ${Math.round(bytes / 2 ** 20)} MiB, more than the ${MAX_SLAB_BYTES / 2 ** 20} MiB we read at once (its shape may be damaged).`, v.name);
  }
  return { s, c };
}

/** Copy a hyperslab out of a whole C-ordered array. */
export function copySlab(data: RawArray, shape: number[], start: number[], count: number[]): RawArray {
  const n = count.reduce((a, b) => a * b, 1);
  const Ctor = data.constructor as new (n: number) => RawArray;
  const out = new Ctor(n);
  if (shape.length === 0) {
    (out as Float64Array)[0] = (data as Float64Array)[0];
    return out;
  }
  const strides = new Array<number>(shape.length);
  strides[shape.length - 1] = 1;
  for (let i = shape.length - 2; i >= 0; i--) strides[i] = strides[i + 1] * shape[i + 1];
  const last = shape.length - 1;
  const rows = n / (count[last] || 1);
  const idx = new Array<number>(shape.length).fill(0);
  let o = 0;
  for (let r = 0; r < rows && count[last] > 0; r++) {
    let off = 0;
    for (let d = 0; d < last; d++) off += (start[d] + idx[d]) * strides[d];
    off += start[last];
    (out as Float64Array).set((data as Float64Array).subarray(off, off + count[last]), o);
    o += count[last];
    for (let d = last - 1; d >= 0; d--) {
      if (++idx[d] < count[d]) break;
      idx[d] = 0;
    }
  }
  return out;
}
