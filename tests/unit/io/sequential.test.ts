/** Noticing slabs read one after another, for reading ahead (app/io/sequential.ts). Hand cases. */
import { describe, expect, it } from 'vitest';
import { slabAhead, slabRecord, steadyMove, type SlabRecord } from '../../../app/io/sequential.js';

/** The records of a sequence of (time, level) slabs of one level each, and the steady move after each. */
function follow(starts: number[][]): ({ dim: number; by: number } | undefined)[] {
  let last: SlabRecord | undefined;
  return starts.map((s) => {
    const r = slabRecord(last, s, [1, 1, 180, 360]);
    const m = steadyMove(last, r);
    last = r;
    return m;
  });
}

describe('reading ahead', () => {
  it('the next step is noticed at once (level by level, or step by step)', () => {
    expect(follow([[0, 5, 0, 0], [1, 5, 0, 0], [2, 5, 0, 0]])).toEqual([undefined, { dim: 0, by: 1 }, { dim: 0, by: 1 }]);
  });
  it("every twelfth step (a month's steps of a monthly run) is noticed once the stride repeats", () => {
    expect(follow([[0, 5, 0, 0], [12, 5, 0, 0], [24, 5, 0, 0], [36, 5, 0, 0]])).toEqual([undefined, undefined, { dim: 0, by: 12 }, { dim: 0, by: 12 }]);
    // the next month starts over: no move backwards, no stride from before it
    expect(follow([[0, 5, 0, 0], [12, 5, 0, 0], [24, 5, 0, 0], [1, 5, 0, 0], [13, 5, 0, 0]])).toEqual([undefined, undefined, { dim: 0, by: 12 }, undefined, undefined]);
  });
  it('a move along two dimensions, or a change of count, is not a steady read', () => {
    let last = slabRecord(undefined, [0, 0], [1, 10]);
    const r = slabRecord(last, [1, 1], [1, 10]);
    expect(steadyMove(last, r)).toBeUndefined();
    last = slabRecord(undefined, [0, 0], [1, 10]);
    expect(steadyMove(last, slabRecord(last, [1, 0], [2, 10]))).toBeUndefined();
  });
  it('the slabs ahead follow the stride and stop at the end of the dimension', () => {
    expect(slabAhead([24, 5, 0, 0], [1, 1, 180, 360], 0, 1, [240, 33, 180, 360], 12)).toEqual([36, 5, 0, 0]);
    expect(slabAhead([228, 5, 0, 0], [1, 1, 180, 360], 0, 1, [240, 33, 180, 360], 12)).toBeUndefined();
    expect(slabAhead([3, 5, 0, 0], [1, 1, 180, 360], 1, 2, [240, 33, 180, 360])).toEqual([3, 7, 0, 0]);
  });
});
