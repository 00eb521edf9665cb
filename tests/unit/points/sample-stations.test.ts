import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { sampleStations } from '../../../app/points/sample-stations.js';
import { gridFromEdges, memoryField } from '../memory-field.js';

// Check values from scipy.interpolate.RegularGridInterpolator(method='linear')
// (tests/fixtures/lines/make_trilinear.py).
interface Case {
  name: string;
  lon_edges: number[];
  lat_edges: number[];
  z_edges: number[];
  values: number[];
  points: { lon: number; lat: number; depth: number }[];
  expected: number[];
}
const fx = JSON.parse(readFileSync(new URL('../../fixtures/lines/trilinear.json', import.meta.url), 'utf8')) as { cases: Case[] };

function positions(points: { lon: number; lat: number; depth: number }[], seafloor = false) {
  return {
    lon: points.map((p) => p.lon),
    lat: points.map((p) => p.lat),
    depth: points.map((p) => p.depth),
    seafloor: points.map(() => (seafloor ? 1 : 0)),
  };
}

describe('trilinear station sampling agrees with scipy RegularGridInterpolator', () => {
  for (const c of fx.cases) {
    it(c.name, async () => {
      const f = memoryField(gridFromEdges(c.lon_edges, c.lat_edges, c.z_edges), Float32Array.from(c.values));
      const s = await sampleStations(f, positions(c.points));
      c.expected.forEach((e, i) => {
        expect(s.status[i]).toBe('ok');
        expect(s.model[i]).toBeCloseTo(e, 5); // float32 storage of the field
      });
    });
  }
});

// A 4 x 3 grid of 1-degree cells, 4 layers of 100 m; value = 10 k + column index, so each answer is known.
const lonE = [0, 1, 2, 3, 4];
const latE = [0, 1, 2, 3];
const zE = [0, 100, 200, 300, 400];
function stepField(wetLevels: number[]): ReturnType<typeof memoryField> {
  const v = new Float32Array(4 * 12);
  for (let k = 0; k < 4; k++) for (let c = 0; c < 12; c++) v[k * 12 + c] = k < wetLevels[c] ? 10 * k + c : NaN;
  return memoryField(gridFromEdges(lonE, latE, zE), v);
}

describe('stations at the seafloor, on land and below the seafloor are each reported', () => {
  // columns: row-major j * 4 + i; column 5 (i=1, j=1) has 2 wet layers, column 0 is land
  const wet = [0, 4, 4, 4, 4, 2, 4, 4, 4, 4, 4, 4];
  const f = stepField(wet);
  it('seafloor means the bottom wet cell of the column (nearest)', async () => {
    const s = await sampleStations(f, { lon: [1.5, 3.5], lat: [1.5, 2.5], depth: [NaN, NaN], seafloor: [1, 1] }, { method: 'nearest' });
    expect(Array.from(s.model)).toEqual([10 * 1 + 5, 10 * 3 + 11]);
    expect(Array.from(s.modelDepthM)).toEqual([150, 350]);
    expect(Array.from(s.seafloorM)).toEqual([200, 400]);
  });
  it('a station on land, one below the seafloor and one outside the grid: none is dropped', async () => {
    const s = await sampleStations(
      f,
      { lon: [1.5, 1.5, 10], lat: [1.5, 1.5, 1], depth: [250, 120, 50], seafloor: [0, 0, 0] },
      { method: 'nearest' },
    );
    // at (1.5, 1.5), 250 m, column 5 itself is dry but its neighbours are wet: the value comes from a neighbour
    expect(s.status).toEqual(['from_neighbour', 'ok', 'outside_grid']);
    expect(s.model[1]).toBe(10 * 1 + 5);
    expect(s.seafloorM[0]).toBe(200);
    const deep = await sampleStations(f, { lon: [1.5], lat: [1.5], depth: [450], seafloor: [0] }, { method: 'nearest' });
    expect(deep.status).toEqual(['below_seafloor']);
    expect(deep.seafloorM[0]).toBe(200);
    // a land block in the south-west corner: no candidate column of (0.2, 0.2) has water
    const island = stepField([0, 0, 4, 4, 0, 0, 4, 4, 4, 4, 4, 4]);
    for (const method of ['nearest', 'trilinear'] as const) {
      const l = await sampleStations(island, { lon: [0.2], lat: [0.2], depth: [50], seafloor: [0] }, { method });
      expect(l.status).toEqual(['on_land']);
      expect(Number.isNaN(l.model[0])).toBe(true);
      expect(l.seafloorM[0]).toBe(0);
    }
  });
  it('trilinear holds the deepest wet value down to the bottom edge of its layer, then reports the seafloor', async () => {
    // at the centre of column 5 (the four bilinear weights are on column 5 alone)
    const s = await sampleStations(f, { lon: [1.5, 1.5, 1.5], lat: [1.5, 1.5, 1.5], depth: [100, 180, 201], seafloor: [0, 0, 0] });
    expect(s.model[0]).toBeCloseTo(5 + 10 * 0.5, 6); // halfway between centres at 50 m and 150 m
    expect(s.model[1]).toBeCloseTo(15, 6);
    expect(s.status[2]).toBe('below_seafloor');
  });
  it('trilinear next to land uses only the wet columns', async () => {
    // between column 0 (land) and column 1, at the cell-edge longitude 1.0, latitude of the first row centre
    const s = await sampleStations(f, { lon: [0.9], lat: [0.5], depth: [50], seafloor: [0] });
    expect(s.status[0]).toBe('from_neighbour');
    expect(s.model[0]).toBeCloseTo(1, 6);
  });
  it('nearest picks the closest column that is wet at that depth', async () => {
    // closer to column 5 (2 wet layers) than to column 6, at 250 m: column 5 is dry there, 6 is wet
    const s = await sampleStations(f, { lon: [1.9], lat: [1.5], depth: [250], seafloor: [0] }, { method: 'nearest' });
    expect(s.model[0]).toBe(10 * 2 + 6);
  });
});
