/** The comparison bar: variable, run, region, depth, period of the year and projection, and the choice of view. */
import { typesetUnits } from '../../app/figures/typeset.js';
import { PROJECTIONS, type ProjectionId } from '../../app/render/projections.js';
import { VIEW_PERIODS, periodLabel } from '../../app/render/period-labels.js';
import type { ViewPeriod } from '../../contract/view-types.js';
import { h, select } from '../elements.js';
import { VIEWS, choose, subscribe, type AppState, type ViewId } from '../state.js';
import { keepFocus } from '../widgets/keep-focus.js';
import { NOT_HERE, type BarControl } from './bar-applies.js';

export function comparisonBar(el: HTMLElement, tabs: HTMLElement): void {
  el.classList.add('comparison-bar');
  el.setAttribute('role', 'group');
  el.setAttribute('aria-label', 'What to compare');

  const tabButtons = new Map<ViewId, HTMLButtonElement>();
  tabs.classList.add('view-tabs');
  tabs.setAttribute('role', 'tablist');
  tabs.setAttribute('aria-label', 'Views');
  for (const v of VIEWS) {
    const b = h('button', { type: 'button', role: 'tab', id: `tab-${v.id}`, 'data-view': v.id, 'aria-controls': 'view-area', title: `${v.label} (Alt+${v.key})` }, v.label);
    b.addEventListener('click', () => choose({ view: v.id }));
    b.addEventListener('keydown', (ev) => {
      // arrow keys move between tabs, as in any tab list
      if (ev.key !== 'ArrowRight' && ev.key !== 'ArrowLeft') return;
      const i = VIEWS.findIndex((x) => x.id === v.id);
      const next = VIEWS[(i + (ev.key === 'ArrowRight' ? 1 : VIEWS.length - 1)) % VIEWS.length];
      choose({ view: next.id });
      tabButtons.get(next.id)?.focus();
    });
    tabButtons.set(v.id, b);
    tabs.append(b);
  }
  document.addEventListener('keydown', (ev) => {
    if (!ev.altKey || ev.ctrlKey || ev.metaKey) return;
    const v = VIEWS.find((x) => x.key === ev.key);
    if (v) {
      ev.preventDefault();
      choose({ view: v.id });
    }
  });

  const render = (st: AppState): void => {
    for (const [id, b] of tabButtons) {
      const on = id === st.sel.view;
      b.setAttribute('aria-selected', String(on));
      b.tabIndex = on ? 0 : -1;
    }
    const s = st.session;
    if (!s) {
      el.replaceChildren(h('span', { class: 'muted' }, 'No recipe open.'));
      return;
    }
    const variable = s.variables.find((v) => v.key === st.sel.variable);
    const controls: [BarControl, HTMLLabelElement][] = [
      ['variable', select('Variable', s.variables.map((v) => ({ value: v.key, label: `${v.key} (${typesetUnits(v.units)})` })), st.sel.variable, (value) => {
        const runs = s.variables.find((v) => v.key === value)?.runs ?? [];
        choose({ variable: value, run: runs.includes(st.sel.run) ? st.sel.run : (runs[0] ?? '') });
      }, 'choose-variable')],
      ['run', select('Run', (variable?.runs ?? []).map((r) => ({ value: r, label: r })), st.sel.run, (value) => choose({ run: value }), 'choose-run')],
      ['region', select('Region', s.regions.map((r) => ({ value: r, label: r })), st.sel.region, (value) => choose({ region: value }), 'choose-region')],
      ['layer', select('Depth', s.layers.map((l) => ({ value: l.id, label: l.label })), st.sel.layer, (value) => choose({ layer: value }), 'choose-layer')],
      ['period', periodControl(st)],
      ['projection', select('Projection', PROJECTIONS.map((p) => ({ value: p.id, label: p.label })), st.sel.projection, (value) => choose({ projection: value as ProjectionId }), 'choose-projection')],
    ];
    const why = NOT_HERE[st.sel.view];
    for (const [name, label] of controls) {
      let reason = name === 'region' && st.sel.cropToRegion && (st.sel.view === 'map' || st.sel.view === 'difference') ? undefined : why[name];
      if (name === 'region' && st.sel.view === 'section' && st.sel.sectionKind !== 'zonal') reason = 'Only the zonal-mean section uses the region.';
      if (st.sel.view === 'profile' && st.sel.profileCycle) {
        // the monthly cycle is one run's, over the levels of the chosen depth, for every month
        if (name === 'run' || name === 'layer') reason = undefined;
        if (name === 'period') reason = 'The monthly cycle shows every month.';
      }
      if (name === 'period' && !reason && s.periods.length < 2) reason = s.periodsNote ?? 'The recipe has no months or seasons.';
      const control = label.querySelector('select')!;
      control.disabled = !!reason;
      label.classList.toggle('not-here', !!reason);
      label.title = reason ?? '';
    }
    const refused = st.periodRefused ? [h('p', { class: 'bar-refusal', role: 'alert', id: 'period-refused' }, st.periodRefused)] : [];
    keepFocus(el, () => el.replaceChildren(...controls.map(([, label]) => label), ...refused));
  };
  subscribe((st, changed) => {
    if (changed.has('probe')) return;
    render(st);
  });
}

/** The period menu: every period, those the recipe has no data for disabled with the reason on hover. */
function periodControl(st: AppState): HTMLLabelElement {
  const s = st.session!;
  const label = select('Period', VIEW_PERIODS.map((p) => ({ value: p, label: p === 'annual' ? 'Year (annual mean)' : periodLabel(p) })), st.sel.period, (value) => choose({ period: value as ViewPeriod }), 'choose-period');
  for (const o of label.querySelectorAll('option')) {
    if (s.periods.includes(o.value as ViewPeriod)) continue;
    o.disabled = true;
    o.title = s.periodsNote ?? `The recipe's options.periods gives no ${o.value}.`;
  }
  return label;
}
