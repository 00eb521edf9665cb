import { resolve } from 'node:path';
import { openField } from '../../app/cf/open-field.js';
import type { FieldSource } from '../../app/cf/field-source.js';
import { parseUnits } from '../../app/cf/units.js';
import { StillwaterError } from '../../app/errors.js';
import { fieldFromDataset } from '../../app/cf/open-field.js';
import { openDataset } from '../../app/io/open.js';
import { canConvert } from '../../app/ocean/convert.js';
import { defaultCacheDir } from '../../app/regrid/weight-cache.js';
import { writeRegridded } from '../../app/regrid/write-regridded.js';
import { checkOutputFile } from '../../app/output/output-target.js';
import type { RemapMethod } from '../../app/regrid/csr.js';
import { allowOnly, optional, optionalNumber, parseArgs, required } from '../args.js';
import type { Command } from '../command.js';
import { err, out } from '../command.js';

const usage = `stillwater regrid --source FILE --var NAME --target FILE --out OUT.nc [options]

Regrids one variable onto the grid of another file (horizontal and vertical, level by level) and
writes a CF NetCDF file with the regridded variable and the covered fraction of each target cell.

  --source FILE          the file holding the variable
  --var NAME             the variable to regrid
  --target FILE          a file on the target grid
  --target-var NAME      the target file's variable whose grid to use (default: the first gridded one)
  --out OUT.nc           the output file (written to a temporary name, then renamed)
  --method M             conservative (default), bilinear or nearest (nearest wet cell)
  --coverage F           minimum covered fraction of a target cell, 0..1 (default 0.5)
  --vertical V           overlap (thickness-weighted, default) or linear (between level centres)
  --units U              convert to these units (concentrations by a nominal 1025 kg m-3, said in the output)
  --cache-dir DIR        where regridding weights are kept (default: the user's cache folder)
  --json                 print a machine-readable summary on stdout`;

const METHODS: RemapMethod[] = ['conservative', 'bilinear', 'nearest'];

export const regridCommand: Command = {
  name: 'regrid',
  summary: 'regrid a variable onto another file\'s grid (conservative, bilinear or nearest)',
  usage,
  async run(argv: string[]): Promise<number> {
    const args = parseArgs(argv, ['json']);
    allowOnly(args, 'regrid', ['source', 'var', 'target', 'target-var', 'out', 'method', 'coverage', 'vertical', 'units', 'cache-dir', 'json']);
    const source = resolve(required(args, 'source'));
    const variable = required(args, 'var');
    const target = resolve(required(args, 'target'));
    const targetVar = optional(args, 'target-var');
    const outPath = resolve(required(args, 'out'));
    const method = (optional(args, 'method') ?? 'conservative') as RemapMethod;
    if (!METHODS.includes(method)) throw new StillwaterError('E_INPUT', `--method must be one of ${METHODS.join(', ')}, got '${method}'.`);
    const coverage = optionalNumber(args, 'coverage') ?? 0.5;
    if (!(coverage >= 0 && coverage <= 1)) throw new StillwaterError('E_INPUT', `--coverage must lie between 0 and 1, got ${coverage}.`);
    const vertical = optional(args, 'vertical') ?? 'overlap';
    if (vertical !== 'overlap' && vertical !== 'linear') throw new StillwaterError('E_INPUT', `--vertical must be overlap or linear, got '${vertical}'.`);
    checkOutputFile(required(args, 'out'), { inputs: [source, target], label: '--out' });
    const unitsText = optional(args, 'units');

    const src = await openField(source, variable);
    let tgt: FieldSource | null = null;
    try {
      tgt = targetVar ? await openField(target, targetVar) : await firstGriddedField(target);
      const toUnits = unitsText !== undefined ? parseUnits(unitsText) : null;
      if (toUnits && !canConvert(src.units, toUnits, isOxygen(src))) {
        throw new StillwaterError('E_UNITS', `${source}, variable '${variable}': there is no conversion from '${src.units.text}' to '${unitsText}'.`, { file: source, variable });
      }
      const summary = await writeRegridded(src, tgt.grid, outPath, {
        method,
        coverage,
        vertical,
        units: toUnits,
        oxygen: isOxygen(src),
        cacheDir: optional(args, 'cache-dir') ?? defaultCacheDir(),
        targetFile: target,
        targetFileGrid: await tgt.fileGrid?.(),
        history: `stillwater regrid ${argv.join(' ')}`,
        progress: (done, total) => {
          if (done === total || done % Math.max(1, Math.round(total / 10)) === 0) err(`regrid: level ${done} of ${total}`);
        },
      });
      if (summary.note) err(summary.note);
      if (args.switches.has('json')) out(JSON.stringify(summary, null, 2));
      else {
        out(`${summary.out}: '${summary.variable}' (${summary.units}) on ${summary.grid}, ${summary.levels} level(s) x ${summary.times} time step(s)`);
        out(`method ${summary.method}${summary.vertical !== 'none' ? `, vertical ${summary.vertical}` : ''}, coverage threshold ${summary.coverageThreshold}; weights ${summary.weights.origin === 'separable' ? 'as two per-axis factors' : summary.weights.origin} (${summary.weights.entries} entries)`);
        out(`valid target values: ${summary.validTarget} of ${summary.totalTarget}`);
      }
      return 0;
    } finally {
      await src.close?.().catch(() => undefined);
      await tgt?.close?.().catch(() => undefined);
    }
  },
};

function isOxygen(f: FieldSource): boolean {
  const names = [f.variable, f.standardName ?? '', f.longName ?? ''].join(' ').toLowerCase();
  return /\bo2\b|oxygen|^o2|doxy/.test(names);
}

/** The target file's first variable that decodes as a field on a grid. */
async function firstGriddedField(path: string): Promise<FieldSource> {
  const ds = await openDataset(path);
  const coordNames = new Set(ds.variables.map((v) => v.name).filter((n) => ds.dimensions.some((d) => d.name === n)));
  let first: unknown = null;
  for (const v of ds.variables) {
    if (coordNames.has(v.name) || v.dims.length < 2 || /_bnds$|_bounds$/.test(v.name)) continue;
    try {
      const f = await fieldFromDataset(ds, v.name);
      f.close = () => ds.close();
      return f;
    } catch (e) {
      // not a gridded field (bounds, 2-D coordinates, ...): try the next one, keep what went wrong
      first ??= e;
    }
  }
  await ds.close().catch(() => undefined);
  if (first instanceof StillwaterError && first.code !== 'E_VARIABLE') throw first;
  throw new StillwaterError('E_GRID', `${path}: no variable on a grid to take as the target (name one with --target-var).`, { file: path });
}
