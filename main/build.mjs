// Builds dist/ with esbuild: the command line, worker threads, the Electron shell and the renderer.
// Type checking is separate (tsc --noEmit); this only bundles. Entries whose source is absent are skipped.
import { build } from 'esbuild';
import { cpSync, existsSync, mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { distIsStale } from './dist-stale.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const dist = join(root, 'dist');

const nodeEntries = [
  { in: 'main/cli.ts', out: 'cli.mjs', format: 'esm' },
  { in: 'main/worker.ts', out: 'worker.mjs', format: 'esm' },
  { in: 'main/hdf5-worker.ts', out: 'hdf5-worker.mjs', format: 'esm' },
  { in: 'main/png-worker.ts', out: 'png-worker.mjs', format: 'esm' },
  { in: 'main/electron-main.ts', out: 'electron-main.cjs', format: 'cjs', external: ['electron'] },
  { in: 'main/preload.ts', out: 'preload.cjs', format: 'cjs', external: ['electron'] },
];
const browserEntries = [{ in: 'renderer/main.ts', out: 'renderer/app.js' }];

export async function buildAll() {
  mkdirSync(dist, { recursive: true });
  const jobs = [];
  for (const e of nodeEntries) {
    if (!existsSync(join(root, e.in))) continue;
    jobs.push(
      build({
        entryPoints: [join(root, e.in)],
        outfile: join(dist, e.out),
        bundle: true,
        platform: 'node',
        target: 'node20',
        format: e.format,
        packages: 'external',
        external: e.external ?? [],
        sourcemap: 'linked',
        logLevel: 'error',
        banner: e.format === 'esm' ? { js: "import { createRequire as __swRequire } from 'node:module'; const require = __swRequire(import.meta.url);" } : undefined,
      }),
    );
  }
  for (const e of browserEntries) {
    if (!existsSync(join(root, e.in))) continue;
    jobs.push(
      build({
        entryPoints: [join(root, e.in)],
        outfile: join(dist, e.out),
        bundle: true,
        platform: 'browser',
        target: 'chrome120',
        format: 'esm',
        sourcemap: 'linked',
        logLevel: 'error',
        loader: { '.json': 'json' },
      }),
    );
  }
  await Promise.all(jobs);
  // static renderer files (html, css) are copied as they are
  const rendererDir = join(root, 'renderer');
  if (existsSync(rendererDir)) {
    mkdirSync(join(dist, 'renderer'), { recursive: true });
    for (const f of readdirSync(rendererDir)) {
      if (f.endsWith('.html') || f.endsWith('.css')) cpSync(join(rendererDir, f), join(dist, 'renderer', f));
    }
  }
  writeFileSync(join(dist, '.build-stamp'), new Date().toISOString());
}

// node main/build.mjs [--if-stale]: build (with --if-stale only when a source is newer than dist/)
if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const skip = process.argv.includes('--if-stale') && !distIsStale(root);
  (skip ? Promise.resolve() : buildAll()).catch((e) => {
    console.error(e);
    process.exit(1);
  });
}
