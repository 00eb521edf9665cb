/**
 * Skill numbers of one weighted comparison, from its centred moments.
 * Conventions: bias = model − reference; standard deviations are weighted population values
 * (Σw(x−x̄)²/Σw, no small-sample correction: the weights are volumes, not counts; common practice).
 * A quantity that is undefined (no compared cells, zero spread) is null, never NaN.
 */
import { emptyMoments, pairMoments, type PairMoments } from './moments.js';

export interface SkillNumbers {
  n: number;
  weight: number;
  model_mean: number | null;
  ref_mean: number | null;
  bias: number | null;
  rmse: number | null;
  /** centred RMS difference E' (Taylor 2001) */
  crmse: number | null;
  /** weighted Pearson correlation R */
  corr: number | null;
  model_std: number | null;
  ref_std: number | null;
  /** σm / σr */
  std_ratio: number | null;
  /** Taylor (2001) eq. (4) with R0 = 1: S = 4(1+R) / ((σ̂ + 1/σ̂)² (1+R0)) */
  taylor_skill: number | null;
  /** Nash & Sutcliffe (1970): 1 − Σw(m−r)² / Σw(r−r̄)² */
  nse: number | null;
  /** target diagram (Jolliff et al. 2009): bias / σr */
  target_bias: number | null;
  /** target diagram: sign(σm − σr) · E' / σr */
  target_urmsd: number | null;
}

export function skillFromMoments(mo: PairMoments): SkillNumbers {
  if (mo.n === 0 || !(mo.w > 0)) {
    return {
      n: 0, weight: 0, model_mean: null, ref_mean: null, bias: null, rmse: null, crmse: null, corr: null,
      model_std: null, ref_std: null, std_ratio: null, taylor_skill: null, nse: null, target_bias: null, target_urmsd: null,
    };
  }
  const w = mo.w;
  const bias = mo.mMean - mo.rMean;
  const crmse2 = mo.sdd / w;
  const crmse = Math.sqrt(crmse2);
  // Jolliff et al. (2009): RMSD² = bias² + uRMSD²
  const rmse = Math.sqrt(bias * bias + crmse2);
  const sm = Math.sqrt(mo.smm / w);
  const sr = Math.sqrt(mo.srr / w);
  const corr = mo.smm > 0 && mo.srr > 0 ? clamp(mo.smr / Math.sqrt(mo.smm * mo.srr), -1, 1) : null;
  const ratio = sr > 0 ? sm / sr : null;
  let taylor: number | null = null;
  if (corr !== null && ratio !== null && ratio > 0) {
    const t = ratio + 1 / ratio;
    taylor = (4 * (1 + corr)) / (t * t * 2);
  }
  // Σw(m−r)² = W·RMSE² = W·bias² + Σw(d−d̄)²
  const nse = mo.srr > 0 ? 1 - (w * bias * bias + mo.sdd) / mo.srr : null;
  const targetBias = sr > 0 ? bias / sr : null;
  const targetU = sr > 0 ? (sm >= sr ? 1 : -1) * (crmse / sr) : null;
  return {
    n: mo.n,
    weight: w,
    model_mean: mo.mMean,
    ref_mean: mo.rMean,
    bias,
    rmse,
    crmse,
    corr,
    model_std: sm,
    ref_std: sr,
    std_ratio: ratio,
    taylor_skill: taylor,
    nse,
    target_bias: targetBias,
    target_urmsd: targetU,
  };
}

function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}

/** Skill of model against reference over the cells where both are valid, weighted by `weight`. */
export function skillStats(model: ArrayLike<number>, ref: ArrayLike<number>, weight: ArrayLike<number>): SkillNumbers {
  if (model.length !== ref.length || model.length !== weight.length) {
    throw new RangeError(`skillStats: arrays differ in length (${model.length}, ${ref.length}, ${weight.length})`);
  }
  return skillFromMoments(model.length ? pairMoments(model, ref, weight) : emptyMoments());
}
