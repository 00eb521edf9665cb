/** Writes skill.json, skill.csv, skill.md and skill.tex into a folder, all or nothing. */
import { join } from 'node:path';
import type { ComparisonResult } from '../compare/run.js';
import { ensureWritableDir, writeFilesAtomically } from './atomic.js';
import { skillCsv } from './csv.js';
import { skillJson } from './json.js';
import { skillLatex } from './latex.js';
import { skillMarkdown } from './markdown.js';
import type { Provenance } from './types.js';

export const TABLE_FILES = ['skill.json', 'skill.csv', 'skill.md', 'skill.tex'] as const;

export async function writeSkillTables(dir: string, result: ComparisonResult, prov: Provenance, title?: string): Promise<string[]> {
  await ensureWritableDir(dir);
  const files = [
    { path: join(dir, 'skill.json'), text: skillJson(result, prov) },
    { path: join(dir, 'skill.csv'), text: skillCsv(result.rows) },
    { path: join(dir, 'skill.md'), text: skillMarkdown(result, prov, title) },
    { path: join(dir, 'skill.tex'), text: skillLatex(result, title) },
  ];
  await writeFilesAtomically(files);
  return files.map((f) => f.path);
}
