/**
 * Diagram view: Taylor and target diagrams of every run × region of the chosen variable and layer, drawn by
 * app/figures (the figure the report and the export write), with a zoom on the reference point.
 */
import { typesetUnits } from '../../app/figures/typeset.js';
import type { ComparisonResult } from '../../app/compare/run.js';
import { periodLabel } from '../../app/render/period-labels.js';
import { getSkill } from '../service-client.js';
import { h } from '../elements.js';
import { diagramsFigure, type DiagramKind, type DiagramRow, type DiagramsSpec } from '../../app/figures/diagrams.js';
import type { Figure } from '../../app/figures/parts.js';
import { figureElement, screenFigure } from '../plot/figure-element.js';
import { choose, currentVariable, state, type AppState } from '../state.js';
import { buttonGroup } from '../widgets/button-group.js';
import { figureFrame } from '../widgets/figure-frame.js';
import { errorText, note, type ViewFactory } from './view.js';

const num = (v: unknown): number => (typeof v === 'number' ? v : NaN);

export const diagramView: ViewFactory = (el) => {
  const frame = figureFrame(el, { label: 'Diagram options' });
  const { toolbar, stage } = frame;
  let result: ComparisonResult | null = null;
  let layer = '';
  let token = 0;

  let zoom = false;
  const kindsOf = (st: AppState): DiagramKind[] => (st.sel.diagram === 'target' ? ['target'] : ['taylor']);

  const figure = (st: AppState): Figure | null => {
    if (!result || !st.session) return null;
    const rowsOfVar = result.rows.filter((r) => r.variable === st.sel.variable && (r.period ?? 'annual') === st.sel.period);
    const layers = [...new Set(rowsOfVar.map((r) => r.layer))];
    if (!layers.includes(layer)) layer = layers[0] ?? '';
    const rows: DiagramRow[] = rowsOfVar
      .filter((r) => r.layer === layer)
      .map((r) => ({ run: r.run, region: r.region, bias: num(r.bias), crmse: num(r.crmse), corr: num(r.corr), model_std: num(r.model_std), ref_std: num(r.ref_std) }));
    if (!rows.length) return null;
    const v = currentVariable();
    const units = rowsOfVar[0]?.units ?? v?.units ?? '';
    const spec: DiagramsSpec = {
      name: `diagram-${st.sel.variable}-${layer}`,
      width: 'double',
      title: `${kindsOf(st)[0] === 'taylor' ? 'Taylor' : 'Target'} diagram: ${v?.longName && v.longName !== v.key ? `${v.longName} (${v.key})` : st.sel.variable}, ${layer}${st.sel.period === 'annual' ? '' : `, ${periodLabel(st.sel.period)}`}`,
      subtitle: `Every run × region; statistics weighted by cell volume (area for the bottom layer), units ${typesetUnits(units)}`,
      rows,
      runs: st.session.runs.map((r) => r.label),
      regions: [...new Set(rows.map((r) => r.region))],
      referenceLabel: st.session.reference.label,
      kinds: kindsOf(st),
      zoom: zoom && st.sel.diagram === 'taylor',
    };
    return diagramsFigure(spec);
  };

  const drawToolbar = (st: AppState): void => {
    const group = buttonGroup({ label: 'Diagram kind', options: [['taylor', 'Taylor'], ['target', 'Target']] as const, value: st.sel.diagram, onPick: (v) => choose({ diagram: v }) }).el;
    const layers = result ? [...new Set(result.rows.filter((r) => r.variable === st.sel.variable).map((r) => r.layer))] : [];
    const sel = h('select', { 'aria-label': 'Layer of the skill rows', id: 'diagram-layer' });
    for (const l of layers) {
      const o = h('option', { value: l }, l);
      if (l === layer) o.selected = true;
      sel.append(o);
    }
    sel.addEventListener('change', () => {
      layer = sel.value;
      void draw(state);
    });
    const near = h('input', { type: 'checkbox', id: 'diagram-zoom', disabled: st.sel.diagram !== 'taylor' });
    near.checked = zoom;
    near.addEventListener('change', () => {
      zoom = near.checked;
      void draw(state);
    });
    const zoomLabel = h('label', { class: 'toolbar-label', title: st.sel.diagram === 'taylor' ? 'Show only the square around the reference point that holds every run' : 'Only the Taylor diagram has a reference point to zoom on' }, near, ' Zoom near the reference');
    toolbar.replaceChildren(group, h('label', { class: 'toolbar-label' }, 'Layer ', sel), zoomLabel, h('span', { class: 'toolbar-hint' }, 'Variable from the bar above; hover a point for its numbers.'));
  };

  const draw = async (st: AppState): Promise<void> => {
    const session = st.session;
    if (!session) return note(stage, 'Open a recipe to see its diagrams.');
    const my = ++token;
    if (!result) {
      drawToolbar(st);
      note(stage, `Computing the skill rows of ${st.sel.variable} (this runs in the background)…`, 'busy');
    }
    try {
      const r = await getSkill(session.session, st.sel.variable);
      if (my !== token) return;
      result = r;
    } catch (e) {
      if (my === token) note(stage, errorText(e), 'error');
      return;
    }
    const fig = figure(st);
    drawToolbar(st);
    if (!fig) return note(stage, `There are no skill rows for ${st.sel.variable}.`);
    // as wide as the stage allows while the whole figure stays in view
    const w = Math.floor(stage.clientWidth || 900);
    const hgt = Math.floor(stage.clientHeight || 600);
    stage.replaceChildren(screenFigure(fig, Math.max(480, Math.min(w, (hgt * fig.widthPt) / fig.heightPt))));
    stage.dataset.drawn = `${st.sel.diagram}|${st.sel.variable}|${layer}${zoom && st.sel.diagram === 'taylor' ? '|zoom' : ''}`;
    stage.dataset.period = st.sel.period;
  };

  return {
    update(st, changed) {
      if (changed.size === 1 && changed.has('probe')) return;
      if (changed.has('session') || changed.has('variable')) result = null;
      void draw(st);
    },
    async figure() {
      const fig = figure(state);
      return fig ? figureElement(fig) : null;
    },
    fileBase: () => `stillwater-${state.sel.diagram}-${state.sel.variable}-${layer}${state.sel.period === 'annual' ? '' : `-${state.sel.period}`}`.replace(/[^A-Za-z0-9._-]+/g, '_'),
    dispose() {
      token++;
    },
  };
};
