import { oxygenSolubility } from './oxygen.js';

/**
 * Oxygen saturation and apparent oxygen utilisation over a level (µmol/kg), element by element:
 * O₂,sat(θ, S) from Garcia & Gordon (1992) and AOU = O₂,sat(θ, S) − O₂ (common practice). O₂ must
 * already be in µmol/kg (the expression functions read it so); θ is potential temperature (°C, ITS-90),
 * S practical salinity. NaN wherever an input is missing.
 */
export function oxygenSaturationLevel(theta: ArrayLike<number>, salinity: ArrayLike<number>): Float64Array {
  const out = new Float64Array(theta.length);
  for (let i = 0; i < theta.length; i++) out[i] = oxygenSolubility(salinity[i], theta[i]);
  return out;
}

export function aouLevel(o2: ArrayLike<number>, theta: ArrayLike<number>, salinity: ArrayLike<number>): Float64Array {
  const out = oxygenSaturationLevel(theta, salinity);
  for (let i = 0; i < out.length; i++) out[i] -= o2[i];
  return out;
}
