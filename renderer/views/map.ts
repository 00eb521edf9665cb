/**
 * Map and Difference views: one level (or layer, or the bottom) of the chosen variable on the chosen
 * projection, composed of the toolbar (map-toolbar.ts), the raster (map-paint.ts) on a canvas laid under
 * app/figures' map figure (map-figure-of.ts: the figure the export writes), the probe, zoom and pan, and, on
 * the Map view, station observations. The pixel lookup is built once per projection, window, grid and canvas
 * size; other changes only recolour.
 */
import { typesetUnits } from '../../app/figures/typeset.js';
import { windowed, zoomWindow, panWindow } from '../../app/render/map-window.js';
import { canvasHeightFor, cellAt, pixelToProjected } from '../../app/render/pixel-lookup.js';
import type { MapProjection } from '../../app/render/projections.js';
import { regionSkill } from '../../app/render/region-skill.js';
import type { LevelData } from '../../contract/view-types.js';
import { getLevel, getRegionCells } from '../service-client.js';
import { call } from '../bridge.js';
import { fmt, h, s, saveBlob } from '../elements.js';
import { mapFigure, mapFigureLayout, type MapFigure } from '../../app/figures/map-figure.js';
import { coastlines, coastlinesIfReady } from '../plot/coast.js';
import { figureElement } from '../plot/figure-element.js';
import { choose, commitPreview, preview, setProbe, state, type AppState } from '../state.js';
import { figureFrame } from '../widgets/figure-frame.js';
import { lookupFor, mapChoice, paint, projectionOf, scaleOf, sharedRange, type MapChoice } from './map-paint.js';
import { exportedMapFigure, mapFigureSpec } from './map-figure-of.js';
import { mapToolbar } from './map-toolbar.js';
import { stationsOverlay } from './stations.js';
import { errorText, type ViewFactory, type ViewHandle } from './view.js';

let firstDrawMarked = false;

/** The level's values outside the region become missing (and not water), so that the crop shows as land. */
function cropped(choice: MapChoice, cells: Int32Array | null): MapChoice {
  if (!cells) return choice;
  const values = new Float32Array(choice.values.length).fill(NaN);
  const water = new Float32Array(choice.values.length);
  for (const c of cells) {
    values[c] = choice.values[c];
    water[c] = choice.water ? choice.water[c] : 1;
  }
  return { ...choice, values, water };
}

/** The window that shows a region's cells whole, with the projection's aspect ratio. */
function regionWindow(proj: MapProjection, st: AppState, cells: Int32Array): MapProjection['extent'] | null {
  const g = st.session!.grid;
  let xmin = Infinity;
  let xmax = -Infinity;
  let ymin = Infinity;
  let ymax = -Infinity;
  for (const c of cells) {
    const i = c % g.nx;
    const j = (c - i) / g.nx;
    const q = proj.forward(0.5 * (g.lonEdges[i] + g.lonEdges[i + 1]), 0.5 * (g.latEdges[j] + g.latEdges[j + 1]));
    if (!q) continue;
    xmin = Math.min(xmin, q[0]);
    xmax = Math.max(xmax, q[0]);
    ymin = Math.min(ymin, q[1]);
    ymax = Math.max(ymax, q[1]);
  }
  if (!(xmax > xmin && ymax > ymin)) return null;
  const full = proj.extent;
  const zoom = Math.min((full.xmax - full.xmin) / ((xmax - xmin) * 1.1), (full.ymax - full.ymin) / ((ymax - ymin) * 1.1));
  if (zoom <= 1.05) return null;
  return recentre(full, Math.min(zoom, 64), (xmin + xmax) / 2, (ymin + ymax) / 2);
}

function recentre(full: MapProjection['extent'], zoom: number, cx: number, cy: number): MapProjection['extent'] | null {
  const w = (full.xmax - full.xmin) / zoom;
  const hgt = (full.ymax - full.ymin) / zoom;
  const win = { xmin: cx - w / 2, xmax: cx + w / 2, ymin: cy - hgt / 2, ymax: cy + hgt / 2 };
  return panWindow(full, win, 0, 0);
}

