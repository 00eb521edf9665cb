/**
 * Built-in basins (our own lines, app/regions/BASINS.md). Facts checked: every cell of a grid lies in exactly
 * one non-global basin; named seas fall where common geography puts them (common practice).
 */
import { describe, expect, it } from 'vitest';
import { makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { BASIN_NAMES, basinOf, builtInRegionCells } from '../../../app/regions/basins.js';

describe('built-in basins', () => {
  it('every cell of a 1° grid (and of a 0.5° grid shifted to 0..360) belongs to exactly one of the five basins', () => {
    for (const g of [makeRegularGrid(1, 1), makeRegularGrid(0.5, 0.5, 0)]) {
      const count = new Uint8Array(g.nx * g.ny);
      for (const b of BASIN_NAMES) for (const c of builtInRegionCells(b, g.lon, g.lat)) count[c]++;
      expect(count.every((x) => x === 1)).toBe(true);
      expect(builtInRegionCells('global', g.lon, g.lat).length).toBe(g.nx * g.ny);
    }
  });

  it.each([
    ['central North Atlantic', -40, 30, 'atlantic'],
    ['Gulf of Mexico', -90, 25, 'atlantic'],
    ['Caribbean Sea', -75, 15, 'atlantic'],
    ['Mediterranean, off Lebanon', 35, 34, 'atlantic'],
    ['Black Sea', 34, 43, 'atlantic'],
    ['Baltic Sea', 19, 58, 'atlantic'],
    ['Labrador Sea', -55, 58, 'atlantic'],
    ['Gulf of Guinea', 3, 2, 'atlantic'],
    ['off Namibia', 12, -22, 'atlantic'],
    ['equatorial East Pacific', -100, 0, 'pacific'],
    ['off Peru', -80, -10, 'pacific'],
    ['Gulf of Panama', -79.5, 8, 'pacific'],
    ['Gulf of California', -111, 27, 'pacific'],
    ['Bering Sea', -175, 58, 'pacific'],
    ['Bering Sea west of the dateline (0..360 longitudes)', 175, 58, 'pacific'],
    ['South China Sea', 113, 12, 'pacific'],
    ['Gulf of Thailand', 101.5, 10, 'pacific'],
    ['Banda Sea', 127, -6, 'pacific'],
    ['Java Sea', 110, -5, 'pacific'],
    ['Tasman Sea', 160, -30, 'pacific'],
    ['Arabian Sea', 65, 15, 'indian'],
    ['Bay of Bengal', 88, 15, 'indian'],
    ['Red Sea', 38, 20, 'indian'],
    ['Persian Gulf', 51, 27, 'indian'],
    ['Andaman Sea', 96, 12, 'indian'],
    ['Strait of Malacca', 100, 4, 'indian'],
    ['south of Java', 110, -12, 'indian'],
    ['Timor Sea', 126, -11, 'indian'],
    ['Great Australian Bight', 130, -34, 'indian'],
    ['Mozambique Channel', 40, -20, 'indian'],
    ['Drake Passage', -65, -58, 'southern'],
    ['south of Africa', 20, -40, 'southern'],
    ['Ross Sea', 180, -75, 'southern'],
    ['North Pole', 0, 89.5, 'arctic'],
    ['Barents Sea', 40, 72, 'arctic'],
    ['Chukchi Sea', -168, 70, 'arctic'],
    ['Hudson Bay', -85, 60, 'arctic'],
    ['James Bay', -80, 53, 'arctic'],
  ])('%s (%f, %f) is %s', (_name, lon, lat, basin) => {
    expect(basinOf(lon as number, lat as number)).toBe(basin);
    expect(basinOf((lon as number) + 360, lat as number)).toBe(basin);
  });
});
