/**
 * Station observations on the map: a small toolbar control (the station CSV, typed as a path) and an
 * overlay that draws each station on the map's colour scale (observed value in the disc, the shown run's
 * value in its ring), from the lines part's service 'points.compare'. Stations the model cannot sample
 * (on land, below the seafloor) are drawn hollow. Only the stations in the map's depth slice are drawn
 * (app/render/stations-on-slice.ts); how many are shown and hidden is said beside the control. The probe,
 * when near a station, gets its values.
 */
import { typesetUnits } from '../../app/figures/typeset.js';
import { stationsOnSlice, type SliceForStations } from '../../app/render/stations-on-slice.js';
import { colourFor, type ColourScale } from '../../app/render/colour-scales.js';
import type { PointsData } from '../../app/services/lines.js';
import { tracked } from '../service-client.js';
import { h, s } from '../elements.js';
import type { AppState } from '../state.js';

export interface StationsOverlay {
  /** the toolbar control */
  control: HTMLElement;
  /** draw the stations into the map's overlay group */
  draw(g: SVGGElement, st: AppState, project: (lon: number, lat: number) => [number, number] | null, scale: ColourScale, min: number, max: number, slice: SliceForStations, floorAt: (lon: number, lat: number) => { floor: number; deepestTop: number }): void;
  /** a line for the probe: the nearest station within `km` of the point, or null */
  probeText(lon: number, lat: number, run: string, km?: number): string | null;
  /** show the probe's nearest station (observed and modelled values) beside the control */
  showProbe(lon: number, lat: number, run: string): void;
}

const RAD = Math.PI / 180;
function km(aLon: number, aLat: number, bLon: number, bLat: number): number {
  const s1 = Math.sin(((bLat - aLat) * RAD) / 2);
  const s2 = Math.sin(((bLon - aLon) * RAD) / 2);
  const a = s1 * s1 + Math.cos(aLat * RAD) * Math.cos(bLat * RAD) * s2 * s2;
  return 2 * 6371.0088 * Math.asin(Math.min(1, Math.sqrt(a)));
}

export function stationsOverlay(onChange: () => void): StationsOverlay {
  let data: PointsData | null = null;
  let token = 0;
  const path = h('input', { type: 'text', placeholder: 'stations CSV (path)', 'aria-label': 'Station observations file', id: 'stations-file', size: 26 });
  const show = h('button', { type: 'button', title: 'Draw the stations on the map, sampled from the reference and every run' }, 'Stations');
  const clear = h('button', { type: 'button', title: 'Remove the stations from the map' }, 'Hide');
  const status = h('span', { class: 'toolbar-hint', 'aria-live': 'polite' });
  let lastState: AppState | null = null;
  show.addEventListener('click', () => {
    if (lastState) void load(lastState);
  });
  clear.addEventListener('click', () => {
    data = null;
    status.textContent = '';
    onChange();
  });
  const control = h('span', { class: 'stations-control' }, path, show, clear, status);

  async function load(st: AppState): Promise<void> {
    const session = st.session;
    if (!session || !st.sel.variable || !path.value.trim()) {
      status.textContent = 'Type the path of a station CSV file.';
      lastState = st;
      return;
    }
    const my = ++token;
    status.textContent = 'Sampling the stations…';
    try {
      const r = await tracked<PointsData>('Sampling at stations', 'points.compare', {
        session: session.session,
        variable: st.sel.variable,
        stations: path.value.trim(),
      });
      if (my !== token) return;
      data = r;
      const left = r.problems.length;
      loaded = `${r.stations.id.length} stations (${typesetUnits(r.units)})${left ? `, ${left} not sampled by every source` : ''}`;
      summary = loaded;
      status.textContent = summary;
      onChange();
    } catch (e) {
      if (my === token) status.textContent = e instanceof Error ? e.message : String(e);
    }
  }

  let summary = '';
  let loaded = '';
  const overlay: StationsOverlay = {
    control,
    draw(g, st, project, scale, min, max, slice, floorAt) {
      lastState = st;
      g.replaceChildren();
      if (!data || data.variable !== st.sel.variable) return;
      const source = data.sources.find((x) => x.label === st.sel.run) ?? data.sources[0];
      const stn = data.stations;
      const on = stationsOnSlice(stn, slice, (i) => floorAt(stn.lon[i], stn.lat[i]));
      summary = `${loaded}; ${on.nShown} shown (${on.rule}), ${on.nHidden} hidden`;
      status.textContent = summary;
      for (let i = 0; i < stn.id.length; i++) {
        if (!on.shown[i]) continue;
        const p = project(stn.lon[i], stn.lat[i]);
        if (!p) continue;
        const obs = colourFor(scale, stn.value[i], min, max) ?? '#ffffff';
        const m = source.model[i];
        const ring = Number.isFinite(m) ? (colourFor(scale, m, min, max) ?? '#111111') : '#111111';
        const hollow = !Number.isFinite(m);
        const c = s('circle', { cx: p[0], cy: p[1], r: 4.2, fill: hollow ? 'none' : obs, stroke: ring, 'stroke-width': 2.2, class: `station ${source.status[i]}` });
        c.append(s('title', {}, `${stn.id[i]}: observed ${stn.value[i]}, ${source.label} ${Number.isFinite(m) ? m.toPrecision(4) : source.status[i].replace('_', ' ')}`));
        g.append(s('circle', { cx: p[0], cy: p[1], r: 5.6, fill: 'none', stroke: '#ffffff', 'stroke-width': 1 }), c);
      }
    },
    probeText(lon, lat, run, within = 150) {
      if (!data) return null;
      const stn = data.stations;
      let best = -1;
      let bestKm = within;
      for (let i = 0; i < stn.id.length; i++) {
        const d = km(lon, lat, stn.lon[i], stn.lat[i]);
        if (d < bestKm) [best, bestKm] = [i, d];
      }
      if (best < 0) return null;
      const source = data.sources.find((x) => x.label === run) ?? data.sources[0];
      const m = source.model[best];
      const depth = stn.seafloor[best] ? 'seafloor' : `${stn.depth[best]} m`;
      return `station ${stn.id[best]} (${depth}): observed ${stn.value[best]} ${typesetUnits(data.units)}, ${source.label} ${Number.isFinite(m) ? m.toPrecision(4) : source.status[best].replace('_', ' ')}`;
    },
    showProbe(lon, lat, run) {
      if (!data) return;
      status.textContent = overlay.probeText(lon, lat, run) ?? summary;
    },
  };
  return overlay;
}
