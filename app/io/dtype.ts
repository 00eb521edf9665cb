import type { DType, RawArray } from './types.js';

/** Bytes per element of each raw dtype ('string' is a pointer-sized placeholder, never read raw). */
export const DTYPE_SIZE: Record<DType, number> = {
  i1: 1, u1: 1, char: 1, i2: 2, u2: 2, i4: 4, u4: 4, i8: 8, u8: 8, f4: 4, f8: 8, string: 8,
};

type ArrayCtor = new (buffer: ArrayBuffer, byteOffset?: number, length?: number) => RawArray;

const CTORS: Record<DType, ArrayCtor> = {
  i1: Int8Array, u1: Uint8Array, char: Uint8Array, i2: Int16Array, u2: Uint16Array,
  i4: Int32Array, u4: Uint32Array, i8: BigInt64Array, u8: BigUint64Array,
  f4: Float32Array, f8: Float64Array, string: Uint8Array,
};

/** A typed array of `n` elements of `dtype`, backed by its own fresh buffer. */
export function allocArray(dtype: DType, n: number): RawArray {
  return new CTORS[dtype](new ArrayBuffer(n * DTYPE_SIZE[dtype]));
}

/**
 * Like allocArray, but the memory is not zeroed first: for readers that overwrite every byte
 * (saves a pass over each level, which matters next to a page-cache read of the same size).
 */
export function allocArrayForOverwrite(dtype: DType, n: number): RawArray {
  const bytes = Buffer.allocUnsafeSlow(n * DTYPE_SIZE[dtype]);
  return new CTORS[dtype](bytes.buffer as ArrayBuffer, bytes.byteOffset, n);
}

/** View `bytes` (aligned, owned) as the typed array of `dtype`. */
export function viewArray(dtype: DType, bytes: Uint8Array): RawArray {
  const size = DTYPE_SIZE[dtype];
  return new CTORS[dtype](bytes.buffer as ArrayBuffer, bytes.byteOffset, bytes.byteLength / size);
}

const LITTLE_ENDIAN_HOST = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/**
 * Turn big-endian bytes into host order in place. Buffer.swapNN is native code, so a
 * level of a few hundred kilobytes costs microseconds.
 */
export function bigEndianToHost(bytes: Uint8Array, elementSize: number): void {
  if (!LITTLE_ENDIAN_HOST || elementSize === 1 || bytes.byteLength === 0) return;
  const b = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (elementSize === 2) b.swap16();
  else if (elementSize === 4) b.swap32();
  else if (elementSize === 8) b.swap64();
}

/** Little-endian bytes into host order in place (a no-op on every host we run on). */
export function littleEndianToHost(bytes: Uint8Array, elementSize: number): void {
  if (LITTLE_ENDIAN_HOST || elementSize === 1 || bytes.byteLength === 0) return;
  const b = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (elementSize === 2) b.swap16();
  else if (elementSize === 4) b.swap32();
  else if (elementSize === 8) b.swap64();
}

/** Numbers of a typed array as plain numbers (64-bit integers converted to number), for attributes. */
export function toNumbers(a: RawArray): number[] {
  const out = new Array<number>(a.length);
  for (let i = 0; i < a.length; i++) out[i] = Number(a[i]);
  return out;
}

/** Element count of a shape (1 for a scalar). */
export function product(shape: readonly number[]): number {
  let n = 1;
  for (const s of shape) n *= s;
  return n;
}
