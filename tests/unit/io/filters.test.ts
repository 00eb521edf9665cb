/**
 * The HDF5 shuffle filter (HDF5 User's Guide, "Shuffle filter"; common practice): a buffer of N elements
 * of size S is stored as byte 0 of every element, then byte 1 of every element, ... Our unshuffle must
 * invert that exactly, for every element size and for lengths that do not split evenly.
 */
import { describe, expect, it } from 'vitest';
import { unshuffle } from '../../../app/io/hdf5/filters.js';

function shuffle(bytes: Uint8Array, size: number): Uint8Array {
  const n = Math.floor(bytes.length / size);
  const out = new Uint8Array(bytes.length);
  for (let k = 0; k < size; k++) for (let i = 0; i < n; i++) out[k * n + i] = bytes[i * size + k];
  out.set(bytes.subarray(n * size), n * size);
  return out;
}

describe('unshuffle inverts the shuffle filter', () => {
  it.each([
    [2, 10], [4, 16], [4, 64800 * 4], [4, 18], [4, 4 * 7], [8, 40], [8, 43], [3, 30],
  ])('element size %i, %i bytes', (size, length) => {
    const bytes = Uint8Array.from({ length }, (_, i) => (i * 37 + 11) & 0xff);
    expect(Array.from(unshuffle(shuffle(bytes, size), size))).toEqual(Array.from(bytes));
  });
});

describe('unshuffle into the caller\'s array', () => {
  it.each([[4, 64800 * 4], [4, 18], [8, 43]])('element size %i, %i bytes: the same bytes, written into the given array', (size, length) => {
    const bytes = Uint8Array.from({ length }, (_, i) => (i * 53 + 7) & 0xff);
    const into = new Uint8Array(length).fill(0xaa);
    const got = unshuffle(shuffle(bytes, size), size, into);
    expect(got).toBe(into);
    expect(Array.from(into)).toEqual(Array.from(bytes));
  });

  it('an array of another length is left alone and a new one returned', () => {
    const bytes = Uint8Array.from({ length: 16 }, (_, i) => i);
    const into = new Uint8Array(8);
    const got = unshuffle(shuffle(bytes, 4), 4, into);
    expect(got).not.toBe(into);
    expect(Array.from(got)).toEqual(Array.from(bytes));
  });
});
