/** Outputs are written to a temporary file beside the target and renamed into place. */
import { mkdir, rename, rm, writeFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { StillwaterError } from '../errors.js';

export function tempPathFor(path: string): string {
  return join(dirname(path), `.${basename(path)}.${process.pid}.${Math.random().toString(36).slice(2, 8)}.tmp`);
}

/** Make sure `dir` exists and can be written, with one clear sentence if not. */
export async function ensureWritableDir(dir: string): Promise<void> {
  try {
    await mkdir(dir, { recursive: true });
    const probe = tempPathFor(join(dir, 'probe'));
    await writeFile(probe, '');
    await rm(probe, { force: true });
  } catch (e) {
    const why = (e as NodeJS.ErrnoException).code ?? 'error';
    throw new StillwaterError('E_FILE', `${dir}: the output folder cannot be written (${why}).`, { file: dir });
  }
}

/**
 * Write several files as one step: all go to temporary names first, and only when every one is complete
 * are they renamed into place; on any failure the temporaries are removed and nothing is left half-written.
 */
export async function writeFilesAtomically(files: { path: string; text: string }[]): Promise<void> {
  const temps: string[] = [];
  try {
    for (const f of files) {
      const t = tempPathFor(f.path);
      temps.push(t);
      await writeFile(t, f.text, 'utf8');
    }
    for (let i = 0; i < files.length; i++) await rename(temps[i], files[i].path);
  } catch (e) {
    await Promise.all(temps.map((t) => rm(t, { force: true })));
    const failed = files[temps.length - 1]?.path ?? dirname(files[0]?.path ?? '.');
    throw new StillwaterError('E_FILE', `${failed}: cannot be written (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}).`, { file: failed });
  }
}
