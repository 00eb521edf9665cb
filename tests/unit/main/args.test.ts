// Issue 16, item 9: a number option given as an empty (or blank) value is refused, not read as 0.
import { describe, expect, it } from 'vitest';
import { optionalNumber, parseArgs } from '../../../main/args.js';

describe('optionalNumber', () => {
  for (const v of ['', ' ', '\t']) {
    it(`--coverage ${JSON.stringify(v)} is refused with one sentence`, () => {
      expect(() => optionalNumber(parseArgs(['--coverage', v]), 'coverage')).toThrow(expect.objectContaining({ code: 'E_INPUT', message: expect.stringMatching(/^Option --coverage must be a number, got '.*'\.$/) }));
    });
  }
  it('--coverage= (empty after the equals sign) is refused too', () => {
    expect(() => optionalNumber(parseArgs(['--coverage=']), 'coverage')).toThrow(/must be a number/);
  });
  it('a number is read, and 0 stays a legitimate value', () => {
    expect(optionalNumber(parseArgs(['--coverage', '0']), 'coverage')).toBe(0);
    expect(optionalNumber(parseArgs(['--coverage', '0.25']), 'coverage')).toBe(0.25);
  });
});
