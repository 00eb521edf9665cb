/**
 * What a report needs beyond the figures' own code, for the command line and the workbench alike: Natural
 * Earth land for the coastlines (the world-atlas package, never fetched) and the SVG rasteriser for the PNGs
 * (resvg, README "Reports"). The rasteriser is a native module, loaded only when a report is written.
 */
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { feature } from 'topojson-client';
import type { Topology } from 'topojson-specification';
import type { MultiPolygon, Polygon } from 'geojson';
import { packageRoot } from '../package-root.js';
import type { Ring } from '../render/coastline.js';

/** Natural Earth land (1:110m: finer than a printed global panel can show) from the world-atlas package. */
export function landRings(): Ring[] {
  const topo = JSON.parse(readFileSync(join(packageRoot(), 'node_modules', 'world-atlas', 'land-110m.json'), 'utf8')) as Topology;
  const land = feature(topo, topo.objects.land) as unknown as { features?: { geometry: Polygon | MultiPolygon }[]; geometry?: Polygon | MultiPolygon };
  const geoms = land.features ? land.features.map((f) => f.geometry) : land.geometry ? [land.geometry] : [];
  const rings: Ring[] = [];
  for (const g of geoms) {
    if (g.type === 'Polygon') rings.push(...g.coordinates);
    else for (const p of g.coordinates) rings.push(...p);
  }
  return rings;
}

type ResvgModule = typeof import('@resvg/resvg-js');
let resvg: ResvgModule | null = null;

const DEJAVU = ['/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf', '/usr/share/fonts/truetype/dejavu/DejaVuSans-Bold.ttf'];
type FontOptions = { loadSystemFonts: boolean; fontFiles?: string[]; defaultFontFamily: string };
let fonts: FontOptions | null = null;

/**
 * resvg with the fonts the figures ask for: only the DejaVu Sans faces when they are installed (loading every
 * system font cost about a tenth of a second per figure), the system's fonts otherwise.
 */
export function svgToPng(svg: string, widthPx: number): Uint8Array {
  resvg ??= createRequire(import.meta.url)('@resvg/resvg-js') as ResvgModule;
  fonts ??= DEJAVU.every((f) => existsSync(f)) ? { loadSystemFonts: false, fontFiles: DEJAVU, defaultFontFamily: 'DejaVu Sans' } : { loadSystemFonts: true, defaultFontFamily: 'DejaVu Sans' };
  const r = new resvg.Resvg(svg, { fitTo: { mode: 'width', value: widthPx }, background: '#ffffff', font: fonts });
  return r.render().asPng();
}
