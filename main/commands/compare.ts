import { resolve } from 'node:path';
import { runComparison, type ComparisonResult } from '../../app/compare/run.js';
import { layerLabel } from '../../app/regions/layers.js';
import { loadRecipe } from '../../app/recipe/load.js';
import { recipeToJson } from '../../app/recipe/to-json.js';
import { consoleTable } from '../../app/report/console-table.js';
import { netcdfFieldSinks } from '../../app/report/fields-netcdf.js';
import type { Provenance } from '../../app/report/types.js';
import { skillTableFiles, TABLE_FILES } from '../../app/report/write.js';
import { openOutputSet } from '../../app/output/output-set.js';
import { checkOutputFolder } from '../../app/output/output-target.js';
import { recipeFiles } from '../../app/recipe/recipe-files.js';
import { allowOnly, optional, parseArgs, required } from '../args.js';
import type { Command } from '../command.js';
import { err, out } from '../command.js';
import { toolVersion } from '../package-paths.js';
import { formatNumber } from '../../app/output/number-format.js';

/** A one-line bar redrawn in place; only when stderr is a terminal. */
function progressBar(): { update(f: number, msg: string): void; done(): void } {
  if (!process.stderr.isTTY) return { update: () => undefined, done: () => undefined };
  let last = '';
  return {
    update(f, msg) {
      const width = 30;
      const filled = Math.round(Math.max(0, Math.min(1, f)) * width);
      const line = `[${'#'.repeat(filled)}${'-'.repeat(width - filled)}] ${String(Math.round(f * 100)).padStart(3)}% ${msg}`;
      if (line !== last) process.stderr.write(`\r${line.slice(0, (process.stderr.columns || 100) - 1).padEnd(last.length)}`);
      last = line;
    },
    done() {
      if (last) process.stderr.write('\n');
    },
  };
}

export const compareCommand: Command = {
  name: 'compare',
  summary: 'skill of model runs against a reference, by basin and depth layer (skill tables)',
  usage: [
    'stillwater compare --recipe RECIPE.json --out DIR [--fields] [--json] [--cache DIR]',
    '',
    '  --recipe FILE  the recipe: reference, runs, variables, regions, layers, options',
    '  --out DIR      writes DIR/skill.json, skill.csv, skill.md, skill.tex (created if missing)',
    '  --fields       also writes each run on the common grid and its difference from the reference',
    '                 as CF NetCDF: DIR/fields_<run>_<variable>.nc; with options.periods, every period',
    '                 reported (a period dimension labelled by period_name: annual, JAN..DEC, DJF..SON)',
    '  --json         print the rows, costs and outputs as JSON instead of a table',
    '  --cache DIR    folder for cached regridding weights (default: the user cache folder)',
  ].join('\n'),
  async run(argv: string[]): Promise<number> {
    const args = parseArgs(argv, ['fields', 'json']);
    allowOnly(args, 'compare', ['recipe', 'out', 'fields', 'json', 'cache']);
    const recipePath = resolve(required(args, 'recipe'));
    const outDir = resolve(required(args, 'out'));
    const cache = optional(args, 'cache');
    const recipe = await loadRecipe(recipePath);
    checkOutputFolder(outDir, TABLE_FILES, { inputs: [recipePath, ...recipeFiles(recipe).map((f) => f.file)], label: '--out' });
    const set = await openOutputSet(outDir);
    const bar = progressBar();
    let result: ComparisonResult;
    let written: string[];
    try {
      result = await runComparison(recipe, {
        cacheDir: cache ? resolve(cache) : undefined,
        onProgress: (f, m) => bar.update(f, m),
        keepFields: args.switches.has('fields') ? netcdfFieldSinks(set) : undefined,
      });
      bar.done();
      const prov: Provenance = {
        tool: 'stillwater',
        version: toolVersion(),
        date: new Date().toISOString(),
        recipe: recipePath,
        inputs: result.inputs,
        options: recipeToJson(recipe).options,
        regions: [...new Set(result.rows.map((r) => r.region))],
        layers: recipe.layers.map(layerLabel),
        variables: result.variables,
      };
      for (const f of skillTableFiles(result, prov, recipe.title)) await set.add(f.name, f.data);
      written = await set.commit();
    } catch (e) {
      bar.done();
      await set.discard();
      throw e;
    }
    if (args.switches.has('json')) {
      out(JSON.stringify({ outputs: written, costs: result.costs, rows: result.rows }, null, 1));
    } else {
      out(consoleTable(result.rows));
      out('');
      for (const c of result.costs) out(`cost ${c.run}: ${formatNumber(c.cost)}`);
      err(`wrote ${written.join(', ')}`);
    }
    return 0;
  },
};
