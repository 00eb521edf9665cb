// Map coordinates of every projection the views offer, forward and inverse, against pyproj (PROJ 9),
// fixture made by tests/fixtures/render/make_render_fixtures.py with the same definition strings.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { PROJECTIONS, makeProjection, type ProjectionId } from '../../../app/render/projections.js';

interface Fwd { lon: number; lat: number; x: number; y: number }
interface Inv { x: number; y: number; lon: number; lat: number }
const fixture = JSON.parse(readFileSync(new URL('../../fixtures/render/projections.json', import.meta.url), 'utf8')) as {
  projections: Record<string, { definition: string; forward: Fwd[]; inverse: Inv[] }>;
};

describe('map projections agree with pyproj', () => {
  it('offers the projections the fixture checks, with the same definitions', () => {
    expect(PROJECTIONS.map((p) => p.id).sort()).toEqual(Object.keys(fixture.projections).sort());
    for (const p of PROJECTIONS) expect(p.definition).toBe(fixture.projections[p.id].definition);
  });
  for (const id of Object.keys(fixture.projections) as ProjectionId[]) {
    const proj = makeProjection(id);
    const f = fixture.projections[id];
    it(`${id}: forward within 1 mm of pyproj`, () => {
      for (const p of f.forward) {
        const q = proj.forward(p.lon, p.lat);
        expect(q, `${id} forward(${p.lon}, ${p.lat})`).not.toBeNull();
        expect(Math.abs(q![0] - p.x)).toBeLessThan(1e-3);
        expect(Math.abs(q![1] - p.y)).toBeLessThan(1e-3);
      }
    });
    it(`${id}: inverse within 1e-7 degrees of pyproj`, () => {
      expect(f.inverse.length).toBeGreaterThan(3);
      for (const p of f.inverse) {
        const q = proj.inverse(p.x, p.y);
        expect(q, `${id} inverse(${p.x}, ${p.y})`).not.toBeNull();
        // longitude is undefined at a pole; compare it only away from the poles
        if (Math.abs(p.lat) < 89.99) expect(Math.abs(((q![0] - p.lon + 540) % 360) - 180)).toBeLessThan(1e-7);
        expect(Math.abs(q![1] - p.lat)).toBeLessThan(1e-7);
      }
    });
  }
});

describe('what lies off the map', () => {
  it('a world view refuses points beyond its outline', () => {
    const ee = makeProjection('equal-earth');
    expect(ee.inverse(ee.extent.xmax * 0.99, ee.extent.ymax * 0.99)).toBeNull(); // corner, off the globe
    expect(ee.inverse(0, 0)).not.toBeNull();
    const plate = makeProjection('plate');
    expect(plate.inverse(plate.extent.xmax * 1.01, 0)).toBeNull();
  });
  it('polar views stop at their latitude limit', () => {
    const np = makeProjection('north-polar');
    expect(np.forward(10, 39)).toBeNull();
    expect(np.forward(10, 41)).not.toBeNull();
    // the square's corner lies beyond the limit circle
    expect(np.inverse(np.extent.xmax * 0.95, np.extent.ymax * 0.95)).toBeNull();
    const sp = makeProjection('south-polar');
    expect(sp.forward(10, -41)).not.toBeNull();
    expect(sp.forward(10, 41)).toBeNull();
  });
  it('an unknown projection is refused with a sentence that names it', () => {
    expect(() => makeProjection('mercator' as ProjectionId)).toThrow(/mercator/);
  });
});