export function mapView(difference: boolean): ViewFactory {
  return (el: HTMLElement): ViewHandle => {
    el.classList.add('map-view');
    const frame = figureFrame(el, { label: 'Map options' });
    const { toolbar, stage } = frame;
    const regionStats = h('div', { class: 'region-stats', id: 'region-stats', role: 'status', hidden: true });
    toolbar.after(regionStats);
    const panelsNote = h('div', { class: 'panels-note muted', id: `${difference ? 'diff' : 'field'}-panels-note`, role: 'status' });
    regionStats.after(panelsNote);

    let data: LevelData | null = null;
    let locked: [number, number] | null = null;
    let lockedKey = '';
    let cells: Int32Array | null = null;
    let fig: MapFigure | null = null;
    /** screen pixels per figure point */
    let pxPerPt = 1;
    let figKey = '';
    let canvas: HTMLCanvasElement | null = null;
    let probeMark: SVGGElement | null = null;
    let stationsMark: SVGGElement | null = null;
    let token = 0;
    // station observations on the field's colour scale (lines and points part); not on the difference map
    const stations = difference ? null : stationsOverlay(() => void draw(state, new Set(['stations'])));

    const shownProjection = (st: AppState): MapProjection => windowed(projectionOf(st.sel.projection), st.sel.mapWindow);

    /** Zoom by a factor about a projected point (the window's centre by default); null: the whole map. */
    const zoom = (factor: number | null, at?: [number, number]): void => {
      if (factor === null) return choose({ mapWindow: null });
      const full = projectionOf(state.sel.projection).extent;
      const cur = state.sel.mapWindow ?? full;
      const [cx, cy] = at ?? [(cur.xmin + cur.xmax) / 2, (cur.ymin + cur.ymax) / 2];
      choose({ mapWindow: zoomWindow(full, state.sel.mapWindow, factor, cx, cy) });
    };
    /** The field shown (cropped when cropped) as a file, written by the service that knows CF. */
    const download = async (format: 'csv' | 'netcdf'): Promise<void> => {
      const session = state.session;
      if (!data || !session) return;
      const base = mapChoice(state, data, difference, locked);
      if (!base) return;
      const shown = cropped(base, cells);
      const label = difference ? `${data.run} minus ${session.reference.label}` : state.sel.mapField === 'model' ? data.run : session.reference.label;
      const l = data.layer;
      try {
        const f = await call<{ fileName: string; mime: string; data: Uint8Array }>('view.export-slice', {
          format,
          variable: data.variable,
          label,
          units: data.units,
          // plain arrays: the request is JSON (missing values travel as null)
          lonEdges: Array.from(session.grid.lonEdges),
          latEdges: Array.from(session.grid.latEdges),
          depth: l.top !== null && l.bottom !== null ? [l.top, l.bottom] : null,
          depthLabel: l.label,
          values: Array.from(shown.values, (v) => (v === v ? v : null)),
        });
        saveBlob(new Blob([f.data as BlobPart], { type: f.mime }), f.fileName);
      } catch (e) {
        frame.say(errorText(e), 'error');
      }
    };
    /** Reference, every run and every difference as one figure, drawn on the session's worker by the report's builder. */
    const panels = async (format: 'svg' | 'png'): Promise<void> => {
      const session = state.session;
      const sel = state.sel;
      if (!session || !sel.variable) return;
      panelsNote.textContent = `Drawing the panels of ${sel.variable} (${format.toUpperCase()})…`;
      panelsNote.classList.remove('error');
      try {
        const f = await call<{ fileName: string; mime: string; data: Uint8Array }>('view.map-panels', {
          session: session.session,
          variable: sel.variable,
          layer: sel.layer,
          region: sel.region,
          projection: sel.projection,
          window: sel.mapWindow,
          format,
          fieldScale: sel.fieldScale,
          differenceScale: sel.diffScale,
          log: sel.logColour,
          period: sel.period,
        });
        saveBlob(new Blob([f.data as BlobPart], { type: f.mime }), f.fileName);
        panelsNote.textContent = `Exported ${f.fileName} (180 mm${format === 'png' ? ', 300 dpi' : ''}).`;
      } catch (e) {
        panelsNote.textContent = errorText(e);
        panelsNote.classList.add('error');
      }
    };
    const bar = mapToolbar(toolbar, difference, state, (f) => zoom(f), (format) => void download(format), (format) => void panels(format));
    if (stations) toolbar.append(stations.control);

    const drawProbe = (): void => {
      if (!fig || !probeMark) return;
      probeMark.replaceChildren();
      const p = state.probe;
      if (!p) return;
      const q = projectionOf(state.sel.projection).forward(p.lon, p.lat);
      if (!q) return;
      const [fx, fy] = fig.toFigure(q[0], q[1]);
      if (fx < fig.plot.x || fx > fig.plot.x + fig.plot.w || fy < fig.plot.y || fy > fig.plot.y + fig.plot.h) return;
      const [x, y] = [fx * pxPerPt, fy * pxPerPt];
      const col = p.pinned ? '#c0392b' : '#111111';
      probeMark.append(
        s('circle', { cx: x, cy: y, r: 6, fill: 'none', stroke: '#ffffff', 'stroke-width': 3 }),
        s('circle', { cx: x, cy: y, r: 6, fill: 'none', stroke: col, 'stroke-width': 1.5 }),
        s('line', { x1: x - 10, x2: x - 6, y1: y, y2: y, stroke: col, 'stroke-width': 1.5 }),
        s('line', { x1: x + 6, x2: x + 10, y1: y, y2: y, stroke: col, 'stroke-width': 1.5 }),
      );
    };

    /** Projected metres under a pointer position. */
    const projectedAt = (ev: MouseEvent): [number, number] | null => {
      if (!canvas) return null;
      const r = canvas.getBoundingClientRect();
      return pixelToProjected(shownProjection(state), r.width, r.height, ev.clientX - r.left - 0.5, ev.clientY - r.top - 0.5);
    };

    const onPointer = (ev: MouseEvent, click: boolean): void => {
      if (!click && state.probe?.pinned) return;
      const xy = projectedAt(ev);
      const ll = xy && projectionOf(state.sel.projection).inverse(xy[0], xy[1]);
      if (!ll) return;
      setProbe({ lon: ll[0], lat: ll[1], pinned: click ? !state.probe?.pinned : false });
    };

    /** Arrow keys move the probe one cell of the common grid; Enter pins it; + and − zoom; 0 shows the whole map. */
    const onKey = (ev: KeyboardEvent): void => {
      const g = state.session?.grid;
      if (!g) return;
      const steps: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, 1], ArrowDown: [0, -1] };
      const step = steps[ev.key];
      if (step) {
        ev.preventDefault();
        const p = state.probe ?? { lon: 0.5 * (g.lonEdges[0] + g.lonEdges[g.nx]), lat: 0 };
        const i = Math.max(0, Math.min(g.nx - 1, cellIndex(g.lonEdges, p.lon) + step[0]));
        const j = Math.max(0, Math.min(g.ny - 1, cellIndex(g.latEdges, p.lat) + step[1]));
        setProbe({ lon: 0.5 * (g.lonEdges[i] + g.lonEdges[i + 1]), lat: 0.5 * (g.latEdges[j] + g.latEdges[j + 1]), pinned: true });
      } else if (ev.key === 'Enter' || ev.key === ' ') {
        ev.preventDefault();
        if (state.probe) setProbe({ ...state.probe, pinned: !state.probe.pinned });
      } else if (ev.key === '+' || ev.key === '=') zoom(2);
      else if (ev.key === '-') zoom(0.5);
      else if (ev.key === '0') zoom(null);
    };

    // drag to pan: the window follows the pointer; one step of undo for the whole drag
    let drag: { x: number; y: number; moved: boolean } | null = null;
    const onDown = (ev: MouseEvent): void => {
      if (ev.button !== 0) return;
      drag = { x: ev.clientX, y: ev.clientY, moved: false };
    };
    const onMove = (ev: MouseEvent): void => {
      if (!drag || !canvas) return onPointer(ev, false);
      const dxPx = ev.clientX - drag.x;
      const dyPx = ev.clientY - drag.y;
      if (!drag.moved && Math.hypot(dxPx, dyPx) < 4) return;
      drag.moved = true;
      const win = state.sel.mapWindow;
      if (!win) return;
      const r = canvas.getBoundingClientRect();
      // whole canvas pixels, so that the pan shifts the pixel lookup instead of building it anew
      const sx = canvas.width / r.width;
      const sy = canvas.height / r.height;
      const cx = Math.round(-dxPx * sx);
      const cy = Math.round(dyPx * sy);
      const dx = (cx * (win.xmax - win.xmin)) / canvas.width;
      const dy = (cy * (win.ymax - win.ymin)) / canvas.height;
      drag.x += -cx / sx;
      drag.y += cy / sy;
      preview({ mapWindow: panWindow(projectionOf(state.sel.projection).extent, win, dx, dy) });
    };
    const onUp = (ev: MouseEvent): void => {
      const d = drag;
      drag = null;
      if (!d) return;
      if (d.moved) commitPreview();
      else onPointer(ev, true);
    };
    const onWheel = (ev: WheelEvent): void => {
      ev.preventDefault();
      const xy = projectedAt(ev);
      if (xy) zoom(ev.deltaY < 0 ? 1.5 : 1 / 1.5, xy);
    };

    const showRegionStats = (st: AppState, d: LevelData): void => {
      if (!difference || !st.sel.cropToRegion || !cells || !st.session) {
        regionStats.hidden = true;
        return;
      }
      const k = regionSkill(d.model, d.reference, st.session.grid.area, d.thickness, cells);
      regionStats.hidden = false;
      regionStats.replaceChildren(
        h('strong', {}, `${st.sel.region}, ${d.layer.label}: `),
        h('span', { 'data-stat': 'bias' }, `bias ${fmt(k.bias)} ${typesetUnits(d.units)}`),
        ' · ',
        h('span', { 'data-stat': 'rmse' }, `RMSE ${fmt(k.rmse)} ${typesetUnits(d.units)}`),
        ' · ',
        h('span', { 'data-stat': 'corr' }, `r ${k.corr === null ? '–' : k.corr.toFixed(3)}`),
        h('span', { class: 'muted' }, ` (${k.n} cells, weighted by cell volume, as the skill rows)`),
      );
    };

    const draw = async (st: AppState, changed: Set<string>): Promise<void> => {
      const session = st.session;
      if (!session || !st.sel.variable || !st.sel.run) {
        frame.say('Open a recipe to see its fields.');
        return;
      }
      const my = ++token;
      const needData = !data || changed.has('session') || data.variable !== st.sel.variable || data.run !== st.sel.run || data.layer.id !== st.sel.layer || data.period !== st.sel.period;
      const width = Math.max(360, Math.floor(stage.clientWidth || el.clientWidth || 900));
      const maxHeight = Math.max(260, Math.floor(stage.clientHeight || 600));
      const dpr = Math.min(2, window.devicePixelRatio || 1);
      const proj = shownProjection(st);
      // the figure is as wide as the stage allows while all of it stays in view; the canvas covers its map
      const fit = (title: string, subtitle: string): { pxPerPt: number; canvasWidth: number } => {
        const l = mapFigureLayout({ projection: proj, width: 'double', title, subtitle });
        const k = Math.min(width / l.widthPt, maxHeight / l.heightPt);
        return { pxPerPt: k, canvasWidth: Math.round(l.plot.w * k * dpr) };
      };
      let canvasWidth = fit(fig?.title ?? '', '').canvasWidth;
      try {
        if (needData) {
          if (!fig) frame.say('Loading the field…', 'busy');
          const pending = getLevel(session.session, st.sel.variable, st.sel.run, st.sel.layer, st.sel.period);
          // while the server reads the level, build the pixel lookup this drawing will need
          lookupFor(proj, session.grid, canvasWidth, canvasHeightFor(proj, canvasWidth));
          const d = await pending;
          if (my !== token) return;
          data = d;
        }
        const key = `${session.session}|${st.sel.variable}|${st.sel.layer}|${st.sel.period}`;
        if (st.sel.lockRange && lockedKey !== key) {
          const variable = session.variables.find((v) => v.key === st.sel.variable);
          const all = await Promise.all((variable?.runs ?? [st.sel.run]).map((run) => getLevel(session.session, st.sel.variable, run, st.sel.layer, st.sel.period)));
          if (my !== token) return;
          locked = sharedRange(all, difference);
          lockedKey = key;
        }
        cells = st.sel.cropToRegion ? (await getRegionCells(session.session, st.sel.region)).cells : null;
        if (my !== token) return;
        if (cells && (changed.has('cropToRegion') || changed.has('region'))) {
          const win = regionWindow(projectionOf(st.sel.projection), st, cells);
          if (JSON.stringify(win) !== JSON.stringify(st.sel.mapWindow)) {
            preview({ mapWindow: win });
            commitPreview();
            return;
          }
        }
      } catch (e) {
        if (my !== token) return;
        fig = null;
        figKey = '';
        frame.say(errorText(e), 'error');
        return;
      }
      if (!data) return;
      const base = mapChoice(st, data, difference, locked);
      bar.show(st, base);
      if (!base) {
        fig = null;
        figKey = '';
        frame.say(`There are no values of ${data.variable} on ${data.layer.label}.`);
        return;
      }
      const choice = cropped(base, cells);
      performance.mark('map-redraw-start');
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
      const figSpec = mapFigureSpec(choice, projectionOf(st.sel.projection), proj, coast, session.grid, st.sel.contours);
      const key = JSON.stringify([proj.info.id, proj.extent, width, maxHeight, choice.min, choice.max, choice.units, choice.title, choice.subtitle, choice.caption, coast.length, figSpec.bar, scaleOf(choice).name, st.sel.contours ? `${data.variable}|${data.run}|${data.layer.id}|${st.sel.mapField}|${!!cells}` : '']);
      if (key !== figKey) {
        fig = mapFigure(figSpec);
        figKey = key;
        ({ pxPerPt, canvasWidth } = fit(choice.title, choice.subtitle));
        const cw = canvasWidth;
        const ch = canvasHeightFor(proj, cw);
        if (!canvas || canvas.width !== cw || canvas.height !== ch) {
          canvas = h('canvas', { class: 'map-canvas', width: cw, height: ch, tabindex: 0, role: 'application', 'aria-label': 'Map: arrow keys move the probe one grid cell, Enter pins it, + and − zoom, 0 shows the whole map' });
          canvas.addEventListener('mousedown', onDown);
          canvas.addEventListener('mousemove', onMove);
          canvas.addEventListener('mouseup', onUp);
          canvas.addEventListener('mouseleave', () => {
            if (drag?.moved) commitPreview();
            drag = null;
          });
          canvas.addEventListener('wheel', onWheel, { passive: false });
          canvas.addEventListener('keydown', onKey);
        }
        canvas.style.left = `${fig.plot.x * pxPerPt}px`;
        canvas.style.top = `${fig.plot.y * pxPerPt}px`;
        canvas.style.width = `${fig.plot.w * pxPerPt}px`;
        canvas.style.height = `${fig.plot.h * pxPerPt}px`;
        canvas.dataset.projection = proj.info.id;
        const svg = figureElement(fig);
        const wPx = Math.round(fig.widthPt * pxPerPt);
        const hPx = Math.round(fig.heightPt * pxPerPt);
        svg.setAttribute('width', String(wPx));
        svg.setAttribute('height', String(hPx));
        // markers are drawn in screen pixels (their size does not follow the figure's scale)
        const px = `scale(${1 / pxPerPt})`;
        probeMark = s('g', { class: 'probe-mark', 'pointer-events': 'none', transform: px });
        stationsMark = s('g', { class: 'stations-mark', 'pointer-events': 'none', transform: px });
        svg.querySelector('g.overlay')?.append(stationsMark, probeMark);
        // the SVG lies above the canvas but lets the pointer through to it
        svg.style.pointerEvents = 'none';
        const hadFocus = document.activeElement === canvas;
        const wrap = h('div', { class: 'figure-wrap', style: `width:${wPx}px;height:${hPx}px` }, canvas, svg);
        stage.replaceChildren(wrap);
        if (hadFocus) canvas.focus();
      }
      if (!canvas) return;
      const lut = lookupFor(proj, session.grid, canvas.width, canvas.height);
      performance.mark('map-recolour-start');
      paint(canvas, lut, choice);
      performance.mark('map-recolour-end');
      performance.measure('map-recolour', 'map-recolour-start', 'map-recolour-end');
      performance.measure('map-redraw', 'map-redraw-start', 'map-recolour-end');
      if (!firstDrawMarked) {
        firstDrawMarked = true;
        performance.mark('map-first-draw');
      }
      const w = st.sel.mapWindow;
      stage.dataset.drawn = `${data.variable}|${data.run}|${data.layer.id}|${st.sel.projection}|${difference ? 'diff' : st.sel.mapField}`;
      stage.dataset.period = data.period;
      stage.dataset.look = `${scaleOf(choice).name}|${choice.log ? 'log' : 'linear'}|${w ? [w.xmin, w.xmax, w.ymin, w.ymax].map((v) => Math.round(v)).join(',') : 'whole'}|${cells ? st.sel.region : 'all'}|${st.sel.contours ? 'contours' : ''}`;
      showRegionStats(st, data);
      if (stations && stationsMark && fig) {
        const f = fig;
        const full = projectionOf(st.sel.projection);
        const d = data;
        const grid = session.grid;
        // the seafloor under a station: the bottom edge of the deepest cell of the map's bottom layer there
        const floorAt = (lon: number, lat: number): { floor: number; deepestTop: number } => {
          const c = cellAt(grid.lonEdges, grid.latEdges, lon, lat);
          const k = c >= 0 && d.bottomLevel ? d.bottomLevel[c] : -1;
          return k >= 0 ? { floor: grid.depthEdges[k + 1], deepestTop: grid.depthEdges[k] } : { floor: NaN, deepestTop: NaN };
        };
        const k = pxPerPt;
        stations.draw(stationsMark, st, (lon, lat) => {
          const q = full.forward(lon, lat);
          if (!q) return null;
          const [fx, fy] = f.toFigure(q[0], q[1]);
          return [fx * k, fy * k];
        }, scaleOf(choice), choice.min, choice.max, d.layer, floorAt);
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
        const base = mapChoice(state, data, difference, locked);
        if (!base) return null;
        const choice = cropped(base, cells);
        const proj = shownProjection(state);
        const coast = await coastlines(proj.info.id, 'print').catch(() => [] as Float64Array[]);
        const spec = mapFigureSpec(choice, projectionOf(state.sel.projection), proj, coast, state.session.grid, state.sel.contours);
        return figureElement(exportedMapFigure(spec, choice, state.session.grid));
      },
      fileBase() {
        const sel = state.sel;
        return `stillwater-${difference ? 'difference' : sel.mapField === 'model' ? 'map' : 'reference'}-${sel.variable}-${difference || sel.mapField === 'model' ? sel.run : 'ref'}-${sel.layer}${sel.period === 'annual' ? '' : `-${sel.period}`}-${sel.projection}`.replace(/[^A-Za-z0-9._-]+/g, '_');
      },
      dispose() {
        token++;
      },
    };
  };
}

/** Index of the cell of increasing edges that holds v, clamped to the grid. */
function cellIndex(edges: Float64Array, v: number): number {
  let lo = 0;
  let hi = edges.length - 1;
  if (v <= edges[0]) return 0;
  if (v >= edges[hi]) return hi - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (edges[mid] <= v) lo = mid;
    else hi = mid;
  }
  return lo;
}
