// The long fuzzing run (outside npm test): node tests/fuzz/run-long.mjs [MUTANTS_PER_FIXTURE] [SEED]
// Prints the counts per fixture and every mutant that ended otherwise than exit 0 or a readable refusal.
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildHarness, fuzzFixture, tally } from './driver.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const perFixture = Number(process.argv[2] ?? 2000);
const seed = Number(process.argv[3] ?? 777);
const fixtures = ['fuzz_classic.nc', 'fuzz_cdf5.nc', 'fuzz_nc4.nc', 'fuzz_tiled.tif', 'fuzz_strips.tif'];
const harness = await buildHarness();
const totals = [];
for (const name of fixtures) {
  const records = await fuzzFixture(harness, join(root, 'tests/fixtures/fuzz', name), { seed, count: perFixture, timeLimitMs: 60_000 });
  const t = tally(records);
  totals.push({ name, ...t });
  console.log(JSON.stringify({ name, ...t }));
  for (const r of records) {
    if ((r.code !== 0 && r.code !== 2) || r.problem || !r.unchanged || r.maxRssMb > 1024) console.log(`  #${r.index} ${r.kind}@${r.where}: ${r.code} ${r.problem ?? ''} ${String(r.message).slice(0, 400)}`);
  }
}
const sum = totals.reduce((a, t) => {
  for (const k of Object.keys(t)) if (typeof t[k] === 'number') a[k] = k === 'maxRssMb' ? Math.max(a[k] ?? 0, t[k]) : (a[k] ?? 0) + t[k];
  return a;
}, {});
console.log(JSON.stringify({ name: 'all', seed, ...sum }));
