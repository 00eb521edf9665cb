/** spinup.json (keys in snake_case, app/output/README.md), spinup.csv and spinup-skill.csv, as one output set. */
import { camelKeys, jsonText, snakeKeys } from '../output/json-keys.js';
import { writeOutputFiles } from '../output/output-set.js';
import { skillCsv, tracksCsv } from './spinup-csv.js';
import type { SpinupResult } from './types.js';

export const SPINUP_FILES = ['spinup.json', 'spinup.csv', 'spinup-skill.csv'] as const;

export function spinupJson(result: SpinupResult): string {
  return jsonText(snakeKeys(result), 1);
}

/** A spinup.json read back as the in-memory result; files written before keys were snake_case read too. */
export function spinupFromJson(json: unknown): unknown {
  return camelKeys(json, new Set(['skill']));
}

/** Write the files into `dir`; returns the paths written. */
export async function writeSpinupOutputs(dir: string, result: SpinupResult): Promise<string[]> {
  const files = [
    { name: 'spinup.json', data: spinupJson(result) },
    { name: 'spinup.csv', data: tracksCsv(result) },
  ];
  if (result.skill.length) files.push({ name: 'spinup-skill.csv', data: skillCsv(result.skill) });
  return writeOutputFiles(dir, files);
}
