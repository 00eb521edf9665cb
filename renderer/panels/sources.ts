/**
 * The sources panel: the recipe, the reference and the runs with their variables and units; open a
 * recipe, pair a run's variable with a reference variable (adding a run), save the session as a recipe.
 */
import { openSession } from '../service-client.js';
import { h } from '../elements.js';
import { setSession, state, subscribe } from '../state.js';
import { pickFile } from './file-picker.js';
import { pairForm, type Say } from './pair-form.js';
import { reportForm } from './report-form.js';
import { saveForm } from './save-form.js';
import { sourceBlock } from './source-block.js';

export function sourcesPanel(el: HTMLElement, say: Say): void {
  el.classList.add('sources');

  const open = async (): Promise<void> => {
    const path = await pickFile('Open a recipe', (e) => e.kind === 'recipe', ['json']);
    if (!path) return;
    try {
      const session = await openSession(path);
      setSession(session);
      const n = session.problems?.length ?? 0;
      say(n ? `Opened ${path} with ${n} problem${n > 1 ? 's' : ''}: see the list in the sources panel.` : `Opened ${path}.`, n ? 'error' : 'info');
    } catch (e) {
      say(e instanceof Error ? e.message : String(e), 'error');
    }
  };

  const render = (): void => {
    const s = state.session;
    const openButton = h('button', { type: 'button', id: 'open-recipe' }, 'Open recipe…');
    openButton.addEventListener('click', () => void open());
    if (!s) {
      el.replaceChildren(h('h2', {}, 'Sources'), openButton);
      return;
    }
    const pairToggle = h('details', { class: 'pair' }, h('summary', {}, 'Pair a variable or add a run…'), pairForm(s, say));
    const saveToggle = h('details', { class: 'save' }, h('summary', {}, 'Save as recipe…'), saveForm(s, say));
    const reportToggle = h('details', { class: 'report', id: 'report-toggle' }, h('summary', {}, 'Report…'), reportForm(s, say));
    el.replaceChildren(
      h('h2', {}, 'Sources'),
      h('div', { class: 'recipe-line' }, h('strong', {}, s.title), s.modified ? h('span', { class: 'badge' }, 'changed') : null),
      h('p', { class: 'muted small path', title: s.recipePath }, s.recipePath),
      h('div', { class: 'row' }, openButton),
      ...(s.problems?.length
        ? [h(
            'section',
            { class: 'recipe-problems', id: 'recipe-problems', role: 'alert' },
            h('h3', {}, `${s.problems.length} problem${s.problems.length > 1 ? 's' : ''} in this recipe`),
            h('ul', {}, ...s.problems.map((p) => h('li', {}, h('code', {}, p.path), ': ', p.sentence))),
          )]
        : []),
      sourceBlock(s.reference, 'reference'),
      ...s.runs.map((r) => sourceBlock(r, 'run')),
      h('p', { class: 'muted small' }, `Common grid: ${s.grid.nx} × ${s.grid.ny} cells, ${s.grid.nz} levels to ${Math.round(s.grid.depthEdges[s.grid.nz])} m.`),
      pairToggle,
      saveToggle,
      reportToggle,
    );
  };
  subscribe((_st, changed) => {
    if (changed.has('session')) render();
  });
  render();
}
