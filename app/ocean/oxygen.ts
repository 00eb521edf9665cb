/**
 * Oxygen solubility in seawater, Garcia & Gordon (1992, Limnol. Oceanogr. 37, 1307–1312), their fit
 * to the Benson & Krause data, in µmol/kg for water in equilibrium with moist air at 1 atm.
 * The fit uses temperatures on the IPTS-68 scale; ITS-90 potential temperature is converted by
 * t68 = 1.00024 · t90 (common practice). Coefficients from memory; the test compares with
 * python3-gsw's O2sol_SP_pt.
 */
const A = [5.80871, 3.20291, 4.17887, 5.10006, -9.86643e-2, 3.80369];
const B = [-7.01577e-3, -7.70028e-3, -1.13864e-2, -9.51519e-3];
const C0 = -2.75915e-7;

/** O₂ solubility (µmol/kg) from practical salinity and potential temperature on the IPTS-68 scale (°C). */
export function oxygenSolubilityT68(sp: number, t68: number): number {
  const ts = Math.log((298.15 - t68) / (273.15 + t68));
  const a = A[0] + ts * (A[1] + ts * (A[2] + ts * (A[3] + ts * (A[4] + ts * A[5]))));
  const b = B[0] + ts * (B[1] + ts * (B[2] + ts * B[3]));
  return Math.exp(a + sp * b + C0 * sp * sp);
}

/** O₂ solubility (µmol/kg) from practical salinity and potential temperature (ITS-90, °C). */
export function oxygenSolubility(sp: number, pt90: number): number {
  return oxygenSolubilityT68(sp, pt90 * 1.00024);
}
