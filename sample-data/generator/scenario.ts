/** The runs of the demo scenario and the years of its spin-up. */
import type { ProcessChoice } from './ocean-state.js';

export interface DemoRun {
  key: string;
  label: string;
  file: string;
  process: ProcessChoice;
}

export const DEMO_RUNS: DemoRun[] = [
  { key: 'short', label: 'remin-short (L = 200 m)', file: 'run-short.nc', process: { reminLength: 200, omzStrength: 1.45, deepNutrientFactor: 0.93 } },
  { key: 'mid', label: 'remin-mid (L = 350 m)', file: 'run-mid.nc', process: { reminLength: 350, omzStrength: 1.1, deepNutrientFactor: 1.02 } },
  { key: 'long', label: 'remin-long (L = 600 m)', file: 'run-long.nc', process: { reminLength: 600, omzStrength: 0.7, deepNutrientFactor: 1.1 } },
];

/** The run whose spin-up is followed, and the model years of its snapshots. */
export const SPINUP_RUN = 'mid';
export const SPINUP_YEARS = [10, 50, 100, 200, 300, 500, 750, 1000, 1500, 2000, 3000, 4000, 5000];
/** Every run file is the state at the end of a spin-up of this many years. */
export const RUN_YEAR = 5000;

/** Uniform initial state of the spin-ups, umol/kg. */
export const INITIAL = { po4: 2.15, no3: 31, o2: 205 };

/** Adjustment timescale of the scenario's tracers at depth z, years: decades at the surface, millennia at depth. */
export function adjustmentTime(z: number): number {
  return 40 + 1900 * (1 - Math.exp(-z / 1600));
}

/**
 * State at model year t. Phosphate and nitrate approach equilibrium at first order; oxygen overshoots
 * (a fast approach past its equilibrium, then a slow return), so its trajectory is non-monotonic.
 */
export function spunUp(eq: number, x0: number, t: number, z: number, overshoot = 0): number {
  const tau = adjustmentTime(z);
  if (overshoot === 0) return eq + (x0 - eq) * Math.exp(-t / tau);
  const fast = 0.2 * tau;
  return eq + (x0 - eq + overshoot) * Math.exp(-t / fast) - overshoot * Math.exp(-t / tau);
}
