import { describe, expect, it } from 'vitest';
import { makeRectilinearGrid, makeRegularGrid } from '../../../app/grid/rectilinear.js';
import type { HorizontalGrid } from '../../../app/grid/types.js';
import { EARTH_RADIUS_M } from '../../../app/grid/types.js';
import { columnSums, rowSums } from '../../../app/regrid/csr.js';
import { buildWeights } from '../../../app/regrid/weights.js';
import { distortedGrid, referenceRemap } from './helpers.js';

const RAD = Math.PI / 180;

/**
 * Remap one level in double precision by the rule of regridField, so that the conservation of the
 * weights shows to 1e-12 (the engines deliver single precision and are held to this reference in
 * kernels.test.ts).
 */
function remap64(src: HorizontalGrid, tgt: HorizontalGrid, v: Float64Array, threshold = 0.5) {
  const w = buildWeights(src, tgt, 'conservative');
  const n = new Float64Array(v.length), d = new Float64Array(v.length);
  for (let s = 0; s < v.length; s++) if (v[s] === v[s]) [n[s], d[s]] = [v[s], 1];
  return { ...referenceRemap(w, tgt.area, 1, n, d, { threshold, normalise: true }), w };
}

function integral(area: Float64Array, v: Float64Array, cov?: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) if (v[i] === v[i]) s += area[i] * v[i] * (cov ? cov[i] : 1);
  return s;
}

/** A smooth test field: 3 sin²φ − 1 (∝ Y₂⁰) plus cos φ cos λ (∝ real Y₁¹). */
const f = (lon: number, lat: number): number => 3 * Math.sin(lat * RAD) ** 2 - 1 + Math.cos(lat * RAD) * Math.cos(lon * RAD);

/** Its exact mean over a lat-lon cell, in closed form (integrals in sin φ and λ). */
function exactMean(w: number, e: number, s: number, n: number): number {
  const s1 = Math.sin(s * RAD), s2 = Math.sin(n * RAD);
  const y20 = s1 * s1 + s1 * s2 + s2 * s2 - 1; // ∫(3x²−1)dx / Δx
  const cos2 = (n - s) * RAD / 2 + (Math.sin(2 * n * RAD) - Math.sin(2 * s * RAD)) / 4; // ∫cos²φ dφ
  const y11 = (cos2 * (Math.sin(e * RAD) - Math.sin(w * RAD))) / ((e - w) * RAD * (s2 - s1));
  return y20 + y11;
}

function cellMeans(g: HorizontalGrid): Float64Array {
  const out = new Float64Array(g.nx * g.ny);
  for (let c = 0; c < out.length; c++) {
    const lo = g.cornerLon.subarray(4 * c, 4 * c + 4), la = g.cornerLat.subarray(4 * c, 4 * c + 4);
    out[c] = exactMean(Math.min(...lo), Math.max(...lo), Math.min(...la), Math.max(...la));
  }
  return out;
}

function noise(n: number): Float64Array {
  const v = new Float64Array(n);
  let x = 12345;
  for (let i = 0; i < n; i++) {
    x = (x * 1103515245 + 12345) % 2147483648;
    v[i] = 10 + 5 * Math.sin(i * 0.37) + x / 2147483648;
  }
  return v;
}

