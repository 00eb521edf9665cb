/**
 * Can this machine show an Electron window? Decided without loading the `electron` package in plain Node
 * (its index.js would try to download the binary): the binary must be on disk and a display present.
 */
import { existsSync, readFileSync } from 'node:fs';
import { delimiter, join } from 'node:path';

/** Absolute path of the Electron binary in node_modules, or undefined when it was never downloaded. */
export function electronBinary(root: string): string | undefined {
  const pathTxt = join(root, 'node_modules', 'electron', 'path.txt');
  if (!existsSync(pathTxt)) return undefined;
  const rel = readFileSync(pathTxt, 'utf8').trim();
  if (!rel) return undefined;
  const bin = join(root, 'node_modules', 'electron', 'dist', rel);
  return existsSync(bin) ? bin : undefined;
}

/** A graphical session: macOS and Windows always have one; elsewhere X11 or Wayland must be named. */
export function hasDisplay(env: NodeJS.ProcessEnv = process.env, platform: NodeJS.Platform = process.platform): boolean {
  if (platform === 'darwin' || platform === 'win32') return true;
  return Boolean(env.DISPLAY || env.WAYLAND_DISPLAY);
}

/** The command that opens a URL in the system browser, if this machine has one. */
export function browserOpener(env: NodeJS.ProcessEnv = process.env, platform: NodeJS.Platform = process.platform): { cmd: string; args: string[] } | undefined {
  if (platform === 'darwin') return { cmd: 'open', args: [] };
  if (platform === 'win32') return { cmd: 'cmd', args: ['/c', 'start', '""'] };
  if (!hasDisplay(env, platform)) return undefined;
  const dirs = (env.PATH ?? '').split(delimiter).filter(Boolean);
  const found = dirs.map((d) => join(d, 'xdg-open')).find((p) => existsSync(p));
  return found ? { cmd: found, args: [] } : undefined;
}
