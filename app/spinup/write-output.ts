import { mkdir, rename, rm, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { StillwaterError } from '../errors.js';
import { skillCsv, tracksCsv } from './csv.js';
import type { SpinupResult } from './types.js';

/**
 * Write spinup.json, spinup.csv (and spinup-skill.csv when there is skill) into `dir`. Every file is first
 * written under a temporary name; only when all are complete are they renamed into place, so a failure
 * leaves no half-written result. Returns the paths written.
 */
export async function writeSpinupOutputs(dir: string, result: SpinupResult): Promise<string[]> {
  try {
    await mkdir(dir, { recursive: true });
  } catch (e) {
    throw new StillwaterError('E_FILE', `${dir}: cannot create the output folder (${(e as Error).message}).`, { file: dir });
  }
  const files: [string, string][] = [
    ['spinup.json', JSON.stringify(result, null, 1) + '\n'],
    ['spinup.csv', tracksCsv(result)],
  ];
  if (result.skill.length) files.push(['spinup-skill.csv', skillCsv(result.skill)]);
  const stamp = `.tmp-${process.pid}-${Date.now()}`;
  const temps: string[] = [];
  try {
    for (const [name, text] of files) {
      const tmp = join(dir, name + stamp);
      temps.push(tmp);
      await writeFile(tmp, text, { flag: 'wx' });
    }
    for (let i = 0; i < files.length; i++) await rename(temps[i], join(dir, files[i][0]));
  } catch (e) {
    await Promise.all(temps.map((t) => rm(t, { force: true })));
    throw new StillwaterError('E_FILE', `${dir}: cannot write the spin-up results (${(e as Error).message}).`, { file: dir });
  }
  return files.map(([name]) => join(dir, name));
}
