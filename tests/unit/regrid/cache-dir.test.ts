/**
 * Where cached weights go: the user's cache folder of the XDG Base Directory Specification 0.8
 * ($XDG_CACHE_HOME, else $HOME/.cache) under "stillwater", never the folder the program was started in.
 * The command line, the browser-mode server and the Electron shell all take it from defaultCacheDir.
 */
import { readFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { defaultCacheDir } from '../../../app/regrid/weight-cache.js';

const saved = process.env.XDG_CACHE_HOME;
afterEach(() => {
  if (saved === undefined) delete process.env.XDG_CACHE_HOME;
  else process.env.XDG_CACHE_HOME = saved;
});

describe('the cache folder', () => {
  it('is $XDG_CACHE_HOME/stillwater when set', () => {
    process.env.XDG_CACHE_HOME = '/var/tmp/somewhere';
    expect(defaultCacheDir()).toBe('/var/tmp/somewhere/stillwater');
  });
  it('is ~/.cache/stillwater when XDG_CACHE_HOME is unset or empty (the specification treats empty as unset)', () => {
    delete process.env.XDG_CACHE_HOME;
    expect(defaultCacheDir()).toBe(join(homedir(), '.cache', 'stillwater'));
    process.env.XDG_CACHE_HOME = '';
    expect(defaultCacheDir()).toBe(join(homedir(), '.cache', 'stillwater'));
  });
  it('the server and the Electron shell use it rather than a folder beside where they were started', () => {
    for (const f of ['main/commands/serve.ts', 'main/electron-main.ts']) {
      const src = readFileSync(join(__dirname, '../../..', f), 'utf8');
      expect(src, f).toMatch(/cacheDir: defaultCacheDir\(\)/);
      expect(src, f).not.toMatch(/\.stillwater-cache/);
    }
  });
});
