/**
 * Bottom layer against a hand computation on a small grid with an uneven seafloor: four columns, four levels
 * (centres 5, 20, 45, 80 m). The expected cells and numbers below were worked out by hand, not by the code.
 */
import { describe, expect, it } from 'vitest';
import { makeVerticalAxis } from '../../../app/grid/vertical.js';
import { PairAccumulator } from '../../../app/compare/accumulate.js';
import { BottomTracker } from '../../../app/regions/bottom.js';
import { skillFromMoments } from '../../../app/stats/skill.js';

const N = NaN;
const axis = makeVerticalAxis(Float64Array.of(0, 10, 30, 60, 100));
// column:      0     1     2     3
// model wet:  0-3   0-1   0-3   none
// ref wet:    0-2   0-3   0-3   0-1, and column 2 has a gap at level 1 in the reference
const model = [
  [1, 2, 3, N],
  [4, 5, 6, N],
  [7, N, 8, N],
  [9, N, 10, N],
];
const ref = [
  [1.5, 2.5, 3.5, 0],
  [4.5, 5.5, N, 0],
  [7.5, 8.5, 8.5, N],
  [N, 9.5, 11.5, N],
];

function track(): BottomTracker {
  const t = new BottomTracker(4);
  for (let k = 0; k < 4; k++) t.update(k, model[k], ref[k]);
  return t;
}

describe('bottom layer', () => {
  it('takes the deepest cell where both have data in each column', () => {
    const sel = track().select(axis.centres);
    // column 0: both at level 2 (7 vs 7.5); column 1: level 1 (5 vs 5.5); column 2: level 3 (10 vs 11.5); column 3: none
    expect(Array.from(sel.level)).toEqual([2, 1, 3, -1]);
    expect(Array.from(sel.model)).toEqual([7, 5, 10, NaN]);
    expect(Array.from(sel.ref)).toEqual([7.5, 5.5, 11.5, NaN]);
  });

  it('with a tolerance keeps only columns whose model and reference seafloors are close', () => {
    // seafloor centres: column 0 model 80 m, ref 45 m (35 m apart); column 1 model 20, ref 80 (60 apart); column 2 both 80
    const sel = track().select(axis.centres, 40);
    expect(Array.from(sel.level)).toEqual([2, -1, 3, -1]);
    expect(Array.from(track().select(axis.centres, 0).level)).toEqual([-1, -1, 3, -1]);
  });

  it('feeds area-weighted bottom statistics to the accumulator', () => {
    const area = Float64Array.of(1, 2, 3, 4);
    const all = { name: 'global', source: 'built-in', cells: Int32Array.of(0, 1, 2, 3) };
    const acc = new PairAccumulator([all], [{ kind: 'bottom' }], axis, area, null);
    for (let k = 0; k < 4; k++) acc.addLevel(k, Float32Array.from(model[k]), Float32Array.from(ref[k]));
    const [cell] = acc.results();
    const s = skillFromMoments(cell.moments);
    // by hand: weights 1, 2, 3; model (7 + 10 + 30)/6 = 47/6, ref (7.5 + 11 + 34.5)/6 = 53/6, bias −1
    expect(s.n).toBe(3);
    expect(s.weight).toBe(6);
    expect(s.model_mean).toBeCloseTo(47 / 6, 12);
    expect(s.ref_mean).toBeCloseTo(53 / 6, 12);
    expect(s.bias).toBeCloseTo(-1, 12);
    // the reference has data in all four columns (area 10); 6 of it was compared
    expect(cell.refWeight).toBe(10);
  });
});
