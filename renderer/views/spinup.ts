/**
 * Spin-up view: the figure of how a run's tracers drift over its snapshots (app/figures/spinup-figure.ts) with the choice of
 * run, quantity, layer, tracers and regions above it, and the table of drift rates and verdicts below
 * (spinup-table.ts); service 'spinup.run', or 'spinup.open' for a spinup.json written by `stillwater spinup`.
 */
import type { SpinupResult } from '../../app/spinup/types.js';
import { tracked } from '../service-client.js';
import { h } from '../elements.js';
import { pickFile } from '../panels/file-picker.js';
import { state, type AppState } from '../state.js';
import { buttonGroup } from '../widgets/button-group.js';
import type { Figure } from '../../app/figures/parts.js';
import { spinupFigure, type SpinupChoice as Choice, type SpinupQuantity as Quantity } from '../../app/figures/spinup-figure.js';
import { figureElement, screenFigure } from '../plot/figure-element.js';
import { spinupTable } from './spinup-table.js';
import { errorText, note, type ViewFactory } from './view.js';

export const spinupView: ViewFactory = (el) => {
  const toolbar = h('div', { class: 'view-toolbar', role: 'toolbar', 'aria-label': 'Spin-up options' });
  const pickers = h('div', { class: 'view-toolbar spinup-pickers' });
  const banner = h('p', { class: 'spinup-banner', role: 'status' });
  const scroll = h('div', { class: 'spinup-scroll' });
  const stage = h('div', { class: 'figure-stage spinup-stage' });
  const tableHead = h('div', { class: 'view-toolbar spinup-table-head' });
  const tableWrap = h('div', { class: 'spinup-table-wrap' });
  scroll.append(stage, tableHead, tableWrap);
  const openResults = h('button', { type: 'button', id: 'spinup-open-results', title: 'Show a spinup.json written by the command line (stillwater spinup), e.g. on a cluster' }, 'Open spinup.json…');
  const fileRow = h('div', { class: 'view-toolbar spinup-file-row' }, openResults);
  el.append(fileRow, toolbar, pickers, banner, scroll);
  let result: SpinupResult | null = null;
  /** the figure on the stage: the export writes the same one */
  let shown: Figure | null = null;
  let resultKey = '';
  let token = 0;
  const table = spinupTable();
  let allTracks = false;
  const c: Choice = { run: '', quantity: 'mean', relative: false, layer: 'all', tracers: [], regions: [], skillTracer: '' };

  const redraw = (): void => {
    if (result) render(result);
  };

  const segmented = (label: string, id: string, options: [string, string][], value: string, onPick: (v: string) => void): HTMLElement =>
    buttonGroup({ label, id, options, value, onPick, showLabel: true }).el;

  const selectOf = (label: string, id: string, options: string[], value: string, onPick: (v: string) => void): HTMLElement => {
    const sel = h('select', { 'aria-label': label, id });
    for (const o of options) {
      const opt = h('option', { value: o }, o);
      if (o === value) opt.selected = true;
      sel.append(opt);
    }
    sel.addEventListener('change', () => onPick(sel.value));
    return h('label', { class: 'toolbar-label' }, `${label} `, sel);
  };

  const checkboxes = (legendText: string, id: string, options: string[], chosen: string[], onChange: (v: string[]) => void): HTMLElement => {
    const fs = h('fieldset', { class: 'spinup-checks', id }, h('legend', {}, legendText));
    for (const o of options) {
      const box = h('input', { type: 'checkbox', value: o, 'data-value': o });
      box.checked = chosen.includes(o);
      box.addEventListener('change', () => onChange([...fs.querySelectorAll('input:checked')].map((e) => (e as HTMLInputElement).value)));
      fs.append(h('label', {}, box, o));
    }
    return fs;
  };

  const drawControls = (r: SpinupResult, runs: string[]): void => {
    const tracerNames = r.tracers.map((t) => t.name);
    toolbar.replaceChildren(
      ...(runs.length > 1
        ? [
            selectOf('Run', 'spinup-run', runs, c.run, (v) => {
              c.run = v;
              void draw(state);
            }),
          ]
        : []),
      segmented('Show', 'spinup-quantity', [['mean', 'mean'], ['inventory', 'inventory']], c.quantity, (v) => {
        c.quantity = v as Quantity;
        redraw();
      }),
      segmented('as', 'spinup-scale', [['absolute', 'absolute'], ['relative', 'relative (%)']], c.relative ? 'relative' : 'absolute', (v) => {
        c.relative = v === 'relative';
        redraw();
      }),
      selectOf('Layer', 'spinup-layer', r.layers, c.layer, (v) => {
        c.layer = v;
        redraw();
      }),
      selectOf('Skill of', 'spinup-skill-tracer', tracerNames.filter((n) => r.skill.some((p) => p.variable === n)), c.skillTracer, (v) => {
        c.skillTracer = v;
        redraw();
      }),
      h('span', { class: 'toolbar-hint' }, `Run ${r.run}: ${r.years.length} snapshots, model years ${r.years[0]}–${r.years[r.years.length - 1]}`),
    );
    pickers.replaceChildren(
      checkboxes('Tracers', 'spinup-tracers', tracerNames, c.tracers, (v) => {
        c.tracers = v;
        if (v.length && !v.includes(c.skillTracer) && r.skill.some((p) => p.variable === v[0])) {
          c.skillTracer = v[0];
          const skillSelect = toolbar.querySelector<HTMLSelectElement>('#spinup-skill-tracer');
          if (skillSelect) skillSelect.value = v[0];
        }
        redraw();
      }),
      checkboxes('Regions', 'spinup-regions', r.regions, c.regions, (v) => {
        c.regions = v;
        redraw();
      }),
    );
  };

  const drawTable = (r: SpinupResult): void => {
    const rows = r.tracks.filter((t) => allTracks || (c.tracers.includes(t.tracer) && c.regions.includes(t.region)));
    table.show(rows);
    const all = h('input', { type: 'checkbox', id: 'spinup-all-tracks' });
    all.checked = allTracks;
    all.addEventListener('change', () => {
      allTracks = all.checked;
      drawTable(r);
      all.focus();
    });
    tableHead.replaceChildren(
      h('h3', { class: 'spinup-table-title' }, 'Drift rates and verdicts'),
      h('label', { class: 'toolbar-label' }, all, ' every tracer and region'),
      h('span', { class: 'toolbar-hint' }, `${rows.length} of ${r.tracks.length} tracks; settled below ${r.settings.thresholdPercentPerKyr} % of the mean per 1000 years`),
    );
    if (table.el.parentElement !== tableWrap) tableWrap.replaceChildren(table.el);
  };

  const render = (r: SpinupResult): void => {
    banner.textContent = [r.summary.sentence, ...r.notes].join(' ');
    banner.className = `spinup-banner ${r.summary.settled ? 'settled' : 'drifting'}`;
    shown = spinupFigure(r, c, 'double');
    stage.replaceChildren(screenFigure(shown, Math.max(640, Math.floor(stage.clientWidth || scroll.clientWidth || 900) - 4)));
    stage.dataset.drawn = `${c.run}|${c.quantity}|${c.relative ? 'relative' : 'absolute'}|${c.layer}|${c.tracers.join(',')}|${c.regions.join(',')}`;
    drawTable(r);
  };

  /** First look: the chosen variable and the tracer that drifts most, the chosen region and where it drifts most. */
  const firstLook = (r: SpinupResult, st: AppState): void => {
    const names = r.tracers.map((t) => t.name);
    const worst = r.summary.worst[0];
    c.tracers = [...new Set([st.sel.variable, worst?.tracer].filter((v): v is string => !!v && names.includes(v)))];
    if (!c.tracers.length) c.tracers = names.slice(0, 1);
    c.regions = [...new Set([st.sel.region, worst?.region].filter((v): v is string => !!v && r.regions.includes(v)))];
    if (!c.regions.length) c.regions = r.regions.slice(0, 1);
    c.layer = worst && r.layers.includes(worst.layer) ? worst.layer : (r.layers[0] ?? 'all');
    c.skillTracer = c.tracers.find((t) => r.skill.some((p) => p.variable === t)) ?? r.skill[0]?.variable ?? '';
  };

  openResults.addEventListener('click', () => {
    void (async () => {
      const path = await pickFile('Open spin-up results (spinup.json)', (e) => e.name.toLowerCase().endsWith('.json'), ['json']);
      if (!path) return;
      const my = ++token;
      try {
        const r = await tracked<SpinupResult>('Reading spin-up results', 'spinup.open', { path });
        if (my !== token) return;
        result = r;
        resultKey = `file:${path}`;
        c.run = r.run;
        firstLook(r, state);
        drawControls(r, [r.run]);
        render(r);
      } catch (e) {
        if (my === token) note(stage, errorText(e), 'error');
      }
    })();
  });

  const draw = async (st: AppState): Promise<void> => {
    const session = st.session;
    if (!session) return note(stage, 'Open a recipe to follow its spin-up.');
    const runs = session.runs.filter((r) => r.snapshots?.length).map((r) => r.label);
    if (!runs.length) return note(stage, 'No run of this recipe lists spin-up snapshots (runs[i].snapshots).');
    if (!runs.includes(c.run)) c.run = runs[0];
    const key = `${session.session}|${c.run}`;
    const my = ++token;
    if (!result || resultKey !== key) {
      note(stage, `Following ${c.run} through its snapshots (in the background)…`, 'busy');
      try {
        const r = await tracked<SpinupResult>('Following the spin-up', 'spinup.run', { session: session.session, run: c.run });
        if (my !== token) return;
        result = r;
        resultKey = key;
      } catch (e) {
        if (my === token) note(stage, /no service/i.test(errorText(e)) ? 'The spin-up analysis is not part of this build yet.' : errorText(e), 'error');
        return;
      }
      firstLook(result, st);
    }
    drawControls(result, runs);
    render(result);
  };
  return {
    update(st, changed) {
      if (changed.size === 1 && changed.has('probe')) return;
      // the spin-up keeps its own choice of tracers and regions; only a new session or a resize redraws
      if (result && !changed.has('session') && !changed.has('size')) return;
      void draw(st);
    },
    async figure() {
      return shown ? figureElement(shown) : null;
    },
    fileBase: () => `stillwater-spinup-${c.run}-${c.quantity}-${c.layer}`.replace(/[^A-Za-z0-9._-]+/g, '_'),
    dispose() {
      token++;
    },
  };
};
