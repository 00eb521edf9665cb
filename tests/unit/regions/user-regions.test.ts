/**
 * User regions. GeoJSON: point-in-polygon on cell centres against shapely's Polygon.contains
 * (tests/fixtures/compare/make_polygons.py). NetCDF flags: CF 1.10 §3.5 flag_values / flag_meanings.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { makeRectilinearGrid, makeRegularGrid } from '../../../app/grid/rectilinear.js';
import { loadGeoJsonRegions, parseGeoJsonRegions } from '../../../app/regions/geojson-regions.js';
import { flagTable, regionsFromFlags } from '../../../app/regions/flag-regions.js';

const dir = join(__dirname, '../../fixtures/compare');

function edges(start: number, step: number, n: number): Float64Array {
  return Float64Array.from({ length: n + 1 }, (_, i) => start + i * step);
}

describe('GeoJSON regions', () => {
  it('cells inside each feature are those shapely says contain the centre (holes and multipolygons included)', async () => {
    const truth = JSON.parse(readFileSync(join(dir, 'polygons-truth.json'), 'utf8'));
    const grid = makeRectilinearGrid(edges(truth.lon0, truth.step, truth.nx), edges(truth.lat0, truth.step, truth.ny));
    const regions = await loadGeoJsonRegions(join(dir, 'polygons.geojson'), grid);
    expect(regions.map((r) => r.name)).toEqual(['concave', 'twoparts']);
    for (const r of regions) {
      const expected = (truth.inside as (string | null)[]).flatMap((n, c) => (n === r.name ? [c] : []));
      expect(Array.from(r.cells)).toEqual(expected);
      expect(expected.length).toBeGreaterThan(50);
    }
  });

  it('bad GeoJSON gets one sentence naming the file', () => {
    expect(() => parseGeoJsonRegions({ type: 'FeatureCollection', features: [{ type: 'Feature', geometry: { type: 'Point', coordinates: [0, 0] } }] }, 'x.geojson')).toThrow(
      /x\.geojson: not usable GeoJSON regions \(feature 0: geometry type Point is not Polygon or MultiPolygon\)/,
    );
  });
});

describe('NetCDF flag regions', () => {
  const table = flagTable([1, 2, 5], 'north south  shelf', 'mask.nc', 'basin');

  it('pairs flag values with meanings', () => {
    expect(table).toEqual({ values: [1, 2, 5], meanings: ['north', 'south', 'shelf'] });
    expect(() => flagTable([1, 2], 'a', 'mask.nc', 'basin')).toThrow(/flag_values has 2 entries but flag_meanings 1/);
    expect(() => flagTable(undefined, undefined, 'mask.nc', 'basin')).toThrow(/needs the attributes flag_values and flag_meanings/);
  });

  it('on the common grid: each flag value is one region', () => {
    const grid = makeRectilinearGrid(edges(0, 10, 3), edges(0, 10, 2));
    const values = Float32Array.of(1, 1, 2, 5, NaN, 2);
    const regions = regionsFromFlags(values, grid, table, grid, 'mask.nc');
    expect(regions.map((r) => [r.name, Array.from(r.cells)])).toEqual([
      ['north', [0, 1]],
      ['south', [2, 5]],
      ['shelf', [3]],
    ]);
  });

  it('on a coarser lat-lon grid: a common-grid cell takes the mask cell holding its centre', () => {
    const mask = makeRegularGrid(180, 90); // 2 x 2 cells, lon −180..180
    const values = Float32Array.of(1, 2, 5, 1); // SW, SE, NW, NE
    const target = makeRegularGrid(90, 90, 0); // 4 x 2 cells, lon 0..360
    const regions = regionsFromFlags(values, mask, table, target, 'mask.nc', ['north', 'shelf']);
    // target centres: lon 45, 135 (in the mask's east column), 225 (= −135), 315 (= −45) (west column);
    // south row takes SE, SE, SW, SW = 2, 2, 1, 1; north row NE, NE, NW, NW = 1, 1, 5, 5
    expect(Array.from(regions[0].cells)).toEqual([2, 3, 4, 5]);
    expect(Array.from(regions[1].cells)).toEqual([6, 7]);
  });
});
