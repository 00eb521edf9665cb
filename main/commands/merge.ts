import { resolve } from 'node:path';
import { consoleTable } from '../../app/report/console-table.js';
import { mergedProvenance, mergeSkillDocuments, readSkillJson } from '../../app/report/merge.js';
import { TABLE_FILES, writeSkillTables } from '../../app/report/write.js';
import { formatNumber } from '../../app/output/number-format.js';
import { checkOutputFolder } from '../../app/output/output-target.js';
import { StillwaterError } from '../../app/errors.js';
import { allowOnly, parseArgs, required } from '../args.js';
import { err, out, type Command } from '../command.js';
import { toolVersion } from '../package-paths.js';

export const mergeCommand: Command = {
  name: 'merge',
  summary: 'merge skill.json tables of separate compare jobs into one table',
  usage: [
    'stillwater merge --out DIR SKILL.json SKILL.json ... [--json]',
    '',
    'Combines the skill tables that separate `stillwater compare` jobs wrote (for example one job per run',
    'in a job array on a cluster) into DIR/skill.json, skill.csv, skill.md and skill.tex. Each run\'s',
    'multi-tracer cost is recombined from its per-variable terms. The same run, variable, region and layer',
    'in two tables is refused.',
  ].join('\n'),
  async run(argv) {
    const args = parseArgs(argv, ['json']);
    allowOnly(args, 'merge', ['out', 'json']);
    const outDir = resolve(required(args, 'out'));
    if (args.positional.length < 2) throw new StillwaterError('E_INPUT', 'stillwater merge needs at least two skill.json files.');
    checkOutputFolder(outDir, TABLE_FILES, { inputs: args.positional.map((p) => resolve(p)), label: '--out' });
    const docs = [];
    for (const p of args.positional) docs.push({ path: resolve(p), doc: await readSkillJson(resolve(p)) });
    const { result, mergedFrom } = mergeSkillDocuments(docs);
    const written = await writeSkillTables(outDir, result, mergedProvenance(result, mergedFrom, toolVersion()), 'Merged skill table');
    if (args.switches.has('json')) out(JSON.stringify({ outputs: written, costs: result.costs, rows: result.rows.length }, null, 1));
    else {
      out(consoleTable(result.rows));
      out('');
      for (const c of result.costs) out(`cost ${c.run}: ${formatNumber(c.cost)}`);
      err(`merged ${mergedFrom.length} tables (${result.rows.length} rows); wrote ${written.join(', ')}`);
    }
    return 0;
  },
};
