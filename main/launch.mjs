#!/usr/bin/env node
// Entry of the `stillwater` bin and of `npm start`: builds dist/ when the sources are newer, then runs the CLI.
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { distIsStale } from './dist-stale.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
if (distIsStale(root)) {
  const { buildAll } = await import(pathToFileURL(join(root, 'main', 'build.mjs')).href);
  await buildAll();
}
await import(pathToFileURL(join(root, 'dist', 'cli.mjs')).href);
