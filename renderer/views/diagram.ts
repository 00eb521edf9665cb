/** Diagram view: Taylor and target diagrams of every run × region of the chosen variable and layer. */
import type { ComparisonResult } from '../../app/compare/run.js';
import { getSkill } from '../service-client.js';
import { h } from '../elements.js';
import { taylorFigure, targetFigure, type DiagramRow, type DiagramSpec } from '../plot/diagrams.js';
import { choose, currentVariable, state, type AppState } from '../state.js';
import { buttonGroup } from '../widgets/button-group.js';
import { figureFrame } from '../widgets/figure-frame.js';
import { EXPORT_WIDTH, errorText, note, type ViewFactory } from './view.js';

const num = (v: unknown): number => (typeof v === 'number' ? v : NaN);

export const diagramView: ViewFactory = (el) => {
  const frame = figureFrame(el, { label: 'Diagram options' });
  const { toolbar, stage } = frame;
  let result: ComparisonResult | null = null;
  let layer = '';
  let token = 0;

  const spec = (st: AppState, width: number, height: number): DiagramSpec | null => {
    if (!result || !st.session) return null;
    const rowsOfVar = result.rows.filter((r) => r.variable === st.sel.variable);
    const layers = [...new Set(rowsOfVar.map((r) => r.layer))];
    if (!layers.includes(layer)) layer = layers[0] ?? '';
    const rows: DiagramRow[] = rowsOfVar
      .filter((r) => r.layer === layer)
      .map((r) => ({ run: r.run, region: r.region, bias: num(r.bias), crmse: num(r.crmse), corr: num(r.corr), model_std: num(r.model_std), ref_std: num(r.ref_std) }));
    const v = currentVariable();
    const units = rowsOfVar[0]?.units ?? v?.units ?? '';
    return {
      width,
      height,
      title: `${v?.longName && v.longName !== v.key ? `${v.longName} (${v.key})` : st.sel.variable}, ${layer}`,
      subtitle: `Every run × region; statistics weighted by cell volume (area for the bottom layer), units ${units}`,
      rows,
      runs: st.session.runs.map((r) => r.label),
      regions: [...new Set(rows.map((r) => r.region))],
      referenceLabel: st.session.reference.label,
    };
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
    toolbar.replaceChildren(group, h('label', { class: 'toolbar-label' }, 'Layer ', sel), h('span', { class: 'toolbar-hint' }, 'Variable from the bar above; hover a point for its numbers.'));
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
    const width = Math.max(520, Math.floor(stage.clientWidth || 900));
    const height = Math.max(380, Math.min(Math.floor(stage.clientHeight || 600), Math.round(width * 0.68)));
    const sp = spec(st, width, height);
    drawToolbar(st);
    if (!sp || sp.rows.length === 0) return note(stage, `There are no skill rows for ${st.sel.variable}.`);
    stage.replaceChildren(st.sel.diagram === 'taylor' ? taylorFigure(sp) : targetFigure(sp));
    stage.dataset.drawn = `${st.sel.diagram}|${st.sel.variable}|${layer}`;
  };

  return {
    update(st, changed) {
      if (changed.size === 1 && changed.has('probe')) return;
      if (changed.has('session') || changed.has('variable')) result = null;
      void draw(st);
    },
    async figure() {
      const sp = spec(state, EXPORT_WIDTH, Math.round(EXPORT_WIDTH * 0.66));
      if (!sp) return null;
      return state.sel.diagram === 'taylor' ? taylorFigure(sp) : targetFigure(sp);
    },
    fileBase: () => `stillwater-${state.sel.diagram}-${state.sel.variable}-${layer}`.replace(/[^A-Za-z0-9._-]+/g, '_'),
    dispose() {
      token++;
    },
  };
};
