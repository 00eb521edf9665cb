/**
 * Section view: a meridian or a parallel through the common grid, or the zonal mean of a region, with
 * depth downwards and the seafloor drawn; the run, the reference or their difference.
 */
import { periodLabel } from '../../app/render/period-labels.js';
import { DIVERGING, SEQUENTIAL, quantileRange, symmetricRange } from '../../app/render/colour-scales.js';
import type { SectionData } from '../../contract/view-types.js';
import { sectionFigure, type SectionFigureSpec } from '../../app/figures/section-figure.js';
import { cutSamples, waterSpan } from '../../app/figures/section-panel.js';
import { latLabel, lonLabel } from '../../app/figures/typeset.js';
import type { Figure } from '../../app/figures/parts.js';
import { getSection } from '../service-client.js';
import { h } from '../elements.js';
import { figureElement, screenFigure } from '../plot/figure-element.js';
import { sectionReadout } from '../plot/section-readout.js';
import { choose, currentVariable, state, type AppState, type Selection } from '../state.js';
import { buttonGroup } from '../widgets/button-group.js';
import { accept, readNumber, refuse } from '../widgets/field-check.js';
import { keepFocus } from '../widgets/keep-focus.js';
import { dataDownload } from '../widgets/data-download.js';
import { figureFrame } from '../widgets/figure-frame.js';
import { errorText, note, type ViewFactory } from './view.js';

interface Built {
  data: SectionData;
  fig: Figure;
}

/** A zonal mean over a basin spans only the basin's latitudes: samples without water at either end are left out. */
function withWater(data: SectionData): SectionData {
  const n = data.edges.length - 1;
  const span = waterSpan(data.seafloor);
  if (data.kind !== 'zonal' || !span || (span[0] === 0 && span[1] === n - 1)) return data;
  const [first, last] = span;
  const cut = (a: Float32Array): Float32Array => cutSamples(a, n, first, last);
  return { ...data, edges: data.edges.slice(first, last + 2), model: cut(data.model), reference: cut(data.reference), difference: cut(data.difference), seafloor: data.seafloor.slice(first, last + 1) };
}

function describe(st: AppState, whole: SectionData): SectionFigureSpec | null {
  const data = withWater(whole);
  const field = st.sel.sectionField;
  const values = field === 'model' ? data.model : field === 'reference' ? data.reference : data.difference;
  const range = field === 'difference' ? symmetricRange([data.difference]) : quantileRange([data.model, data.reference]);
  if (!range) return null;
  const v = currentVariable();
  const name = v?.longName && v.longName !== v.key ? `${v.longName} (${v.key})` : data.variable;
  const who = field === 'model' ? data.run : field === 'reference' ? st.session!.reference.label : `${data.run} minus ${st.session!.reference.label}`;
  const where =
    data.kind === 'zonal'
      ? `Zonal mean over ${data.region}, area-weighted, where run and reference both have water`
      : data.kind === 'meridian'
        ? `Section along ${lonLabel(Number(data.atGrid!.toFixed(2)))} (grid column nearest to ${lonLabel(data.at!)})`
        : `Section along ${latLabel(Number(data.atGrid!.toFixed(2)))} (grid row nearest to ${latLabel(data.at!)})`;
  let deepest = 0;
  for (const f of data.seafloor) if (Number.isFinite(f) && f > deepest) deepest = f;
  const depthMax = st.sel.sectionDepth ?? (deepest > 0 ? deepest : data.depthEdges[data.depthEdges.length - 1]);
  const when = data.period !== 'annual' || st.session!.periods.length > 1 ? `${periodLabel(data.period)}. ` : '';
  return {
    name: 'section',
    title: `${name}: ${who}`,
    subtitle: `${when}${where}`,
    width: 'double',
    grid: { xEdges: data.edges, depthEdges: data.depthEdges },
    xLabel: data.axis === 'latitude' ? 'Latitude (degrees north)' : 'Longitude (degrees east)',
    formatX: data.axis === 'latitude' ? latLabel : lonLabel,
    depthMax,
    values,
    seafloor: data.seafloor,
    scale: field === 'difference' ? DIVERGING : SEQUENTIAL,
    limits: range,
    units: data.units,
    quantity: field === 'difference' ? `${data.variable}, run minus reference` : data.variable,
  };
}

