import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { deflateSync } from 'node:zlib';
import { useDeflate } from '../../app/figures/png.js';
import { loadRecipe } from '../../app/recipe/load.js';
import { runReport } from '../../app/report/run-report.js';
import { allowOnly, optional, parseArgs, required } from '../args.js';
import type { Command } from '../command.js';
import { err, out } from '../command.js';
import { toolVersion } from '../package-paths.js';
import { landRings } from '../../app/report/report-tools.js';
import { pngPool } from '../png-pool.js';

export const reportCommand: Command = {
  name: 'report',
  summary: 'a self-contained report (HTML, figures as SVG and 300 dpi PNG, skill tables, provenance) from a recipe',
  usage: [
    'stillwater report --recipe RECIPE.json --out DIR [--cache DIR]',
    '',
    '  --recipe FILE  the recipe; its "report" section says which layers, lines, basins and width (RECIPE.md)',
    '  --out DIR      writes DIR/report.html, DIR/figures/NAME.svg and NAME.png, DIR/skill.json, .csv, .md, .tex',
    '                 and DIR/provenance.json; the folder appears complete at the end, or not at all',
    '  --cache DIR    folder for cached regridding weights (default: the user cache folder)',
    '',
    'Progress goes to stderr, one line per figure. Ctrl+C stops the report and leaves nothing behind.',
  ].join('\n'),
  async run(argv: string[]): Promise<number> {
    const args = parseArgs(argv, []);
    allowOnly(args, 'report', ['recipe', 'out', 'cache']);
    const recipePath = resolve(required(args, 'recipe'));
    const outDir = resolve(required(args, 'out'));
    const cache = optional(args, 'cache');
    const recipe = await loadRecipe(recipePath);
    const abort = new AbortController();
    const onSigint = () => {
      err('stillwater report: stopping (Ctrl+C); nothing will be left behind');
      abort.abort();
    };
    process.once('SIGINT', onSigint);
    let lastStage = '';
    // the bundle's folder: dist/png-worker.mjs sits beside dist/cli.mjs
    const png = pngPool(dirname(fileURLToPath(import.meta.url)));
    // the map and section rasters embedded in the figures: Node's zlib, the same level as fflate's default here
    useDeflate((data) => deflateSync(data, { level: 6 }));
    try {
      const result = await runReport(recipe, {
        recipePath,
        outDir,
        version: toolVersion(),
        land: landRings(),
        toPng: png.toPng,
        pngParallel: png.parallel,
        cacheDir: cache ? resolve(cache) : undefined,
        signal: abort.signal,
        onProgress: (_f, m) => {
          const stage = m.replace(/: level.*$/, '');
          if (stage !== lastStage) err(`${stage}`);
          lastStage = stage;
        },
        onFigure: (name, n) => err(`figure ${n}: ${name}`),
      });
      err(`wrote ${result.figures.length} figures and the report to ${outDir}`);
      out(join(outDir, 'report.html'));
    } finally {
      process.removeListener('SIGINT', onSigint);
      await png.close();
    }
    return 0;
  },
};
