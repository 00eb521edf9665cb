/**
 * The probe: model, reference and difference under the cursor (or at a typed position), with the
 * position, the depth of the cell and its volume.
 */
import { typesetUnits } from '../../app/figures/typeset.js';
import { cellAt } from '../../app/render/pixel-lookup.js';
import type { LevelData } from '../../contract/view-types.js';
import { getLevel } from '../service-client.js';
import { fmt, fmtLat, fmtLon, h } from '../elements.js';
import { setProbe, subscribe, type AppState } from '../state.js';

export function probePanel(el: HTMLElement): void {
  el.classList.add('probe');
  const heading = h('h2', {}, 'Probe');
  const lonIn = h('input', { type: 'number', step: 'any', min: -180, max: 360, id: 'probe-lon', 'aria-label': 'Probe longitude (degrees east)' });
  const latIn = h('input', { type: 'number', step: 'any', min: -90, max: 90, id: 'probe-lat', 'aria-label': 'Probe latitude (degrees north)' });
  const go = h('button', { type: 'submit', id: 'probe-go' }, 'Probe');
  const form = h(
    'form',
    { class: 'probe-form' },
    h('label', { class: 'field' }, h('span', { class: 'field-label' }, 'Lon (°E)'), lonIn),
    h('label', { class: 'field' }, h('span', { class: 'field-label' }, 'Lat (°N)'), latIn),
    go,
  );
  form.addEventListener('submit', (ev) => {
    ev.preventDefault();
    const lon = Number(lonIn.value);
    const lat = Number(latIn.value);
    if (lonIn.value === '' || latIn.value === '' || !(lat >= -90 && lat <= 90) || !Number.isFinite(lon)) return;
    setProbe({ lon, lat, pinned: true });
  });
  const table = h('dl', { class: 'probe-values', id: 'probe-values' });
  el.append(heading, form, table);

  let token = 0;
  const row = (label: string, value: string, key: string, raw?: number, extra?: string): void => {
    const dd = h('dd', { 'data-probe': key }, value);
    if (raw !== undefined) dd.dataset.value = String(raw);
    if (extra) dd.title = extra;
    table.append(h('dt', {}, label), dd);
  };

  const show = async (st: AppState): Promise<void> => {
    const my = ++token;
    const p = st.probe;
    const session = st.session;
    if (!p || !session || !st.sel.variable || !st.sel.run) {
      table.replaceChildren(h('p', { class: 'muted' }, 'Point at the map, or type a position.'));
      return;
    }
    if (document.activeElement !== lonIn && document.activeElement !== latIn) {
      lonIn.value = p.lon.toFixed(2);
      latIn.value = p.lat.toFixed(2);
    }
    let data: LevelData;
    try {
      data = await getLevel(session.session, st.sel.variable, st.sel.run, st.sel.layer, st.sel.period);
    } catch {
      return;
    }
    if (my !== token) return;
    const g = session.grid;
    const c = cellAt(g.lonEdges, g.latEdges, p.lon, p.lat);
    table.replaceChildren();
    // what the values are of, so that a reader (a person's script, a test) can wait for the right ones
    table.dataset.period = data.period;
    table.dataset.at = `${p.lon},${p.lat}`;
    row('Position', `${fmtLon(p.lon)}, ${fmtLat(p.lat)}`, 'position');
    if (c < 0) {
      row('Cell', 'outside the common grid', 'cell');
      return;
    }
    const i = c % g.nx;
    const j = (c - i) / g.nx;
    row('Cell centre', `${fmtLon(0.5 * (g.lonEdges[i] + g.lonEdges[i + 1]))}, ${fmtLat(0.5 * (g.latEdges[j] + g.latEdges[j + 1]))}`, 'cell', c, `column i = ${i}, row j = ${j}`);
    const layer = data.layer;
    let depth: string;
    if (layer.kind === 'bottom') {
      const k = data.bottomLevel ? data.bottomLevel[c] : -1;
      depth = k >= 0 ? `bottom cell: level ${k + 1}, ${fmt(g.depthEdges[k])}–${fmt(g.depthEdges[k + 1])} m` : 'no bottom cell here';
    } else if (layer.kind === 'level' && layer.k !== undefined) {
      depth = `${fmt(g.depthCentres[layer.k])} m (layer ${fmt(g.depthEdges[layer.k])}–${fmt(g.depthEdges[layer.k + 1])} m)`;
    } else {
      depth = `${layer.label} (thickness-weighted mean)`;
    }
    row('Depth', depth, 'depth');
    const areaKm2 = g.area[c] / 1e6;
    const volKm3 = (g.area[c] * data.thickness[c]) / 1e9;
    row('Cell area', `${fmt(areaKm2)} km²`, 'area', g.area[c]);
    row('Cell volume', data.thickness[c] > 0 ? `${fmt(volKm3)} km³` : '– (dry)', 'volume', g.area[c] * data.thickness[c]);
    const u = typesetUnits(data.units);
    row(`Run: ${data.run}`, `${fmt(data.model[c])} ${u}`, 'model', data.model[c]);
    row(`Reference: ${session.reference.label}`, `${fmt(data.reference[c])} ${u}`, 'reference', data.reference[c]);
    row('Difference (run − ref.)', `${fmt(data.difference[c])} ${u}`, 'difference', data.difference[c]);
  };

  subscribe((st, changed) => {
    if (changed.has('probe') || changed.has('variable') || changed.has('run') || changed.has('layer') || changed.has('period') || changed.has('session')) void show(st);
  });
  table.replaceChildren(h('p', { class: 'muted' }, 'Point at the map, or type a position.'));
}
