import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { deriveCorners, makeCurvilinearGrid, nearLongitude, quadArea } from '../../../app/grid/curvilinear.js';
import { latLonCellArea } from '../../../app/grid/rectilinear.js';
import { sphericalPolygonArea } from '../../../app/grid/spherical-area.js';
import { EARTH_RADIUS_M } from '../../../app/grid/types.js';

// Sphere area 4πR² with the GRS 80 mean radius R1 = 6 371 008.8 m (Moritz 2000): 5.10066e14 m².
const SPHERE = 4 * Math.PI * EARTH_RADIUS_M ** 2;

function latLon2d(dLon: number, dLat: number, lon0 = 0) {
  const nx = Math.round(360 / dLon);
  const ny = Math.round(180 / dLat);
  const lon = new Float64Array(nx * ny);
  const lat = new Float64Array(nx * ny);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      lon[j * nx + i] = lon0 + (i + 0.5) * dLon;
      lat[j * nx + i] = -90 + (j + 0.5) * dLat;
    }
  }
  return { lon, lat, nx, ny };
}

describe('spherical polygon area (Van Oosterom & Strackee 1983)', () => {
  it('an octant (0..90°E, equator to pole) is 4πR²/8 exactly', () => {
    expect(sphericalPolygonArea([0, 90, 0], [0, 0, 90]) / (SPHERE / 8)).toBeCloseTo(1, 12);
  });
  it('a lat-lon cell agrees with R²Δλ(sin φ2 − sin φ1) to the bulge of great-circle edges (< 6e-5 for 1° cells)', () => {
    for (const lat0 of [-89, -60, -1, 0, 30, 75, 89]) {
      const a = sphericalPolygonArea([10, 11, 11, 10], [lat0, lat0, lat0 + 1, lat0 + 1]);
      const exact = latLonCellArea(10, 11, lat0, lat0 + 1);
      expect(Math.abs(a / exact - 1)).toBeLessThan(6e-5);
    }
  });
  it('the difference shrinks with cell size (second order)', () => {
    const err = (d: number) => Math.abs(sphericalPolygonArea([0, d, d, 0], [45, 45, 45 + d, 45 + d]) / latLonCellArea(0, d, 45, 45 + d) - 1);
    expect(err(0.5) / err(1)).toBeLessThan(0.3);
  });
});

