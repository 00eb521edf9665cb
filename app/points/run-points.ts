/**
 * Station observations against a recipe: the reference and every run sampled at each station (each on
 * its own grid, in the stations' units), a table of model, observed and difference, and statistics.
 */
import { readFile } from 'node:fs/promises';
import { parseUnits, type ParsedUnits } from '../cf/units.js';
import { StillwaterError, isStillwaterError } from '../errors.js';
import { checkParsingHere } from '../io/parsing-thread.js';
import { prepareFields } from '../lines/recipe-fields.js';
import type { Recipe } from '../recipe/types.js';
import { sampleStations, type StationMethod, type StationSamples } from './sample-stations.js';
import { parseStations, type Stations } from './stations-csv.js';
import { spansDecades, stationSkill, type StationSkill } from './station-stats.js';

export interface PointsRequest {
  variable: string;
  stationsFile: string;
  method?: StationMethod;
  cacheDir?: string;
  progress?: (fraction: number, message: string) => void;
}

export interface SampledSource {
  label: string;
  role: 'reference' | 'run';
  samples: StationSamples;
  skill: StationSkill;
}

export interface PointsResult {
  variable: string;
  units: string;
  method: StationMethod;
  stations: Stations;
  sources: SampledSource[];
  /** observations span two decades or more, so the log10 statistics are the ones to read */
  spansDecades: boolean;
  notes: string[];
}

export async function readStations(path: string): Promise<Stations> {
  checkParsingHere(path);
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    throw new StillwaterError('E_FILE', `${path}: cannot read the station file (no such file, or not readable).`, { file: path });
  }
  return parseStations(text, path);
}

function stationUnits(st: Stations): ParsedUnits | undefined {
  if (st.units === undefined) return undefined;
  try {
    return parseUnits(st.units);
  } catch (e) {
    if (isStillwaterError(e)) throw new StillwaterError('E_UNITS', `${st.file}: ${e.message}`, { file: st.file });
    throw e;
  }
}

/**
 * The variable the stations are compared with: the one their file names (a `# variable: NAME` line), else the
 * one asked for. A file naming a variable the recipe does not compare is refused.
 */
function stationsVariable(recipe: Recipe, asked: string, st: Stations): string {
  if (st.variable === undefined) return asked;
  if (!recipe.variables.includes(st.variable)) {
    throw new StillwaterError('E_INPUT', `${st.file}: its '# variable: ${st.variable}' line names a variable the recipe does not compare (it compares ${recipe.variables.join(', ')}).`, { file: st.file });
  }
  return st.variable;
}

export async function runPoints(recipe: Recipe, req: PointsRequest): Promise<PointsResult> {
  const stations = await readStations(req.stationsFile);
  const units = stationUnits(stations);
  const variable = stationsVariable(recipe, req.variable, stations);
  let fields: Awaited<ReturnType<typeof prepareFields>>;
  try {
    fields = await prepareFields(recipe, variable, { cacheDir: req.cacheDir, units, native: true });
  } catch (e) {
    if (isStillwaterError(e) && e.code === 'E_UNITS' && units && stations.variable === undefined) {
      throw new StillwaterError(
        'E_UNITS',
        `${stations.file}: its values in '${units.text}' do not match the variable ${variable}, whose units cannot be converted to them; choose the variable the file holds, or name it in a '# variable: NAME' line.`,
        { file: stations.file, variable },
      );
    }
    throw e;
  }
  const notes = [...fields.notes];
  if (variable !== req.variable) notes.push(`${stations.file} holds ${variable} (its '# variable' line), so the stations are compared with ${variable}, not ${req.variable}.`);
  if (!units) notes.push(`${stations.file} names no units; its values are taken to be in ${fields.units.text}, the units of the comparison.`);
  const method = req.method ?? 'trilinear';
  try {
    const all = [
      { ...fields.reference, role: 'reference' as const },
      ...fields.runs.map((r) => ({ ...r, role: 'run' as const })),
    ];
    const sources: SampledSource[] = [];
    for (let i = 0; i < all.length; i++) {
      const src = all[i];
      const samples = await sampleStations(src.field, stations, {
        method,
        progress: (f) => req.progress?.((i + f) / all.length, `sampling ${src.label} at ${stations.n} stations`),
      });
      sources.push({ label: src.label, role: src.role, samples, skill: stationSkill(src.label, samples.model, stations.value, samples.status) });
    }
    if (sources.every((s) => s.skill.stats.n === 0)) {
      throw new StillwaterError('E_INPUT', `${stations.file}: none of its ${stations.n} stations lies in the water of the reference or any run (on land, below the seafloor or outside the grids).`, { file: stations.file });
    }
    return {
      variable,
      units: units?.text ?? fields.units.text,
      method,
      stations,
      sources,
      spansDecades: spansDecades(stations.value),
      notes,
    };
  } finally {
    await fields.close();
  }
}

/** One sentence per station that some source could not sample, naming the sources and why. */
export function stationProblems(r: PointsResult): string[] {
  const st = r.stations;
  const out: string[] = [];
  const why = { on_land: 'on land in', below_seafloor: 'below the seafloor of', outside_grid: 'outside the grid of' } as const;
  for (let i = 0; i < st.n; i++) {
    const parts: string[] = [];
    for (const key of ['on_land', 'below_seafloor', 'outside_grid'] as const) {
      const names = r.sources.filter((s) => s.samples.status[i] === key).map((s) => {
        const floor = s.samples.seafloorM[i];
        return key === 'below_seafloor' && Number.isFinite(floor) ? `${s.label} (${floor} m)` : s.label;
      });
      if (names.length) parts.push(`${why[key]} ${names.join(', ')}`);
    }
    if (parts.length === 0) continue;
    const depth = st.seafloor[i] ? 'seafloor' : `${st.depth[i]} m`;
    out.push(`${st.file} line ${st.line[i]} (station ${st.id[i]} at ${st.lon[i]}, ${st.lat[i]}, ${depth}): ${parts.join('; ')}; left out of those statistics.`);
  }
  return out;
}
