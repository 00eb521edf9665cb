import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { EARTH_RADIUS_M } from '../../../app/grid/types.js';
import { destination, greatCircleDistance, initialAzimuth, intermediatePoint, type LonLat } from '../../../app/lines/great-circle.js';
import { sampleGreatCircles, sampleMeridian, sampleParallel } from '../../../app/lines/sample-path.js';

// Check values from pyproj's Geod(a=6371008.8, f=0) (tests/fixtures/lines/make_geodesy.py).
interface Geodesy {
  inv: { name: string; a: number[]; b: number[]; distance_m: number; az12: number }[];
  npts: { name: string; a: number[]; b: number[]; n: number; points: number[][] }[];
  fwd: { name: string; a: number[]; azimuth: number; distance_m: number; end: number[] }[];
  transects: { name: string; a: number[]; b: number[]; spacing_km: number; distance_km: number[]; points: number[][] }[];
}
const fx = JSON.parse(readFileSync(new URL('../../fixtures/lines/geodesy.json', import.meta.url), 'utf8')) as Geodesy;
const ll = (p: number[]): LonLat => ({ lon: p[0], lat: p[1] });

/** Distance between two points in metres, so that comparisons near poles are not fooled by longitude. */
const gap = (a: LonLat, b: LonLat): number => greatCircleDistance(a, b);

describe('great circles agree with pyproj Geod on a sphere of R = 6 371 008.8 m', () => {
  it('uses the GRS 80 mean radius R1 (Moritz 2000)', () => {
    expect(EARTH_RADIUS_M).toBe(6371008.8);
  });
  for (const c of fx.inv) {
    it(`distance and azimuth: ${c.name}`, () => {
      expect(greatCircleDistance(ll(c.a), ll(c.b))).toBeCloseTo(c.distance_m, 3); // millimetres
      expect(initialAzimuth(ll(c.a), ll(c.b))).toBeCloseTo(c.az12, 7);
    });
  }
  for (const c of fx.npts) {
    it(`intermediate points: ${c.name}`, () => {
      c.points.forEach((p, i) => {
        const q = intermediatePoint(ll(c.a), ll(c.b), (i + 1) / (c.n + 1));
        expect(gap(q, ll(p))).toBeLessThan(1e-3);
      });
    });
  }
  for (const c of fx.fwd) {
    it(`forward problem: ${c.name}`, () => {
      expect(gap(destination(ll(c.a), c.azimuth, c.distance_m), ll(c.end))).toBeLessThan(1e-3);
    });
  }
  for (const c of fx.transects) {
    it(`transect sampled every ${c.spacing_km} km: ${c.name}`, () => {
      const line = sampleGreatCircles([ll(c.a), ll(c.b)], c.spacing_km);
      expect(line.distanceKm.length).toBe(c.distance_km.length);
      c.points.forEach((p, i) => {
        expect(line.distanceKm[i]).toBeCloseTo(c.distance_km[i], 6);
        expect(gap({ lon: line.lon[i], lat: line.lat[i] }, ll(p))).toBeLessThan(1e-3);
      });
    });
  }
});

