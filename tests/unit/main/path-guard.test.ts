// The browser mode's file rule (issue 5, DESIGN.md section 6): only inside the folders named at start, no
// traversal, symbolic links followed before the check (common practice for path confinement, as in the
// OWASP "Path Traversal" guidance: canonicalise, then compare against the allowed base).
import { mkdirSync, mkdtempSync, realpathSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PathGuard, isInside } from '../../../main/path-guard.js';

function tree(): { top: string; allowed: string; outside: string } {
  const top = realpathSync(mkdtempSync(join(tmpdir(), 'sw-guard-')));
  const allowed = join(top, 'allowed');
  const outside = join(top, 'outside');
  mkdirSync(join(allowed, 'sub'), { recursive: true });
  mkdirSync(outside);
  writeFileSync(join(allowed, 'sub', 'a.nc'), 'x');
  writeFileSync(join(outside, 'secret.txt'), 'x');
  writeFileSync(join(top, 'allowed-twin.txt'), 'x');
  symlinkSync(join(outside, 'secret.txt'), join(allowed, 'link-out'));
  symlinkSync(outside, join(allowed, 'dir-out'));
  return { top, allowed, outside };
}

describe('isInside', () => {
  it('accepts the folder itself and anything below it', () => {
    expect(isInside('/a/b', '/a/b')).toBe(true);
    expect(isInside('/a/b', '/a/b/c/d')).toBe(true);
  });
  it('refuses a sibling sharing the prefix, the parent, and names that merely start with dots', () => {
    expect(isInside('/a/b', '/a/bc')).toBe(false);
    expect(isInside('/a/b', '/a')).toBe(false);
    expect(isInside('/a/b', '/a/b/..x')).toBe(true);
  });
});

describe('PathGuard', () => {
  it('resolves a file inside an allowed folder, given absolute or relative to the base', () => {
    const t = tree();
    const g = new PathGuard([t.allowed], t.top);
    expect(g.resolve(join(t.allowed, 'sub', 'a.nc'))).toBe(join(t.allowed, 'sub', 'a.nc'));
    expect(g.resolve('allowed/sub/a.nc')).toBe(join(t.allowed, 'sub', 'a.nc'));
  });
  it('allows a file that does not exist yet inside an allowed folder (an export target)', () => {
    const t = tree();
    const g = new PathGuard([t.allowed], t.top);
    expect(g.resolve(join(t.allowed, 'new', 'table.csv'))).toBe(join(t.allowed, 'new', 'table.csv'));
  });
  it('refuses a path outside, naming it', () => {
    const t = tree();
    const g = new PathGuard([t.allowed], t.top);
    expect(() => g.resolve(join(t.outside, 'secret.txt'))).toThrow(/outside the folders/);
    expect(() => g.resolve('/etc/passwd')).toThrow(expect.objectContaining({ code: 'E_FILE' }));
    expect(() => g.resolve(join(t.top, 'allowed-twin.txt'))).toThrow(/outside/);
  });
  it("refuses '..' segments even when they would land inside again", () => {
    const t = tree();
    const g = new PathGuard([t.allowed], t.top);
    expect(() => g.resolve(join(t.allowed, 'sub') + '/../../outside/secret.txt')).toThrow(/'\.\.'/);
    expect(() => g.resolve('allowed/sub/../sub/a.nc')).toThrow(/'\.\.'/);
    expect(() => g.resolve('allowed\\..\\outside')).toThrow(/'\.\.'/);
  });
  it('follows symbolic links before deciding, so a link pointing out is refused', () => {
    const t = tree();
    const g = new PathGuard([t.allowed], t.top);
    expect(() => g.resolve(join(t.allowed, 'link-out'))).toThrow(/outside/);
    expect(() => g.resolve(join(t.allowed, 'dir-out', 'secret.txt'))).toThrow(/outside/);
  });
  it('refuses NUL characters and empty paths', () => {
    const t = tree();
    const g = new PathGuard([t.allowed], t.top);
    expect(() => g.resolve('allowed/sub/a.nc\0.txt')).toThrow(/NUL/);
    expect(() => g.resolve('')).toThrow(/empty/);
  });
  it('lets a granted file through (an Electron dialog choice) but not its neighbours', () => {
    const t = tree();
    const g = new PathGuard([t.allowed], t.top);
    g.grant(join(t.outside, 'secret.txt'));
    expect(g.resolve(join(t.outside, 'secret.txt'))).toBe(join(t.outside, 'secret.txt'));
    expect(() => g.resolve(join(t.outside, 'other.txt'))).toThrow(/outside/);
    const copy = new PathGuard(g.roots, t.top, g.grantedPaths());
    expect(copy.resolve(join(t.outside, 'secret.txt'))).toBe(join(t.outside, 'secret.txt'));
  });
  it('refuses to start with a folder that does not exist', () => {
    expect(() => new PathGuard(['/no/such/folder/here'])).toThrow(/no such folder/);
  });
});
