import type { SkillRow } from '../compare/rows.js';
import type { LayerSpec } from '../regions/layers.js';

/**
 * Spin-up analysis: what it takes and what it returns. The output types are the contract with the
 * workbench views (renderer/views) and with spinup.json; extra fields are welcome, renames are not.
 *
 * Services (app/services/spinup.ts), all with input { session } or { recipe, baseDir }, and run?, ...:
 * - 'spinup.run' (heavy)      -> SpinupResult: tracks (series, drift, fit, verdict), skill per snapshot, summary
 *                               options: variables?: string[], threshold?: number, tailYears?: number, skill?: boolean
 * - 'spinup.verdict' (heavy)  -> SpinupSummary | null (null: the run lists no snapshots; no banner)
 * - 'spinup.open' { path }    -> SpinupResult read from a spinup.json written by `stillwater spinup`
 * Results are cached on disk by request and file times, so asking again is cheap.
 *
 * Recipe: runs[i].snapshots = [{ file, year? }], model years strictly increasing. A snapshot without a year
 * takes it from the file's CF time axis (one snapshot per time step). Tracers are the run's variables (same
 * in-file names as in runs[i].variables) that the first snapshot holds, or those named; regions and layers
 * are the recipe's, with the whole column ("all") always first.
 *
 * Words used throughout:
 * - snapshot: the state of one run at one model year (one file, or one time step of a file);
 * - track: one tracer x region x layer followed over all snapshots;
 * - tail: the last N model years of a track, where the drift rate is measured;
 * - fit window: the part of a track the first-order fit uses (all of it, or only what follows the last
 *   turning point when the track overshoots and turns back).
 */

/** One snapshot of a run: a file and the model year it shows. `timeIndex` picks a step of a file with a time axis. */
export interface SnapshotSpec {
  file: string;
  year: number;
  timeIndex?: number;
  /** where the snapshot came from, for error sentences, e.g. "runs[0].snapshots[3]" or "--snapshots" */
  origin?: string;
}

/** A tracer to follow: a label and the variable name in the snapshot files. */
export interface TracerSpec {
  name: string;
  variable: string;
  /** units to read the variable in (converted by the CF helper), when not the file's own */
  units?: string;
}

/**
 * Layers are the regions helper's (app/regions/layers.ts): [top, bottom] intervals, "surface", "all" and
 * "bottom" (the deepest wet cell of every column). A level straddling an interval's edge counts with the
 * part of its volume inside. Regions are its cell lists (app/regions/region.ts) on the snapshots' grid.
 */
export type { LayerSpec };

export interface SpinupSettings {
  /** settled when |drift| is below this, in per cent of the mean per 1000 years (default 0.1) */
  thresholdPercentPerKyr: number;
  /** length of the tail in model years where the drift rate is measured; default: the last 10 % of the series, at least 3 snapshots */
  tailYears?: number;
  /** density used to turn amount-per-mass into amount (kg m-3) */
  nominalDensity: number;
}

export const DEFAULT_SETTINGS: SpinupSettings = { thresholdPercentPerKyr: 0.1, nominalDensity: 1025 };

/** Volume-weighted sums of one track at one snapshot. */
export interface SnapshotSums {
  /** Σ c·V over wet cells, in the field's units × m³ */
  sumCV: number;
  /** Σ V over wet cells, m³ */
  volume: number;
  /** number of wet cells (a cell straddling a layer edge counts once in each layer it touches) */
  n: number;
}

/** How a tracer's inventory is expressed. */
export interface InventoryUnits {
  /** unit of the inventory, e.g. "mol" */
  units: string;
  /** inventory = factor · Σ c·V (field units × m³) + perVolume · Σ V */
  factor: number;
  /** for scales whose zero is elsewhere (a temperature in K counted from 0 °C), per m³; default 0 */
  perVolume?: number;
  /** a sentence when an assumption was made, e.g. the nominal density */
  note?: string;
}

/** A straight-line drift rate over the tail. */
export interface DriftRate {
  /** model years of the tail window (first, last) */
  fromYear: number;
  toYear: number;
  /** snapshots in the window */
  n: number;
  /** least-squares slope of the mean, field units per 1000 years */
  perKyr: number;
  /** mean of the track over the window, field units */
  windowMean: number;
  /** what the relative drift is relative to, when not the mean itself (temperatures: "the mean in kelvin") */
  relativeTo?: string;
  /** slope relative to |windowMean| (temperatures: in kelvin), per cent per 1000 years (null when that is zero) */
  percentPerKyr: number | null;
  /** slope of the inventory, inventory units per 1000 years */
  inventoryPerKyr: number;
  /** how the window was chosen, e.g. "last 3 snapshots (10 % of the series holds fewer)" */
  window: string;
}