describe('lines through waypoints', () => {
  it('a transect across the antimeridian keeps longitudes in [-180, 180) and never jumps the long way round', () => {
    const line = sampleGreatCircles([{ lon: 170, lat: -10 }, { lon: -170, lat: 10 }], 50);
    for (let i = 0; i < line.lon.length; i++) {
      expect(line.lon[i]).toBeGreaterThanOrEqual(-180);
      expect(line.lon[i]).toBeLessThan(180);
      expect(line.lon[i] >= 170 || line.lon[i] <= -170).toBe(true);
    }
    // consecutive samples are 50 km apart on the sphere (the last one may be shorter)
    for (let i = 1; i + 1 < line.lon.length; i++) {
      expect(gap({ lon: line.lon[i - 1], lat: line.lat[i - 1] }, { lon: line.lon[i], lat: line.lat[i] })).toBeCloseTo(50_000, 3);
    }
  });
  it('a transect close to the pole passes within 1.5 degrees of it with evenly spaced samples', () => {
    const line = sampleGreatCircles([{ lon: -40, lat: 82 }, { lon: 120, lat: 84 }], 50);
    expect(Math.max(...line.lat)).toBeGreaterThan(88.5);
    for (let i = 1; i + 1 < line.lon.length; i++) {
      expect(gap({ lon: line.lon[i - 1], lat: line.lat[i - 1] }, { lon: line.lon[i], lat: line.lat[i] })).toBeCloseTo(50_000, 3);
    }
  });
  it('keeps every waypoint as a sample, so corners are not cut', () => {
    const wps = [{ lon: -60, lat: 0 }, { lon: -30, lat: 10 }, { lon: -30.2, lat: 40 }];
    const line = sampleGreatCircles(wps, 300);
    line.waypointKm.forEach((d, w) => {
      const i = Array.from(line.distanceKm).findIndex((x) => Math.abs(x - d) < 1e-6);
      expect(i).toBeGreaterThanOrEqual(0);
      expect(gap({ lon: line.lon[i], lat: line.lat[i] }, wps[w])).toBeLessThan(1e-3);
    });
    // total length is the sum of the legs
    expect(line.waypointKm[2] * 1000).toBeCloseTo(gap(wps[0], wps[1]) + gap(wps[1], wps[2]), 3);
  });
  it('a meridian section is 20 015 km pole to pole (π R)', () => {
    const s = sampleMeridian(-25, -90, 90, 100);
    expect(s.distanceKm[s.distanceKm.length - 1]).toBeCloseTo((Math.PI * EARTH_RADIUS_M) / 1000, 6);
    expect(s.lat[0]).toBe(-90);
    expect(s.lat[s.lat.length - 1]).toBeCloseTo(90, 9);
  });
  it('a parallel section across the antimeridian goes east and measures R cos φ Δλ', () => {
    const s = sampleParallel(60, 170, -170, 25);
    expect(s.distanceKm[s.distanceKm.length - 1]).toBeCloseTo(((EARTH_RADIUS_M * Math.PI) / 180 / 1000) * 0.5 * 20, 6);
    expect(Array.from(s.lon).every((x) => x >= 170 || x <= -170)).toBe(true);
  });
});

describe('bad lines are refused with one clear sentence', () => {
  it('a path with one point', () => {
    expect(() => sampleGreatCircles([{ lon: 0, lat: 0 }])).toThrow(/needs at least two waypoints, got 1/);
  });
  it('waypoints out of range', () => {
    expect(() => sampleGreatCircles([{ lon: 0, lat: 0 }, { lon: 10, lat: 95 }])).toThrow(/waypoint 2: latitude 95 lies outside -90\.\.90/);
    expect(() => sampleGreatCircles([{ lon: 400, lat: 0 }, { lon: 10, lat: 5 }])).toThrow(/waypoint 1: longitude 400 lies outside/);
  });
  it('antipodal waypoints', () => {
    expect(() => sampleGreatCircles([{ lon: 0, lat: 0 }, { lon: 180, lat: 0 }])).toThrow(/antipodal/);
  });
  it('a spacing so small that the line would have more than 10 000 samples', () => {
    expect(() => sampleGreatCircles([{ lon: 0, lat: 0 }, { lon: 1, lat: 1 }], 0.0001)).toThrow(/--spacing-km 0\.0001 gives 1572\d\d\d samples along this line, more than the 10000/);
    expect(() => sampleParallel(0, -180, 180, 0.001)).toThrow(/more than the 10000/);
  });
  it('a line of zero length and a spacing that is not positive', () => {
    expect(() => sampleGreatCircles([{ lon: 5, lat: 5 }, { lon: 5, lat: 5 }])).toThrow(/no length/);
    expect(() => sampleGreatCircles([{ lon: 5, lat: 5 }, { lon: 6, lat: 5 }], 0)).toThrow(/--spacing-km must be a positive number/);
  });
});
