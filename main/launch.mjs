#!/usr/bin/env node
// Entry of the `stillwater` bin and of `npm start`: builds dist/ when the sources are newer, then runs the CLI.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const stamp = join(root, 'dist', '.build-stamp');

function newestSource(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(p));
    else if (/\.(ts|mjs|html|css|json)$/.test(entry.name)) newest = Math.max(newest, statSync(p).mtimeMs);
  }
  return newest;
}

const stale =
  !existsSync(stamp) ||
  ['app', 'main', 'renderer', 'sample-data/generator'].some((d) => existsSync(join(root, d)) && newestSource(join(root, d)) > statSync(stamp).mtimeMs);
if (stale) {
  const { buildAll } = await import(pathToFileURL(join(root, 'main', 'build.mjs')).href);
  await buildAll();
}
await import(pathToFileURL(join(root, 'dist', 'cli.mjs')).href);
