// Damaged files (issue 16): mutants of small valid files (tests/fixtures/fuzz, written by netCDF4-python and
// GDAL: make_fuzz_fixtures.py) read through the real reading path must end in a result or one readable
// sentence: never an internal fault, a crash, a hang past the time limit, memory past the limit, or a changed
// input. Fixed seed, bounded count; the long run is tests/fuzz/run-long.mjs (outside npm test).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildHarness, fuzzFixture, tally } from './driver.mjs';
import { mutant } from './mutate.mjs';

const root = join(__dirname, '../..');
const SEED = 20261205;
/** no mutant of these few-kilobyte files may take longer (a hang) or more resident memory (a blow-up) */
const TIME_LIMIT_MS = 60_000;
const RSS_LIMIT_MB = 1024;
/** a test's own limit: a shared, loaded machine runs hundreds of mutants in minutes, not seconds */
const TEST_LIMIT_MS = 600_000;

const FIXTURES: [string, number][] = [
  ['fuzz_classic.nc', 150],
  ['fuzz_cdf5.nc', 150],
  ['fuzz_nc4.nc', 300],
  ['fuzz_tiled.tif', 150],
  ['fuzz_strips.tif', 150],
];

let harness: string;
const dir = mkdtempSync(join(tmpdir(), 'sw-fuzz-cli-'));

beforeAll(async () => {
  const b = spawnSync(process.execPath, [join(root, 'main/build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(b.stderr);
  harness = await buildHarness();
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('mutated files through openDataset, CF decoding and level reads', () => {
  for (const [name, count] of FIXTURES) {
    it(`${count} mutants of ${name}: exit 0 or one readable sentence, within the limits`, async () => {
      const records = await fuzzFixture(harness, join(root, 'tests/fixtures/fuzz', name), { seed: SEED, count, timeLimitMs: TIME_LIMIT_MS });
      const t = tally(records);
      const bad = records.filter((r) => (r.code !== 0 && r.code !== 2) || r.problem || !r.unchanged || r.maxRssMb > RSS_LIMIT_MB);
      expect(bad.map((r) => `#${r.index} ${r.kind}: ${r.code} ${r.problem ?? ''} ${String(r.message).slice(0, 300)}`)).toEqual([]);
      expect(t.total).toBe(count);
      // the mutants do reach past the header: some files still read, some are refused
      expect(t.ok).toBeGreaterThan(0);
      expect(t.refused).toBeGreaterThan(0);
    }, TEST_LIMIT_MS);
  }
});

describe('a sample through the command line', () => {
  it('stillwater inspect --stats exits 0 or 2 with one line on stderr', () => {
    for (const [name] of FIXTURES) {
      const bytes = readFileSync(join(root, 'tests/fixtures/fuzz', name));
      for (const index of [1, 4]) {
        const m = mutant(bytes, SEED, index);
        const file = join(dir, `${index}-${name}`);
        writeFileSync(file, m.bytes);
        const r = spawnSync(process.execPath, [join(root, 'main/launch.mjs'), 'inspect', file, '--stats'], { cwd: root, encoding: 'utf8', timeout: TIME_LIMIT_MS });
        expect([0, 2], `${name} mutant ${index}: ${r.stderr}`).toContain(r.status);
        if (r.status === 2) {
          expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
          expect(r.stderr).toContain(file);
        }
      }
    }
  }, TEST_LIMIT_MS);
});
