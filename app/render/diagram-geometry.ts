/**
 * Where a run × region lands on the Taylor diagram (Taylor 2001) and on the target diagram
 * (Jolliff et al. 2009), from its skill numbers. Both are normalised by the reference's standard deviation.
 */

export interface SkillNumbers {
  bias: number;
  crmse: number;
  corr: number;
  model_std: number;
  ref_std: number;
}

export interface TaylorPoint {
  /** normalised standard deviation σm / σr (the radius) */
  s: number;
  /** correlation R (the angle is acos R) */
  r: number;
  x: number;
  y: number;
  /** normalised centred RMS difference E'/σr: the distance from the reference point (1, 0) */
  e: number;
}

/** Polar position (radius σm/σr, angle acos R) in Cartesian coordinates; null where σr is 0 or numbers are missing. */
export function taylorPoint(k: SkillNumbers): TaylorPoint | null {
  if (!(k.ref_std > 0) || !Number.isFinite(k.model_std) || !Number.isFinite(k.corr)) return null;
  const s = k.model_std / k.ref_std;
  const r = Math.max(-1, Math.min(1, k.corr));
  const theta = Math.acos(r);
  // law of cosines, Taylor (2001) eq. 2: E'² = σm² + σr² − 2 σm σr R, here divided by σr²
  const e = Math.sqrt(Math.max(0, 1 + s * s - 2 * s * r));
  return { s, r, x: s * Math.cos(theta), y: s * Math.sin(theta), e };
}

export interface TargetPoint {
  /** unbiased RMS difference / σr, signed by σm − σr (Jolliff et al. 2009) */
  x: number;
  /** bias / σr */
  y: number;
  /** total RMS difference / σr: the distance from the origin */
  d: number;
}

export function targetPoint(k: SkillNumbers): TargetPoint | null {
  if (!(k.ref_std > 0) || !Number.isFinite(k.crmse) || !Number.isFinite(k.bias)) return null;
  const sign = k.model_std >= k.ref_std ? 1 : -1;
  const x = (sign * k.crmse) / k.ref_std;
  const y = k.bias / k.ref_std;
  return { x, y, d: Math.hypot(x, y) };
}

/**
 * Points of the arc of constant centred RMS difference e around the reference point (1, 0),
 * clipped to the quarter (or half, with negative correlations) disc of radius sMax.
 */
export function rmsArc(e: number, sMax: number, allowNegative: boolean, steps = 90): [number, number][][] {
  const arcs: [number, number][][] = [];
  let cur: [number, number][] = [];
  for (let i = 0; i <= steps; i++) {
    const a = (Math.PI * i) / steps;
    const x = 1 + e * Math.cos(a);
    const y = e * Math.sin(a);
    const inside = Math.hypot(x, y) <= sMax + 1e-12 && (allowNegative || x >= -1e-12);
    if (inside) cur.push([x, y]);
    else if (cur.length) {
      arcs.push(cur);
      cur = [];
    }
  }
  if (cur.length > 1) arcs.push(cur);
  return arcs;
}
