/**
 * The report's station comparisons: each `report.stations` file is read and checked before the comparison
 * starts (a malformed row or a file of another variable stops the report before anything is written), then
 * sampled like `stillwater points` does (each source on its own grid, in the stations' units) and drawn as a
 * model-against-observation scatter (app/figures/station-scatter.ts) with a table of the same numbers.
 */
import { StillwaterError } from '../errors.js';
import { stationScatterFigure } from '../figures/station-scatter.js';
import type { Figure } from '../figures/parts.js';
import { shortNumber } from '../figures/typeset.js';
import { readStations, runPoints, type PointsResult } from '../points/run-points.js';
import type { Recipe } from '../recipe/types.js';
import type { ReportSettings } from './report-settings.js';
import { slug } from './variable-figures.js';

/** Read every stations file of the report section; refuse one whose `# variable` line names another variable than the recipe says. */
export async function checkStationFiles(settings: ReportSettings): Promise<void> {
  for (const [i, s] of settings.stations.entries()) {
    const st = await readStations(s.file);
    if (st.variable !== undefined && st.variable !== s.variable) {
      throw new StillwaterError('E_RECIPE', `report.stations[${i}]: ${s.file} holds ${st.variable} (its '# variable' line), not ${s.variable} as the recipe says.`, { path: `report.stations[${i}]`, file: s.file });
    }
  }
}

export interface StationSection {
  variable: string;
  heading: string;
  intro: string;
  figure: Figure;
  table: string[][];
}

const basename = (p: string) => p.split(/[\\/]/).pop() ?? p;

/** The scatter figure and table of one sampled stations file. */
export function stationFigure(r: PointsResult, recipe: Recipe, settings: ReportSettings, index: number): StationSection {
  const log = recipe.options.logStats.includes(r.variable);
  const file = basename(r.stations.file);
  const figure = stationScatterFigure({
    name: `${slug(r.variable)}-stations-${index + 1}`,
    title: `${r.variable} at ${r.stations.n} stations (${file}): model against observation`,
    subtitle: `Each source sampled at the stations on its own grid (${r.method}), in the stations' units; the dashed line is 1:1; every station weighs the same.${log ? ' Logarithmic axes (the recipe lists the variable in logStats).' : ''}`,
    width: settings.figureWidth,
    quantity: r.variable,
    units: r.units,
    observed: r.stations.value,
    log,
    panels: r.sources.map((s) => ({ label: s.role === 'reference' ? `${s.label} (reference)` : s.label, model: s.samples.model, stats: s.skill.stats, log10: s.skill.log10 })),
  });
  const head = ['source', 'stations compared', 'bias', 'RMSE', 'r', ...(log ? ['log10 bias', 'log10 RMSE', 'log10 r'] : [])];
  const table = [
    head,
    ...r.sources.map((s) => {
      const a = s.skill.stats;
      const l = s.skill.log10;
      return [s.label, `${a.n} of ${r.stations.n}`, shortNumber(a.bias), shortNumber(a.rmse), shortNumber(a.corr), ...(log ? [shortNumber(l.bias), shortNumber(l.rmse), shortNumber(l.corr)] : [])];
    }),
  ];
  return { variable: r.variable, heading: `${r.variable} at stations: ${file}`, intro: r.notes.join(' '), figure, table };
}

/** Sample and draw every stations file of the report section, in order. */
export async function* stationSections(recipe: Recipe, settings: ReportSettings, opts: { cacheDir?: string; onProgress?: (fraction: number, message: string) => void }): AsyncGenerator<StationSection> {
  for (const [i, s] of settings.stations.entries()) {
    opts.onProgress?.(1, `stations: sampling every source at ${basename(s.file)}`);
    const r = await runPoints(recipe, { variable: s.variable, stationsFile: s.file, cacheDir: opts.cacheDir });
    yield stationFigure(r, recipe, settings, i);
  }
}
