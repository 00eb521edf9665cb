import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { makeRectilinearGrid, makeRegularGrid } from '../../../app/grid/rectilinear.js';
import type { HorizontalGrid } from '../../../app/grid/types.js';
import { conservativeRectilinear, expandSeparable, separableWeights } from '../../../app/regrid/conservative-rectilinear.js';
import { inverse, type LevelEngine, type LevelRule, type SourceLayer } from '../../../app/regrid/remap-level.js';
import { ellpack, SeparableLevel, separableEngine } from '../../../app/regrid/separable-level.js';
import { SparseLevel } from '../../../app/regrid/sparse-level.js';
import type { SparseWeights } from '../../../app/regrid/csr.js';
import { rowSums } from '../../../app/regrid/csr.js';
import { buildWeights } from '../../../app/regrid/weights.js';
import { seededRandom as random } from '../spinup/seeded.js';
import { distortedGrid, referenceRemap } from './helpers.js';

// The WebAssembly engines (two factors row by row for lat-lon pairs; the sparse matrix for the rest)
// against the remapping rule written plainly in double precision (helpers.ts referenceRemap), the rule
// with which the conservation (Jones 1999) and overlap (shapely) tests check the weights against outside
// sources. Same coverage and values to single-precision rounding, the same missing cells, for every shape
// of factor (shifted, refined, coarsened, regional, odd sizes) and for curvilinear and bilinear matrices.

const edges = (a: number, b: number, n: number): Float64Array => Float64Array.from({ length: n + 1 }, (_, i) => a + ((b - a) * i) / n);

function level(n: number, rnd: () => number, missing: number): Float32Array {
  return Float32Array.from({ length: n }, () => (rnd() < missing ? NaN : 0.5 + 10 * rnd()));
}

type Layers = SourceLayer[];

function run(engine: LevelEngine, layers: Layers, ref: number, rule: LevelRule, n: number): { values: Float32Array; coverage: Float32Array; valid: number[] } {
  const values = new Float32Array(n), coverage = new Float32Array(n);
  const valid = engine.remap(layers, ref, rule, values, coverage);
  return { values, coverage, valid };
}

/** The sums per source cell in double precision, then the reference rule. */
function reference(w: SparseWeights, rowRef: Float64Array, layers: Layers, ref: number, rule: LevelRule) {
  const n = new Float64Array(w.nCols), d = new Float64Array(w.nCols);
  const valid = layers.map(({ level, h }) => {
    let count = 0;
    for (let s = 0; s < level.length; s++) {
      if (level[s] === level[s]) {
        n[s] += h * level[s];
        d[s] += h;
        count++;
      }
    }
    return count;
  });
  return { ...referenceRemap(w, rowRef, ref, n, d, rule), valid };
}

/** Several levels (one, three and two layers, all missing, none) through an engine and the reference. */
function compare(engine: LevelEngine, w: SparseWeights, rowRef: Float64Array, seed: number): void {
  const nSrc = w.nCols, nTgt = w.nRows;
  const rnd = random(seed);
  const cases: { layers: Layers; ref: number; rule: LevelRule }[] = [
    { layers: [{ level: level(nSrc, rnd, 0.3), h: 10 }], ref: 10, rule: { threshold: 0.5, normalise: true } },
    { layers: [{ level: level(nSrc, rnd, 0.2), h: 7.5 }, { level: level(nSrc, rnd, 0.5), h: 2.5 }, { level: level(nSrc, rnd, 0.9), h: 40 }], ref: 50, rule: { threshold: 0.07, normalise: true } },
    { layers: [{ level: level(nSrc, rnd, 0.4), h: 3 }, { level: level(nSrc, rnd, 0), h: 1 }], ref: 4, rule: { threshold: 0.3, normalise: false } },
    { layers: [{ level: level(nSrc, rnd, 1), h: 5 }], ref: 5, rule: { threshold: 0, normalise: true } },
    { layers: [], ref: 5, rule: { threshold: 0.5, normalise: true } },
  ];
  let compared = 0, covered = 0;
  const wrong: string[] = [];
  for (const [i, c] of cases.entries()) {
    const a = run(engine, c.layers, c.ref, c.rule, nTgt), b = reference(w, rowRef, c.layers, c.ref, c.rule);
    expect(a.valid).toEqual(b.valid);
    for (let r = 0; r < nTgt; r++) {
      if (b.coverage[r] > 0) covered++;
      // (a cell exactly at the threshold could fall either side of it by rounding: none is, here)
      const same =
        Math.abs(a.coverage[r] - b.coverage[r]) <= 4e-7 &&
        Number.isNaN(a.values[r]) === Number.isNaN(b.values[r]) &&
        (Number.isNaN(b.values[r]) || Math.abs(a.values[r] - b.values[r]) <= 4e-7 * Math.abs(b.values[r]));
      if (!same && wrong.length < 5) wrong.push(`case ${i} cell ${r}: ${a.values[r]} / ${a.coverage[r]} against ${b.values[r]} / ${b.coverage[r]}`);
      if (!Number.isNaN(b.values[r])) compared++;
    }
  }
  expect(wrong).toEqual([]);
  expect(compared).toBeGreaterThan(covered / 4);
}

