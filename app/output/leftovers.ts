/**
 * What an interrupted write leaves in an output folder, and how the next write clears it.
 * A staging folder `.stillwater-out-<pid>-<tag>` holds the new files (`new/`), hard links to the files they
 * replace (`old/`) and, once the final renames begin, `journal.json` naming the targets. A process killed
 * during the renames leaves that folder behind; the next write into the same folder puts the earlier
 * files back (the set is then unchanged, as if the killed run had never started) and removes the rest.
 * Temporary files of the older writers (`.name.<pid>.<tag>.tmp`, `.partial`, `name.tmp-<pid>-<ms>`,
 * `.stillwater-fields-<pid>-<ms>`) are removed too, once the process that made them is gone.
 */
import { existsSync } from 'node:fs';
import { readFile, readdir, rename, rm } from 'node:fs/promises';
import { join } from 'node:path';

export const STAGING_PREFIX = '.stillwater-out-';

export interface Journal {
  /** target file names, in the order they are placed */
  names: string[];
  /** which targets held a file before (kept in old/ until the set is placed) */
  existed: boolean[];
}

const LEFTOVER_PATTERNS: RegExp[] = [
  /^\.stillwater-out-(\d+)-[0-9a-z]+$/,
  /^\.stillwater-fields-(\d+)-\d+$/,
  /^\..+\.(\d+)[.-][0-9a-z]+\.(?:tmp|partial)$/,
  /^.+\.tmp-(\d+)-\d+$/,
];

/** The pid that made a leftover, or null for a name that is not one of ours. */
export function leftoverPid(name: string): number | null {
  for (const re of LEFTOVER_PATTERNS) {
    const m = re.exec(name);
    if (m) return Number(m[1]);
  }
  return null;
}

function processAlive(pid: number): boolean {
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Undo a set whose renames had begun: every target that had an earlier file gets it back, every target
 * that was new is removed. Without a journal nothing was placed, so there is nothing to undo.
 */
export async function rollBack(dir: string, staging: string): Promise<void> {
  let journal: Journal;
  try {
    journal = JSON.parse(await readFile(join(staging, 'journal.json'), 'utf8')) as Journal;
  } catch {
    return;
  }
  for (let i = 0; i < journal.names.length; i++) {
    const name = journal.names[i];
    const old = join(staging, 'old', name);
    if (journal.existed[i]) {
      if (existsSync(old)) await rename(old, join(dir, name));
    } else if (!existsSync(join(staging, 'new', name))) {
      await rm(join(dir, name), { force: true });
    }
  }
}

/** Clear what interrupted writes of processes that no longer run left in `dir`; returns the names removed. */
export async function clearLeftovers(dir: string): Promise<string[]> {
  let names: string[];
  try {
    names = await readdir(dir);
  } catch {
    return [];
  }
  const removed: string[] = [];
  for (const name of names) {
    const pid = leftoverPid(name);
    if (pid === null || processAlive(pid)) continue;
    const path = join(dir, name);
    if (name.startsWith(STAGING_PREFIX)) await rollBack(dir, path).catch(() => undefined);
    await rm(path, { recursive: true, force: true }).catch(() => undefined);
    removed.push(name);
  }
  return removed;
}
