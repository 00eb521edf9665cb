/**
 * Weighted skill statistics. Expected numbers come from numpy (np.average, np.cov with aweights and
 * bias=True) via tests/fixtures/compare/make_fixtures.py; identities from Taylor (2001), Jolliff et al.
 * (2009) and Nash & Sutcliffe (1970).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { emptyMoments, mergeMoments, pairMoments } from '../../../app/stats/moments.js';
import { skillFromMoments, skillStats, type SkillNumbers } from '../../../app/stats/skill.js';
import { multiTracerCost } from '../../../app/stats/cost.js';
import { log10Values } from '../../../app/stats/log-space.js';

type Expected = { n: number; weight: number; model_mean: number; ref_mean: number; model_std: number; ref_std: number; corr: number; rmse: number; crmse: number; nse: number };
const fixture = JSON.parse(readFileSync(join(__dirname, '../../fixtures/compare/stats.json'), 'utf8'));
const arr = (a: (number | null)[]) => Float64Array.from(a, (x) => (x === null ? NaN : x));

function expectClose(s: SkillNumbers, e: Expected, rel = 1e-11) {
  expect(s.n).toBe(e.n);
  for (const key of ['weight', 'model_mean', 'ref_mean', 'model_std', 'ref_std', 'corr', 'rmse', 'crmse', 'nse'] as const) {
    const got = s[key] as number;
    expect(Math.abs(got - e[key]), key).toBeLessThanOrEqual(rel * Math.max(1, Math.abs(e[key])));
  }
}

/** Taylor (2001), eq. 2 (the law of cosines of the diagram): E'² = σm² + σr² − 2σmσrR */
function taylorResidual(s: SkillNumbers): number {
  const lhs = s.crmse! ** 2;
  const rhs = s.model_std! ** 2 + s.ref_std! ** 2 - 2 * s.model_std! * s.ref_std! * s.corr!;
  return Math.abs(lhs - rhs) / Math.max(s.model_std! ** 2 + s.ref_std! ** 2, 1e-300);
}

describe('weighted statistics against numpy', () => {
  it('means, standard deviations, correlation, RMSE, centred RMSE and NSE of a plain case (numpy)', () => {
    const c = fixture.plain;
    expectClose(skillStats(arr(c.model), arr(c.ref), arr(c.weight)), c.expected);
  });

  it('stays accurate when the mean is 1e5 times the spread (numpy two-pass np.cov)', () => {
    const c = fixture.offset;
    const s = skillStats(arr(c.model), arr(c.ref), arr(c.weight));
    expectClose(s, c.expected, 1e-9);
    expect(taylorResidual(s)).toBeLessThan(1e-10);
  });

  it('merging level by level equals the statistics of all values at once (numpy over the flattened field)', () => {
    const c = fixture.levels;
    const edges: number[] = c.edges;
    const area = arr(c.area);
    const all = emptyMoments();
    const layer = emptyMoments();
    for (let k = 0; k < edges.length - 1; k++) {
      const mo = pairMoments(arr(c.model[k]), arr(c.ref[k]), area);
      mergeMoments(all, mo, edges[k + 1] - edges[k]);
      const ov = Math.max(0, Math.min(edges[k + 1], 130) - Math.max(edges[k], 25));
      mergeMoments(layer, mo, ov);
    }
    expectClose(skillFromMoments(all), c.expected_all);
    expectClose(skillFromMoments(layer), c.expected_25_130);
  });
});

