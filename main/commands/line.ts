import { resolve } from 'node:path';
import { StillwaterError } from '../../app/errors.js';
import { parseRange, parseWaypoints } from '../../app/lines/waypoints.js';
import { LINE_FILES, runLine, writeLineFiles, type LineSpec } from '../../app/lines/run-line.js';
import { jsonText } from '../../app/output/json-keys.js';
import { formatNumber } from '../../app/output/number-format.js';
import { writeOutputFiles } from '../../app/output/output-set.js';
import { checkOutputFolder } from '../../app/output/output-target.js';
import { recipeFiles } from '../../app/recipe/recipe-files.js';
import { runZonalMean, zonalCsv, zonalJson } from '../../app/lines/zonal-mean.js';
import { loadRecipe } from '../../app/recipe/index.js';
import { allowOnly, optional, optionalNumber, parseArgs, required } from '../args.js';
import type { Command } from '../command.js';
import { err, out } from '../command.js';

const usage = `stillwater line --recipe R.json --var V --path "lon,lat;lon,lat;..." --out DIR [options]

Samples the reference and every run of a recipe along a line on the common grid and writes
DIR/section.csv, DIR/section.json (every level at every sample, run minus reference, seafloor outline)
and DIR/column-means.csv, DIR/column-means.json (thickness-weighted column means along the line).

  --recipe R.json        the comparison recipe
  --var V                a variable of the recipe's reference
  --path "lon,lat;..."   two or more waypoints in degrees, joined by great circles
  --meridian LON         instead of --path: a section along a meridian (--lat-range S,N, default -90,90)
  --parallel LAT         instead of --path: a section eastwards along a parallel (--lon-range W,E, default -180,180)
  --zonal-mean BASIN     instead of a line: the zonal mean of a basin (atlantic, pacific, indian, southern,
                         arctic, global, or a region of the recipe) per latitude and depth; writes
                         DIR/zonal.csv and DIR/zonal.json
  --spacing-km 50        distance between samples (waypoints are always samples too)
  --depth-range 0,6000   depth range of the column means, metres (default: the whole column)
  --method bilinear      bilinear (default) or nearest (nearest wet cell)
  --out DIR              output folder (created if needed)
  --json                 print a machine-readable summary on stdout`;

function lineSpec(args: ReturnType<typeof parseArgs>): LineSpec {
  const path = optional(args, 'path');
  const meridian = optionalNumber(args, 'meridian');
  const parallel = optionalNumber(args, 'parallel');
  const given = [path !== undefined, meridian !== undefined, parallel !== undefined].filter(Boolean).length;
  if (given !== 1) throw new StillwaterError('E_INPUT', 'Give exactly one of --path, --meridian, --parallel or --zonal-mean.');
  if (path !== undefined) return { kind: 'waypoints', points: parseWaypoints(path) };
  if (meridian !== undefined) {
    const r = optional(args, 'lat-range');
    const [lat0, lat1] = r ? parseRange(r, '--lat-range') : [-90, 90];
    return { kind: 'meridian', lon: meridian, lat0, lat1 };
  }
  const r = optional(args, 'lon-range');
  const [lon0, lon1] = r ? parseRange(r, '--lon-range') : [-180, 180];
  return { kind: 'parallel', lat: parallel!, lon0, lon1 };
}

const fmt = (v: number | null): string => formatNumber(v);

export const lineCommand: Command = {
  name: 'line',
  summary: 'sections and transects along a line, with column means',
  usage,
  async run(argv: string[]): Promise<number> {
    const args = parseArgs(argv, ['json']);
    allowOnly(args, 'line', ['recipe', 'var', 'path', 'meridian', 'parallel', 'zonal-mean', 'lat-range', 'lon-range', 'spacing-km', 'depth-range', 'method', 'out', 'json']);
    const recipePath = required(args, 'recipe');
    const variable = required(args, 'var');
    const outDir = resolve(required(args, 'out'));
    const basin = optional(args, 'zonal-mean');
    if (basin !== undefined) {
      if (['path', 'meridian', 'parallel'].some((k) => args.options.has(k))) throw new StillwaterError('E_INPUT', 'Give exactly one of --path, --meridian, --parallel or --zonal-mean.');
      const zr = await loadRecipe(recipePath);
      checkOutputFolder(outDir, ['zonal.csv', 'zonal.json'], { inputs: [resolve(recipePath), ...recipeFiles(zr).map((f) => f.file)], label: '--out' });
      const z = await runZonalMean(zr, variable, basin);
      const files = await writeOutputFiles(outDir, [
        { name: 'zonal.csv', data: zonalCsv(z) },
        { name: 'zonal.json', data: jsonText(zonalJson(z)) },
      ]);
      if (args.switches.has('json')) out(JSON.stringify({ variable, units: z.units, basin, latitudes: z.lat.length, levels: z.depthCentres.length, files, notes: z.notes }, null, 1));
      else {
        out(`${variable} (${z.units}): zonal mean of ${basin} over ${z.lat.length} latitudes and ${z.depthCentres.length} levels`);
        for (const note of z.notes) err(`note: ${note}`);
        for (const f of files) err(`wrote ${f}`);
      }
      return 0;
    }
    const line = lineSpec(args);
    const spacingKm = optionalNumber(args, 'spacing-km');
    const dr = optional(args, 'depth-range');
    const depthRange = dr ? (([top, bottom]) => ({ top, bottom }))(parseRange(dr, '--depth-range')) : undefined;
    const method = optional(args, 'method') ?? 'bilinear';
    if (method !== 'bilinear' && method !== 'nearest') throw new StillwaterError('E_INPUT', `--method must be bilinear or nearest, got '${method}'.`);
    const recipe = await loadRecipe(recipePath);
    checkOutputFolder(outDir, LINE_FILES, { inputs: [resolve(recipePath), ...recipeFiles(recipe).map((f) => f.file)], label: '--out' });
    const tty = process.stderr.isTTY;
    const result = await runLine(recipe, {
      variable,
      line,
      spacingKm,
      depthRange,
      method,
      progress: (f, m) => {
        if (tty) process.stderr.write(`\r${(f * 100).toFixed(0).padStart(3)}% ${m}`.padEnd(70));
      },
    });
    if (tty) process.stderr.write('\n');
    const files = await writeLineFiles(outDir, result);
    const n = result.line.lon.length;
    const lengthKm = result.line.distanceKm[n - 1];
    if (args.switches.has('json')) {
      out(JSON.stringify({ variable, units: result.units, samples: n, length_km: lengthKm, depth_range_m: [result.range.top, result.range.bottom], files, skill: result.skill, notes: result.notes }, null, 1));
    } else {
      out(`${variable} (${result.units}) along ${n} samples, ${lengthKm.toFixed(1)} km; column means over ${result.range.top}..${result.range.bottom} m`);
      const w = Math.max(3, ...result.skill.map((s) => s.label.length));
      out(`${'run'.padEnd(w)}  ${'bias'.padStart(10)} ${'rmse'.padStart(10)} ${'corr'.padStart(8)}`);
      for (const s of result.skill) out(`${s.label.padEnd(w)}  ${fmt(s.bias).padStart(10)} ${fmt(s.rmse).padStart(10)} ${fmt(s.corr).padStart(8)}`);
      for (const note of result.notes) err(`note: ${note}`);
      for (const f of files) err(`wrote ${f}`);
    }
    return 0;
  },
};
