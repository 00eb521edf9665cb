// Runs every tests/bench/*.bench.ts (bundled with esbuild) one after the other, or only those named:
//   npm run bench            all benchmarks
//   npm run bench -- io      those whose file name contains "io"
// Each benchmark prints its own side-by-side table (ours vs. the peer, with ratios).
import { build } from 'esbuild';
import { readdirSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const root = join(here, '..', '..');
const filters = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => filters.length === 0 || filters.some((x) => f.includes(x)))
  .sort();
let failed = 0;
for (const f of files) {
  const outfile = join(root, 'dist', 'bench', f.replace(/\.ts$/, '.mjs'));
  await build({
    entryPoints: [join(here, f)],
    outfile,
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'esm',
    packages: 'external',
    logLevel: 'error',
    banner: { js: "import { createRequire as __swRequire } from 'node:module'; const require = __swRequire(import.meta.url);" },
  });
  console.log(`\n=== ${f} ===`);
  const r = spawnSync(process.execPath, ['--expose-gc', outfile], { stdio: 'inherit', cwd: root });
  if (r.status !== 0) failed++;
}
if (files.length === 0) console.log('no benchmark matched');
process.exit(failed ? 1 : 0);