const pairs: [string, HorizontalGrid, HorizontalGrid][] = [
  ['1° onto 1° shifted half a cell (periodic wrap)', makeRectilinearGrid(edges(-180, 180, 360), edges(-90, 90, 180)), makeRectilinearGrid(edges(-179.5, 180.5, 360), Float64Array.from([-90, ...edges(-89.5, 89.5, 179), 90]))],
  ['2° onto 0.5°, odd target width', makeRectilinearGrid(edges(0, 360, 180), edges(-80, 80, 80)), makeRectilinearGrid(edges(10.25, 55.75, 91), edges(-30, 30, 120))],
  ['0.5° onto 3° (six source columns a target)', makeRectilinearGrid(edges(0, 360, 720), edges(-90, 90, 360)), makeRectilinearGrid(edges(0, 360, 120), edges(-90, 90, 60))],
  ['a regional source under a global target (columns and rows with no source)', makeRectilinearGrid(edges(100, 140.5, 81), edges(-10.3, 20, 61)), makeRectilinearGrid(edges(-180, 180, 73), edges(-90, 90, 37))],
  ['irregular edges on both sides, odd counts', makeRectilinearGrid(Float64Array.from([0, 1, 3, 3.5, 7, 11, 12.25, 20]), Float64Array.from([-5, -4, -1, 0, 2.5, 6, 7])), makeRectilinearGrid(Float64Array.from([0.5, 2, 2.2, 9, 15, 19.5]), Float64Array.from([-4.5, -2, 1, 5]))],
];

describe('the WebAssembly engines follow the remapping rule to single-precision rounding', () => {
  for (const [name, src, tgt] of pairs) {
    it(`lat-lon pair as two factors: ${name}`, () => {
      const w = separableWeights(src, tgt);
      compare(new SeparableLevel(w, inverse(tgt.area)), expandSeparable(w), tgt.area, src.nx * src.ny + tgt.nx * tgt.ny);
    });
  }

  it('conservative weights of a curvilinear source, as a sparse matrix', () => {
    const src = distortedGrid(90, 40, -80, 80), tgt = makeRectilinearGrid(edges(-180, 180, 120), edges(-90, 90, 60));
    const w = buildWeights(src, tgt, 'conservative');
    compare(SparseLevel.of(w, () => inverse(tgt.area)), w, tgt.area, 11);
  });

  it('bilinear weights (full weight: the row sum), as a sparse matrix', () => {
    const src = makeRectilinearGrid(edges(0, 360, 72), edges(-90, 90, 36)), tgt = makeRectilinearGrid(edges(1, 359, 101), edges(-85, 85, 53));
    const w = buildWeights(src, tgt, 'bilinear');
    const rs = rowSums(w);
    compare(SparseLevel.of(w, () => inverse(rs)), w, rs, 12);
  });

  it('the factors expand to exactly the matrix of the direct construction, entry for entry', () => {
    const [, src, tgt] = pairs[1];
    const a = expandSeparable(separableWeights(src, tgt)), b = conservativeRectilinear(src, tgt);
    expect(Array.from(a.rowPtr)).toEqual(Array.from(b.rowPtr));
    expect(Array.from(a.col)).toEqual(Array.from(b.col));
    expect(Array.from(a.w)).toEqual(Array.from(b.w));
  });

  it('one engine per pair of lat-lon grids (equal grids built twice share it), one per sparse weights', () => {
    const a = separableEngine(makeRegularGrid(2, 2), makeRegularGrid(1, 1));
    expect(separableEngine(makeRegularGrid(2, 2), makeRegularGrid(1, 1))).toBe(a);
    expect(separableEngine(makeRegularGrid(2, 2), makeRegularGrid(1.5, 1.5))).not.toBe(a);
    const w = buildWeights(distortedGrid(36, 18, -80, 80), makeRegularGrid(10, 10), 'conservative');
    const inv = () => new Float64Array(w.nRows).fill(1);
    expect(SparseLevel.of(w, inv)).toBe(SparseLevel.of(w, inv));
  });

  it('ellpack pads each column to the longest with weight 0 on a source the column has', () => {
    const f = { start: Int32Array.of(0, 1, 4, 4), src: Int32Array.of(5, 6, 7, 8), len: Float64Array.of(1, 2, 3, 4) };
    const e = ellpack(f, 3);
    expect(e.slots).toBe(3);
    expect(Array.from(e.idx)).toEqual([5, 6, 0, 5, 7, 0, 5, 8, 0]);
    expect(Array.from(e.w)).toEqual([1, 2, 0, 0, 3, 0, 0, 4, 0]);
  });
});

describe('the committed WebAssembly module', () => {
  it('is what main/build-kernels.mjs makes of app/regrid/kernels/remap.as.ts today', () => {
    const root = join(__dirname, '../../..');
    const r = spawnSync(process.execPath, [join(root, 'main/build-kernels.mjs'), '--check'], { cwd: root, encoding: 'utf8', timeout: 60_000 });
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
  });
});
