import { resolve } from 'node:path';
import { StillwaterError } from '../../app/errors.js';
import { jsonText } from '../../app/output/json-keys.js';
import { formatNumber } from '../../app/output/number-format.js';
import { writeOutputFiles } from '../../app/output/output-set.js';
import { checkOutputFolder } from '../../app/output/output-target.js';
import { recipeFiles } from '../../app/recipe/recipe-files.js';
import { pointsCsv, pointsJson, pointsSkillCsv } from '../../app/points/points-output.js';
import { runPoints, stationProblems } from '../../app/points/run-points.js';
import { loadRecipe } from '../../app/recipe/index.js';
import { allowOnly, optional, parseArgs, required } from '../args.js';
import type { Command } from '../command.js';
import { err, out } from '../command.js';

const usage = `stillwater points --recipe R.json --var V --stations S.csv --out DIR [options]

Samples the reference and every run of a recipe at station observations and writes DIR/points.csv
(each station: observed, model, model minus observed, status), DIR/points-skill.csv (statistics per
source, also of log10 values) and DIR/points.json.

Station CSV: a header with longitude, latitude, depth, value (optional id, time, units); depth in
metres (positive down) or the word seafloor; units on a first comment line "# units: mmol m-3" or
in a units column. Stations on land, below the seafloor or off a grid are listed on stderr, one
sentence each, and left out of that source's statistics.

  --recipe R.json        the comparison recipe
  --var V                a variable of the recipe's reference
  --stations S.csv       the station observations
  --method trilinear     trilinear (default) or nearest (nearest wet cell)
  --out DIR              output folder (created if needed)
  --json                 print the statistics as JSON on stdout`;

const fmt = (v: number | null): string => formatNumber(v);

export const pointsCommand: Command = {
  name: 'points',
  summary: 'the model against station observations',
  usage,
  async run(argv: string[]): Promise<number> {
    const args = parseArgs(argv, ['json']);
    allowOnly(args, 'points', ['recipe', 'var', 'stations', 'method', 'out', 'json']);
    const recipePath = required(args, 'recipe');
    const variable = required(args, 'var');
    const stationsFile = resolve(required(args, 'stations'));
    const outDir = resolve(required(args, 'out'));
    const method = optional(args, 'method') ?? 'trilinear';
    if (method !== 'trilinear' && method !== 'nearest') throw new StillwaterError('E_INPUT', `--method must be trilinear or nearest, got '${method}'.`);
    const recipe = await loadRecipe(recipePath);
    checkOutputFolder(outDir, ['points.csv', 'points-skill.csv', 'points.json'], { inputs: [resolve(recipePath), stationsFile, ...recipeFiles(recipe).map((f) => f.file)], label: '--out' });
    const result = await runPoints(recipe, { variable, stationsFile, method });
    for (const p of stationProblems(result)) err(p);
    const json = pointsJson(result);
    const files = await writeOutputFiles(outDir, [
      { name: 'points.csv', data: pointsCsv(result) },
      { name: 'points-skill.csv', data: pointsSkillCsv(result) },
      { name: 'points.json', data: jsonText(json) },
    ]);
    if (args.switches.has('json')) {
      out(JSON.stringify({ variable: result.variable, units: result.units, stations: result.stations.n, spans_decades: result.spansDecades, skill: json.skill, files, notes: result.notes }, null, 1));
      return 0;
    }
    out(`${result.variable} (${result.units}) at ${result.stations.n} stations, ${result.method} sampling${result.spansDecades ? '; observations span decades: read the log10 columns' : ''}`);
    const w = Math.max(6, ...result.sources.map((s) => s.label.length));
    out(`${'source'.padEnd(w)}  ${'n'.padStart(5)} ${'bias'.padStart(10)} ${'rmse'.padStart(10)} ${'corr'.padStart(8)} ${'log10 rmse'.padStart(11)} ${'not sampled'.padStart(11)}`);
    for (const s of result.sources) {
      const c = s.skill.counts;
      const st = s.skill.stats;
      out(`${s.label.padEnd(w)}  ${String(st.n).padStart(5)} ${fmt(st.bias).padStart(10)} ${fmt(st.rmse).padStart(10)} ${fmt(st.corr).padStart(8)} ${fmt(s.skill.log10.rmse).padStart(11)} ${String(c.on_land + c.below_seafloor + c.outside_grid).padStart(11)}`);
    }
    for (const note of result.notes) err(`note: ${note}`);
    for (const f of files) err(`wrote ${f}`);
    return 0;
  },
};
