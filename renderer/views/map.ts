/**
 * Map and Difference views: one level (or layer, or the bottom) of the chosen variable on the chosen
 * projection. The pixel-to-cell lookup is built once per projection, grid and canvas size; a change of
 * depth, variable or range only recolours.
 */
import { DIVERGING, SEQUENTIAL } from '../../app/render/colour-scales.js';
import { buildPixelLookup, canvasHeightFor, cellAt, pixelToProjected } from '../../app/render/pixel-lookup.js';
import type { LevelData } from '../../contract/view-types.js';
import { getLevel } from '../data.js';
import { h, s } from '../dom.js';
import { coastlines, coastlinesIfReady } from '../plot/coast.js';
import { mapFigure, mapPlotRect, type MapFigure } from '../plot/map-figure.js';
import { choose, setProbe, state, type AppState } from '../state.js';
import { lookupFor, mapChoice, paint, projectionOf } from './map-paint.js';
import { buttonGroup } from '../widgets/button-group.js';
import { figureFrame } from '../widgets/figure-frame.js';
import { EXPORT_WIDTH, errorText, note, type ViewFactory, type ViewHandle } from './view.js';
import { stationsOverlay } from './stations.js';

let firstDrawMarked = false;

export function mapView(difference: boolean): ViewFactory {
  return (el: HTMLElement): ViewHandle => {
    el.classList.add('map-view');
    const frame = figureFrame(el, { label: 'Map options' });
    const { toolbar, stage } = frame;

    let data: LevelData | null = null;
    let fig: MapFigure | null = null;
    let figKey = '';
    let canvas: HTMLCanvasElement | null = null;
    let probeMark: SVGGElement | null = null;
    let stationsMark: SVGGElement | null = null;
    let token = 0;
    // station observations on the field's colour scale (lines and points part); not on the difference map
    const stations = difference ? null : stationsOverlay(() => void draw(state, new Set(['stations'])));

    // toolbar: which field (Map view only), colour range
    const fieldGroup = difference
      ? null
      : buttonGroup({ label: 'Field shown', options: [['model', 'Run'], ['reference', 'Reference']] as const, value: state.sel.mapField, onPick: (v) => choose({ mapField: v }) });
    if (fieldGroup) toolbar.append(fieldGroup.el);
    const minIn = h('input', { type: 'number', step: 'any', 'aria-label': 'Colour range minimum', class: 'range-input' });
    const maxIn = h('input', { type: 'number', step: 'any', 'aria-label': 'Colour range maximum', class: 'range-input' });
    const applyRange = (): void => {
      const a = Number(minIn.value);
      const b = Number(maxIn.value);
      if (minIn.value === '' || maxIn.value === '' || !(b > a)) return;
      choose(difference ? { diffRange: [a, b] } : { fieldRange: [a, b] });
    };
    minIn.addEventListener('change', applyRange);
    maxIn.addEventListener('change', applyRange);
    const auto = h('button', { type: 'button', title: 'Range from the 2nd to the 98th percentile of this level' }, 'Auto range');
    auto.addEventListener('click', () => choose(difference ? { diffRange: null } : { fieldRange: null }));
    toolbar.append(h('span', { class: 'toolbar-label' }, 'Colour range'), minIn, h('span', { class: 'toolbar-sep' }, 'to'), maxIn, auto);
    const hint = h('span', { class: 'toolbar-hint' }, 'Move over the map to probe; click to pin.');
    toolbar.append(hint);
    if (stations) toolbar.append(stations.control);

    const drawProbe = (): void => {
      if (!fig || !probeMark) return;
      probeMark.replaceChildren();
      const p = state.probe;
      if (!p) return;
      const q = projectionOf(state.sel.projection).forward(p.lon, p.lat);
      if (!q) return;
      const [x, y] = fig.toFigure(q[0], q[1]);
      const col = p.pinned ? '#c0392b' : '#111111';
      probeMark.append(
        s('circle', { cx: x, cy: y, r: 6, fill: 'none', stroke: '#ffffff', 'stroke-width': 3 }),
        s('circle', { cx: x, cy: y, r: 6, fill: 'none', stroke: col, 'stroke-width': 1.5 }),
        s('line', { x1: x - 10, x2: x - 6, y1: y, y2: y, stroke: col, 'stroke-width': 1.5 }),
        s('line', { x1: x + 6, x2: x + 10, y1: y, y2: y, stroke: col, 'stroke-width': 1.5 }),
      );
    };

    const onPointer = (ev: MouseEvent, click: boolean): void => {
      if (!canvas || !fig) return;
      if (!click && state.probe?.pinned) return;
      const r = canvas.getBoundingClientRect();
      const proj = projectionOf(state.sel.projection);
      const [x, y] = pixelToProjected(proj, r.width, r.height, ev.clientX - r.left - 0.5, ev.clientY - r.top - 0.5);
      const ll = proj.inverse(x, y);
      if (!ll) return;
      const pinned = click ? !state.probe?.pinned : false;
      setProbe({ lon: ll[0], lat: ll[1], pinned });
    };

    const draw = async (st: AppState, changed: Set<string>): Promise<void> => {
      const session = st.session;
      if (!session || !st.sel.variable || !st.sel.run) {
        note(stage, 'Open a recipe to see its fields.');
        return;
      }
      fieldGroup?.set(st.sel.mapField);
      const my = ++token;
      const needData = !data || changed.has('session') || changed.has('variable') || changed.has('run') || changed.has('layer') || data.variable !== st.sel.variable || data.run !== st.sel.run || data.layer.id !== st.sel.layer;
      const width = Math.max(360, Math.floor(stage.clientWidth || el.clientWidth || 900));
      const maxHeight = Math.max(260, Math.floor(stage.clientHeight || 600));
      const dpr = Math.min(2, window.devicePixelRatio || 1);
      const proj = projectionOf(st.sel.projection);
      const canvasWidth = Math.round(mapPlotRect(proj, width, maxHeight).w * dpr);
      if (needData) {
        if (!fig) note(stage, 'Loading the field…', 'busy');
        const pending = getLevel(session.session, st.sel.variable, st.sel.run, st.sel.layer);
        // while the server reads the level, build the pixel lookup this drawing will need
        lookupFor(proj, session.grid, canvasWidth, canvasHeightFor(proj, canvasWidth));
        try {
          const d = await pending;
          if (my !== token) return;
          data = d;
        } catch (e) {
          if (my !== token) return;
          fig = null;
          figKey = '';
          note(stage, errorText(e), 'error');
          return;
        }
      }
      if (!data) return;
      const choice = mapChoice(st, data, difference);
      if (!choice) {
        fig = null;
        figKey = '';
        note(stage, `There are no values of ${data.variable} on ${data.layer.label}.`);
        return;
      }
      minIn.value = String(Number(choice.min.toPrecision(4)));
      maxIn.value = String(Number(choice.max.toPrecision(4)));

      // the field first; the coastlines join when they are loaded (a redraw, with the same canvas)
      let coast = coastlinesIfReady(proj.info.id);
      if (!coast) {
        coast = [];
        void coastlines(proj.info.id)
          .then(() => {
            if (my === token) void draw(state, new Set(['coast']));
          })
          .catch(() => undefined);
      }
      const key = JSON.stringify([proj.info.id, width, maxHeight, choice.min, choice.max, choice.units, choice.title, choice.subtitle, choice.caption, coast.length]);
      if (key !== figKey) {
        fig = mapFigure({ width, maxHeight, projection: proj, title: choice.title, subtitle: choice.subtitle, scale: choice.diverging ? DIVERGING : SEQUENTIAL, min: choice.min, max: choice.max, units: choice.units, caption: choice.caption, coast });
        figKey = key;
        const cw = canvasWidth;
        const ch = canvasHeightFor(proj, cw);
        if (!canvas || canvas.width !== cw || canvas.height !== ch) {
          canvas = h('canvas', { class: 'map-canvas', width: cw, height: ch, 'aria-label': 'Map raster; move the pointer to probe values' });
          canvas.addEventListener('mousemove', (ev) => onPointer(ev, false));
          canvas.addEventListener('click', (ev) => onPointer(ev, true));
        }
        canvas.style.left = `${fig.plot.x}px`;
        canvas.style.top = `${fig.plot.y}px`;
        canvas.style.width = `${fig.plot.w}px`;
        canvas.style.height = `${fig.plot.h}px`;
        canvas.dataset.projection = proj.info.id;
        probeMark = s('g', { class: 'probe-mark', 'pointer-events': 'none' });
        stationsMark = s('g', { class: 'stations-mark', 'pointer-events': 'none' });
        fig.overlay.append(stationsMark, probeMark);
        // the SVG lies above the canvas but lets the pointer through to it
        fig.svg.style.pointerEvents = 'none';
        const wrap = h('div', { class: 'figure-wrap', style: `width:${width}px;height:${fig.svg.getAttribute('height')}px` }, canvas, fig.svg);
        stage.replaceChildren(wrap);
      }
      if (!canvas) return;
      const lut = lookupFor(proj, session.grid, canvas.width, canvas.height);
      performance.mark('map-recolour-start');
      paint(canvas, lut, choice);
      performance.mark('map-recolour-end');
      performance.measure('map-recolour', 'map-recolour-start', 'map-recolour-end');
      if (!firstDrawMarked) {
        firstDrawMarked = true;
        performance.mark('map-first-draw');
      }
      stage.dataset.drawn = `${data.variable}|${data.run}|${data.layer.id}|${st.sel.projection}|${difference ? 'diff' : st.sel.mapField}`;
      if (stations && stationsMark && fig) {
        const f = fig;
        const d = data;
        const grid = st.session!.grid;
        // the seafloor under a station: the bottom edge of the deepest cell of the map's bottom layer there
        const floorAt = (lon: number, lat: number): { floor: number; deepestTop: number } => {
          const c = cellAt(grid.lonEdges, grid.latEdges, lon, lat);
          const k = c >= 0 && d.bottomLevel ? d.bottomLevel[c] : -1;
          return k >= 0 ? { floor: grid.depthEdges[k + 1], deepestTop: grid.depthEdges[k] } : { floor: NaN, deepestTop: NaN };
        };
        stations.draw(stationsMark, st, (lon, lat) => {
          const q = proj.forward(lon, lat);
          return q ? f.toFigure(q[0], q[1]) : null;
        }, choice.diverging ? DIVERGING : SEQUENTIAL, choice.min, choice.max, d.layer, floorAt);
      }
      drawProbe();
    };

    return {
      update(st, changed) {
        if (changed.size === 1 && changed.has('probe')) {
          drawProbe();
          if (stations && st.probe && st.sel.run) stations.showProbe(st.probe.lon, st.probe.lat, st.sel.run);
          return;
        }
        void draw(st, changed);
      },
      async figure() {
        if (!data || !state.session) return null;
        const choice = mapChoice(state, data, difference);
        if (!choice) return null;
        const proj = projectionOf(state.sel.projection);
        const coast = await coastlines(proj.info.id, 'print').catch(() => [] as Float64Array[]);
        const f = mapFigure({ width: EXPORT_WIDTH, projection: proj, title: choice.title, subtitle: choice.subtitle, scale: choice.diverging ? DIVERGING : SEQUENTIAL, min: choice.min, max: choice.max, units: choice.units, caption: choice.caption, coast });
        // the raster at print resolution: 300 dpi over the plot's width (1 unit = 0.25 mm)
        const cw = Math.round((f.plot.w * 0.25 * 300) / 25.4);
        const ch = canvasHeightFor(proj, cw);
        const c = h('canvas', { width: cw, height: ch });
        paint(c, buildPixelLookup(proj, state.session.grid.lonEdges, state.session.grid.latEdges, cw, ch), choice);
        const raster = f.svg.querySelector('g.raster');
        raster?.append(s('image', { x: f.plot.x, y: f.plot.y, width: f.plot.w, height: f.plot.h, preserveAspectRatio: 'none', href: c.toDataURL('image/png') }));
        return f.svg;
      },
      fileBase() {
        const sel = state.sel;
        return `stillwater-${difference ? 'difference' : sel.mapField === 'model' ? 'map' : 'reference'}-${sel.variable}-${difference || sel.mapField === 'model' ? sel.run : 'ref'}-${sel.layer}-${sel.projection}`.replace(/[^A-Za-z0-9._-]+/g, '_');
      },
      dispose() {
        token++;
      },
    };
  };
}
