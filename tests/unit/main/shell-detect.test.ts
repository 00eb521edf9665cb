// `npm start` picks Electron only where it can work: the binary on disk (node_modules/electron/path.txt
// names it inside dist/, as the electron package's install script writes it) and a display (X11 $DISPLAY or
// Wayland $WAYLAND_DISPLAY; macOS and Windows always have one).
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { browserOpener, electronBinary, hasDisplay } from '../../../main/shell-detect.js';

describe('display', () => {
  it('needs DISPLAY or WAYLAND_DISPLAY on Linux', () => {
    expect(hasDisplay({}, 'linux')).toBe(false);
    expect(hasDisplay({ DISPLAY: ':0' }, 'linux')).toBe(true);
    expect(hasDisplay({ WAYLAND_DISPLAY: 'wayland-0' }, 'linux')).toBe(true);
    expect(hasDisplay({ DISPLAY: '' }, 'linux')).toBe(false);
  });
  it('is always there on macOS and Windows', () => {
    expect(hasDisplay({}, 'darwin')).toBe(true);
    expect(hasDisplay({}, 'win32')).toBe(true);
  });
  it('offers no system browser on a Linux machine without a display', () => {
    expect(browserOpener({ PATH: '/usr/bin:/bin' }, 'linux')).toBeUndefined();
    expect(browserOpener({}, 'darwin')).toEqual({ cmd: 'open', args: [] });
  });
});

describe('Electron binary', () => {
  it('is absent without path.txt, or when path.txt names a missing file', () => {
    const root = mkdtempSync(join(tmpdir(), 'sw-el-'));
    expect(electronBinary(root)).toBeUndefined();
    mkdirSync(join(root, 'node_modules', 'electron', 'dist'), { recursive: true });
    writeFileSync(join(root, 'node_modules', 'electron', 'path.txt'), 'electron');
    expect(electronBinary(root)).toBeUndefined();
    writeFileSync(join(root, 'node_modules', 'electron', 'dist', 'electron'), '');
    expect(electronBinary(root)).toBe(join(root, 'node_modules', 'electron', 'dist', 'electron'));
  });
});
