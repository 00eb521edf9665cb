/** Depth layers: cells weighted by the overlap of their vertical extent with the interval (hand values). */
import { describe, expect, it } from 'vitest';
import { makeVerticalAxis } from '../../../app/grid/vertical.js';
import { layerLabel, layerLevelMetres, overlap1d } from '../../../app/regions/layers.js';

const axis = makeVerticalAxis(Float64Array.of(0, 10, 30, 60, 100, 160, 250));

describe('layers', () => {
  it('an interval takes the metres of each level inside it', () => {
    expect(Array.from(layerLevelMetres({ kind: 'interval', top: 25, bottom: 130 }, axis))).toEqual([0, 5, 30, 40, 30, 0]);
    expect(Array.from(layerLevelMetres({ kind: 'interval', top: 0, bottom: 6000 }, axis))).toEqual([10, 20, 30, 40, 60, 90]);
  });
  it('surface is the top level only, all is every level', () => {
    expect(Array.from(layerLevelMetres({ kind: 'surface' }, axis))).toEqual([10, 0, 0, 0, 0, 0]);
    expect(Array.from(layerLevelMetres({ kind: 'all' }, axis))).toEqual([10, 20, 30, 40, 60, 90]);
  });
  it('overlap of intervals, and labels', () => {
    expect(overlap1d(0, 10, 5, 20)).toBe(5);
    expect(overlap1d(0, 10, 10, 20)).toBe(0);
    expect(layerLabel({ kind: 'interval', top: 100, bottom: 1000 })).toBe('100-1000 m');
    expect(layerLabel({ kind: 'bottom' })).toBe('bottom');
  });
});
