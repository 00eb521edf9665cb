import { resolve } from 'node:path';
import { StillwaterError } from '../../app/errors.js';
import { loadRecipe } from '../../app/recipe/index.js';
import { spinupFromFiles, spinupFromRecipe } from '../../app/spinup/run-spinup.js';
import { parseSnapshotOption } from '../../app/spinup/snapshot-list.js';
import { fullVerdictTable, verdictTable } from '../../app/spinup/verdict-table.js';
import { SPINUP_FILES, writeSpinupOutputs } from '../../app/spinup/write-output.js';
import { checkOutputFolder } from '../../app/output/output-target.js';
import { recipeFiles } from '../../app/recipe/recipe-files.js';
import type { SpinupResult } from '../../app/spinup/types.js';
import { allowOnly, optional, optionalNumber, parseArgs, required } from '../args.js';
import type { Command } from '../command.js';
import { err, out } from '../command.js';

const usage = `stillwater spinup --recipe R.json --out DIR [options]
stillwater spinup --snapshots "a.nc:100,b.nc:200" --variables po4,o2 --out DIR [options]

Follows a run through its spin-up snapshots (runs[].snapshots: [{file, year}] in the recipe): the
volume-weighted mean and inventory of every tracer per region and layer, the drift over the last model
years, a first-order fit x(t) = x∞ + (x0 − x∞)·e^(−t/τ), and a verdict: settled or still drifting. With a
recipe, every snapshot is also scored against the reference. Writes DIR/spinup.json, DIR/spinup.csv and,
with skill, DIR/spinup-skill.csv; prints a verdict table.

  --recipe R.json        the comparison recipe (regions, layers, reference, the run's snapshots)
  --run LABEL            the run to follow (default: the first run that lists snapshots)
  --snapshots LIST       snapshots as file:model-year, comma separated; a file with a CF time axis may be
                         given alone ("all.nc") to take one snapshot per time step
  --variables A,B        the tracers to follow (recipe keys with --recipe, else names in the files);
                         default with a recipe: the run's variables that the first snapshot holds
  --threshold 0.1        settled below this drift, per cent of the mean per 1000 years (default 0.1)
  --tail-years N         measure the drift over the last N model years (default: the last 10 % of the
                         series, at least 3 snapshots)
  --density 1025         nominal seawater density for amounts per kg, kg m-3 (default: the recipe's, else 1025)
  --no-skill             do not score the snapshots against the reference
  --full-table           print one line per tracer x region x layer with the fit, instead of the compact table
  --out DIR              output folder (created if needed)
  --json                 print spinup.json's summary and verdicts on stdout`;

function positive(name: string, v: number | undefined): number | undefined {
  if (v !== undefined && !(v > 0)) throw new StillwaterError('E_INPUT', `--${name} must be a positive number, got ${v}.`);
  return v;
}

export const spinupCommand: Command = {
  name: 'spinup',
  summary: 'drift, approach to equilibrium and skill over a spin-up',
  usage,
  async run(argv: string[]): Promise<number> {
    const args = parseArgs(argv, ['json', 'no-skill', 'full-table']);
    allowOnly(args, 'spinup', ['recipe', 'run', 'snapshots', 'variables', 'threshold', 'tail-years', 'density', 'no-skill', 'full-table', 'out', 'json']);
    const outDir = resolve(required(args, 'out'));
    const recipePath = optional(args, 'recipe');
    const snapshotText = optional(args, 'snapshots');
    if (!recipePath && !snapshotText) throw new StillwaterError('E_INPUT', 'Give --recipe R.json, or --snapshots with --variables.');
    const snapshots = snapshotText ? parseSnapshotOption(snapshotText).map((s) => ({ ...s, file: resolve(s.file) })) : undefined;
    const variables = optional(args, 'variables')
      ?.split(',')
      .map((v) => v.trim())
      .filter((v) => v.length > 0);
    const settings = {
      ...(args.options.has('threshold') ? { thresholdPercentPerKyr: positive('threshold', optionalNumber(args, 'threshold'))! } : {}),
      ...(args.options.has('tail-years') ? { tailYears: positive('tail-years', optionalNumber(args, 'tail-years')) } : {}),
      ...(args.options.has('density') ? { nominalDensity: positive('density', optionalNumber(args, 'density'))! } : {}),
    };
    const tty = process.stderr.isTTY;
    const progress = (f: number, m: string): void => {
      if (tty) process.stderr.write(`\r${(f * 100).toFixed(0).padStart(3)}% ${m}`.padEnd(78));
    };
    let result: SpinupResult;
    try {
      if (recipePath) {
        const recipe = await loadRecipe(recipePath);
        checkOutputFolder(outDir, SPINUP_FILES, { inputs: [resolve(recipePath), ...recipeFiles(recipe).map((f) => f.file)], label: '--out' });
        result = await spinupFromRecipe(recipe, { run: optional(args, 'run'), variables, snapshots, settings, skill: !args.switches.has('no-skill'), progress });
      } else {
        if (optional(args, 'run')) throw new StillwaterError('E_INPUT', '--run needs --recipe.');
        checkOutputFolder(outDir, SPINUP_FILES, { inputs: snapshots!.map((s) => s.file), label: '--out' });
        result = await spinupFromFiles(snapshots!, variables ?? [], { settings, progress });
      }
    } finally {
      if (tty) process.stderr.write('\n');
    }
    const files = await writeSpinupOutputs(outDir, result);
    if (args.switches.has('json')) {
      const verdicts = result.tracks.map((t) => ({
        tracer: t.tracer,
        region: t.region,
        layer: t.layer,
        status: t.verdict.status,
        drift_percent_per_kyr: t.drift?.percentPerKyr ?? null,
        x_inf: t.fit?.xInf ?? null,
        tau_years: t.fit?.tau ?? null,
        monotonic: t.monotonic,
        deep_caution: t.verdict.deepCaution,
        sentence: t.verdict.sentence,
      }));
      out(JSON.stringify({ summary: result.summary, years: result.years, verdicts, notes: result.notes, files }, null, 1));
    } else {
      out(args.switches.has('full-table') ? fullVerdictTable(result) : verdictTable(result));
      for (const note of result.notes) err(`note: ${note}`);
      for (const f of files) err(`wrote ${f}`);
    }
    return 0;
  },
};
