/** A validated recipe with absolute paths and every default filled in. */
import type { LayerSpec } from '../regions/layers.js';
import type { ReportSectionInput } from './report-schema.js';
import type { ScreenSection } from './screen-schema.js';
import type { TimeChoice } from '../time/select.js';
import type { RecipeOptions } from './schema.js';

export interface VariableSource {
  /** absolute path */
  file: string;
  /** variable name in the file */
  name: string;
  units?: string;
  time?: Exclude<TimeChoice, undefined>;
  /** recipe path for messages, e.g. runs[1].variables.O2 */
  path: string;
}

export interface SourceSpec {
  label: string;
  /** the source's default file (absolute), if given */
  file?: string;
  variables: Record<string, VariableSource>;
  /** spin-up snapshots; a missing year is taken from the file's time axis (app/spinup) */
  snapshots?: { file: string; year?: number }[];
  /** recipe path, e.g. reference or runs[1] */
  path: string;
}

export type ResolvedRegion =
  | { kind: 'built-in'; name: string }
  | { kind: 'mask'; file: string; variable: string; flags?: string[]; path: string }
  | { kind: 'geojson'; file: string; property: string; features?: string[]; path: string };

export interface Recipe {
  title?: string;
  /** folder that relative paths were resolved against */
  baseDir: string;
  reference: SourceSpec;
  runs: SourceSpec[];
  regions: ResolvedRegion[];
  layers: LayerSpec[];
  options: RecipeOptions;
  /** compared variables in order: the reference's, then derived ones */
  variables: string[];
  /** the `report` section as written (defaults are filled by app/recipe/report-settings.ts) */
  report?: ReportSectionInput;
  /** the workbench's view when the session was saved */
  screen?: ScreenSection;
}
