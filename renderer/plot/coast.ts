/** Natural Earth land outlines from the local world-atlas copy, projected once per projection. */
import { feature } from 'topojson-client';
import type { Topology } from 'topojson-specification';
import type { MultiPolygon, Polygon } from 'geojson';
import { projectRings, type Ring } from '../../app/render/coastline.js';
import { makeProjection, type ProjectionId } from '../../app/render/projections.js';
import { vendorUrl } from '../bridge.js';

let rings: Promise<Ring[]> | null = null;
const projected = new Map<ProjectionId, Promise<Float64Array[]>>();

/** Land rings (lon/lat) of Natural Earth 1:50m land, loaded from the workbench's own files. */
export function landRings(): Promise<Ring[]> {
  if (!rings) {
    rings = (async () => {
      const res = await fetch(vendorUrl('land50m'), { credentials: 'same-origin' });
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
    rings.catch(() => (rings = null));
  }
  return rings;
}

export function coastlines(id: ProjectionId): Promise<Float64Array[]> {
  let p = projected.get(id);
  if (!p) {
    p = landRings().then((r) => projectRings(makeProjection(id), r));
    projected.set(id, p);
    p.catch(() => projected.delete(id));
  }
  return p;
}
