#!/usr/bin/env node
// Entry of the `stillwater` bin and of `npm start`: builds dist/ when the sources are newer, then runs the CLI.
import { spawn } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { needsRestartWithoutTrapHandler, NO_TRAP_HANDLER } from './address-space.mjs';
import { distIsStale } from './dist-stale.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

if (needsRestartWithoutTrapHandler()) {
  // under `ulimit -v`: the same command in a Node started without WebAssembly's trap handler
  const child = spawn(process.execPath, [NO_TRAP_HANDLER, ...process.execArgv, fileURLToPath(import.meta.url), ...process.argv.slice(2)], { stdio: 'inherit' });
  for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(sig, () => child.kill(sig));
  child.on('exit', (code, signal) => {
    if (signal) {
      process.removeAllListeners(signal);
      process.kill(process.pid, signal);
    } else process.exit(code ?? 1);
  });
} else {
  if (distIsStale(root)) {
    const { buildAll } = await import(pathToFileURL(join(root, 'main', 'build.mjs')).href);
    await buildAll();
  }
  await import(pathToFileURL(join(root, 'dist', 'cli.mjs')).href);
}
