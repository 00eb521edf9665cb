/**
 * The workbench: sources on the left, the comparison bar and one view in the middle, the probe on the
 * right, the status line at the bottom. Opens the recipe the workbench was started with.
 */
import { startRecipe } from './bridge.js';
import { openSession } from './service-client.js';
import { h } from './elements.js';
import { comparisonBar } from './panels/comparison-bar.js';
import { probePanel } from './panels/probe.js';
import { sourcesPanel } from './panels/sources.js';
import { statusLine } from './panels/status.js';
import { savePng, saveSvg } from './plot/export.js';
import { VIEWS, redo, setSession, state, subscribe, undo, type ViewId } from './state.js';
import { diagramView } from './views/diagram.js';
import { lineView } from './views/line.js';
import { mapView } from './views/map.js';
import { profileView } from './views/profile.js';
import { scoresView } from './views/scores.js';
import { sectionView } from './views/section.js';
import { spinupView } from './views/spinup.js';
import { errorText, type ViewFactory, type ViewHandle } from './views/view.js';

const FACTORIES: Record<ViewId, ViewFactory> = {
  map: mapView(false),
  difference: mapView(true),
  section: sectionView,
  profile: profileView,
  diagram: diagramView,
  scores: scoresView,
  spinup: spinupView,
  line: lineView,
};

function layout(root: HTMLElement) {
  const brand = h('div', { class: 'brand' }, h('span', { class: 'brand-name' }, 'Stillwater'));
  const bar = h('div', { id: 'comparison-bar' });
  const top = h('header', { class: 'topbar' }, brand, bar);
  const sources = h('aside', { id: 'sources-panel', 'aria-label': 'Sources' });
  const tabs = h('div', { id: 'view-tabs' });
  const exportSvg = h('button', { type: 'button', id: 'export-svg', title: 'The figure as SVG, 180 mm wide' }, 'Export SVG');
  const exportPng = h('button', { type: 'button', id: 'export-png', title: 'The figure as PNG, 180 mm wide at 300 dpi' }, 'Export PNG');
  const exports = h('div', { class: 'export-buttons', role: 'group', 'aria-label': 'Export the figure' }, exportSvg, exportPng);
  const viewHead = h('div', { class: 'view-head' }, tabs, exports);
  const area = h('section', { id: 'view-area', role: 'tabpanel', 'aria-live': 'polite' });
  const centre = h('main', { class: 'centre' }, viewHead, area);
  const probe = h('aside', { id: 'probe-panel', 'aria-label': 'Probe' });
  const status = h('footer', { id: 'status' });
  root.replaceChildren(top, sources, centre, probe, status);
  return { bar, sources, tabs, area, probe, status, exportSvg, exportPng, exports };
}

async function main(): Promise<void> {
  const root = document.getElementById('app') ?? document.body;
  root.classList.add('workbench');
  const ui = layout(root);
  const status = statusLine(ui.status);
  comparisonBar(ui.bar, ui.tabs);
  sourcesPanel(ui.sources, status.say);
  probePanel(ui.probe);

  let current: { id: ViewId; handle: ViewHandle; el: HTMLElement } | null = null;
  const mount = (id: ViewId): void => {
    current?.handle.dispose();
    const el = h('div', { class: `view view-${id}`, 'data-view': id });
    ui.area.replaceChildren(el);
    ui.area.setAttribute('aria-labelledby', `tab-${id}`);
    root.dataset.view = id;
    const handle = FACTORIES[id](el, state);
    current = { id, handle, el };
    ui.exports.hidden = !handle.figure;
    handle.update(state, new Set(['session', 'variable', 'run', 'layer', 'region', 'projection', 'view']));
  };

  subscribe((st, changed) => {
    if (changed.has('view') || !current) {
      mount(st.sel.view);
      return;
    }
    current.handle.update(st, changed);
  });

  const doExport = async (kind: 'svg' | 'png'): Promise<void> => {
    if (!current?.handle.figure) return;
    try {
      const svg = await current.handle.figure();
      if (!svg) {
        status.say('There is no figure to export yet.', 'error');
        return;
      }
      const base = current.handle.fileBase?.() ?? `stillwater-${current.id}`;
      if (kind === 'svg') saveSvg(svg, base);
      else await savePng(svg, base);
      status.say(`Exported ${base}.${kind} (180 mm wide${kind === 'png' ? ', 300 dpi' : ''}).`);
    } catch (e) {
      status.say(errorText(e), 'error');
    }
  };
  ui.exportSvg.addEventListener('click', () => void doExport('svg'));
  ui.exportPng.addEventListener('click', () => void doExport('png'));

  // undo and redo of view changes; inside a text field the keys stay the field's own
  document.addEventListener('keydown', (ev) => {
    if (!(ev.ctrlKey || ev.metaKey) || ev.altKey) return;
    const t = ev.target;
    if (t instanceof HTMLInputElement && t.type !== 'checkbox' && t.type !== 'radio') return;
    if (t instanceof HTMLTextAreaElement) return;
    const key = ev.key.toLowerCase();
    if (key === 'z' && !ev.shiftKey) {
      ev.preventDefault();
      if (!undo()) status.say('There is nothing to undo.');
    } else if (key === 'y' || (key === 'z' && ev.shiftKey)) {
      ev.preventDefault();
      if (!redo()) status.say('There is nothing to redo.');
    }
  });

  let resizeTimer = 0;
  window.addEventListener('resize', () => {
    window.clearTimeout(resizeTimer);
    resizeTimer = window.setTimeout(() => current?.handle.update(state, new Set(['size'])), 150);
  });

  mount(state.sel.view);
  const recipe = await startRecipe().catch(() => null);
  if (!recipe) {
    status.say('No recipe was given at start: open one from the sources panel.');
    return;
  }
  try {
    const session = await openSession(recipe);
    setSession(session);
    const n = session.problems?.length ?? 0;
    status.say(n ? `Opened ${recipe} with ${n} problem${n > 1 ? 's' : ''}: see the list in the sources panel.` : `Opened ${recipe}.`, n ? 'error' : 'info');
    document.body.dataset.ready = 'true';
  } catch (e) {
    status.say(errorText(e), 'error');
    document.body.dataset.ready = 'error';
  }
}

void VIEWS;
void main();
