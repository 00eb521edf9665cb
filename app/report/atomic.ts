/** Outputs are written to a temporary file beside the target and renamed into place. */
import { mkdir, rename, rm, stat, writeFile } from 'node:fs/promises';
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
 * Write several files as one step: all go to temporary names first; only when every one is complete are
 * they renamed into place, an earlier file at a target being kept aside until all renames succeeded. On any
 * failure the new files and temporaries are removed and the earlier files put back: nothing half-written.
 */
export async function writeFilesAtomically(files: { path: string; text: string }[]): Promise<void> {
  const temps: string[] = [];
  const placed: string[] = [];
  const kept: { path: string; aside: string }[] = [];
  let current = files[0]?.path ?? '.';
  try {
    for (const f of files) {
      current = f.path;
      const t = tempPathFor(f.path);
      temps.push(t);
      await writeFile(t, f.text, 'utf8');
    }
    for (const f of files) {
      current = f.path;
      const st = await stat(f.path).catch(() => null);
      if (st && !st.isFile()) throw Object.assign(new Error('not a file'), { code: 'EISDIR' });
    }
    for (let i = 0; i < files.length; i++) {
      current = files[i].path;
      if (await stat(files[i].path).catch(() => null)) {
        const aside = tempPathFor(files[i].path);
        await rename(files[i].path, aside);
        kept.push({ path: files[i].path, aside });
      }
      await rename(temps[i], files[i].path);
      placed.push(files[i].path);
    }
  } catch (e) {
    await Promise.all([...temps, ...placed].map((t) => rm(t, { force: true })));
    for (const k of kept) await rename(k.aside, k.path).catch(() => undefined);
    throw new StillwaterError('E_FILE', `${current}: cannot be written (${(e as NodeJS.ErrnoException).code ?? (e as Error).message}).`, { file: current });
  }
  await Promise.all(kept.map((k) => rm(k.aside, { force: true })));
}
