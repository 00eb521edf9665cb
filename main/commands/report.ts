import { join, resolve } from 'node:path';
import { loadRecipe } from '../../app/recipe/load.js';
import { runReport } from '../../app/report/run-report.js';
import { allowOnly, optional, parseArgs, required } from '../args.js';
import type { Command } from '../command.js';
import { err, out } from '../command.js';
import { toolVersion } from '../package-paths.js';
import { landRings, svgToPng } from '../../app/report/report-tools.js';

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
    try {
      const result = await runReport(recipe, {
        recipePath,
        outDir,
        version: toolVersion(),
        land: landRings(),
        toPng: svgToPng,
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
    }
    return 0;
  },
};
