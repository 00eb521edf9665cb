import { csvTable, type CsvCell } from '../output/csv.js';
import type { SkillPoint, SpinupResult, SpinupTrack } from './types.js';

const yearKey = (y: number): string => String(Math.round(y * 1000) / 1000);

/**
 * spinup.csv: one row per tracer x region x layer with its drift, fit and verdict, then its series as
 * columns mean_y<year> and inventory_y<year>: one rectangular table a spreadsheet opens as it is.
 */
export function tracksCsv(r: SpinupResult): string {
  const head = [
    'run', 'tracer', 'variable', 'region', 'layer', 'units', 'inventory_units', 'volume_m3', 'status', 'deep_caution',
    'drift_per_kyr', 'drift_percent_per_kyr', 'inventory_drift_per_kyr', 'tail_from_year', 'tail_to_year', 'tail_snapshots',
    'monotonic', 'turning_years', 'fit_t0', 'fit_x0', 'fit_x_inf', 'fit_tau_years', 'fit_t90_years', 'fit_years_to_90',
    'fit_drift_per_kyr', 'fit_drift_percent_per_kyr', 'fit_years_to_settle', 'fit_remaining_change', 'fit_remaining_percent', 'fit_rmse', 'fit_snapshots', 'fit_constrained', 'fit_note', 'verdict_basis', 'verdict_percent_per_kyr', 'verdict',
    ...r.years.map((y) => `mean_y${yearKey(y)}`),
    ...r.years.map((y) => `inventory_y${yearKey(y)}`),
  ];
  const row = (t: SpinupTrack): CsvCell[] => [
    r.run, t.tracer, t.variable, t.region, t.layer, t.units, t.inventoryUnits, t.volume, t.verdict.status, t.verdict.deepCaution,
    t.drift?.perKyr, t.drift?.percentPerKyr, t.drift?.inventoryPerKyr, t.drift?.fromYear, t.drift?.toYear, t.drift?.n,
    t.monotonic, t.turningYears.join(' '), t.fit?.t0, t.fit?.x0, t.fit?.xInf, t.fit?.tau, t.fit?.t90, t.fit?.yearsTo90,
    t.fit?.driftPerKyr, t.fit?.driftPercentPerKyr, t.fit?.yearsToSettle, t.fit?.remainingChange, t.fit?.remainingPercent, t.fit?.rmse, t.fit?.n, t.fit?.constrained, t.fitNote, t.verdict.basis, t.verdict.percentPerKyr, t.verdict.sentence,
    ...t.mean,
    ...t.inventory,
  ];
  return csvTable(head, r.tracks.map(row));
}

/** spinup-skill.csv: the skill rows of every snapshot, model year first. */
export function skillCsv(points: SkillPoint[]): string {
  const head = ['year', 'run', 'variable', 'region', 'layer', 'units', 'n', 'weight', 'model_mean', 'ref_mean', 'bias', 'rmse', 'crmse', 'corr', 'model_std', 'ref_std', 'std_ratio'] as const;
  return csvTable(head, points.map((p) => head.map((k) => p[k] as CsvCell)));
}
