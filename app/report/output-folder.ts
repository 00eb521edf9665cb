/**
 * A folder written as one step: everything goes into a temporary folder beside the target; commit() puts it
 * in place (an earlier folder of that name is moved aside and removed only once the new one is there),
 * discard() removes it. A report folder is complete or absent. The one place to switch to a shared output
 * layer once there is one.
 */
import { appendFile, mkdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { StillwaterError } from '../errors.js';

export interface OutputFolder {
  /** where files go until commit */
  readonly staging: string;
  write(relativePath: string, data: string | Uint8Array): Promise<void>;
  /** add to a file written before (or start it) */
  append(relativePath: string, data: string): Promise<void>;
  /** read back a text file written before commit */
  readText(relativePath: string): Promise<string>;
  commit(): Promise<void>;
  discard(): Promise<void>;
}

const tempName = (dir: string, tag: string) => join(dirname(dir), `.${basename(dir)}.${tag}.${process.pid}.${Math.random().toString(36).slice(2, 8)}`);

export async function openOutputFolder(target: string): Promise<OutputFolder> {
  const existing = await stat(target).catch(() => null);
  if (existing && !existing.isDirectory()) throw new StillwaterError('E_FILE', `${target}: exists and is not a folder, so the report cannot be written there.`, { file: target });
  const staging = tempName(target, 'partial');
  try {
    await mkdir(dirname(target), { recursive: true });
    await mkdir(staging);
  } catch (e) {
    throw new StillwaterError('E_FILE', `${target}: the output folder cannot be written (${(e as NodeJS.ErrnoException).code ?? 'error'}).`, { file: target });
  }
  let done = false;
  return {
    staging,
    async write(rel, data) {
      const path = join(staging, rel);
      await mkdir(dirname(path), { recursive: true });
      await writeFile(path, data);
    },
    async append(rel, data) {
      const path = join(staging, rel);
      await mkdir(dirname(path), { recursive: true });
      await appendFile(path, data);
    },
    async readText(rel) {
      return readFile(join(staging, rel), 'utf8');
    },
    async commit() {
      const before = await stat(target).catch(() => null);
      const aside = before ? tempName(target, 'previous') : null;
      try {
        if (aside) await rename(target, aside);
        await rename(staging, target);
      } catch (e) {
        if (aside) await rename(aside, target).catch(() => undefined);
        throw new StillwaterError('E_FILE', `${target}: the report could not be put in place (${(e as NodeJS.ErrnoException).code ?? 'error'}).`, { file: target });
      }
      done = true;
      if (aside) await rm(aside, { recursive: true, force: true });
    },
    async discard() {
      if (!done) await rm(staging, { recursive: true, force: true });
    },
  };
}
