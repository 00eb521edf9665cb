// Slices the views draw from levels on the common grid: layer means, bottom cells, sections, zonal means,
// mean profiles. Each expected value is worked out by hand in the comment beside it (weighted means are
// Σw·v / Σw, common practice).
import { describe, expect, it } from 'vitest';
import { areaMean, atLevels, bottomLevels, layerMeans, meridianSection, parallelSection, seafloorOf, zonalMeans } from '../../../app/lines/slices.js';

const f = (a: number[]): Float32Array => Float32Array.from(a);

describe('layer means', () => {
  it('weight each level by the metres it has in the layer, only where model and reference both have values', () => {
    // two columns, three levels; column 1 has no reference on level 2
    const model = [f([1, 10]), f([2, 20]), f([4, 40])];
    const ref = [f([0, 0]), f([1, 10]), f([3, NaN])];
    const metres = [10, 20, 0];
    const r = layerMeans(model, ref, metres);
    // column 0: (10·1 + 20·2) / 30 = 50/30; reference (10·0 + 20·1) / 30 = 20/30
    expect(r.model[0]).toBeCloseTo(50 / 30, 6);
    expect(r.reference[0]).toBeCloseTo(20 / 30, 6);
    expect(r.difference[0]).toBeCloseTo(1, 6);
    expect(r.thickness[0]).toBe(30);
    // column 1: level 2 has weight 0 anyway: (10·10 + 20·20)/30
    expect(r.model[1]).toBeCloseTo(500 / 30, 5);
  });
  it('a column with no compared level is missing, with no thickness', () => {
    const r = layerMeans([f([NaN])], [f([1])], [5]);
    expect(r.model[0]).toBeNaN();
    expect(r.thickness[0]).toBe(0);
  });
});

describe('bottom cells', () => {
  it('is the deepest level where both have values, column by column', () => {
    const model = [f([1, 1, NaN]), f([2, 2, NaN]), f([3, NaN, NaN])];
    const ref = [f([1, 1, 1]), f([2, 2, 2]), f([3, 3, 3])];
    const k = bottomLevels(model, ref);
    expect(Array.from(k)).toEqual([2, 1, -1]);
    expect(Array.from(atLevels(model, k))).toEqual([3, 2, NaN]);
  });
});

describe('sections', () => {
  // a 3 × 2 grid (nx = 3, ny = 2) with two levels; value = 100·k + 10·j + i
  const levels = [0, 1].map((k) => f([0, 1, 2, 10, 11, 12].map((v) => v + 100 * k)));
  it('along a meridian: column i of every row, level by level', () => {
    expect(Array.from(meridianSection(levels, 3, 2, 1))).toEqual([1, 11, 101, 111]);
  });
  it('along a parallel: row j, level by level', () => {
    expect(Array.from(parallelSection(levels, 3, 1))).toEqual([10, 11, 12, 110, 111, 112]);
  });
  it('the seafloor lies under the deepest valued level', () => {
    const sec = [f([1, 1, NaN]), f([2, NaN, NaN])];
    const floor = seafloorOf(sec, 3, [0, 10, 50]);
    expect(floor[0]).toBe(50);
    expect(floor[1]).toBe(10);
    expect(floor[2]).toBeNaN();
  });
  it('zonal means are area-weighted over the region, where both have values', () => {
    const model = [f([1, 3, 100, 5, 7, 9])];
    const ref = [f([0, 0, 0, 1, 1, NaN])];
    const area = [1, 3, 1, 2, 2, 2];
    const mask = Uint8Array.from([1, 1, 0, 1, 1, 1]); // the third cell of row 0 is outside the region
    const z = zonalMeans(model, ref, area, mask, 3, 2);
    // row 0: (1·1 + 3·3) / 4 = 2.5 ; row 1: (2·5 + 2·7) / 4 = 6 (the last cell has no reference)
    expect(Array.from(z.model)).toEqual([2.5, 6]);
    expect(Array.from(z.reference)).toEqual([0, 1]);
    expect(Array.from(z.difference)).toEqual([2.5, 5]);
  });
});

describe('area means for profiles', () => {
  it('weights by cell area over the region, skipping cells that either array lacks', () => {
    const level = f([1, 2, 3, NaN]);
    const other = f([0, NaN, 0, 0]);
    const area = [1, 1, 3, 1];
    const cells = Int32Array.from([0, 1, 2, 3]);
    expect(areaMean(level, area, cells)).toBeCloseTo((1 + 2 + 9) / 5, 12);
    expect(areaMean(level, area, cells, other)).toBeCloseTo((1 + 9) / 4, 12);
    expect(areaMean(f([NaN]), [1], Int32Array.from([0]))).toBeNaN();
  });
});
