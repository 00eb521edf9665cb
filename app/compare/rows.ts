/**
 * Skill rows (DESIGN.md section 3): one per run × variable × region × layer. Undefined numbers are null
 * (written "—" in tables), never NaN; a row with no compared cells says why in `note`.
 */
import { skillFromMoments, type SkillNumbers } from '../stats/skill.js';
import type { CellResult } from './accumulate.js';

export interface SkillRow extends SkillNumbers {
  run: string;
  variable: string;
  region: string;
  layer: string;
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

/** The columns every table carries, in order. */
export const ROW_COLUMNS = [
  'run', 'variable', 'region', 'layer', 'units', 'n', 'weight', 'model_mean', 'ref_mean', 'bias', 'rmse', 'crmse', 'corr',
  'model_std', 'ref_std', 'std_ratio', 'taylor_skill', 'nse', 'target_bias', 'target_urmsd', 'compared_fraction', 'weight_units',
] as const;
export const LOG_COLUMNS = ['log10_n', 'log10_bias', 'log10_rmse', 'log10_crmse', 'log10_corr', 'log10_std_ratio'] as const;

export const NO_CELLS_NOTE = 'no compared cells: no cell of this region and layer has both model and reference data';

export interface RowContext {
  run: string;
  variable: string;
  region: string;
  layer: string;
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
