/**
 * Line view: a transect through waypoints (typed, clicked on the view's own small map, or taken from the probe)
 * from the lines part (service 'line.sample'): the chosen field along the line with depth downwards, the
 * seafloor and the waypoints marked on the top axis, and the column means of the reference and every run below
 * it. The line, its spacing and the field shown are kept in the state for the session.
 */
import { typesetUnits } from '../../app/figures/typeset.js';
import { DIVERGING, SEQUENTIAL, quantileRange, symmetricRange } from '../../app/render/colour-scales.js';
import type { LineData } from '../../app/services/lines.js';
import { tracked } from '../service-client.js';
import { h, s } from '../elements.js';
import { linear, padded } from '../../app/figures/scale.js';
import { COLUMN_MEAN_CAPTION } from '../../app/figures/section-panels.js';
import { sectionFigure } from '../plot/section-figure.js';
import { bottomAxis, figureRoot, INK, leftAxis, legend, RUN_COLOURS, title, type Rect } from '../plot/svg-parts.js';
import { choose, state, type AppState, type LineChoice } from '../state.js';
import { accept, readNumber, refuse } from '../widgets/field-check.js';
import { letter, lineMap } from './line-map.js';
import { figureFrame } from '../widgets/figure-frame.js';
import { EXPORT_WIDTH, errorText, note, type ViewFactory } from './view.js';

function edgesOf(centres: Float64Array): Float64Array {
  const n = centres.length;
  const e = new Float64Array(n + 1);
  for (let i = 1; i < n; i++) e[i] = 0.5 * (centres[i - 1] + centres[i]);
  e[0] = n > 1 ? centres[0] - (e[1] - centres[0]) : centres[0] - 1;
  e[n] = n > 1 ? centres[n - 1] + (centres[n - 1] - e[n - 1]) : centres[0] + 1;
  return e;
}

