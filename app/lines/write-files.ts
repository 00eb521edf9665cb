/** Output files are written to a temporary name in the same folder and renamed into place. */
import { mkdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { StillwaterError } from '../errors.js';

/** Make sure the output folder exists and is a folder; one clear sentence when it cannot be. */
export function prepareOutputFolder(dir: string): void {
  try {
    mkdirSync(dir, { recursive: true });
    if (!statSync(dir).isDirectory()) throw new Error('not a folder');
  } catch (e) {
    throw new StillwaterError('E_FILE', `${dir}: the output folder cannot be created or is not a folder (${(e as Error).message}).`, { file: dir });
  }
}

/** Write each file under a temporary name first, then rename them all; nothing half-written on failure. */
export function writeFilesAtomic(dir: string, files: Record<string, string>): string[] {
  prepareOutputFolder(dir);
  const stamp = `${process.pid}-${Date.now()}`;
  const temps: [string, string][] = [];
  try {
    for (const [name, text] of Object.entries(files)) {
      const final = join(dir, name);
      const temp = join(dir, `.${name}.${stamp}.tmp`);
      writeFileSync(temp, text);
      temps.push([temp, final]);
    }
  } catch (e) {
    for (const [t] of temps) rmSync(t, { force: true });
    throw new StillwaterError('E_FILE', `${dir}: cannot write the output files (${(e as Error).message}).`, { file: dir });
  }
  for (const [t, f] of temps) renameSync(t, f);
  return temps.map(([, f]) => f);
}

/** A number for CSV: empty for NaN, otherwise up to 7 significant digits (float32 data). */
export function csvNumber(v: number, digits = 7): string {
  if (!Number.isFinite(v)) return '';
  return String(Number(v.toPrecision(digits)));
}

/** A number for JSON: null for NaN (JSON has no NaN). */
export function jsonNumber(v: number, digits = 7): number | null {
  return Number.isFinite(v) ? Number(v.toPrecision(digits)) : null;
}

/** Quote a CSV field when it holds a comma, a quote or a line break (RFC 4180). */
export function csvText(s: string): string {
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}
