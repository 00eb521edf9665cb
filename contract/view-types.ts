/**
 * What the view services (app/services/views.ts) hand to the screen. Types only, importing nothing: the
 * services and the renderer both import these. Arrays are typed arrays with NaN for missing values.
 */

/**
 * A period of the year the views can show: the year, a calendar month, or a meteorological season (the
 * same names as the skill rows' `period`, app/time/periods.ts).
 */
export type ViewPeriod = 'annual' | 'JAN' | 'FEB' | 'MAR' | 'APR' | 'MAY' | 'JUN' | 'JUL' | 'AUG' | 'SEP' | 'OCT' | 'NOV' | 'DEC' | 'DJF' | 'MAM' | 'JJA' | 'SON';

/** One variable of the reference or of a run, as the sources panel lists it. */
export interface SourceVariable {
  /** the recipe's key, e.g. "PO4" */
  key: string;
  file: string;
  /** name in the file */
  name: string;
  units: string;
  longName?: string;
  /** why the variable cannot be used (file unreadable, variable absent), when it cannot */
  problem?: string;
}

/** A problem of the recipe found on opening it, at its recipe path. */
export interface RecipeProblem {
  path: string;
  sentence: string;
}

export interface SourceInfo {
  label: string;
  variables: SourceVariable[];
  /** spin-up snapshots listed for a run */
  snapshots?: { file: string; year?: number }[];
}

/** A depth choice for maps: one level of the common grid, a layer of the recipe, or the bottom. */
export interface LayerChoice {
  /** "k:5", "layer:0-100", "bottom", "surface", "all" */
  id: string;
  label: string;
  kind: 'level' | 'interval' | 'bottom' | 'surface' | 'all';
  /** metres; null for bottom (chosen column by column) */
  top: number | null;
  bottom: number | null;
  /** level index for kind 'level' */
  k?: number;
  /** bottom only: the recipe's bottom tolerance, m (stations within it of the seafloor are drawn) */
  bottomTolerance?: number | null;
}

/** The common lat-lon-depth grid every field is regridded onto. */
export interface ViewGrid {
  nx: number;
  ny: number;
  nz: number;
  lonEdges: Float64Array;
  latEdges: Float64Array;
  /** metres, positive down */
  depthEdges: Float64Array;
  depthCentres: Float64Array;
  /** cell area, m², ny * nx */
  area: Float64Array;
}

/** A paired variable: present in the reference and in at least one run. */
export interface PairedVariable {
  key: string;
  /** units of the comparison (the reference's, or the recipe's choice) */
  units: string;
  longName: string;
  /** labels of the runs that have it */
  runs: string[];
}

export interface SessionInfo {
  /** handle for the other view services */
  session: string;
  recipePath: string;
  title: string;
  reference: SourceInfo;
  runs: SourceInfo[];
  variables: PairedVariable[];
  regions: string[];
  layers: LayerChoice[];
  grid: ViewGrid;
  /** the periods the views can show: 'annual' always, months and seasons when the recipe asks for them (options.periods) */
  periods: ViewPeriod[];
  /** why months and seasons cannot be chosen, when they cannot */
  periodsNote?: string;
  /** every problem found on opening the recipe (listed in the sources panel) */
  problems?: RecipeProblem[];
  /** the recipe's `screen` section: the view saved with it, restored on open */
  screen?: ScreenSection;
  /** true when the session differs from the recipe file (pairs added, runs added) */
  modified: boolean;
}

/** One horizontal slice on the common grid: a level, a layer mean, or the bottom values. */
export interface LevelData {
  variable: string;
  run: string;
  period: ViewPeriod;
  layer: LayerChoice;
  units: string;
  model: Float32Array;
  reference: Float32Array;
  /** model minus reference */
  difference: Float32Array;
  /** for the bottom: level index used in each column (-1 where none) */
  bottomLevel?: Int16Array;
  /** metres of water that each column contributes to this slice (cell volume = area × this) */
  thickness: Float32Array;
}

export type SectionKind = 'meridian' | 'parallel' | 'zonal';

export interface SectionData {
  variable: string;
  run: string;
  period: ViewPeriod;
  kind: SectionKind;
  /** longitude of a meridian or latitude of a parallel that was asked for, and the grid line used */
  at: number | null;
  atGrid: number | null;
  region: string | null;
  units: string;
  /** 'latitude' or 'longitude' */
  axis: 'latitude' | 'longitude';
  /** sample edges along the section (n + 1), degrees */
  edges: Float64Array;
  depthEdges: Float64Array;
  /** level-major values: [k * n + s] */
  model: Float32Array;
  reference: Float32Array;
  difference: Float32Array;
  /** depth of the seafloor under each sample, m (NaN where the column is dry) */
  seafloor: Float64Array;
}

export interface ProfileData {
  variable: string;
  region: string;
  period: ViewPeriod;
  units: string;
  depthCentres: Float64Array;
  depthEdges: Float64Array;
  /** area-weighted mean of each level over the region's wet cells */
  reference: Float64Array;
  runs: { label: string; values: Float64Array }[];
}

/**
 * The monthly cycle of a region's mean over the levels of a depth choice: a month × depth section. Values are
 * month-major within a level, [k * 12 + m] (m = 0 is January), k counting the levels listed in depthEdges.
 */
export interface ProfileCycleData {
  variable: string;
  run: string;
  region: string;
  layer: LayerChoice;
  units: string;
  /** edges of the levels shown (nk + 1), m, from the first level of the depth choice */
  depthEdges: Float64Array;
  /** index of the first level shown on the common grid */
  firstLevel: number;
  /** days of each month as the reference's calendar counts them (its month weights) */
  monthDays: Float64Array;
  /** area-weighted mean over the region's cells where the reference has a value */
  reference: Float64Array;
  /** the run over the cells where it and the reference both have values */
  model: Float64Array;
  /** the run minus the reference, both over the cells where both have values */
  difference: Float64Array;
}

export type TableFormat = 'csv' | 'markdown' | 'latex' | 'json';

export interface TableText {
  format: TableFormat;
  fileName: string;
  mime: string;
  text: string;
}

/**
 * The recipe's `screen` section: what the workbench showed when the session was saved (schema in
 * app/recipe/screen-schema.ts, which is held to this shape).
 */
export interface ScreenSection {
  view?: 'map' | 'difference' | 'section' | 'profile' | 'diagram' | 'scores' | 'spinup' | 'line';
  variable?: string;
  run?: string;
  region?: string;
  layer?: string;
  projection?: 'plate' | 'equal-earth' | 'north-polar' | 'south-polar';
  mapField?: 'model' | 'reference';
  fieldRange?: [number, number] | null;
  diffRange?: [number, number] | null;
  fieldScale?: string;
  diffScale?: string;
  logColour?: boolean;
  lockRange?: boolean;
  contours?: boolean;
  mapWindow?: { xmin: number; xmax: number; ymin: number; ymax: number } | null;
  cropToRegion?: boolean;
  sectionKind?: SectionKind;
  sectionAt?: number;
  sectionField?: 'model' | 'reference' | 'difference';
  sectionDepth?: number | null;
  diagram?: 'taylor' | 'target';
  /** the period of the year the views showed */
  period?: ViewPeriod;
  /** the Profile view showed the monthly cycle (month × depth) instead of the mean profile */
  profileCycle?: boolean;
  line?: { points: [number, number][]; spacingKm: number; field?: number; stretch: boolean };
}

/** What `report.write` answers: where the report was written. */
export interface ReportWritten {
  outDir: string;
  /** the report page itself, outDir/report.html */
  html: string;
  figures: number;
}