describe('conservation of the area integral (Jones 1999, first-order conservative remapping)', () => {
  it('lat-lon 1° onto a 1.4° grid starting at 0°E: the integral is kept to 1e-12', () => {
    const src = makeRegularGrid(1, 1);
    const tgt = makeRectilinearGrid(Float64Array.from({ length: 258 }, (_, i) => (i * 360) / 257), Float64Array.from({ length: 130 }, (_, j) => -90 + (j * 180) / 129));
    const v = noise(src.nx * src.ny);
    const { values, coverage } = remap64(src, tgt, v);
    expect(Math.min(...coverage)).toBeGreaterThan(1 - 1e-12);
    expect(Math.abs(integral(tgt.area, values) / integral(src.area, v) - 1)).toBeLessThan(1e-12);
  });

  it('with missing source cells, the coverage-weighted integral equals the integral of valid cells', () => {
    const src = makeRegularGrid(2, 2);
    const tgt = makeRegularGrid(1.5, 1.5, -100);
    const v = noise(src.nx * src.ny);
    for (let i = 0; i < v.length; i += 7) v[i] = NaN;
    const { values, coverage } = remap64(src, tgt, v, 0);
    expect(Math.abs(integral(tgt.area, values, coverage) / integral(src.area, v) - 1)).toBeLessThan(1e-12);
  });

  it('curvilinear 2° source onto 1° lat-lon: integral kept to 1e-12, every target cell covered', () => {
    const src = distortedGrid(180, 90, -90, 90);
    const tgt = makeRegularGrid(1, 1);
    const v = noise(src.nx * src.ny);
    const { values, coverage, w } = remap64(src, tgt, v);
    let total = 0;
    for (const a of src.area) total += a;
    // cell areas (great-circle quadrilaterals) tile the sphere: 4πR² (exact geometry)
    expect(Math.abs(total / (4 * Math.PI * EARTH_RADIUS_M ** 2) - 1)).toBeLessThan(1e-12);
    // near the poles the frame's y = sin φ approaches 1, and thin cells lose a few digits there
    expect(Math.min(...coverage)).toBeGreaterThan(1 - 1e-9);
    // each source cell's overlaps add up to its area; nearly meridional sides near the poles (y changing
    // fast with x) are the ill-conditioned part, a few parts in 1e11 there
    const cs = columnSums(w);
    for (let s = 0; s < cs.length; s++) expect(Math.abs(cs[s] / src.area[s] - 1)).toBeLessThan(5e-11);
    expect(Math.abs(integral(tgt.area, values) / integral(src.area, v) - 1)).toBeLessThan(1e-12);
  });

  it('lat-lon source onto a curvilinear target (weights transposed): the integral is kept', () => {
    const src = makeRegularGrid(3, 3);
    const tgt = distortedGrid(90, 45, -90, 90);
    const v = noise(src.nx * src.ny);
    const w = buildWeights(src, tgt, 'conservative');
    const rs = rowSums(w);
    for (let t = 0; t < rs.length; t++) expect(Math.abs(rs[t] / tgt.area[t] - 1)).toBeLessThan(1e-11);
    const n = new Float64Array(v), d = new Float64Array(v.length).fill(1);
    const { values } = referenceRemap(w, tgt.area, 1, n, d, { threshold: 0.5, normalise: true });
    expect(Math.abs(integral(tgt.area, values) / integral(src.area, v) - 1)).toBeLessThan(1e-12);
  });
});

describe('smooth analytic field: remapped cell means converge to the exact means (Jones 1999)', () => {
  const target = makeRegularGrid(5, 5, -180);
  const exact = cellMeans(target);
  const maxErr = (values: Float64Array): number => {
    let m = 0;
    for (let i = 0; i < values.length; i++) m = Math.max(m, Math.abs(values[i] - exact[i]));
    return m;
  };

  it('the closed-form cell mean agrees with a fine midpoint quadrature', () => {
    const [w, e, s, n] = [10, 15, 40, 45];
    let num = 0, den = 0;
    for (let a = 0; a < 200; a++) for (let b = 0; b < 200; b++) {
      const lon = w + ((a + 0.5) * (e - w)) / 200, lat = s + ((b + 0.5) * (n - s)) / 200;
      num += f(lon, lat) * Math.cos(lat * RAD);
      den += Math.cos(lat * RAD);
    }
    expect(exactMean(w, e, s, n)).toBeCloseTo(num / den, 6);
  });

  it('lat-lon sources of 2.4°, 1.2°, 0.6° (not nested in the target): error falls at first order or better', () => {
    const errs = [2.4, 1.2, 0.6].map((h) => {
      const src = makeRegularGrid(h, 180 / Math.round(180 / h), -179.3);
      return maxErr(remap64(src, target, cellMeans(src)).values);
    });
    expect(errs[0]).toBeLessThan(0.05);
    expect(errs[1] / errs[0]).toBeLessThan(0.6);
    expect(errs[2] / errs[1]).toBeLessThan(0.6);
  });

  it('curvilinear sources of 4°, 2°, 1° (values at cell centres): error falls at first order or better', () => {
    const errs = [90, 180, 360].map((nx) => {
      const src = distortedGrid(nx, nx / 2, -90, 90, 1, -179.3);
      const v = new Float64Array(src.nx * src.ny);
      for (let c = 0; c < v.length; c++) v[c] = f(src.lon[c], src.lat[c]);
      return maxErr(remap64(src, target, v).values);
    });
    expect(errs[0]).toBeLessThan(0.1);
    expect(errs[1] / errs[0]).toBeLessThan(0.6);
    expect(errs[2] / errs[1]).toBeLessThan(0.6);
  });
});
