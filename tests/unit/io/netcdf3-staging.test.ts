/**
 * The classic reader reads through a reused staging buffer: results must still be arrays of their own,
 * and reads started together (not awaited one by one) must each get their own slab. Expected values are
 * netCDF4-python's (tests/fixtures/io/make_fixtures.py).
 */
import { describe, expect, it } from 'vitest';
import { openDataset } from '../../../app/io/open.js';
import { expectedNc, expectedSlab, fixture, plain } from './expected.js';

describe('classic reads through the staging buffer', () => {
  const temp = expectedNc('classic_cdf1').variables.temp;
  const levels: [number[], number[]][] = [
    [[0, 0, 0, 0], [1, 1, 4, 5]],
    [[1, 2, 0, 0], [1, 1, 4, 5]],
    [[0, 1, 0, 0], [2, 2, 4, 5]],
    [[1, 0, 1, 2], [1, 3, 2, 3]],
  ];

  it('keeps every earlier result intact while later slabs are read', async () => {
    const ds = await openDataset(fixture('classic_cdf1.nc'));
    const kept = [];
    for (const [s, c] of levels) kept.push(await ds.read('temp', s, c));
    kept.forEach((a, i) => expect(plain(a)).toEqual(expectedSlab(temp, levels[i][0], levels[i][1])));
    const buffers = new Set(kept.map((a) => a.buffer));
    expect(buffers.size).toBe(kept.length);
    await ds.close();
  });

  it('gives reads started together each their own slab', async () => {
    const ds = await openDataset(fixture('classic_cdf1.nc'));
    const got = await Promise.all(levels.map(([s, c]) => ds.read('temp', s, c)));
    got.forEach((a, i) => expect(plain(a)).toEqual(expectedSlab(temp, levels[i][0], levels[i][1])));
    await ds.close();
  });
});
