import { describe, expect, it } from 'vitest';
import { stationsOnSlice, type ColumnFloor } from '../../../app/render/stations-on-slice.js';

// Stations at 5, 50, 150, 980 and 3900 m and one given as `seafloor`; every column's seafloor at 4000 m with
// its deepest cell from 3500 m (common practice: a bottom observation is one taken near the seafloor).
const stations = { depth: Float64Array.of(5, 50, 150, 980, 3900, NaN), seafloor: Uint8Array.of(0, 0, 0, 0, 0, 1) };
const deep: ColumnFloor = () => ({ floor: 4000, deepestTop: 3500 });

describe('stations on a map of one depth slice', () => {
  it('a level or layer shows the stations whose depth lies in it (top inclusive, bottom exclusive), and counts the rest', () => {
    const s = stationsOnSlice(stations, { kind: 'interval', top: 0, bottom: 100 }, deep);
    expect(Array.from(s.shown)).toEqual([1, 1, 0, 0, 0, 0]);
    expect([s.nShown, s.nHidden]).toEqual([2, 4]);
    expect(s.rule).toBe('stations at 0–100 m');
    expect(Array.from(stationsOnSlice(stations, { kind: 'level', top: 50, bottom: 150 }, deep).shown)).toEqual([0, 1, 0, 0, 0, 0]);
  });

  it('the bottom map shows seafloor stations and those within the bottom tolerance of their seafloor', () => {
    const s = stationsOnSlice(stations, { kind: 'bottom', top: null, bottom: null, bottomTolerance: 200 }, deep);
    expect(Array.from(s.shown)).toEqual([0, 0, 0, 0, 1, 1]);
    expect(s.rule).toBe('stations within 200 m of the seafloor');
    // shallow water: the 150 m station is 30 m above a 180 m seafloor
    const shelf: ColumnFloor = (i) => (i === 2 ? { floor: 180, deepestTop: 120 } : { floor: 4000, deepestTop: 3500 });
    expect(Array.from(stationsOnSlice(stations, { kind: 'bottom', top: null, bottom: null, bottomTolerance: 50 }, shelf).shown)).toEqual([0, 0, 1, 0, 0, 1]);
  });

  it('without a tolerance the bottom map keeps stations inside their column\'s deepest cell; unknown columns are hidden', () => {
    const s = stationsOnSlice(stations, { kind: 'bottom', top: null, bottom: null }, (i) => (i === 4 ? { floor: NaN, deepestTop: NaN } : { floor: 1000, deepestTop: 900 }));
    expect(Array.from(s.shown)).toEqual([0, 0, 0, 1, 0, 1]);
    expect(s.nHidden).toBe(4);
  });

  it('a full-depth mean shows every station', () => {
    expect(stationsOnSlice(stations, { kind: 'all', top: null, bottom: null }, deep).nShown).toBe(6);
  });
});
