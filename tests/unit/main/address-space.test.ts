// Reading the address-space limit from /proc/self/limits (format of proc(5), Linux man-pages; common practice).
import { describe, expect, it } from 'vitest';
import { addressSpaceLimit } from '../../../main/address-space.mjs';

const limits = (soft: string, hard: string): string =>
  [
    'Limit                     Soft Limit           Hard Limit           Units     ',
    'Max cpu time              unlimited            unlimited            seconds   ',
    `Max address space         ${soft.padEnd(21)}${hard.padEnd(21)}bytes     `,
    'Max open files            1024                 1048576              files     ',
  ].join('\n');

describe('addressSpaceLimit', () => {
  it('is undefined without a limit', () => {
    expect(addressSpaceLimit(limits('unlimited', 'unlimited'))).toBeUndefined();
  });
  it('reads the soft limit in bytes (ulimit -v 4000000 is 4000000 KiB)', () => {
    expect(addressSpaceLimit(limits('4096000000', 'unlimited'))).toBe(4_096_000_000);
  });
  it('is undefined where the limits cannot be read', () => {
    expect(addressSpaceLimit(undefined)).toBeUndefined();
  });
});
