/**
 * The one writer of output files. A set of files bound for one folder is staged in a hidden folder inside it
 * and placed only when every file is complete: the folder then holds all of the new files, or (on any
 * failure, and after a kill, once the next write has cleared it: see leftovers.ts) none of them, with the
 * earlier files back where they were. A single file is a set of one.
 */
import { randomBytes } from 'node:crypto';
import { copyFile, link, lstat, mkdir, rename, rm, stat, writeFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { StillwaterError } from '../errors.js';
import { clearLeftovers, rollBack, STAGING_PREFIX, type Journal } from './leftovers.js';

export interface OutputSet {
  /** the folder the files go to */
  readonly dir: string;
  /** Stage a file with this content. */
  add(name: string, data: string | Uint8Array): Promise<void>;
  /** Reserve `name` and return the staging path where a streaming writer (NetCDF) writes it. */
  stagedPath(name: string): string;
  /** Place every staged file; returns their final paths. */
  commit(): Promise<string[]>;
  /** Drop the staged files; the folder is left as it was. */
  discard(): Promise<void>;
}

export interface CommitHooks {
  /** called after each file is placed (fault injection in tests: a kill between renames) */
  afterPlaced?: (name: string, index: number) => void;
}

function why(e: unknown): string {
  return (e as NodeJS.ErrnoException).code ?? (e as Error).message;
}

function checkName(name: string, dir: string): void {
  if (!name || name !== basename(name) || name === '.' || name === '..' || name.startsWith(STAGING_PREFIX)) {
    throw new StillwaterError('E_INTERNAL', `${dir}: '${name}' is not a plain file name for an output.`, { file: dir });
  }
}

/** Create `dir` when needed and make sure it is a folder we can write into; one sentence when not. */
async function prepareFolder(dir: string): Promise<void> {
  try {
    await mkdir(dir, { recursive: true });
  } catch (e) {
    throw new StillwaterError('E_FILE', `${dir}: the output folder cannot be created (${why(e)}).`, { file: dir });
  }
  const st = await stat(dir);
  if (!st.isDirectory()) throw new StillwaterError('E_FILE', `${dir}: is not a folder, so the outputs cannot be written into it.`, { file: dir });
}

/** Open a set of outputs for `dir`, first clearing what interrupted earlier runs left there. */
export async function openOutputSet(dir: string, hooks: CommitHooks = {}): Promise<OutputSet> {
  await prepareFolder(dir);
  await clearLeftovers(dir);
  const staging = join(dir, `${STAGING_PREFIX}${process.pid}-${randomBytes(4).toString('hex')}`);
  try {
    await mkdir(join(staging, 'new'), { recursive: true, mode: 0o700 });
    await mkdir(join(staging, 'old'), { mode: 0o700 });
  } catch (e) {
    await rm(staging, { recursive: true, force: true }).catch(() => undefined);
    throw new StillwaterError('E_FILE', `${dir}: the output folder cannot be written (${why(e)}).`, { file: dir });
  }
  const names: string[] = [];
  let closed = false;
  const reserve = (name: string): string => {
    checkName(name, dir);
    if (closed) throw new StillwaterError('E_INTERNAL', `${dir}: the output set is already closed.`, { file: dir });
    if (names.includes(name)) throw new StillwaterError('E_INTERNAL', `${join(dir, name)}: written twice in one output set.`, { file: join(dir, name) });
    names.push(name);
    return join(staging, 'new', name);
  };
  const discard = async (): Promise<void> => {
    closed = true;
    await rm(staging, { recursive: true, force: true }).catch(() => undefined);
  };

  return {
    dir,
    stagedPath: reserve,
    async add(name, data) {
      const path = reserve(name);
      try {
        await writeFile(path, data, { flag: 'wx' });
      } catch (e) {
        throw new StillwaterError('E_FILE', `${join(dir, name)}: cannot be written (${why(e)}).`, { file: join(dir, name) });
      }
    },
    discard,
    async commit() {
      closed = true;
      let current = dir;
      try {
        const existed: boolean[] = [];
        for (const name of names) {
          current = join(dir, name);
          await stat(join(staging, 'new', name)); // every reserved file was written
          const st = await stat(current).catch(() => null);
          if (st && !st.isFile()) {
            throw new StillwaterError('E_FILE', `${current}: is not a regular file (a folder or device is there), so it is not replaced.`, { file: current });
          }
          existed.push(!!(await lstat(current).catch(() => null)));
        }
        const journal: Journal = { names, existed };
        await writeFile(join(staging, 'journal.tmp'), JSON.stringify(journal));
        await rename(join(staging, 'journal.tmp'), join(staging, 'journal.json'));
        for (let i = 0; i < names.length; i++) {
          current = join(dir, names[i]);
          if (existed[i]) await link(current, join(staging, 'old', names[i])).catch(() => copyFile(current, join(staging, 'old', names[i])));
          await rename(join(staging, 'new', names[i]), current);
          hooks.afterPlaced?.(names[i], i);
        }
      } catch (e) {
        await rollBack(dir, staging).catch(() => undefined);
        await discard();
        if (e instanceof StillwaterError) throw e;
        throw new StillwaterError('E_FILE', `${current}: cannot be written (${why(e)}); the earlier files were kept.`, { file: current });
      }
      await discard();
      return names.map((n) => join(dir, n));
    },
  };
}

/** Write several files into `dir` as one set. */
export async function writeOutputFiles(dir: string, files: { name: string; data: string | Uint8Array }[]): Promise<string[]> {
  const set = await openOutputSet(dir);
  try {
    for (const f of files) await set.add(f.name, f.data);
  } catch (e) {
    await set.discard();
    throw e;
  }
  return set.commit();
}

/** Write one file: complete at `path`, or the earlier file (if any) unchanged. */
export async function writeOutputFile(path: string, data: string | Uint8Array): Promise<string> {
  const [placed] = await writeOutputFiles(dirname(path), [{ name: basename(path), data }]);
  return placed;
}
