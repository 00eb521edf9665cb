/**
 * How much of a monthly climatology the reduction keeps (app/time/reduce.ts): the 12 months of one level by
 * default, of as many levels as one target level of a vertical regridding covers when asked. Hand cases on
 * a field in memory whose reads are counted; the hand monthly plan gives each month two steps of weight 1.
 */
import { describe, expect, it } from 'vitest';
import type { FieldSource } from '../../../app/cf/field-source.js';
import { levelsUnderOneLevel } from '../../../app/compare/level-reader.js';
import { reduceTime } from '../../../app/time/reduce.js';
import type { TimePlan } from '../../../app/time/select.js';
import { gridFromEdges, memoryField } from '../memory-field.js';

const NT = 24;
const NZ = 3;
/** step t of level k holds 100·k + t in its one cell */
function counted(): { field: FieldSource; reads: () => number } {
  const grid = gridFromEdges([0, 1], [0, 1], [0, 10, 20, 30]);
  const levels = Array.from({ length: NT * NZ }, (_, i) => Float32Array.of(100 * (i % NZ) + Math.floor(i / NZ)));
  const f = memoryField(grid, levels, { nt: NT });
  let n = 0;
  return { field: { ...f, readLevel: (t, k) => (n++, f.readLevel(t, k)) }, reads: () => n };
}
const plan: TimePlan = {
  kind: 'monthly',
  months: Array.from({ length: 12 }, (_, m) => ({ steps: Int32Array.of(m, m + 12), weights: Float64Array.of(1, 1) })),
  monthWeights: new Float64Array(12).fill(2),
  note: 'hand plan',
};

describe('the months kept', () => {
  it("builds a level's 12 months from its 24 steps once, month by month: (m + m + 12) / 2 = m + 6 at level 0", async () => {
    const { field, reads } = counted();
    const clim = reduceTime(field, plan);
    for (let m = 0; m < 12; m++) expect((await clim.readLevel(m, 0))[0]).toBe(m + 6);
    expect(reads()).toBe(NT);
    expect((await clim.readLevel(3, 2))[0]).toBe(209);
    expect(reads()).toBe(2 * NT);
  });
  it('keeps one level by default: going back to a level builds it again; keep(2) does not', async () => {
    const one = counted();
    const a = reduceTime(one.field, plan);
    await a.readLevel(0, 0);
    await a.readLevel(0, 1);
    await a.readLevel(1, 0);
    expect(one.reads()).toBe(3 * NT);
    const two = counted();
    const b = reduceTime(two.field, plan);
    b.keep(2);
    await b.readLevel(0, 0);
    await b.readLevel(0, 1);
    await b.readLevel(1, 0);
    expect(two.reads()).toBe(2 * NT);
  });
  it('a vertical regridding keeps as many levels as one target level covers', () => {
    // target 0-25 m covers source 0-10, 10-20, 20-30; 25-50 m covers 20-30 and 30-50
    expect(levelsUnderOneLevel([0, 10, 20, 30, 50], [0, 25, 50])).toBe(3);
    // the same levels: one each
    expect(levelsUnderOneLevel([0, 10, 20], [0, 10, 20])).toBe(1);
    // a target finer than the source: one each
    expect(levelsUnderOneLevel([0, 100], [0, 10, 50, 100])).toBe(1);
  });
});
