/**
 * Statistics for all regions × layers in one pass over the levels, against numpy over the flattened field
 * (tests/fixtures/compare/make_fixtures.py: np.average, np.cov with aweights = area × overlap).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PairAccumulator } from '../../../app/compare/accumulate.js';
import { makeVerticalAxis } from '../../../app/grid/vertical.js';
import { skillFromMoments } from '../../../app/stats/skill.js';
import { looksLikeOxygen, makeLevelConverter } from '../../../app/compare/level-units.js';
import { parseUnits } from '../../../app/cf/units.js';

const fixture = JSON.parse(readFileSync(join(__dirname, '../../fixtures/compare/stats.json'), 'utf8')).levels;
const arr = (a: (number | null)[]) => Float64Array.from(a, (x) => (x === null ? NaN : x));

describe('PairAccumulator', () => {
  it('interval and whole-column layers over a region equal numpy with overlap weights', () => {
    const axis = makeVerticalAxis(Float64Array.from(fixture.edges));
    const area = Float64Array.from(fixture.area);
    const all = { name: 'global', source: 'built-in', cells: Int32Array.from(area.keys()) };
    const half = { name: 'half', source: 'test', cells: Int32Array.from({ length: 20 }, (_, i) => 2 * i) };
    const acc = new PairAccumulator([all, half], [{ kind: 'interval', top: 25, bottom: 130 }, { kind: 'all' }], axis, area);
    for (let k = 0; k < axis.nz; k++) acc.addLevel(k, arr(fixture.model[k]), arr(fixture.ref[k]));
    const res = acc.results();
    const check = (got: ReturnType<typeof skillFromMoments>, e: Record<string, number>) => {
      expect(got.n).toBe(e.n);
      for (const k of ['weight', 'model_mean', 'ref_mean', 'model_std', 'ref_std', 'corr', 'rmse', 'crmse', 'nse'] as const) {
        expect(Math.abs((got[k] as number) - e[k]), k).toBeLessThan(1e-11 * Math.max(1, Math.abs(e[k])));
      }
    };
    check(skillFromMoments(res.find((c) => c.region === 0 && c.layer === 0)!.moments), fixture.expected_25_130);
    check(skillFromMoments(res.find((c) => c.region === 0 && c.layer === 1)!.moments), fixture.expected_all);
    check(skillFromMoments(acc.globalFullDepth()), fixture.expected_all);
    // the second region holds fewer cells than the whole
    expect(res.find((c) => c.region === 1 && c.layer === 1)!.moments.n).toBeLessThan(fixture.expected_all.n);

    // with regions that partition the grid, the whole is the merge of their moments: still numpy's numbers
    const odd = { name: 'odd', source: 'test', cells: Int32Array.from({ length: 20 }, (_, i) => 2 * i + 1) };
    const acc2 = new PairAccumulator([half, all, odd], [{ kind: 'interval', top: 25, bottom: 130 }, { kind: 'all' }], axis, area);
    for (let k = 0; k < axis.nz; k++) acc2.addLevel(k, arr(fixture.model[k]), arr(fixture.ref[k]));
    const res2 = acc2.results();
    check(skillFromMoments(res2.find((c) => c.region === 1 && c.layer === 0)!.moments), fixture.expected_25_130);
    check(skillFromMoments(res2.find((c) => c.region === 1 && c.layer === 1)!.moments), fixture.expected_all);
    check(skillFromMoments(acc2.globalFullDepth()), fixture.expected_all);
    const halves = [0, 2].map((r) => res2.find((c) => c.region === r && c.layer === 1)!.moments.n);
    expect(halves[0] + halves[1]).toBe(fixture.expected_all.n);
  });

  it('a 2-D field: surface and all are area-weighted; depth intervals and bottom say they do not apply', () => {
    const area = Float64Array.of(1, 3);
    const reg = { name: 'global', source: 'built-in', cells: Int32Array.of(0, 1) };
    const acc = new PairAccumulator([reg], [{ kind: 'surface' }, { kind: 'interval', top: 0, bottom: 10 }, { kind: 'bottom' }], null, area);
    acc.addLevel(0, Float32Array.of(2, 4), Float32Array.of(1, 1));
    const [surf, interval, bottom] = acc.results();
    expect(skillFromMoments(surf.moments)).toMatchObject({ n: 2, weight: 4, bias: 2.5 });
    expect(interval.inapplicable).toMatch(/2-D field/);
    expect(bottom.inapplicable).toMatch(/2-D field/);
  });
});

describe('units of the tables', () => {
  it('mmol m-3 to umol kg-1 with a nominal 1025 kg m-3 divides by 1.025 (common practice)', () => {
    const c = makeLevelConverter(parseUnits('mmol m-3'), parseUnits('umol kg-1'), 'x', 'PO4', false)!;
    expect(c.needsDensity).toBe(true);
    const out = c.apply(Float32Array.of(1.025, NaN), { density: 1025 });
    expect(out[0]).toBeCloseTo(1, 6);
    expect(out[1]).toBeNaN();
    expect(c.describe('a nominal density of 1025 kg m-3')).toBe('converted mmol m-3 to umol kg-1 with a nominal density of 1025 kg m-3');
  });
  it('ml L-1 converts only for oxygen: 1 ml L-1 = 44.661 mmol m-3 (common practice, from memory)', () => {
    expect(looksLikeOxygen('O2')).toBe(true);
    expect(looksLikeOxygen('PO4', 'mole_concentration_of_phosphate_in_sea_water')).toBe(false);
    const c = makeLevelConverter(parseUnits('ml/l'), parseUnits('mmol m-3'), 'x', 'O2', true)!;
    expect(c.apply(Float32Array.of(1))[0]).toBeCloseTo(44.661, 3);
    expect(() => makeLevelConverter(parseUnits('ml/l'), parseUnits('mmol m-3'), 'runs[0].variables.X', 'X', false)).toThrow(/runs\[0\]\.variables\.X: cannot convert 'ml\/l' to 'mmol m-3' \(a gas volume per volume converts only for oxygen\)/);
    expect(makeLevelConverter(parseUnits('mmol m-3'), parseUnits('mmol/m^3'), 'x', 'PO4', false)).toBeNull();
  });
});
