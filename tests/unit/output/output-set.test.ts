/**
 * The output layer's promise (app/output/README.md): a set of files lands complete or not at all, earlier
 * files come back on failure, a kill during the final renames is undone by the next write into the folder,
 * and leftovers of interrupted runs (ours and those of the writers before it) are removed.
 */
import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildSync } from 'esbuild';
import { describe, expect, it } from 'vitest';
import { clearLeftovers, leftoverPid } from '../../../app/output/leftovers.js';
import { openOutputSet, writeOutputFile, writeOutputFiles } from '../../../app/output/output-set.js';

const fresh = (): string => mkdtempSync(join(tmpdir(), 'sw-output-'));
const text = (dir: string, name: string): string => readFileSync(join(dir, name), 'utf8');

/** A pid that certainly belonged to a process that has ended. */
function deadPid(): number {
  const r = spawnSync(process.execPath, ['-e', '']);
  return r.pid!;
}

describe('a set of outputs is complete or unchanged', () => {
  it('places every file of the set, replacing earlier ones, and leaves nothing else behind', async () => {
    const dir = fresh();
    writeFileSync(join(dir, 'a.csv'), 'old a');
    const placed = await writeOutputFiles(dir, [{ name: 'a.csv', data: 'new a' }, { name: 'b.json', data: Uint8Array.of(123, 125) }]);
    expect(placed).toEqual([join(dir, 'a.csv'), join(dir, 'b.json')]);
    expect(text(dir, 'a.csv')).toBe('new a');
    expect(text(dir, 'b.json')).toBe('{}');
    expect(readdirSync(dir).sort()).toEqual(['a.csv', 'b.json']);
  });

  it('creates a missing folder, and writes a single file as a set of one', async () => {
    const dir = join(fresh(), 'deeper', 'out');
    await writeOutputFile(join(dir, 'recipe.json'), '{}\n');
    expect(readdirSync(dir)).toEqual(['recipe.json']);
  });

  it('when one target cannot take its file, no file of the set is placed and earlier files are kept', async () => {
    const dir = fresh();
    writeFileSync(join(dir, 'old.md'), 'before');
    mkdirSync(join(dir, 'b.csv')); // a folder where a file is meant
    await expect(writeOutputFiles(dir, [{ name: 'old.md', data: 'after' }, { name: 'b.csv', data: 'x' }])).rejects.toThrow(/b\.csv: is not a regular file/);
    expect(text(dir, 'old.md')).toBe('before');
    expect(readdirSync(dir).sort()).toEqual(['b.csv', 'old.md']);
  });

  it('a failure after some files were placed puts the earlier files back and removes the new ones', async () => {
    const dir = fresh();
    writeFileSync(join(dir, 'a.csv'), 'old a');
    const set = await openOutputSet(dir, {
      afterPlaced: (_n, i) => {
        if (i === 1) throw new Error('disk full (simulated)');
      },
    });
    for (const n of ['a.csv', 'b.csv', 'c.csv']) await set.add(n, `new ${n}`);
    await expect(set.commit()).rejects.toThrow(/b\.csv: cannot be written \(disk full \(simulated\)\); the earlier files were kept/);
    expect(readdirSync(dir)).toEqual(['a.csv']);
    expect(text(dir, 'a.csv')).toBe('old a');
  });

  it('discard leaves the folder as it was', async () => {
    const dir = fresh();
    const set = await openOutputSet(dir);
    await set.add('a.csv', 'x');
    await set.discard();
    expect(readdirSync(dir)).toEqual([]);
  });

  it.skipIf(process.getuid?.() === 0)('a folder that cannot be written is one sentence naming it', async () => {
    const dir = fresh();
    chmodSync(dir, 0o500);
    try {
      await expect(writeOutputFiles(dir, [{ name: 'a.csv', data: 'x' }])).rejects.toThrow(new RegExp(`^${dir}: the output folder cannot be written \\(EACCES\\)\\.$`));
    } finally {
      chmodSync(dir, 0o700);
    }
  });
});

describe('interrupted runs', () => {
  it('a process killed between its final renames: the next write into the folder puts the earlier set back first', async () => {
    const dir = fresh();
    for (const n of ['a.csv', 'b.csv', 'c.csv']) writeFileSync(join(dir, n), `old ${n}`);
    const child = join(fresh(), 'child.mjs');
    buildSync({ entryPoints: [join(__dirname, 'kill-during-renames.child.ts')], bundle: true, platform: 'node', format: 'esm', outfile: child, logLevel: 'silent' });
    const r = spawnSync(process.execPath, [child, dir], { encoding: 'utf8' });
    expect(r.signal).toBe('SIGKILL');
    // what the kill left: two new files beside an old one, and the staging folder with its journal
    expect(['a.csv', 'b.csv', 'c.csv'].map((n) => text(dir, n))).toEqual(['new a.csv', 'new b.csv', 'old c.csv']);
    const staging = readdirSync(dir).filter((n) => n.startsWith('.stillwater-out-'));
    expect(staging).toHaveLength(1);
    expect(existsSync(join(dir, staging[0], 'journal.json'))).toBe(true);

    expect(await clearLeftovers(dir)).toEqual(staging);
    expect(['a.csv', 'b.csv', 'c.csv'].map((n) => text(dir, n))).toEqual(['old a.csv', 'old b.csv', 'old c.csv']);
    expect(readdirSync(dir).sort()).toEqual(['a.csv', 'b.csv', 'c.csv']);
  });

  it('a file the killed run added (no earlier file) is removed when its set is undone', async () => {
    const dir = fresh();
    writeFileSync(join(dir, 'c.csv'), 'old c.csv');
    const child = join(fresh(), 'child.mjs');
    buildSync({ entryPoints: [join(__dirname, 'kill-during-renames.child.ts')], bundle: true, platform: 'node', format: 'esm', outfile: child, logLevel: 'silent' });
    expect(spawnSync(process.execPath, [child, dir]).signal).toBe('SIGKILL');
    await writeOutputFiles(dir, [{ name: 'other.txt', data: 'next run' }]);
    expect(readdirSync(dir).sort()).toEqual(['c.csv', 'other.txt']);
    expect(text(dir, 'c.csv')).toBe('old c.csv');
  });

  it('temporary files and folders of every earlier writer are recognised, and removed once their process is gone', async () => {
    const dir = fresh();
    const dead = deadPid();
    const names = [
      `.stillwater-out-${dead}-0a1b2c3d`, // this layer's staging folder
      `.stillwater-fields-${dead}-1733390000000`, // the fields writer before it
      `.skill.csv.${dead}.k3x9q1.tmp`, // report tables
      `.section.csv.${dead}-1733390000000.tmp`, // line files
      `spinup.json.tmp-${dead}-1733390000000`, // spin-up files
      `.out.nc.${dead}.1733390000000.partial`, // the NetCDF writer
    ];
    for (const n of names) expect(leftoverPid(n), n).toBe(dead);
    mkdirSync(join(dir, names[0]));
    mkdirSync(join(dir, names[1]));
    for (const n of names.slice(2)) writeFileSync(join(dir, n), 'partial');
    const alive = `.skill.csv.${process.pid}.abcdef.tmp`; // a write in progress in this very process
    writeFileSync(join(dir, alive), '');
    writeFileSync(join(dir, 'notes.tmp'), 'a person\'s own file');
    await writeOutputFiles(dir, [{ name: 'skill.csv', data: 'x' }]);
    expect(readdirSync(dir).sort()).toEqual([alive, 'notes.tmp', 'skill.csv'].sort());
  });
});