describe('identities', () => {
  const c = fixture.plain;
  const s = skillStats(arr(c.model), arr(c.ref), arr(c.weight));

  it("Taylor (2001): E'² = σm² + σr² − 2σmσrR", () => {
    expect(taylorResidual(s)).toBeLessThan(1e-12);
  });

  it("Jolliff et al. (2009): RMSD² = bias² + uRMSD², and the target point lies at distance RMSD/σr", () => {
    expect(Math.abs(s.rmse! ** 2 - (s.bias! ** 2 + s.crmse! ** 2))).toBeLessThan(1e-12 * s.rmse! ** 2);
    const d = Math.hypot(s.target_bias!, s.target_urmsd!);
    expect(d).toBeCloseTo(s.rmse! / s.ref_std!, 12);
    // sign of the unbiased RMSD: that of σm − σr (Jolliff et al. 2009)
    expect(Math.sign(s.target_urmsd!)).toBe(Math.sign(s.model_std! - s.ref_std!));
  });

  it('a perfect model: bias 0, RMSE 0, r 1, NSE 1 (Nash & Sutcliffe 1970), Taylor skill 1 (Taylor 2001, eq. 4)', () => {
    const r = arr(c.ref);
    const p = skillStats(r, r, arr(c.weight));
    expect(p.bias).toBe(0);
    expect(p.rmse).toBe(0);
    expect(p.crmse).toBe(0);
    expect(p.corr).toBeCloseTo(1, 14);
    expect(p.nse).toBe(1);
    expect(p.std_ratio).toBeCloseTo(1, 14);
    expect(p.taylor_skill).toBeCloseTo(1, 14);
  });

  it('a model shifted by a constant: bias = the shift, centred RMS difference 0, RMSE = |shift|', () => {
    const r = arr(c.ref);
    const m = r.map((x) => x - 0.75);
    const p = skillStats(m, r, arr(c.weight));
    expect(p.bias).toBeCloseTo(-0.75, 12);
    expect(p.crmse!).toBeLessThan(1e-12);
    expect(p.rmse).toBeCloseTo(0.75, 12);
    expect(p.corr).toBeCloseTo(1, 12);
  });

  it('Taylor (2001) eq. 4 with R0 = 1 on a hand value: σ̂ = 2, R = 1 gives 4·2/((2 + 1/2)²·2) = 0.64 (formula from memory)', () => {
    const r = Float64Array.of(1, 2, 3, 4);
    const m = r.map((x) => 2 * x);
    const w = Float64Array.of(1, 1, 1, 1);
    const s1 = skillStats(m, r, w);
    expect(s1.std_ratio).toBeCloseTo(2, 14);
    expect(s1.taylor_skill).toBeCloseTo(0.64, 14);
  });

  it('no valid pair: n = 0 and every number null, never NaN', () => {
    const s0 = skillStats(Float64Array.of(NaN, 1), Float64Array.of(1, NaN), Float64Array.of(1, 1));
    expect(s0.n).toBe(0);
    for (const v of Object.values(s0)) expect(Number.isNaN(v)).toBe(false);
    expect(s0.rmse).toBeNull();
  });

  it('a constant reference: correlation, std ratio and NSE are undefined (null), bias and RMSE are not', () => {
    const s1 = skillStats(Float64Array.of(1, 2, 3), Float64Array.of(2, 2, 2), Float64Array.of(1, 1, 1));
    expect(s1.corr).toBeNull();
    expect(s1.std_ratio).toBeNull();
    expect(s1.nse).toBeNull();
    expect(s1.bias).toBeCloseTo(0, 15);
    expect(s1.rmse).toBeCloseTo(Math.sqrt(2 / 3), 14);
  });
});

describe('log10 statistics and the multi-tracer cost', () => {
  it('log10 drops zero and negative values', () => {
    expect(Array.from(log10Values(Float64Array.of(100, 0, -1, 0.01, NaN)))).toEqual([2, NaN, NaN, -2, NaN]);
  });

  it('a model off by a factor 10 everywhere has a log10 bias of 1 and log10 centred RMSE 0', () => {
    const r = Float64Array.of(0.1, 1, 3, 20, 0.5);
    const s = skillStats(log10Values(r.map((x) => 10 * x)), log10Values(r), new Float64Array(5).fill(1));
    expect(s.bias).toBeCloseTo(1, 6);
    expect(s.crmse!).toBeLessThan(1e-6);
  });

  it('cost = Σ RMSE/|reference mean| (hand sum)', () => {
    const c = multiTracerCost([
      { variable: 'PO4', rmse: 0.2, refMean: 2 },
      { variable: 'O2', rmse: 30, refMean: -150 },
    ]);
    expect(c.cost).toBeCloseTo(0.1 + 0.2, 14);
    expect(multiTracerCost([{ variable: 'X', rmse: 1, refMean: 0 }]).cost).toBeNull();
  });
});