/** First-order fit x(t) = x∞ + (x0 − x∞)·e^(−(t − t0)/τ) on the fit window. */
export interface FirstOrderFit {
  /** model year of the first point of the fit window (t0) */
  t0: number;
  /** fitted value at t0 */
  x0: number;
  xInf: number;
  /** e-folding time, years */
  tau: number;
  /** τ·ln 10: years to cover 90 % of any remaining change */
  t90: number;
  /** fitted x∞ minus fitted value at the last snapshot: change still to come */
  remainingChange: number;
  /** remainingChange relative to |x∞|, per cent (null when x∞ is zero) */
  remainingPercent: number | null;
  /** model years after the last snapshot until 90 % of the change from x0 to x∞ is covered (0 when past) */
  yearsTo90: number;
  /** the fit's own drift at the last snapshot, dx/dt = −(x0 − x∞)/τ·e^(−(t − t0)/τ), field units per 1000 years */
  driftPerKyr: number;
  /** that drift relative to the same mean as the tail slope's, per cent per 1000 years (null when that is zero) */
  driftPercentPerKyr: number | null;
  /**
   * model years after the last snapshot until the fit's drift falls below the threshold, in closed form:
   * t* = t0 + τ·ln(|x0 − x∞| / (τ·threshold)). 0 when already below; null when the fit is unconstrained.
   */
  yearsToSettle: number | null;
  /** root mean square of the residuals, field units */
  rmse: number;
  /** snapshots used */
  n: number;
  /**
   * false when τ runs to the edge of the search (the window still looks like a straight line or a step):
   * then x∞ and τ are lower bounds at best and the sentence says so.
   */
  constrained: boolean;
  /** true when τ exceeds the span of the fit window, so x∞ is extrapolated beyond the data */
  extrapolated: boolean;
}

export type VerdictStatus = 'settled' | 'drifting' | 'undetermined';

export interface TrackVerdict {
  status: VerdictStatus;
  /** the drift the verdict judged: the constrained first-order fit's drift at the last snapshot, else the tail slope */
  basis: 'first-order fit' | 'tail slope';
  /** that drift, per cent of the mean per 1000 years (null when undetermined) */
  percentPerKyr: number | null;
  /** true when the track involves the deep ocean and the run is shorter than a few thousand years */
  deepCaution: boolean;
  /** one or two plain sentences */
  sentence: string;
}

/** One tracer x region x layer over all snapshots, with its analysis. */
export interface SpinupTrack {
  tracer: string;
  variable: string;
  region: string;
  layer: string;
  units: string;
  inventoryUnits: string;
  /** per snapshot (same order as SpinupResult.years); NaN where the track has no wet cell */
  mean: number[];
  inventory: number[];
  /** mean minus the first snapshot's mean */
  meanDeviation: number[];
  inventoryDeviation: number[];
  /** wet volume, m³ (from the first snapshot) */
  volume: number;
  drift: DriftRate | null;
  fit: FirstOrderFit | null;
  /** why there is no fit, or how the fit window was chosen */
  fitNote: string;
  /** model years of turning points (overshoot and turn back); empty when monotonic */
  turningYears: number[];
  monotonic: boolean;
  verdict: TrackVerdict;
}

/**
 * The compare statistics of one snapshot against the reference: a skill row of the compare helper
 * (app/compare/rows.ts; null where undefined) with the snapshot's model year. `run` is the spun-up run's label.
 */
export type SkillPoint = SkillRow & { year: number };

/** What 'spinup.run' returns and spinup.json holds. */
export interface SpinupResult {
  run: string;
  /** model years of the snapshots, increasing */
  years: number[];
  snapshots: { file: string; year: number; timeIndex?: number }[];
  tracers: { name: string; variable: string; units: string; inventoryUnits: string; inventoryNote?: string }[];
  regions: string[];
  /** layer labels as in tracks (layerLabel of app/regions/layers.ts) */
  layers: string[];
  settings: SpinupSettings;
  tracks: SpinupTrack[];
  /** skill of every snapshot against the reference, when the recipe names a reference */
  skill: SkillPoint[];
  /** the whole run in one verdict, for the scores-view banner */
  summary: SpinupSummary;
  /** sentences a person should read: assumptions made, short-run caution */
  notes: string[];
}

/** What 'spinup.verdict' returns: enough for a banner on the scores view. */
export interface SpinupSummary {
  run: string;
  lastYear: number;
  /** true when every track is settled and the run is long enough for the deep ocean */
  settled: boolean;
  drifting: number;
  undetermined: number;
  tracks: number;
  /** true when the run is shorter than a few thousand model years and deep layers are scored */
  shortForDeep: boolean;
  /** one sentence for the banner */
  sentence: string;
  /** the tracks that drift most, up to five, with their sentences */
  worst: { tracer: string; region: string; layer: string; percentPerKyr: number | null; sentence: string }[];
}