describe('curvilinear grid areas', () => {
  it('global 2° grid with derived corners: cells sum to 4πR² (Moritz 2000 radius)', () => {
    const g2 = latLon2d(2, 2);
    const grid = makeCurvilinearGrid(g2.lon, g2.lat, g2.nx, g2.ny);
    expect(grid.periodic).toBe(true);
    expect(grid.boundsDerived).toBe(true);
    const total = grid.area.reduce((a, b) => a + b, 0);
    expect(total / SPHERE).toBeCloseTo(1, 9);
    expect(total).toBeCloseTo(5.10066e14, -10); // 4πR1² = 5.10066 × 10¹⁴ m² (Moritz 2000)
  });
  it('derived corners of a lat-lon grid lie on the half-degree lines and areas match the lat-lon formula', () => {
    const g = latLon2d(1, 1, -180);
    const grid = makeCurvilinearGrid(g.lon, g.lat, g.nx, g.ny);
    for (const c of [0, 5 * 360 + 7, 90 * 360 + 100, 179 * 360 + 359]) {
      const i = c % 360;
      const j = Math.floor(c / 360);
      expect(grid.cornerLat[c * 4]).toBeCloseTo(-90 + j, 6);
      expect(grid.cornerLat[c * 4 + 2]).toBeCloseTo(-89 + j, 6);
      expect(nearLongitude(grid.cornerLon[c * 4], g.lon[c])).toBeCloseTo(-180 + i, 6);
      const exact = latLonCellArea(-180 + i, -179 + i, -90 + j, -89 + j);
      expect(Math.abs(grid.area[c] / exact - 1)).toBeLessThan(1e-4);
    }
  });
  it('a rotated regional grid: corners are averages of the four surrounding centres', () => {
    const nx = 4, ny = 3;
    const lon = new Float64Array(nx * ny);
    const lat = new Float64Array(nx * ny);
    for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
      lon[j * nx + i] = 170 + 2 * i + 0.5 * j;
      lat[j * nx + i] = 10 + 2 * j - 0.5 * i;
    }
    const c = deriveCorners(lon, lat, nx, ny, false);
    // corner (i+½, j+½) of cell (0,0): near the plane average of centres (0,0),(1,0),(0,1),(1,1)
    expect(c.lon[2]).toBeCloseTo((170 + 172 + 170.5 + 172.5) / 4, 1);
    expect(c.lat[2]).toBeCloseTo((10 + 9.5 + 12 + 11.5) / 4, 1);
  });
  it('corner longitudes stay next to their centre across the 180° seam', () => {
    const lon = Float64Array.from([178, 180, 182 - 360, 178, 180, -178]);
    const lat = Float64Array.from([0, 0, 0, 2, 2, 2]);
    const grid = makeCurvilinearGrid(lon, lat, 3, 2);
    for (let c = 0; c < 6; c++) for (let q = 0; q < 4; q++) expect(Math.abs(grid.cornerLon[c * 4 + q] - lon[c])).toBeLessThan(2);
    // each 2°×2° cell has its lat-lon area, wherever it sits across the seam
    for (let c = 0; c < 6; c++) {
      const j = Math.floor(c / 3);
      expect(Math.abs(grid.area[c] / latLonCellArea(0, 2, -1 + 2 * j, 1 + 2 * j) - 1)).toBeLessThan(3e-4); // 2° edges bulge 4× the 1° case
    }
  });
  it('rejects mismatched sizes', () => {
    expect(() => makeCurvilinearGrid(new Float64Array(5), new Float64Array(6), 3, 2)).toThrow(/needs 6/);
  });
});

describe('spherical polygon areas equal pyproj.Geod on a sphere (geodesics are great circles)', () => {
  // made by tests/fixtures/cf/make_polygon_areas.py with pyproj.Geod(a=R1, b=R1).polygon_area_perimeter
  const fixture = JSON.parse(readFileSync(join(__dirname, '../../fixtures/cf/polygon-areas.json'), 'utf8')) as {
    radius: number;
    cases: { lon: number[]; lat: number[]; area: number }[];
  };
  it('uses the same radius', () => expect(fixture.radius).toBe(EARTH_RADIUS_M));
  fixture.cases.forEach((c, n) => {
    it(`quadrilateral ${n} (${c.lon[0].toFixed(1)}, ${c.lat[0].toFixed(1)})`, () => {
      expect(Math.abs(sphericalPolygonArea(c.lon, c.lat) / c.area - 1)).toBeLessThan(1e-9);
      expect(Math.abs(quadArea(c.lon, c.lat, 0) / c.area - 1)).toBeLessThan(1e-9);
    });
  });
});

describe('derived corners on a grid that is affine in longitude and latitude', () => {
  it('equal the CF bounds netCDF4-python wrote for tests/fixtures/cf/curvilinear.nc (same formula there)', async () => {
    const { openDataset } = await import('../../../app/io/open.js');
    const ds = await openDataset(join(__dirname, '../../fixtures/cf/curvilinear.nc'));
    try {
      const lon = (await ds.read('lon')) as Float64Array;
      const lat = (await ds.read('lat')) as Float64Array;
      const blon = (await ds.read('lon_bnds')) as Float64Array;
      const blat = (await ds.read('lat_bnds')) as Float64Array;
      // averages of four centres and linear extrapolation are exact for an affine grid
      const c = deriveCorners(lon, lat, 8, 5, false);
      for (let q = 0; q < blon.length; q++) {
        expect(c.lon[q]).toBeCloseTo(blon[q], 9);
        expect(c.lat[q]).toBeCloseTo(blat[q], 9);
      }
    } finally {
      await ds.close();
    }
  });
});
