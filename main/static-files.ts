/**
 * Which files the workbench page may load, the same for both transports: the built renderer in dist/renderer
 * and a fixed list of vendor files from node_modules (the Natural Earth shapes of world-atlas).
 * Nothing else from disk, nothing ever from the network.
 */
import { existsSync, realpathSync, statSync } from 'node:fs';
import { dirname, extname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { VENDOR } from '../contract/transport.js';
import { isInside } from './path-guard.js';

/** The project folder: found from this bundle's location (dist/) or from the source (main/). */
export function projectRoot(): string {
  const here = typeof __dirname !== 'undefined' ? __dirname : dirname(fileURLToPath(import.meta.url));
  let dir = here;
  for (let i = 0; i < 4; i++) {
    if (existsSync(join(dir, 'package.json')) && existsSync(join(dir, 'main'))) return dir;
    dir = dirname(dir);
  }
  return process.cwd();
}

const VENDOR_FILES: Record<string, string> = {
  [VENDOR.land110m]: 'node_modules/world-atlas/land-110m.json',
  [VENDOR.land50m]: 'node_modules/world-atlas/land-50m.json',
  [VENDOR.countries110m]: 'node_modules/world-atlas/countries-110m.json',
};

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.map': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.woff2': 'font/woff2',
};

export function contentType(file: string): string {
  return TYPES[extname(file).toLowerCase()] ?? 'application/octet-stream';
}

/**
 * The file behind a URL path such as "/", "/app.js" or "/vendor/world-atlas/land-110m.json", or undefined.
 * Renderer files must lie inside dist/renderer after symbolic links are followed.
 */
export function staticFile(urlPath: string, root: string = projectRoot()): string | undefined {
  let p: string;
  try {
    p = decodeURIComponent(urlPath);
  } catch {
    return undefined;
  }
  if (p.includes('\0')) return undefined;
  p = p.replace(/^\/+/, '');
  if (p === '') p = 'index.html';
  const vendor = VENDOR_FILES[p];
  if (vendor) {
    const f = join(root, vendor);
    return existsSync(f) ? f : undefined;
  }
  if (p.split(/[\\/]+/).includes('..')) return undefined;
  const base = join(root, 'dist', 'renderer');
  const f = resolve(base, p);
  if (!isInside(base, f) || !existsSync(f) || !statSync(f).isFile()) return undefined;
  if (!isInside(realpathSync(base), realpathSync(f))) return undefined;
  return f;
}
