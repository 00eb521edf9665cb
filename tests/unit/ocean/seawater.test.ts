import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  absoluteSalinityFromPractical,
  conservativeFromPotential,
  densityFromPracticalAndPotential,
  densityTeos10,
} from '../../../app/ocean/teos10.js';
import { densityOfLevel } from '../../../app/ocean/density-level.js';
import { oxygenSolubility, oxygenSolubilityT68 } from '../../../app/ocean/oxygen.js';
import { aouLevel } from '../../../app/ocean/aou.js';
import { nStar, nStarLevel } from '../../../app/ocean/nstar.js';

interface DensityRow { sp: number; pt: number; p: number; sa: number; ct: number; rho: number }
interface O2Row { sp: number; pt: number; o2sol: number }
const fx = JSON.parse(readFileSync(new URL('../../fixtures/ocean/seawater.json', import.meta.url), 'utf8')) as {
  density: DensityRow[];
  oxygen: O2Row[];
};

describe('density (TEOS-10, 75-term polynomial of Roquet et al. 2015)', () => {
  it('reference salinity from practical salinity matches gsw.SR_from_SP', () => {
    for (const r of fx.density) expect(absoluteSalinityFromPractical(r.sp)).toBeCloseTo(r.sa, 12);
  });
  it('conservative temperature from potential temperature matches gsw.CT_from_pt to 1e-10 °C', () => {
    for (const r of fx.density) expect(Math.abs(conservativeFromPotential(r.sa, r.pt) - r.ct)).toBeLessThan(1e-10);
  });
  it('in-situ density matches gsw.rho over the oceanographic range to 1e-9 kg m-3', () => {
    let worst = 0;
    for (const r of fx.density) {
      worst = Math.max(worst, Math.abs(densityTeos10(r.sa, r.ct, r.p) - r.rho));
      expect(Math.abs(densityFromPracticalAndPotential(r.sp, r.pt, r.p) - r.rho)).toBeLessThan(1e-8);
    }
    expect(worst).toBeLessThan(1e-9);
    expect(fx.density.length).toBeGreaterThan(300);
  });
});

describe('density of a whole level (WebAssembly kernel)', () => {
  it('matches gsw.rho at the fixture points to 1e-9 kg m-3, pressure by pressure', () => {
    const byP = new Map<number, DensityRow[]>();
    for (const r of fx.density) byP.set(r.p, [...(byP.get(r.p) ?? []), r]);
    for (const [p, rows] of byP) {
      const rho = densityOfLevel(Float32Array.from(rows, (r) => r.sp), Float32Array.from(rows, (r) => r.pt), p);
      // the fixture's SP and θ are doubles; the level is float32, so compare with gsw through the scalar path
      rows.forEach((r, i) => expect(Math.abs(rho[i] - densityFromPracticalAndPotential(Math.fround(r.sp), Math.fround(r.pt), p))).toBe(0));
      rows.forEach((r, i) => { if (Math.fround(r.sp) === r.sp && Math.fround(r.pt) === r.pt) expect(Math.abs(rho[i] - r.rho)).toBeLessThan(1e-9); });
    }
  });
  it('gives the doubles of the scalar function exactly, NaN where T or S is missing, for odd lengths and negative S', () => {
    for (const n of [1, 2, 7, 64800 + 1]) {
      const S = new Float32Array(n), T = new Float32Array(n);
      for (let i = 0; i < n; i++) {
        S[i] = i % 97 === 5 ? NaN : -1 + ((i * 37) % 431) * 0.1;
        T[i] = i % 89 === 3 ? NaN : -2.5 + ((i * 53) % 383) * 0.1;
      }
      for (const p of [0, 1000, 5500]) {
        const rho = densityOfLevel(S, T, p);
        expect(rho.length).toBe(n);
        for (let i = 0; i < n; i++) {
          const want = densityFromPracticalAndPotential(S[i], T[i], p);
          if (Number.isNaN(want)) expect(rho[i]).toBeNaN();
          else expect(rho[i]).toBe(want);
        }
      }
    }
  });
});

describe('oxygen solubility (Garcia & Gordon 1992, Benson & Krause fit)', () => {
  it('matches gsw.O2sol_SP_pt to 0.01 µmol/kg over 0–40 salinity and −1.5–35 °C', () => {
    for (const r of fx.oxygen) expect(Math.abs(oxygenSolubility(r.sp, r.pt) - r.o2sol)).toBeLessThan(0.01);
  });
  it('gives the check value 274.610 µmol/kg at t68 = 10 °C, S = 35 (Garcia & Gordon 1992; from memory)', () => {
    expect(Math.abs(oxygenSolubilityT68(35, 10) - 274.61)).toBeLessThan(0.0005);
  });
  it('on ITS-90 at 10 °C the value is lower by the temperature-scale difference (~0.015; REFERENCES.md)', () => {
    const d = oxygenSolubilityT68(35, 10) - oxygenSolubility(35, 10);
    expect(d).toBeGreaterThan(0.01);
    expect(d).toBeLessThan(0.02);
  });
  it('AOU = saturation − O2 (common practice), NaN where an input is missing', () => {
    const aou = aouLevel(Float32Array.of(200, 250, NaN), Float32Array.of(10, 2, 5), Float32Array.of(35, 34.7, 35));
    expect(aou[0]).toBeCloseTo(274.5957 - 200, 3);
    expect(aou[1]).toBeCloseTo(oxygenSolubility(34.7, 2) - 250, 3);
    expect(Number.isNaN(aou[2])).toBe(true);
  });
});

describe('N* (Gruber & Sarmiento 1997; from memory)', () => {
  it('GS97 form (N − 16P + 2.90) × 0.87 and the simplified form N − 16P + 2.9 differ and say which', () => {
    expect(nStar(30, 2, 'gruber-sarmiento-1997')).toBeCloseTo((30 - 32 + 2.9) * 0.87, 12);
    expect(nStar(30, 2, 'simplified')).toBeCloseTo(0.9, 12);
    const r = nStarLevel(Float32Array.of(30, NaN), Float32Array.of(2, 1), 'simplified');
    expect(r.formula).toMatch(/simplified/);
    expect(r.values[0]).toBeCloseTo(0.9, 5);
    expect(Number.isNaN(r.values[1])).toBe(true);
    expect(nStarLevel(Float32Array.of(30), Float32Array.of(2)).formula).toMatch(/Gruber & Sarmiento 1997/);
  });
  it('Redfield water (N = 16 P, Anderson & Sarmiento 1994) has N* = 2.9 × 0.87 in the GS97 form', () => {
    expect(nStar(32, 2)).toBeCloseTo(2.523, 12);
  });
});
