/**
 * N*, the nitrate excess or deficit relative to phosphate (Gruber & Sarmiento 1997, Global
 * Biogeochem. Cycles 11, 235–266): N* = (N − 16·P + 2.90 µmol/kg) · 0.87 (from memory). A simplified
 * N − 16·P + 2.9 is also in common use. Both take N and P in the same units (µmol/kg); the result
 * says which form was used.
 */
export type NStarForm = 'gruber-sarmiento-1997' | 'simplified';

export const NSTAR_FORMULA: Record<NStarForm, string> = {
  'gruber-sarmiento-1997': 'N* = (N - 16 P + 2.90) x 0.87 (Gruber & Sarmiento 1997)',
  simplified: 'N* = N - 16 P + 2.9 (simplified form)',
};

export function nStar(n: number, p: number, form: NStarForm = 'gruber-sarmiento-1997'): number {
  const excess = n - 16 * p + 2.9;
  return form === 'gruber-sarmiento-1997' ? excess * 0.87 : excess;
}

/** N* over a level; NaN wherever N or P is missing. */
export function nStarLevel(n: ArrayLike<number>, p: ArrayLike<number>, form: NStarForm = 'gruber-sarmiento-1997'): { values: Float64Array; form: NStarForm; formula: string } {
  const out = new Float64Array(n.length);
  for (let i = 0; i < n.length; i++) out[i] = nStar(n[i], p[i], form);
  return { values: out, form, formula: NSTAR_FORMULA[form] };
}
