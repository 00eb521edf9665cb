/**
 * Line view: a transect through waypoints (typed, clicked on the view's own small map, or taken from the probe)
 * from the lines part (service 'line.sample'), drawn as the report draws a line (app/figures/line-figure.ts):
 * reference, runs and differences along the line with the waypoints marked on the top axis, the column means
 * below. The export writes that same figure. The line, its spacing and the depth stretch are kept in the state
 * for the session.
 */
import { lineFigure, sampleEdges } from '../../app/figures/line-figure.js';
import { deepestWater } from '../../app/figures/section-panel.js';
import type { Figure } from '../../app/figures/parts.js';
import { latLabel, lonLabel } from '../../app/figures/typeset.js';
import type { LineData } from '../../app/services/lines.js';
import { tracked } from '../service-client.js';
import { h } from '../elements.js';
import { figureElement, screenFigure } from '../plot/figure-element.js';
import { sectionReadout } from '../plot/section-readout.js';
import { choose, state, type AppState, type LineChoice } from '../state.js';
import { accept, readNumber, refuse } from '../widgets/field-check.js';
import { letter, lineMap } from './line-map.js';
import { dataDownload } from '../widgets/data-download.js';
import { figureFrame } from '../widgets/figure-frame.js';
import { errorText, note, type ViewFactory } from './view.js';

/**
 * The line's figure, as the report draws a line: the reference, each run and each run minus the reference along
 * it (one colour scale for the fields, one symmetric scale for the differences), the waypoints marked A, B, C…
 * on every panel's top axis, and the column means below.
 */
export function lineFigureOf(d: LineData, spacingKm: number, stretch: boolean, referenceLabel: string): Figure {
  const ref = d.fields.find((f) => f.role === 'reference')!;
  const runs = d.fields.filter((f) => f.role === 'run');
  const diffs = d.fields.filter((f) => f.role === 'difference');
  return lineFigure({
    name: 'line',
    variable: d.variable,
    units: d.units,
    lineName: d.waypoints.map((p, i) => `${letter(i)} (${lonLabel(Number(p.lon.toFixed(1)))} ${latLabel(Number(p.lat.toFixed(1)))})`).join(' → '),
    width: 'double',
    spacingKm,
    method: 'bilinear',
    meansRange: d.depthRange,
    distanceKm: d.distanceKm,
    depthEdges: d.depthEdges,
    seafloor: d.seafloorM,
    reference: { label: referenceLabel, values: ref.values, columnMean: ref.columnMean },
    runs: runs.map((r, i) => ({ label: r.label, values: r.values, difference: diffs[i].values, columnMean: r.columnMean })),
    marks: d.waypoints.map((p, i) => ({ at: p.distanceKm, label: letter(i) })),
    stretch,
  });
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
  let shown: Figure | null = null;
  let sampledKm = 0;
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
  /** the request the line shown was sampled with: the download asks for the same */
  let sampledInput: Record<string, unknown> | null = null;
  const download = dataDownload('line', 'line', () => (sampledInput && data ? { service: 'view.export-line', input: sampledInput } : null));
  const stretch = h('input', { type: 'checkbox', id: 'line-stretch' });
  stretch.addEventListener('change', () => choose({ line: { ...line(), stretch: stretch.checked } }));
  toolbar.append(
    h('label', { class: 'toolbar-label' }, 'Waypoints (lon,lat; …) ', points),
    h('label', { class: 'toolbar-label' }, 'every ', spacing, ' km'),
    fromProbe,
    go,
    h('label', { class: 'toolbar-label', title: 'The upper 1000 m take half the height of the section' }, stretch, ' stretch upper ocean'),
    download,
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

  const render = (): void => {
    if (!data || !state.session) return;
    shown = lineFigureOf(data, sampledKm, line().stretch, state.session.reference.label);
    const svg = screenFigure(shown, frame.width(560));
    const d = data;
    const runs = d.fields.filter((f) => f.role === 'run');
    const diffs = d.fields.filter((f) => f.role === 'difference');
    const field = (panel: string) => {
      const [role, i] = panel.split(':');
      return role === 'reference' ? d.fields.find((f) => f.role === 'reference') : role === 'run' ? runs[Number(i)] : role === 'difference' ? diffs[Number(i)] : undefined;
    };
    const readout = sectionReadout(svg, {
      grid: { xEdges: sampleEdges(d.distanceKm), depthEdges: d.depthEdges },
      depthMax: deepestWater(d.seafloorM, d.depthEdges),
      stretch: line().stretch,
      valuesOf: (panel) => field(panel)?.values ?? null,
      nameOf: (panel) => (panel === 'reference' ? `${state.session?.reference.label ?? 'reference'} (reference)` : (field(panel)?.label ?? panel)),
      formatX: (x) => `${Math.round(x)} km along the line`,
      units: d.units,
    });
    frame.show(`${data.variable}|${data.fields.length}|${line().stretch ? 'stretched' : 'linear'}|${data.waypoints.length}`, readout, svg);
  };

  const load = async (st: AppState): Promise<void> => {
    const session = st.session;
    if (!session || !st.sel.variable) return note(stage, 'Open a recipe to draw lines.');
    if (st.sel.line.points.length < 2) return note(stage, 'A line needs at least two waypoints: click on the small map or type them.');
    const my = ++token;
    const asked = JSON.stringify([session.session, st.sel.variable, st.sel.line.points, st.sel.line.spacingKm]);
    note(stage, 'Sampling the fields along the line (in the background)…', 'busy');
    try {
      const input = {
        session: session.session,
        variable: st.sel.variable,
        line: { kind: 'waypoints', points: textOf(st.sel.line.points) },
        spacingKm: st.sel.line.spacingKm,
      };
      const r = await tracked<LineData>('Sampling along the line', 'line.sample', input);
      if (my !== token) return;
      data = r;
      sampledKm = st.sel.line.spacingKm;
      sampledInput = input;
      sampled = asked;
    } catch (e) {
      if (my === token) note(stage, errorText(e), 'error');
      return;
    }
    render();
  };

  // waypoints moved on the small map: sample again once they rest
  let resample = 0;
  const showLine = (): void => {
    if (document.activeElement !== points) points.value = textOf(line().points);
    if (points.getAttribute('aria-invalid') !== 'true') accept(points);
    if (document.activeElement !== spacing) spacing.value = String(line().spacingKm);
    stretch.checked = line().stretch;
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
      return shown ? figureElement(shown) : null;
    },
    fileBase: () => `stillwater-line-${state.sel.variable}`.replace(/[^A-Za-z0-9._-]+/g, '_'),
    dispose() {
      token++;
      window.clearTimeout(resample);
    },
  };
};
