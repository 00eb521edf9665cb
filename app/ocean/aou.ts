import { oxygenSolubility } from './oxygen.js';

/**
 * Apparent oxygen utilisation over a level (µmol/kg): O₂,sat(θ, S) − O₂ (common practice), with the
 * saturation of Garcia & Gordon (1992). O₂ must already be in µmol/kg (see convert.ts); θ is
 * potential temperature (°C, ITS-90), S practical salinity. NaN where any input is missing.
 */
export function aouLevel(o2: Float32Array, theta: Float32Array, salinity: Float32Array): Float32Array {
  const out = new Float32Array(o2.length);
  for (let i = 0; i < o2.length; i++) out[i] = oxygenSolubility(salinity[i], theta[i]) - o2[i];
  return out;
}

/** Oxygen saturation (µmol/kg) over a level. */
export function oxygenSaturationLevel(theta: Float32Array, salinity: Float32Array): Float32Array {
  const out = new Float32Array(theta.length);
  for (let i = 0; i < theta.length; i++) out[i] = oxygenSolubility(salinity[i], theta[i]);
  return out;
}
