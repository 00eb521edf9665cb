// Whether dist/ is older than the sources it is built from: the one rule used by main/launch.mjs (the
// `stillwater` bin) and by `node main/build.mjs --if-stale` (the end-to-end tests).
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

/** the folders whose files go into dist/ (the demo generator is bundled into the command line) */
const SOURCES = ['app', 'contract', 'main', 'renderer', 'sample-data/generator'];

function newestSource(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(p));
    else if (/\.(ts|mjs|html|css|json)$/.test(entry.name)) newest = Math.max(newest, statSync(p).mtimeMs);
  }
  return newest;
}

export function distIsStale(root) {
  const stamp = join(root, 'dist', '.build-stamp');
  if (!existsSync(stamp)) return true;
  const built = statSync(stamp).mtimeMs;
  return SOURCES.some((d) => existsSync(join(root, d)) && newestSource(join(root, d)) > built);
}