export const sectionView: ViewFactory = (el) => {
  const frame = figureFrame(el, { label: 'Section options' });
  const { toolbar, stage } = frame;
  let built: Built | null = null;
  let token = 0;
  /** what the figure shown was drawn from: the download asks for the same */
  let asked: Record<string, unknown> | null = null;
  const download = dataDownload('section', 'section', () => (asked && built ? { service: 'view.export-section', input: asked } : null));

  const drawToolbar = (sel: Selection): void => {
    const at = h('input', { type: 'number', step: 'any', id: 'section-at', value: String(sel.sectionAt), 'aria-label': sel.sectionKind === 'parallel' ? 'Latitude of the section (degrees north)' : 'Longitude of the section (degrees east)' });
    at.addEventListener('change', () => {
      // a longitude beyond one turn, or a latitude beyond a pole, is a typing slip: refused, not wrapped
      const v = sel.sectionKind === 'parallel' ? readNumber(at, 'The latitude of the section', { min: -90, max: 90 }) : readNumber(at, 'The longitude of the section', { min: -180, max: 360 });
      if (typeof v === 'string') return refuse(at, v);
      accept(at);
      choose({ sectionAt: v });
    });
    const depth = h('select', { 'aria-label': 'Depth range', id: 'section-depth' });
    for (const [v, label] of [
      ['', 'to the seafloor'],
      ['500', 'upper 500 m'],
      ['1000', 'upper 1000 m'],
      ['2000', 'upper 2000 m'],
    ]) {
      const o = h('option', { value: v }, label);
      if ((sel.sectionDepth === null ? '' : String(sel.sectionDepth)) === v) o.selected = true;
      depth.append(o);
    }
    depth.addEventListener('change', () => choose({ sectionDepth: depth.value === '' ? null : Number(depth.value) }));
    keepFocus(toolbar, () =>
      toolbar.replaceChildren(
        buttonGroup({
          label: 'Section kind',
          id: 'section-kind',
          options: [['meridian', 'Meridian'], ['parallel', 'Parallel'], ['zonal', 'Zonal mean']] as const,
          value: sel.sectionKind,
          onPick: (v) => choose({ sectionKind: v, sectionAt: v === 'parallel' ? (sel.sectionKind === 'parallel' ? sel.sectionAt : 0) : sel.sectionKind === 'meridian' ? sel.sectionAt : -25 }),
        }).el,
        sel.sectionKind === 'zonal'
          ? h('span', { class: 'toolbar-label' }, `region: ${sel.region} (choose above)`)
          : h('label', { class: 'toolbar-label' }, sel.sectionKind === 'meridian' ? 'Longitude (°E) ' : 'Latitude (°N) ', at),
        buttonGroup({ label: 'Field shown', id: 'section-field', options: [['model', 'Run'], ['reference', 'Reference'], ['difference', 'Difference']] as const, value: sel.sectionField, onPick: (v) => choose({ sectionField: v }) }).el,
        depth,
        download,
      ),
    );
  };

  const draw = async (st: AppState): Promise<void> => {
    drawToolbar(st.sel);
    const session = st.session;
    if (!session || !st.sel.variable || !st.sel.run) return note(stage, 'Open a recipe to see sections.');
    if (session.grid.nz < 2) return note(stage, 'This variable has no depth axis, so there is no section to draw.');
    const my = ++token;
    if (!built) note(stage, 'Reading all levels for the section…', 'busy');
    let data: SectionData;
    try {
      data = await getSection(session.session, st.sel.variable, st.sel.run, st.sel.sectionKind, st.sel.sectionAt, st.sel.region, st.sel.period);
    } catch (e) {
      if (my === token) note(stage, errorText(e), 'error');
      return;
    }
    if (my !== token) return;
    const spec = describe(st, data);
    if (!spec) return note(stage, 'There are no values along this section.');
    built = { data, fig: sectionFigure(spec) };
    const svg = screenFigure(built.fig, frame.width(480));
    const readout = sectionReadout(svg, {
      grid: spec.grid,
      depthMax: spec.depthMax!,
      valuesOf: (panel) => (panel === 'section' ? spec.values : null),
      nameOf: () => spec.title.slice(spec.title.lastIndexOf(': ') + 2),
      formatX: spec.formatX!,
      units: spec.units,
    });
    asked = { session: session.session, variable: st.sel.variable, run: st.sel.run, kind: st.sel.sectionKind, at: st.sel.sectionAt, region: st.sel.region, period: st.sel.period };
    stage.replaceChildren(svg, readout);
    stage.dataset.drawn = `${data.variable}|${data.run}|${data.kind}|${data.at ?? data.region}`;
    stage.dataset.period = data.period;
  };

  return {
    update(st, changed) {
      if (changed.size === 1 && changed.has('probe')) return;
      void draw(st);
    },
    async figure() {
      if (!built) return null;
      return figureElement(built.fig);
    },
    fileBase() {
      const sel = state.sel;
      return `stillwater-section-${sel.variable}-${sel.sectionField === 'reference' ? 'ref' : sel.run}-${sel.sectionKind}-${sel.sectionKind === 'zonal' ? sel.region : sel.sectionAt}`.replace(/[^A-Za-z0-9._-]+/g, '_');
    },
    dispose() {
      token++;
    },
  };
};
