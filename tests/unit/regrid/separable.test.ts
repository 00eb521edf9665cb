import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { makeRectilinearGrid } from '../../../app/grid/rectilinear.js';
import type { HorizontalGrid } from '../../../app/grid/types.js';
import { conservativeRectilinear, expandSeparable, separableWeights } from '../../../app/regrid/conservative-rectilinear.js';
import { MatrixLevel, type LevelEngine, type LevelRule } from '../../../app/regrid/remap-level.js';
import { ellpack, SeparableLevel } from '../../../app/regrid/separable-level.js';
import { seededRandom as random } from '../spinup/seeded.js';

// The WebAssembly engine for lat-lon pairs (two factors, row by row) against the sparse-matrix engine
// in JavaScript, which the conservation (Jones 1999) and overlap (shapely) tests check against outside
// sources. Both must give the same coverage and values to single-precision rounding, with the same
// missing cells, for every shape of factor: shifted, refined, coarsened, regional, odd sizes.

const edges = (a: number, b: number, n: number): Float64Array => Float64Array.from({ length: n + 1 }, (_, i) => a + ((b - a) * i) / n);

function level(n: number, rnd: () => number, missing: number): Float32Array {
  return Float32Array.from({ length: n }, () => (rnd() < missing ? NaN : 0.5 + 10 * rnd()));
}

function run(engine: LevelEngine, layers: { level: Float32Array; h: number }[], ref: number, rule: LevelRule, n: number): { values: Float32Array; coverage: Float32Array; valid: number[] } {
  if (layers.length === 0) engine.clear();
  const valid = layers.map((l, i) => engine.accumulate(l.level, l.h, i === 0));
  const values = new Float32Array(n), coverage = new Float32Array(n);
  engine.finish(ref, rule, values, coverage);
  return { values, coverage, valid };
}

const pairs: [string, HorizontalGrid, HorizontalGrid][] = [
  ['1° onto 1° shifted half a cell (periodic wrap)', makeRectilinearGrid(edges(-180, 180, 360), edges(-90, 90, 180)), makeRectilinearGrid(edges(-179.5, 180.5, 360), Float64Array.from([-90, ...edges(-89.5, 89.5, 179), 90]))],
  ['2° onto 0.5°, odd target width', makeRectilinearGrid(edges(0, 360, 180), edges(-80, 80, 80)), makeRectilinearGrid(edges(10.25, 55.75, 91), edges(-30, 30, 120))],
  ['0.5° onto 3° (six source columns a target)', makeRectilinearGrid(edges(0, 360, 720), edges(-90, 90, 360)), makeRectilinearGrid(edges(0, 360, 120), edges(-90, 90, 60))],
  ['a regional source under a global target (columns and rows with no source)', makeRectilinearGrid(edges(100, 140.5, 81), edges(-10.3, 20, 61)), makeRectilinearGrid(edges(-180, 180, 73), edges(-90, 90, 37))],
  ['irregular edges on both sides, odd counts', makeRectilinearGrid(Float64Array.from([0, 1, 3, 3.5, 7, 11, 12.25, 20]), Float64Array.from([-5, -4, -1, 0, 2.5, 6, 7])), makeRectilinearGrid(Float64Array.from([0.5, 2, 2.2, 9, 15, 19.5]), Float64Array.from([-4.5, -2, 1, 5]))],
];

describe('conservative lat-lon pairs in WebAssembly (two factors) equal the sparse matrix in JavaScript', () => {
  for (const [name, src, tgt] of pairs) {
    it(name, () => {
      const w = separableWeights(src, tgt);
      const matrix = expandSeparable(w);
      const nSrc = src.nx * src.ny, nTgt = tgt.nx * tgt.ny;
      const rnd = random(nSrc + nTgt);
      const inv = tgt.area.map((a) => (a > 0 ? 1 / a : 0));
      const cases: { layers: { level: Float32Array; h: number }[]; ref: number; rule: LevelRule }[] = [
        { layers: [{ level: level(nSrc, rnd, 0.3), h: 10 }], ref: 10, rule: { threshold: 0.5, normalise: true } },
        { layers: [{ level: level(nSrc, rnd, 0.2), h: 7.5 }, { level: level(nSrc, rnd, 0.5), h: 2.5 }, { level: level(nSrc, rnd, 0.9), h: 40 }], ref: 50, rule: { threshold: 0.07, normalise: true } },
        { layers: [{ level: level(nSrc, rnd, 0.4), h: 3 }, { level: level(nSrc, rnd, 0), h: 1 }], ref: 4, rule: { threshold: 0.3, normalise: false } },
        { layers: [{ level: level(nSrc, rnd, 1), h: 5 }], ref: 5, rule: { threshold: 0, normalise: true } },
        { layers: [], ref: 5, rule: { threshold: 0.5, normalise: true } },
      ];
      const wasm = new SeparableLevel(w, inv), js = new MatrixLevel(matrix, tgt.area);
      let compared = 0, covered = 0;
      const wrong: string[] = [];
      for (const [i, c] of cases.entries()) {
        const a = run(wasm, c.layers, c.ref, c.rule, nTgt), b = run(js, c.layers, c.ref, c.rule, nTgt);
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
    });
  }

  it('the factors expand to exactly the matrix of the direct construction, entry for entry', () => {
    const [, src, tgt] = pairs[1];
    const a = expandSeparable(separableWeights(src, tgt)), b = conservativeRectilinear(src, tgt);
    expect(Array.from(a.rowPtr)).toEqual(Array.from(b.rowPtr));
    expect(Array.from(a.col)).toEqual(Array.from(b.col));
    expect(Array.from(a.w)).toEqual(Array.from(b.w));
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
  it('is what main/build-kernels.mjs makes of app/regrid/kernels/separable.as.ts today', () => {
    const root = join(__dirname, '../../..');
    const r = spawnSync(process.execPath, [join(root, 'main/build-kernels.mjs'), '--check'], { cwd: root, encoding: 'utf8', timeout: 60_000 });
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
  });
});
