import { describe, expect, it } from 'vitest';
import { mapFigure, type MapFigureSpec } from '../../../app/figures/map-figure.js';
import type { SvgNode } from '../../../app/figures/svg-tree.js';
import { SEQUENTIAL } from '../../../app/render/colour-scales.js';
import { windowed, zoomWindow } from '../../../app/render/map-window.js';
import { makeProjection, type ProjectionId } from '../../../app/render/projections.js';
import { checkFigure, parsesAsXml } from './figure-checks.js';

// a synthetic 5° grid whose value is the latitude: the checks are about where things are drawn, by geometry
const nx = 72;
const ny = 36;
const lonEdges = Float64Array.from({ length: nx + 1 }, (_, i) => -180 + 5 * i);
const latEdges = Float64Array.from({ length: ny + 1 }, (_, j) => -90 + 5 * j);
const latitude = Float32Array.from({ length: nx * ny }, (_, c) => -87.5 + 5 * Math.floor(c / nx));

function spec(id: ProjectionId, extra: Partial<MapFigureSpec> = {}): MapFigureSpec {
  return { name: 'm', title: 'Latitude', subtitle: 'a test field', width: 'double', projection: makeProjection(id), coast: [], scale: SEQUENTIAL, min: -90, max: 90, barLabel: 'Latitude (degrees_north)', ...extra };
}
const texts = (n: SvgNode, cls?: string): string[] => [...n.walk()].filter((t) => t.tag === 'text' && (!cls || t.getAttribute('class') === cls)).map((t) => t.textContent());
const byClass = (n: SvgNode, cls: string): SvgNode[] => [...n.walk()].filter((t) => (t.getAttribute('class') ?? '').split(' ').includes(cls));
/** every (x, y) of a path's M/L commands */
const points = (d: string): [number, number][] => [...d.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);

describe('one map (the Map and Difference views and their export)', () => {
  it('is a print figure: parses as XML, has a title, units on its colour bar, no text below 7 pt', () => {
    const f = mapFigure(spec('equal-earth', { raster: 'data:image/png;base64,iVBORw0KGgo=' }));
    const c = checkFigure(f);
    expect(c.problems).toEqual([]);
    expect(c.colourBarLabels).toEqual(['Latitude (degrees_north)']);
    expect(parsesAsXml([f])).toEqual([true]);
    expect(f.svg.getAttribute('width')).toBe('180mm');
    // the raster is embedded where the map is
    const img = [...f.svg.walk()].find((n) => n.tag === 'image')!;
    expect(Number(img.getAttribute('width'))).toBeCloseTo(f.plot.w, 1);
  });

  it('leaves the raster to the screen when none is given (an empty raster group at the plot)', () => {
    const f = mapFigure(spec('plate'));
    expect(byClass(f.svg, 'raster')[0].children).toHaveLength(0);
    expect(byClass(f.svg, 'overlay')).toHaveLength(1);
  });

  it('labels latitudes and longitudes on every projection (issue 14: Equal Earth and polar maps had none)', () => {
    const ee = texts(mapFigure(spec('equal-earth')).svg);
    for (const l of ['60°N', '30°S', '120°W', '60°E']) expect(ee).toContain(l);
    const sp = texts(mapFigure(spec('south-polar')).svg);
    for (const l of ['60°S', '70°S', '120°E']) expect(sp).toContain(l);
    const pl = texts(mapFigure(spec('plate')).svg);
    for (const l of ['90°S', '0°', '30°N', '180°', '60°W']) expect(pl).toContain(l);
  });

  it('draws a contour where the field takes its value: latitude 50° (a colour-bar tick) lies at 40/180 of the equirectangular map from the top (exact geometry)', () => {
    const f = mapFigure(spec('plate', { contours: { values: latitude, lonEdges, latEdges } }));
    const path = byClass(f.svg, 'contours')[0].walk();
    const level50 = [...path].find((n) => n.tag === 'path' && n.getAttribute('data-level') === '50')!;
    const pts = points(level50.getAttribute('d')!);
    expect(pts.length).toBeGreaterThan(50);
    const y50 = f.plot.y + (40 / 180) * f.plot.h;
    for (const [, y] of pts) expect(Math.abs(y - y50)).toBeLessThan(0.011);
    expect(texts(f.svg, 'contour-label')).toContain('50');
  });

  it('in a zoomed window shows a finer graticule and only labels inside the map', () => {
    const full = makeProjection('plate');
    const win = zoomWindow(full.extent, null, 8, 0, 0);
    const f = mapFigure(spec('plate', { projection: windowed(full, win), zoom: 8 }));
    const lon = texts(f.svg).filter((t) => /°[EW]$/.test(t));
    // the window spans 45° of longitude about 0°: meridians every 10° from 20°W to 20°E
    expect(lon).toEqual(['20°W', '10°W', '10°E', '20°E']);
  });

  it('a zoomed Equal Earth window off the equator and the globe\'s edge still labels its parallels and meridians', () => {
    const full = makeProjection('equal-earth');
    // about the North Atlantic: 40°W, 45°N, zoomed 6×
    const [cx, cy] = full.forward(-40, 45)!;
    const win = zoomWindow(full.extent, null, 6, cx, cy);
    const f = mapFigure(spec('equal-earth', { projection: windowed(full, win), zoom: 6 }));
    const t = texts(f.svg);
    expect(t.filter((x) => /°N$/.test(x)).length).toBeGreaterThanOrEqual(2);
    expect(t.filter((x) => /°W$/.test(x)).length).toBeGreaterThanOrEqual(2);
    for (const n of [...f.svg.walk()].filter((x) => x.tag === 'text' && x.getAttribute('class') === 'halo')) {
      const x = Number(n.getAttribute('x'));
      const y = Number(n.getAttribute('y'));
      expect(x >= f.plot.x && x <= f.plot.x + f.plot.w && y >= f.plot.y && y <= f.plot.y + f.plot.h).toBe(true);
    }
  });

  it('says when the stretch is logarithmic and marks clipped values with arrows', () => {
    const f = mapFigure(spec('plate', { min: 0.1, max: 10, bar: { log: true, below: true, above: false } }));
    expect(texts(f.svg, 'colour-bar-label')).toEqual(['Latitude (degrees_north), log scale']);
    expect(byClass(f.svg, 'clip-below')).toHaveLength(1);
    expect(byClass(f.svg, 'clip-above')).toHaveLength(0);
  });
});
