/** Seasonal-cycle rows from the monthly skill rows of one run × variable and the cells' cycle correlations. */
import { cycleRange, harmonicPeak, monthOfMaximum, wrapMonths } from '../stats/seasonal-cycle.js';
import type { CellCorrelation } from './cycle-accumulate.js';
import type { CycleRow, SkillRow } from './rows.js';

const ratio = (a: number | null, b: number | null): number | null => (a !== null && b !== null && b !== 0 ? a / b : null);
const diff = (a: number | null, b: number | null): number | null => (a !== null && b !== null ? wrapMonths(a - b) : null);

/** `monthRows` are the rows of one region × layer for JAN…DEC, in that order. */
export function cycleRow(monthRows: SkillRow[], corr: CellCorrelation | null): CycleRow {
  const first = monthRows[0];
  const model = monthRows.map((r) => r.model_mean ?? NaN);
  const ref = monthRows.map((r) => r.ref_mean ?? NaN);
  const modelRange = cycleRange(model);
  const refRange = cycleRange(ref);
  const mMax = monthOfMaximum(model);
  const rMax = monthOfMaximum(ref);
  const row: CycleRow = {
    run: first.run,
    variable: first.variable,
    region: first.region,
    layer: first.layer,
    units: first.units,
    model_range: modelRange,
    ref_range: refRange,
    range_ratio: ratio(modelRange, refRange),
    max_phase_months: diff(mMax, rMax),
    harmonic_phase_months: diff(harmonicPeak(model), harmonicPeak(ref)),
    cell_corr_mean: corr?.mean ?? null,
    cell_corr_cells: corr?.cells ?? 0,
  };
  const missing = monthRows.filter((r) => r.model_mean === null || r.ref_mean === null).map((r) => r.period);
  if (missing.length) row.note = `no compared cells in ${missing.join(', ')}`;
  else if (!corr) row.note = 'the bottom layer has no cell-by-cell cycle correlation';
  return row;
}
