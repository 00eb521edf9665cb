/** Natural Earth land outlines from the local world-atlas copy, projected once per projection. */
import { feature } from 'topojson-client';
import type { Topology } from 'topojson-specification';
import type { MultiPolygon, Polygon } from 'geojson';
import { projectRings, type Ring } from '../../app/render/coastline.js';
import { makeProjection, type ProjectionId } from '../../app/render/projections.js';
import { vendorUrl } from '../bridge.js';

export type CoastDetail = 'screen' | 'print';

const rings = new Map<CoastDetail, Promise<Ring[]>>();
const projected = new Map<string, Promise<Float64Array[]>>();
const ready = new Map<string, Float64Array[]>();

/**
 * Land rings (lon/lat) of Natural Earth land, loaded from the workbench's own files: 1:110m on screen
 * (a pixel is coarser than its detail), 1:50m for figures printed at 300 dpi.
 */
export function landRings(detail: CoastDetail): Promise<Ring[]> {
  let r = rings.get(detail);
  if (!r) {
    r = (async () => {
      const res = await fetch(vendorUrl(detail === 'print' ? 'land50m' : 'land110m'), { credentials: 'same-origin' });
      if (!res.ok) throw new Error(`The coastline file could not be loaded (${res.status}).`);
      const topo = (await res.json()) as Topology;
      const land = feature(topo, topo.objects.land) as unknown as { features?: { geometry: Polygon | MultiPolygon }[]; geometry?: Polygon | MultiPolygon };
      const geoms = land.features ? land.features.map((f) => f.geometry) : land.geometry ? [land.geometry] : [];
      const out: Ring[] = [];
      for (const g of geoms) {
        if (g.type === 'Polygon') out.push(...g.coordinates);
        else for (const poly of g.coordinates) out.push(...poly);
      }
      return out;
    })();
    rings.set(detail, r);
    r.catch(() => rings.delete(detail));
  }
  return r;
}

export function coastlines(id: ProjectionId, detail: CoastDetail = 'screen'): Promise<Float64Array[]> {
  const key = `${id}|${detail}`;
  let p = projected.get(key);
  if (!p) {
    p = landRings(detail).then((r) => projectRings(makeProjection(id), r));
    projected.set(key, p);
    p.then((lines) => ready.set(key, lines)).catch(() => projected.delete(key));
  }
  return p;
}

/** The coastlines if they are already projected, otherwise null (and their loading starts). */
export function coastlinesIfReady(id: ProjectionId, detail: CoastDetail = 'screen'): Float64Array[] | null {
  const hit = ready.get(`${id}|${detail}`);
  if (hit) return hit;
  void coastlines(id, detail).catch(() => undefined);
  return null;
}
