/** Where Stillwater's own files are (its package folder) and its version, found from this file whether bundled (dist/) or not. */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The folder holding Stillwater's package.json. */
export function packageRoot(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const pkg = join(dir, 'package.json');
    if (existsSync(pkg) && (JSON.parse(readFileSync(pkg, 'utf8')) as { name?: string }).name === 'stillwater') return dir;
    const up = dirname(dir);
    if (up === dir) throw new Error('Stillwater package root not found above ' + fileURLToPath(import.meta.url));
    dir = up;
  }
}

/** The version in package.json, for provenance. */
export function toolVersion(): string {
  try {
    return (JSON.parse(readFileSync(join(packageRoot(), 'package.json'), 'utf8')) as { version: string }).version;
  } catch {
    return 'unknown';
  }
}
