import { describe, expect, it } from 'vitest';
import { StillwaterError } from '../../app/errors.js';
import { MemorySource } from '../../app/io/byte-source.js';

describe('errors and byte sources', () => {
  it('bad input is told apart from internal faults', () => {
    expect(new StillwaterError('E_FILE', 'x: no such file.').isBadInput).toBe(true);
    expect(new StillwaterError('E_INTERNAL', 'oops').isBadInput).toBe(false);
  });
  it('a memory source refuses a range past its end with the file name in the sentence', async () => {
    const src = new MemorySource('mem.nc', new Uint8Array(10));
    await expect(src.read(8, 4)).rejects.toThrow(/mem\.nc: the file is truncated/);
    expect((await src.read(2, 3)).length).toBe(3);
  });
});
