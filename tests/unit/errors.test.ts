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

// Issue 16, items 5 and 6: text from a damaged file or a person reaches a console, a page or an output file
// escaped and cut, and a message stays one sentence of sensible length.
describe('printable text in messages', () => {
  it('shows control characters, escape sequences and bidirectional overrides as escapes', async () => {
    const { printable } = await import('../../app/errors.js');
    expect(printable('o2\u0000\u0000')).toBe('o2\\x00\\x00');
    expect(printable('\u001b[31mred')).toBe('\\x1b[31mred');
    expect(printable('a\nb\tc\u007f')).toBe('a\\x0ab\\x09c\\x7f');
    expect(printable('abc\u202edef')).toBe('abc\\u{202e}def');
    expect(printable('µmol kg⁻¹ — Ω')).toBe('µmol kg⁻¹ — Ω');
  });
  it('cuts long text in the middle, keeping its start and its end', async () => {
    const { printable } = await import('../../app/errors.js');
    const long = 'a'.repeat(500) + 'END';
    const shown = printable(long, 40);
    expect(Array.from(shown)).toHaveLength(40);
    expect(shown.startsWith('aaaa')).toBe(true);
    expect(shown.endsWith('END')).toBe(true);
    expect(shown).toContain('…');
  });
  it('a megabyte path and a binary name give a short one-line message that still names the file', async () => {
    const { fileError, MESSAGE_LIMIT } = await import('../../app/errors.js');
    const path = '/data/' + 'x'.repeat(1024 * 1024) + '/run.nc';
    const e = fileError('E_FORMAT', path, 'the header is damaged.', 'o2\u0000\u0001\n');
    expect(e.message.length).toBeLessThanOrEqual(MESSAGE_LIMIT);
    expect(e.message).toContain('/run.nc');
    expect(e.message).toContain("variable 'o2\\x00\\x01\\x0a'");
    expect(e.message).not.toMatch(/\n/);
    expect(JSON.stringify(e.toJSON()).length).toBeLessThan(2000);
    expect(e.subject.file).toBe(path); // the program keeps the real path
  });
  it('the sentence itself is escaped even when a caller forgot', () => {
    const e = new StillwaterError('E_FORMAT', 'x.nc: attribute \u001b]0;title\u0007 is damaged.');
    expect(e.message).toBe('x.nc: attribute \\x1b]0;title\\x07 is damaged.');
  });
});
