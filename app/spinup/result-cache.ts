import { createHash } from 'node:crypto';
import { readFile, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { writeOutputFile } from '../output/output-set.js';
import type { SpinupResult } from './types.js';

const RESULT_SHAPE = 3;

/**
 * Spin-up results kept on disk between requests of the workbench (worker threads do not share memory):
 * keyed by the request and by the size and modification time of every file it reads, so a changed
 * snapshot is never answered from the cache. A damaged or missing entry is simply recomputed.
 */
export async function cacheKey(request: unknown, files: string[]): Promise<string> {
  const h = createHash('sha256');
  // the shape of a result: raised when what a result holds changes (2: skill of concentrations in the tracks' units; 3: units typeset in the sentences and notes)
  h.update(`result ${RESULT_SHAPE}\n`);
  h.update(JSON.stringify(request));
  for (const f of [...new Set(files)].sort()) {
    try {
      const st = await stat(f);
      h.update(`\n${f} ${st.size} ${st.mtimeMs}`);
    } catch {
      h.update(`\n${f} absent`);
    }
  }
  return h.digest('hex');
}

/** JSON has no NaN: missing values come back as null; restore NaN for the typed contract. */
export function restoreNaN(r: SpinupResult): SpinupResult {
  for (const t of r.tracks) for (const k of ['mean', 'inventory', 'meanDeviation', 'inventoryDeviation'] as const) t[k] = t[k].map((v) => (v === null ? NaN : v));
  return r;
}

export async function readCachedResult(dir: string, key: string): Promise<SpinupResult | undefined> {
  try {
    const r = JSON.parse(await readFile(join(dir, 'spinup', `${key}.json`), 'utf8')) as SpinupResult;
    return Array.isArray(r.tracks) && Array.isArray(r.years) && r.summary ? restoreNaN(r) : undefined;
  } catch {
    return undefined;
  }
}

export async function writeCachedResult(dir: string, key: string, r: SpinupResult): Promise<void> {
  try {
    await writeOutputFile(join(dir, 'spinup', `${key}.json`), JSON.stringify(r));
  } catch {
    // a cache that cannot be written only costs time
  }
}
