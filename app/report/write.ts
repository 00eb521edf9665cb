/** Writes skill.json, skill.csv, skill.md and skill.tex (and seasonal-cycle.csv when there are cycle rows) into a folder, as one set (app/output). */
import type { ComparisonResult } from '../compare/run.js';
import { writeOutputFiles } from '../output/output-set.js';
import { cycleCsv, skillCsv } from './skill-csv.js';
import { skillJson } from './skill-json.js';
import { skillLatex } from './latex.js';
import { skillMarkdown } from './markdown.js';
import type { Provenance } from './types.js';

export const TABLE_FILES = ['skill.json', 'skill.csv', 'skill.md', 'skill.tex'] as const;

/** The four tables as files of an output set. */
export function skillTableFiles(result: ComparisonResult, prov: Provenance, title?: string): { name: (typeof TABLE_FILES)[number] | 'seasonal-cycle.csv'; data: string }[] {
  return [
    { name: 'skill.json', data: skillJson(result, prov) },
    { name: 'skill.csv', data: skillCsv(result.rows) },
    { name: 'skill.md', data: skillMarkdown(result, prov, title) },
    { name: 'skill.tex', data: skillLatex(result, title) },
    ...(result.cycles ? [{ name: 'seasonal-cycle.csv' as const, data: cycleCsv(result.cycles) }] : []),
  ];
}

export async function writeSkillTables(dir: string, result: ComparisonResult, prov: Provenance, title?: string): Promise<string[]> {
  return writeOutputFiles(dir, skillTableFiles(result, prov, title));
}