function columnMeanFigure(d: LineData, width: number, height: number): SVGSVGElement {
  const svg = figureRoot(width, height, `Column means of ${d.variable} along the line`);
  title(svg, 12, 18, `Column mean of ${d.variable}, ${d.depthRange[0]}–${d.depthRange[1]} m`, `Thickness-weighted mean over the depth range, along the line; ${COLUMN_MEAN_CAPTION}`);
  const plot: Rect = { x: 76, y: 50, w: width - 76 - 220, h: height - 50 - 48 };
  const series = d.fields.filter((f) => f.role !== 'difference');
  let lo = Infinity;
  let hi = -Infinity;
  for (const f of series) for (const v of f.columnMean) {
      if (!Number.isFinite(v)) continue;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  const dist = d.distanceKm;
  const sx = linear([dist[0], dist[dist.length - 1]], [plot.x, plot.x + plot.w]);
  const sy = linear(padded(lo, hi), [plot.y + plot.h, plot.y]);
  const g = s('g', {});
  bottomAxis(g, plot, sx, 'Distance along the line (km)', { grid: true, ticks: 8 });
  leftAxis(g, plot, sy, `${d.variable} (${typesetUnits(d.units)})`, { grid: true, ticks: 5 });
  svg.append(g);
  const items = series.map((f, i) => ({ label: f.role === 'reference' ? `${f.label} (reference)` : f.label, colour: f.role === 'reference' ? INK : RUN_COLOURS[(i - 1) % RUN_COLOURS.length], marker: f.role === 'reference' ? ('dash' as const) : ('line' as const) }));
  series.forEach((f, i) => {
    let path = '';
    let pen = false;
    for (let q = 0; q < dist.length; q++) {
      const v = f.columnMean[q];
      if (!Number.isFinite(v)) {
        pen = false;
        continue;
      }
      path += `${pen ? 'L' : 'M'}${sx(dist[q]).toFixed(2)},${sy(v).toFixed(2)}`;
      pen = true;
    }
    svg.append(s('path', { d: path, fill: 'none', stroke: items[i].colour, 'stroke-width': f.role === 'reference' ? 2.2 : 1.6, ...(f.role === 'reference' ? { 'stroke-dasharray': '6 3' } : {}) }));
  });
  svg.append(s('rect', { x: plot.x, y: plot.y, width: plot.w, height: plot.h, fill: 'none', stroke: INK, 'stroke-width': 0.9 }));
  legend(svg, plot.x + plot.w + 16, plot.y + 8, items);
  return svg;
}

/** Waypoints as typed ("lon,lat; lon,lat; …"), or the sentence that says what is wrong. */
export function parseWaypointText(text: string): [number, number][] | string {
  const parts = text.split(';').map((p) => p.trim()).filter(Boolean);
  if (parts.length < 2) return 'A line needs at least two waypoints, typed as lon,lat; lon,lat.';
  const points: [number, number][] = [];
  for (const [i, part] of parts.entries()) {
    const nums = part.split(',').map((x) => Number(x.trim()));
    if (nums.length !== 2 || !nums.every(Number.isFinite)) return `Waypoint ${i + 1} "${part}" is not lon,lat (two numbers and a comma).`;
    const [lon, lat] = nums;
    if (lat < -90 || lat > 90) return `Waypoint ${i + 1} has latitude ${lat}, beyond the poles (−90 to 90).`;
    if (lon < -180 || lon > 360) return `Waypoint ${i + 1} has longitude ${lon}, outside −180 to 360.`;
    points.push([lon, lat]);
  }
  return points;
}

const textOf = (points: [number, number][]): string => points.map(([lon, lat]) => `${lon},${lat}`).join('; ');

export const lineView: ViewFactory = (el) => {
  const frame = figureFrame(el, { label: 'Line options', stageClass: 'line-stage', toolbarTag: 'form' });
  const { toolbar, stage } = frame;
  let data: LineData | null = null;
  let sampled = '';
  let token = 0;
  const line = (): LineChoice => state.sel.line;
  const points = h('input', { type: 'text', value: textOf(line().points), 'aria-label': 'Waypoints as lon,lat; lon,lat', id: 'line-points', class: 'line-points', size: 34 });
  const spacing = h('input', { type: 'number', value: String(line().spacingKm), step: 'any', 'aria-label': 'Spacing in km', id: 'line-spacing' });
  const fromProbe = h('button', { type: 'button', title: 'Append the probe position to the waypoints' }, 'Add probe point');
  fromProbe.addEventListener('click', () => {
    const p = state.probe;
    if (!p) return;
    choose({ line: { ...line(), points: [...line().points, [Number(p.lon.toFixed(2)), Number(p.lat.toFixed(2))]] } });
  });
  const go = h('button', { type: 'submit', class: 'primary' }, 'Draw line');
  const fieldSel = h('select', { 'aria-label': 'Field along the line', id: 'line-field' });
  fieldSel.addEventListener('change', () => choose({ line: { ...line(), field: Number(fieldSel.value) } }));
  const stretch = h('input', { type: 'checkbox', id: 'line-stretch' });
  stretch.addEventListener('change', () => choose({ line: { ...line(), stretch: stretch.checked } }));
  toolbar.append(
    h('label', { class: 'toolbar-label' }, 'Waypoints (lon,lat; …) ', points),
    h('label', { class: 'toolbar-label' }, 'every ', spacing, ' km'),
    fromProbe,
    go,
    fieldSel,
    h('label', { class: 'toolbar-label', title: 'The upper 1000 m take half the height of the section' }, stretch, ' stretch upper ocean'),
  );
  const map = lineMap();
  const mapBox = h('div', { class: 'line-map-box' }, map.el, h('p', { class: 'toolbar-hint' }, 'Click to add a waypoint, drag to move it, right-click (or Delete on a focused one) to remove it; arrows move a focused waypoint by 1°.'));
  toolbar.after(mapBox);

  /** Take what is typed: refused at the field, or into the state. */
  const takeTyped = (): boolean => {
    const pts = parseWaypointText(points.value);
    if (typeof pts === 'string') {
      refuse(points, pts);
      return false;
    }
    accept(points);
    const km = readNumber(spacing, 'The spacing', { above: 0, max: 5000 });
    if (typeof km === 'string') {
      refuse(spacing, km);
      return false;
    }
    accept(spacing);
    choose({ line: { ...line(), points: pts, spacingKm: km } });
    return true;
  };
  toolbar.addEventListener('submit', (ev) => {
    ev.preventDefault();
    if (takeTyped()) void load(state);
  });

  const specOf = (d: LineData, width: number, height: number) => {
    const f = d.fields[Math.min(line().field, d.fields.length - 1)];
    const diff = f.role === 'difference';
    const range = diff ? symmetricRange([f.values]) : quantileRange(d.fields.filter((x) => x.role !== 'difference').map((x) => x.values));
    if (!range) return null;
    const floors = Array.from(d.seafloorM).filter(Number.isFinite);
    const depthMax = floors.length ? Math.max(...floors) : d.depthEdges[d.depthEdges.length - 1];
    return {
      width,
      height,
      title: `${d.variable}: ${f.label}`,
      subtitle: `Along ${d.waypoints.map((p, i) => `${letter(i)} ${p.lon.toFixed(1)}°E ${p.lat.toFixed(1)}°N`).join(' → ')}`,
      edges: edgesOf(d.distanceKm),
      axisLabel: 'Distance along the line (km)',
      depthEdges: d.depthEdges,
      depthMax,
      values: f.values,
      seafloor: d.seafloorM,
      scale: diff ? DIVERGING : SEQUENTIAL,
      min: range[0],
      max: range[1],
      units: d.units,
      caption: diff ? `${d.variable} difference` : d.variable,
      stretch: line().stretch,
      marks: d.waypoints.map((p, i) => ({ at: p.distanceKm, label: letter(i) })),
    };
  };

  const render = (): void => {
    if (!data) return;
    const width = Math.max(560, Math.floor(stage.clientWidth || 900));
    const spec = specOf(data, width, Math.round(width * 0.42));
    if (!spec) return note(stage, 'There are no values along this line.');
    frame.show(`${data.variable}|${data.fields.length}|${line().field}|${line().stretch ? 'stretched' : 'linear'}|${data.waypoints.length}`, sectionFigure(spec).svg, columnMeanFigure(data, width, Math.round(width * 0.3)));
  };

  const load = async (st: AppState): Promise<void> => {
    const session = st.session;
    if (!session || !st.sel.variable) return note(stage, 'Open a recipe to draw lines.');
    if (st.sel.line.points.length < 2) return note(stage, 'A line needs at least two waypoints: click on the small map or type them.');
    const my = ++token;
    const asked = JSON.stringify([session.session, st.sel.variable, st.sel.line.points, st.sel.line.spacingKm]);
    note(stage, 'Sampling the fields along the line (in the background)…', 'busy');
    try {
      const r = await tracked<LineData>('Sampling along the line', 'line.sample', {
        session: session.session,
        variable: st.sel.variable,
        line: { kind: 'waypoints', points: textOf(st.sel.line.points) },
        spacingKm: st.sel.line.spacingKm,
      });
      if (my !== token) return;
      data = r;
      sampled = asked;
    } catch (e) {
      if (my === token) note(stage, errorText(e), 'error');
      return;
    }
    fieldSel.replaceChildren(...data.fields.map((f, i) => h('option', { value: String(i), selected: i === line().field }, f.role === 'difference' ? `${f.label}` : `${f.label} (${f.role})`)));
    render();
  };

  // waypoints moved on the small map: sample again once they rest
  let resample = 0;
  const showLine = (): void => {
    if (document.activeElement !== points) points.value = textOf(line().points);
    if (points.getAttribute('aria-invalid') !== 'true') accept(points);
    if (document.activeElement !== spacing) spacing.value = String(line().spacingKm);
    stretch.checked = line().stretch;
    fieldSel.value = String(line().field);
    map.show(line());
  };

  return {
    update(st, changed) {
      if (changed.size === 1 && changed.has('probe')) return;
      showLine();
      const asked = st.session ? JSON.stringify([st.session.session, st.sel.variable, st.sel.line.points, st.sel.line.spacingKm]) : '';
      if (changed.has('variable') || changed.has('session') || changed.has('view') || !data) void load(st);
      else if (changed.has('line') && asked !== sampled) {
        window.clearTimeout(resample);
        resample = window.setTimeout(() => void load(state), 500);
      } else if (changed.has('size') || changed.has('line')) render();
    },
    async figure() {
      if (!data) return null;
      const spec = specOf(data, EXPORT_WIDTH, Math.round(EXPORT_WIDTH * 0.45));
      return spec ? sectionFigure({ ...spec, rasterScale: 3 }).svg : null;
    },
    fileBase: () => `stillwater-line-${state.sel.variable}`.replace(/[^A-Za-z0-9._-]+/g, '_'),
    dispose() {
      token++;
      window.clearTimeout(resample);
    },
  };
};
