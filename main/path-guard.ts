import { realpathSync, existsSync } from 'node:fs';
import { dirname, isAbsolute, relative, resolve, sep } from 'node:path';
import { StillwaterError } from '../app/errors.js';

/** Is `child` the folder `parent` itself or somewhere below it? Both absolute and normalised. */
export function isInside(parent: string, child: string): boolean {
  const rel = relative(parent, child);
  return rel === '' || (rel !== '..' && !rel.startsWith('..' + sep) && !isAbsolute(rel));
}

/** realpath of the path, or of its nearest existing parent folder joined with the rest (for files not yet written). */
function realpathOrParent(p: string): string {
  let head = p;
  const tail: string[] = [];
  while (!existsSync(head)) {
    const up = dirname(head);
    if (up === head) return p;
    tail.unshift(head.slice(up.length).replace(/^[\\/]+/, ''));
    head = up;
  }
  return resolve(realpathSync(head), ...tail);
}

/**
 * File access for the screen: only inside the folders named at start, or files granted one by one
 * (an Electron open dialog). Paths are resolved, '..' segments refused, and symbolic links followed
 * before the check, so neither traversal nor a link pointing out of a folder gets through.
 */
export class PathGuard {
  readonly roots: string[];
  private readonly granted = new Set<string>();

  constructor(roots: string[], private readonly base: string = process.cwd(), granted: string[] = []) {
    if (roots.length === 0) throw new StillwaterError('E_INPUT', 'At least one folder must be allowed.');
    this.roots = [];
    for (const r of roots) {
      const abs = resolve(base, r);
      if (!existsSync(abs)) throw new StillwaterError('E_FILE', `${abs}: no such folder to allow.`, { file: abs });
      const real = realpathSync(abs);
      if (!this.roots.includes(real)) this.roots.push(real);
    }
    for (const g of granted) this.granted.add(g);
  }

  /** Allow one more file or folder (chosen by the person in a system dialog). */
  grant(path: string): void {
    this.granted.add(realpathOrParent(resolve(this.base, path)));
  }

  /** Files and folders granted one by one (passed on to worker threads). */
  grantedPaths(): string[] {
    return [...this.granted];
  }

  /** The absolute real path a handler may use; throws E_FILE when the path is outside what is allowed. */
  resolve(path: string): string {
    if (typeof path !== 'string' || path.length === 0) throw new StillwaterError('E_INPUT', 'A file path is empty.');
    if (path.includes('\0')) throw new StillwaterError('E_FILE', `${JSON.stringify(path)}: a path may not contain a NUL character.`, { file: path });
    if (path.split(/[\\/]+/).includes('..')) {
      throw new StillwaterError('E_FILE', `${path}: paths with '..' are not accepted; give the path inside an allowed folder.`, { file: path });
    }
    const abs = resolve(this.base, path);
    const real = realpathOrParent(abs);
    const allowed = (p: string): boolean => this.roots.some((r) => isInside(r, p)) || [...this.granted].some((g) => isInside(g, p));
    if (!allowed(real)) {
      throw new StillwaterError('E_FILE', `${path}: outside the folders this workbench may read (${this.roots.join(', ')}).`, { file: path });
    }
    return real;
  }
}
