/**
 * Merging the tables of separate compare jobs (one run per job, as on a cluster job array) must give the
 * rows and costs of one job over all runs. The oracle is our own single-job comparison, which
 * tests/integration/compare.test.ts holds against numpy; here the property is that splitting loses nothing.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(__dirname, '../..');
const fx = join(__dirname, '../fixtures/compare');

function stillwater(args: string[]) {
  return spawnSync(process.execPath, [join(root, 'main', 'launch.mjs'), ...args], { encoding: 'utf8' });
}

function writeRecipe(dir: string, name: string, runs: string[]): string {
  const all: Record<string, unknown> = {
    same: { label: 'Same grid', variables: { PO4: { file: join(fx, 'run_same.nc') } } },
    coarse: { label: 'Coarse', variables: { PO4: { file: join(fx, 'run_coarse.nc') } } },
  };
  const recipe = {
    reference: { label: 'Climatology', variables: { PO4: { file: join(fx, 'ref.nc'), name: 'p_mean' } } },
    runs: runs.map((r) => all[r]),
    regions: ['global', 'atlantic', 'pacific'],
    layers: [[0, 100], 'all', 'bottom'],
  };
  const path = join(dir, name);
  writeFileSync(path, JSON.stringify(recipe));
  return path;
}

describe('stillwater merge', () => {
  const dir = mkdtempSync(join(tmpdir(), 'sw-merge-'));
  const cache = join(dir, 'cache');

  it('two one-run jobs merge into the table of one job over both runs', () => {
    for (const [name, runs] of [['both', ['same', 'coarse']], ['a', ['same']], ['b', ['coarse']]] as const) {
      const r = stillwater(['compare', '--recipe', writeRecipe(dir, `${name}.json`, [...runs]), '--out', join(dir, name), '--cache', cache]);
      expect(r.status, r.stderr).toBe(0);
    }
    const m = stillwater(['merge', '--out', join(dir, 'merged'), join(dir, 'a', 'skill.json'), join(dir, 'b', 'skill.json')]);
    expect(m.status, m.stderr).toBe(0);
    const one = JSON.parse(readFileSync(join(dir, 'both', 'skill.json'), 'utf8'));
    const merged = JSON.parse(readFileSync(join(dir, 'merged', 'skill.json'), 'utf8'));
    const key = (r: { run: string; region: string; layer: string }) => `${r.run}|${r.region}|${r.layer}`;
    const sort = (rows: { run: string; region: string; layer: string }[]) => [...rows].sort((x, y) => key(x).localeCompare(key(y)));
    expect(sort(merged.rows)).toEqual(sort(one.rows));
    expect(merged.costs).toEqual(one.costs);
    expect(merged.provenance.merged_from).toHaveLength(2);
    const csv = readFileSync(join(dir, 'merged', 'skill.csv'), 'utf8').trim().split('\n');
    expect(csv.length - 1).toBe(one.rows.length);
  });

  it('refuses the same row in two tables, and a file that is no skill table, with one sentence and exit 2', () => {
    const a = join(dir, 'a', 'skill.json');
    const twice = stillwater(['merge', '--out', join(dir, 'bad'), a, a]);
    expect(twice.status).toBe(2);
    expect(twice.stderr.trim().split('\n')).toHaveLength(1);
    expect(twice.stderr).toMatch(/is also in/);
    const notTable = join(dir, 'not-a-table.json');
    writeFileSync(notTable, JSON.stringify({ hello: 1 }));
    const wrong = stillwater(['merge', '--out', join(dir, 'bad'), a, notTable]);
    expect(wrong.status).toBe(2);
    expect(wrong.stderr).toMatch(/not-a-table\.json: not a skill\.json/);
  });
});
