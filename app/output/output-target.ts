/**
 * Output targets are checked before any work is done: a target is a regular file or a new name in a folder
 * that can be written; never a device, never a folder where a file is meant, never a file the same run
 * reads, never inside the kernel's pseudo file systems (/proc, /sys), and for recipes never anything but
 * `.json`. The sentence names the target and what is wrong with it.
 */
import { accessSync, constants, statfsSync, statSync, type Stats } from 'node:fs';
import { dirname, extname, join, resolve } from 'node:path';
import { StillwaterError } from '../errors.js';

/** statfs magic numbers of Linux's proc and sysfs (linux/magic.h: PROC_SUPER_MAGIC, SYSFS_MAGIC). */
const PSEUDO_FS = new Set([0x9fa0, 0x62656572]);

export interface OutputTargetOptions {
  /** files the same run reads; the target may be none of them (compared by device and inode) */
  inputs?: readonly string[];
  /** the only extension allowed, e.g. ".json" */
  extension?: string;
  /** how the target is named in the sentence, e.g. "--out" (default: the path alone) */
  label?: string;
}

function refuse(path: string, label: string | undefined, what: string): StillwaterError {
  return new StillwaterError('E_FILE', `${label ? `${label} ${path}` : path}: ${what}`, { file: path });
}

function statOrNull(path: string): Stats | null {
  try {
    return statSync(path);
  } catch {
    return null;
  }
}

/** The nearest folder that exists at or above `path`. */
function nearestExisting(path: string): string {
  let p = path;
  while (!statOrNull(p)) {
    const up = dirname(p);
    if (up === p) break;
    p = up;
  }
  return p;
}

function checkWritableFolder(folder: string, target: string, label: string | undefined): void {
  const st = statOrNull(folder);
  if (!st || !st.isDirectory()) throw refuse(target, label, `'${folder}' is not a folder, so nothing can be written there.`);
  try {
    if (PSEUDO_FS.has(Number(statfsSync(folder).type))) throw refuse(target, label, 'lies in a system pseudo file system (/proc or /sys), not a place for outputs.');
  } catch (e) {
    if (e instanceof StillwaterError) throw e;
  }
  try {
    accessSync(folder, constants.W_OK | constants.X_OK);
  } catch {
    throw refuse(target, label, `the folder '${folder}' cannot be written.`);
  }
}

function checkNotInput(path: string, st: Stats, inputs: readonly string[], label: string | undefined): void {
  for (const input of inputs) {
    const s = statOrNull(input);
    if (s && s.dev === st.dev && s.ino === st.ino) throw refuse(path, label, `is an input of this run (${input}); outputs never replace inputs.`);
  }
}

/** A file to be written (or replaced) at `path`. Returns the absolute path. */
export function checkOutputFile(path: string, opts: OutputTargetOptions = {}): string {
  const abs = resolve(path);
  if (/[\\/]$/.test(path)) throw refuse(path, opts.label, 'names a folder; give a file name.');
  if (opts.extension && extname(abs).toLowerCase() !== opts.extension.toLowerCase()) {
    throw refuse(path, opts.label, `must be a ${opts.extension} file.`);
  }
  const st = statOrNull(abs);
  if (st) {
    if (st.isDirectory()) throw refuse(path, opts.label, 'is a folder; give a file name.');
    if (!st.isFile()) throw refuse(path, opts.label, 'is not a regular file (a device or other special file); outputs are written only to regular files.');
    checkNotInput(path, st, opts.inputs ?? [], opts.label);
  }
  checkWritableFolder(nearestExisting(dirname(abs)), path, opts.label);
  return abs;
}

/** A folder to write a set of files into (created if needed); `names` are the files the set will hold. */
export function checkOutputFolder(dir: string, names: readonly string[] = [], opts: OutputTargetOptions = {}): string {
  const abs = resolve(dir);
  const st = statOrNull(abs);
  if (st && !st.isDirectory()) throw refuse(dir, opts.label, 'is not a folder; outputs need a folder here.');
  checkWritableFolder(nearestExisting(abs), dir, opts.label);
  if (st) for (const n of names) checkOutputFile(join(abs, n), { inputs: opts.inputs, label: opts.label });
  return abs;
}
