/**
 * Output targets checked before any work (app/output/output-target.ts): a regular file or a new name in a
 * folder that can be written; never a device (/dev/null is a character device: Linux devices.txt), a folder
 * where a file is meant, a file the same run reads (same device and inode, so links count too), the
 * kernel's pseudo file systems (proc(5), sysfs(5)), or for recipes anything but .json.
 */
import { linkSync, mkdirSync, mkdtempSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkOutputFile, checkOutputFolder } from '../../../app/output/output-target.js';

const dir = mkdtempSync(join(tmpdir(), 'sw-target-'));
const input = join(dir, 'input.nc');
writeFileSync(input, 'CDF');

describe('a file target', () => {
  it('a new name in a writable folder, or an existing regular file, is accepted (absolute path back)', () => {
    expect(checkOutputFile(join(dir, 'new.nc'))).toBe(join(dir, 'new.nc'));
    writeFileSync(join(dir, 'earlier.nc'), '');
    expect(checkOutputFile(join(dir, 'earlier.nc'), { inputs: [input] })).toBe(join(dir, 'earlier.nc'));
    expect(checkOutputFile(join(dir, 'sub', 'deeper', 'new.nc'))).toBe(join(dir, 'sub', 'deeper', 'new.nc'));
  });

  it('a device is refused', () => {
    expect(() => checkOutputFile('/dev/null', { label: '--out' })).toThrow(/^--out \/dev\/null: is not a regular file \(a device or other special file\)/);
  });

  it('a folder where a file is meant is refused, with or without a trailing slash', () => {
    expect(() => checkOutputFile(dir, { label: '--out' })).toThrow(/: is a folder; give a file name\.$/);
    expect(() => checkOutputFile(`${join(dir, 'not-yet')}/`)).toThrow(/names a folder; give a file name/);
  });

  it('an input of the same run is refused: by its name, through a symbolic link, and through a hard link', () => {
    expect(() => checkOutputFile(input, { inputs: [input] })).toThrow(/is an input of this run/);
    symlinkSync(input, join(dir, 'via-symlink.nc'));
    expect(() => checkOutputFile(join(dir, 'via-symlink.nc'), { inputs: [input] })).toThrow(/is an input of this run/);
    linkSync(input, join(dir, 'via-hardlink.nc'));
    expect(() => checkOutputFile(join(dir, 'via-hardlink.nc'), { inputs: [input] })).toThrow(/is an input of this run/);
  });

  it('a place inside /proc or /sys is refused before anything is written', () => {
    expect(() => checkOutputFile('/proc/x', { label: '--out' })).toThrow(/^--out \/proc\/x: lies in a system pseudo file system/);
    expect(() => checkOutputFile('/sys/kernel/x.nc')).toThrow(/pseudo file system/);
  });

  it('a recipe must be a .json file', () => {
    expect(() => checkOutputFile(join(dir, 'input.nc'), { extension: '.json' })).toThrow(/must be a \.json file/);
    expect(checkOutputFile(join(dir, 'Session.JSON'), { extension: '.json' })).toBe(join(dir, 'Session.JSON'));
  });

  it.skipIf(process.getuid?.() === 0)('a folder that cannot be written is refused', async () => {
    const ro = mkdtempSync(join(tmpdir(), 'sw-target-ro-'));
    const { chmodSync } = await import('node:fs');
    chmodSync(ro, 0o500);
    try {
      expect(() => checkOutputFile(join(ro, 'x.nc'))).toThrow(/cannot be written/);
    } finally {
      chmodSync(ro, 0o700);
    }
  });
});

describe('a folder target', () => {
  it('a file where the folder is meant is refused', () => {
    expect(() => checkOutputFolder(input, [], { label: '--out' })).toThrow(/^--out .*input\.nc: is not a folder/);
  });

  it('a file of the set that would replace an input, or a folder in the way, is refused before any work', () => {
    const out = join(dir, 'out');
    mkdirSync(out);
    linkSync(input, join(out, 'skill.json'));
    expect(() => checkOutputFolder(out, ['skill.json'], { inputs: [input] })).toThrow(/skill\.json: is an input of this run/);
    mkdirSync(join(out, 'skill.csv'));
    expect(() => checkOutputFolder(out, ['skill.csv'])).toThrow(/skill\.csv: is a folder/);
  });

  it('/proc/x as an output folder is refused', () => {
    expect(() => checkOutputFolder('/proc/x', [], { label: '--out' })).toThrow(/pseudo file system/);
  });
});
