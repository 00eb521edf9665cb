/**
 * Statistics of a model against station observations: the compare statistics (app/stats) with every
 * compared station weighing the same, and the same statistics of log10 values for quantities that span
 * decades (only positive pairs enter those). Stations without a model value are counted, not used.
 */
import { log10Values } from '../stats/log-space.js';
import { skillStats, type SkillNumbers } from '../stats/weighted.js';
import type { StationStatus } from './sample-stations.js';

export interface StationSkill {
  label: string;
  /** stations by status */
  counts: Record<StationStatus, number>;
  stats: SkillNumbers;
  /** statistics of log10(model) against log10(observed), positive pairs only */
  log10: SkillNumbers;
}

export function stationSkill(label: string, model: Float64Array, observed: Float64Array, status: StationStatus[]): StationSkill {
  const counts: Record<StationStatus, number> = { ok: 0, from_neighbour: 0, on_land: 0, below_seafloor: 0, outside_grid: 0 };
  for (const s of status) counts[s]++;
  // skillStats skips pairs with a NaN on either side
  const weight = new Float64Array(model.length).fill(1);
  return {
    label,
    counts,
    stats: skillStats(model, observed, weight),
    log10: skillStats(log10Values(model), log10Values(observed), weight),
  };
}

/** Do the positive observations span at least `decades` powers of ten? (a hint for reading log10 statistics) */
export function spansDecades(observed: ArrayLike<number>, decades = 2): boolean {
  let lo = Infinity, hi = 0;
  for (let i = 0; i < observed.length; i++) {
    const v = observed[i];
    if (v > 0) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return hi > 0 && Math.log10(hi / lo) >= decades;
}
