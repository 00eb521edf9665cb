/**
 * Skill rows (DESIGN.md section 3): one per run × variable × region × layer × period. Undefined numbers are
 * null (written "—" in tables), never NaN; a row with no compared cells says why in `note`. The period is
 * `annual`, a month (`JAN`…`DEC`) or a season (`DJF`, `MAM`, `JJA`, `SON`), app/time/periods.ts.
 */
import { skillFromMoments, type SkillNumbers } from '../stats/skill.js';
import type { CellResult } from './accumulate.js';

export interface SkillRow extends SkillNumbers {
  run: string;
  variable: string;
  region: string;
  layer: string;
  period: string;
  units: string;
  /** m3 for volume weights, m2 for area weights (bottom layer, 2-D fields) */
  weight_units: string;
  /** share of the reference's weight in this region and layer that was compared (0..1) */
  compared_fraction: number | null;
  log10_n?: number;
  log10_bias?: number | null;
  log10_rmse?: number | null;
  log10_crmse?: number | null;
  log10_corr?: number | null;
  log10_std_ratio?: number | null;
  note?: string;
}

/** The columns every table carries, in order (DESIGN.md's first; `period` is an extra column, so it comes last). */
export const ROW_COLUMNS = [
  'run', 'variable', 'region', 'layer', 'units', 'n', 'weight', 'model_mean', 'ref_mean', 'bias', 'rmse', 'crmse', 'corr',
  'model_std', 'ref_std', 'std_ratio', 'taylor_skill', 'nse', 'target_bias', 'target_urmsd', 'compared_fraction', 'weight_units', 'period',
] as const;
export const LOG_COLUMNS = ['log10_n', 'log10_bias', 'log10_rmse', 'log10_crmse', 'log10_corr', 'log10_std_ratio'] as const;

export const NO_CELLS_NOTE = 'no compared cells: no cell of this region and layer has both model and reference data';

export interface RowContext {
  run: string;
  variable: string;
  region: string;
  layer: string;
  period: string;
  units: string;
  weightUnits: string;
}

export function makeRow(ctx: RowContext, cell: CellResult, log?: CellResult): SkillRow {
  const s = skillFromMoments(cell.moments);
  const row: SkillRow = {
    run: ctx.run,
    variable: ctx.variable,
    region: ctx.region,
    layer: ctx.layer,
    period: ctx.period,
    units: ctx.units,
    ...s,
    compared_fraction: cell.refWeight > 0 ? Math.min(1, s.weight / cell.refWeight) : null,
    weight_units: ctx.weightUnits,
  };
  if (log) {
    const ls = skillFromMoments(log.moments);
    row.log10_n = ls.n;
    row.log10_bias = ls.bias;
    row.log10_rmse = ls.rmse;
    row.log10_crmse = ls.crmse;
    row.log10_corr = ls.corr;
    row.log10_std_ratio = ls.std_ratio;
  }
  if (cell.inapplicable) row.note = cell.inapplicable;
  else if (s.n === 0) row.note = NO_CELLS_NOTE;
  return row;
}

/**
 * Seasonal-cycle numbers of one run × variable × region × layer, from the 12 monthly rows' weighted means
 * (app/stats/seasonal-cycle.ts): ranges (max − min) and their ratio run / reference, the phase difference in
 * months of the maximum and of the first harmonic (positive: the run peaks later), and the volume-weighted
 * mean over cells of the correlation of the cells' 12-month cycles.
 */
export interface CycleRow {
  run: string;
  variable: string;
  region: string;
  layer: string;
  units: string;
  model_range: number | null;
  ref_range: number | null;
  range_ratio: number | null;
  max_phase_months: number | null;
  harmonic_phase_months: number | null;
  cell_corr_mean: number | null;
  cell_corr_cells: number;
  note?: string;
}

export const CYCLE_COLUMNS = [
  'run', 'variable', 'region', 'layer', 'units', 'model_range', 'ref_range', 'range_ratio', 'max_phase_months', 'harmonic_phase_months',
  'cell_corr_mean', 'cell_corr_cells',
] as const;
