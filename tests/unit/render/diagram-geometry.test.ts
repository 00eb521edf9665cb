// Positions on the Taylor and target diagrams.
import { describe, expect, it } from 'vitest';
import { rmsArc, targetPoint, taylorPoint } from '../../../app/render/diagram-geometry.js';

/** weighted statistics computed here from first principles for a small sample (Taylor 2001, eqs. 1–2) */
function stats(m: number[], o: number[]) {
  const n = m.length;
  const mm = m.reduce((a, b) => a + b) / n;
  const om = o.reduce((a, b) => a + b) / n;
  const sm = Math.sqrt(m.reduce((a, v) => a + (v - mm) ** 2, 0) / n);
  const so = Math.sqrt(o.reduce((a, v) => a + (v - om) ** 2, 0) / n);
  const cov = m.reduce((a, v, i) => a + (v - mm) * (o[i] - om), 0) / n;
  const crmse = Math.sqrt(m.reduce((a, v, i) => a + (v - mm - (o[i] - om)) ** 2, 0) / n);
  const rmse = Math.sqrt(m.reduce((a, v, i) => a + (v - o[i]) ** 2, 0) / n);
  return { bias: mm - om, crmse, rmse, corr: cov / (sm * so), model_std: sm, ref_std: so };
}

const model = [1.2, 2.9, 3.1, 4.8, 6.5, 5.0];
const ref = [1.0, 2.0, 3.5, 4.0, 5.0, 6.0];

describe('Taylor diagram (Taylor 2001)', () => {
  it('the distance from the reference point is the normalised centred RMS difference (eq. 2)', () => {
    const k = stats(model, ref);
    const p = taylorPoint(k)!;
    expect(Math.hypot(p.x - 1, p.y)).toBeCloseTo(k.crmse / k.ref_std, 12);
    expect(p.e).toBeCloseTo(k.crmse / k.ref_std, 12);
    expect(Math.hypot(p.x, p.y)).toBeCloseTo(k.model_std / k.ref_std, 12);
    expect(p.x / Math.hypot(p.x, p.y)).toBeCloseTo(k.corr, 12);
  });
  it('a perfect model sits on the reference point', () => {
    const p = taylorPoint(stats(ref, ref))!;
    expect(p.x).toBeCloseTo(1, 12);
    expect(p.y).toBeCloseTo(0, 12);
  });
  it('anticorrelated fields land on the left half', () => {
    const p = taylorPoint(stats(ref.map((v) => -v), ref))!;
    expect(p.x).toBeCloseTo(-1, 12);
  });
  it('no point where the reference has no spread', () => {
    expect(taylorPoint({ bias: 0, crmse: 0, corr: 1, model_std: 1, ref_std: 0 })).toBeNull();
  });
  it('RMS arcs stay on their circle around (1, 0) and inside the plotted disc', () => {
    for (const arc of rmsArc(0.5, 1.5, false)) {
      for (const [x, y] of arc) {
        expect(Math.hypot(x - 1, y)).toBeCloseTo(0.5, 12);
        expect(Math.hypot(x, y)).toBeLessThanOrEqual(1.5 + 1e-9);
      }
    }
    // an arc larger than the disc is cut
    const big = rmsArc(1.2, 1.5, false).flat();
    expect(big.every(([x]) => x >= -1e-12)).toBe(true);
  });
});

describe('target diagram (Jolliff et al. 2009)', () => {
  it('the distance from the origin is RMSD/σr, since RMSD² = bias² + uRMSD²', () => {
    const k = stats(model, ref);
    const t = targetPoint(k)!;
    expect(t.d).toBeCloseTo(k.rmse / k.ref_std, 12);
    expect(t.y).toBeCloseTo(k.bias / k.ref_std, 12);
  });
  it('the sign of the x coordinate is the sign of σm − σr', () => {
    const wide = stats(ref.map((v) => 2 * v), ref);
    const narrow = stats(ref.map((v) => 0.5 * v + 1), ref);
    expect(targetPoint(wide)!.x).toBeGreaterThan(0);
    expect(targetPoint(narrow)!.x).toBeLessThan(0);
  });
});
